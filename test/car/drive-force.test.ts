// The drive force of a geared car against the wheel-force formula F = T(rpm) i_gear i_final eta / r_wheel, capped by
// the power at the wheels eta P / v, with rpm = v / r_wheel * i_gear * i_final * 60 / (2 pi) (Gillespie, Fundamentals
// of Vehicle Dynamics, 1992, chapter 2, "Power-limited acceleration" and the tractive-force equations there), and
// the table's reuse between cars that share a gearbox.

import { describe, expect, it } from 'vitest';
import { driveForceTable } from '../../src/car/drive-force.js';
import type { Car, Gearing } from '../../src/car/types.js';
import { testCar } from '../helpers/cars.js';

/** Two gears, a flat 400 N m from 1,000 to 7,000 rpm, so each gear's force is one number below its rev limit. */
function gearbox(finalDrive: number): Gearing {
  return {
    torqueCurve: { rpm: [1000, 7000], torqueNm: [400, 400] },
    gearRatios: [3, 1.5],
    finalDrive,
    wheelRadiusM: 0.3,
    shiftTimeS: 0,
    maxRpm: 7000,
  };
}

function gearedCar(finalDrive: number, maxPowerW: number): Car {
  const car = testCar({ maxPowerW, drivetrainEfficiency: 0.9 });
  return { ...car, powertrain: { ...car.powertrain, gearing: gearbox(finalDrive) } };
}

const RPM_PER_RAD_S = 60 / (2 * Math.PI);

/** The formula's force at a speed: the best gear within its rev limit, capped by eta P / v. */
function expectedForceN(car: Car, speedMps: number, powerFactor: number): { forceN: number; gear: number } {
  const gearing = car.powertrain.gearing!;
  const eta = car.powertrain.drivetrainEfficiency;
  let best = 0;
  let gear = 0;
  gearing.gearRatios.forEach((ratio, g) => {
    const overall = ratio * gearing.finalDrive;
    if ((speedMps / gearing.wheelRadiusM) * overall * RPM_PER_RAD_S > gearing.maxRpm) return;
    const forceN = (400 * overall * eta) / gearing.wheelRadiusM;
    if (forceN > best) [best, gear] = [forceN, g + 1];
  });
  const powerN = (car.powertrain.maxPowerW * powerFactor * eta) / speedMps;
  return { forceN: Math.min(best * powerFactor, powerN), gear };
}

describe('drive force of a geared car', () => {
  // Speeds on the table's 0.1 m/s steps, so no interpolation enters; first gear runs out at about 24.4 m/s with a
  // final drive of 4, second at 48.9 m/s.
  const speedsMps = [5, 12, 20, 30, 45];

  it('is the wheel-force formula in the best gear, capped by the power', () => {
    const car = gearedCar(4, 150_000);
    const table = driveForceTable(car, 1);
    for (const speedMps of speedsMps) {
      const expected = expectedForceN(car, speedMps, 1);
      expect(table.forceN(speedMps)).toBeCloseTo(expected.forceN, 6);
      expect(table.gearAt(speedMps)).toBe(expected.gear);
    }
    // The formula by hand at 5 m/s: first gear, 400 * 12 * 0.9 / 0.3 = 14,400 N, under 0.9 * 150 kW / 5 = 27,000 N.
    expect(table.forceN(5)).toBeCloseTo(14_400, 6);
    // At 30 m/s first gear is past 7,000 rpm: second, 7,200 N, over the power's 4,500 N, which caps it.
    expect(table.forceN(30)).toBeCloseTo(4_500, 6);
  });

  it('follows each car when cars share, change or edit in place their gearbox', () => {
    // One car, then one with the same gearbox in thinner air, then the first edited in place: each must read its own
    // numbers, whatever table the one before it built.
    const car = gearedCar(4, 150_000);
    const cases: [Car, number][] = [
      [car, 1],
      [gearedCar(4, 150_000), 0.92],
      [gearedCar(3, 150_000), 1],
      [car, 1],
    ];
    for (const [driven, powerFactor] of cases) {
      const table = driveForceTable(driven, powerFactor);
      for (const speedMps of speedsMps)
        expect(table.forceN(speedMps)).toBeCloseTo(expectedForceN(driven, speedMps, powerFactor).forceN, 6);
    }
    car.powertrain.gearing!.finalDrive = 3.5;
    const edited = driveForceTable(car, 1);
    for (const speedMps of speedsMps) {
      const expected = expectedForceN(car, speedMps, 1);
      expect(edited.forceN(speedMps)).toBeCloseTo(expected.forceN, 6);
      expect(edited.gearAt(speedMps)).toBe(expected.gear);
    }
  });
});
