// Invented tracks and a car for the sweep tests, written into a test's temporary folder.

import { writeFileSync } from 'node:fs';
import { join } from 'node:path';

/** Four bends of different radii (four braking zones); closes by construction (sides 600, 300, 630, 310 m). */
export function writeTestLoop(folder: string): string {
  const file = join(folder, 'loop.json');
  writeFileSync(
    file,
    JSON.stringify({
      name: 'test loop',
      closed: true,
      widthM: 12,
      segments: [
        { kind: 'straight', lengthM: 600 },
        { kind: 'arc', radiusM: 60, angleDeg: 90 },
        { kind: 'straight', lengthM: 300 },
        { kind: 'arc', radiusM: 20, angleDeg: 90 },
        { kind: 'straight', lengthM: 630 },
        { kind: 'arc', radiusM: 40, angleDeg: 90 },
        { kind: 'straight', lengthM: 310 },
        { kind: 'arc', radiusM: 30, angleDeg: 90 },
      ],
    }),
  );
  return file;
}

/** A 600 m straight into a 20 m hairpin, open. */
export function writeHairpin(folder: string): string {
  const file = join(folder, 'hairpin.json');
  writeFileSync(
    file,
    JSON.stringify({
      name: 'straight into a hairpin',
      closed: false,
      widthM: 12,
      segments: [
        { kind: 'straight', lengthM: 600 },
        { kind: 'arc', radiusM: 20, angleDeg: 180 },
        { kind: 'straight', lengthM: 100 },
      ],
    }),
  );
  return file;
}

/** No drag, no downforce, almost no power: the car holds its start speed down the straight. */
export function writeSlickCar(folder: string): string {
  const file = join(folder, 'slick.json');
  writeFileSync(
    file,
    JSON.stringify({
      name: 'test slick',
      massKg: 800,
      frontWeightFraction: 0.5,
      rollingResistanceCoeff: 0,
      tyre: { muLong: 1.2, muLat: 1.2, loadSensitivity: 0 },
      aero: { dragAreaM2: 0, liftAreaM2: 0 },
      powertrain: { maxPowerW: 1, drive: 'all' },
      fuel: { massKg: 0, burnKgPerLap: 0 },
    }),
  );
  return file;
}
