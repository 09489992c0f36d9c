// A small invented circuit built from straights and arcs, a test car, and a driver lap made directly from a
// reference trace, for the comparison tests. Nothing here calls the comparison code.

import type { TrackGrid } from '../../src/track/types.js';
import type { DriverLap } from '../../src/compare/types.js';
import type { LapResult } from '../../src/solve/types.js';
import { testCar } from '../helpers/cars.js';
import { trackFromCurvature } from '../line/hand-tracks.js';

/** Straights (radius null) and arcs (signed radius, + = left) with their lengths, m. */
export const TEST_CIRCUIT: { lengthM: number; radiusM: number | null }[] = [
  { lengthM: 500, radiusM: null },
  { lengthM: (Math.PI / 2) * 60, radiusM: 60 },
  { lengthM: 300, radiusM: null },
  { lengthM: (Math.PI / 2) * 120, radiusM: 120 },
  { lengthM: 200, radiusM: null },
  { lengthM: (Math.PI / 4) * 300, radiusM: 300 },
  { lengthM: 250, radiusM: null },
  { lengthM: (Math.PI / 4) * 80, radiusM: -80 },
  { lengthM: 100, radiusM: null },
  { lengthM: Math.PI * 50, radiusM: 50 },
  { lengthM: 300, radiusM: null },
];

/** The circuit on a 1 m grid: curvature piecewise constant (positions integrated by the line tests' helper). */
export function testCircuit(stepM = 1): TrackGrid {
  const totalM = TEST_CIRCUIT.reduce((sum, piece) => sum + piece.lengthM, 0);
  const n = Math.round(totalM / stepM);
  const curvaturePerM = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let s = (i + 0.5) * stepM;
    for (const piece of TEST_CIRCUIT) {
      if (s < piece.lengthM) {
        curvaturePerM[i] = piece.radiusM === null ? 0 : 1 / piece.radiusM;
        break;
      }
      s -= piece.lengthM;
    }
  }
  return {
    ...trackFromCurvature('test circuit', true, stepM, curvaturePerM, 6, 6),
    corners: [{ atM: 500 + 47, name: 'First' }],
  };
}

export const circuitCar = () =>
  testCar({ massKg: 1200, mu: 1.3, dragAreaM2: 0.7, maxPowerW: 220_000, rollingResistanceCoeff: 0.013 });

/** Index ranges of the circuit's arcs on the grid, in running order. */
export function arcRanges(stepM = 1): { fromM: number; toM: number; radiusM: number }[] {
  const ranges: { fromM: number; toM: number; radiusM: number }[] = [];
  let s = 0;
  for (const piece of TEST_CIRCUIT) {
    if (piece.radiusM !== null) ranges.push({ fromM: s, toM: s + piece.lengthM, radiusM: piece.radiusM });
    s += piece.lengthM;
  }
  void stepM;
  return ranges;
}

/** A driver lap from given speeds on the grid: time by the trapezoid rule, ax from v^2 differences, ay = v^2 kappa. */
export function driverLapFromSpeeds(
  track: TrackGrid,
  speedMps: Float64Array,
  throttle: Float64Array,
  brake: Float64Array,
  source = 'synthetic lap',
): DriverLap {
  const n = speedMps.length;
  const timeS = new Float64Array(n);
  const axMps2 = new Float64Array(n);
  const ayMps2 = new Float64Array(n);
  let elapsed = 0;
  for (let i = 0; i < n; i++) {
    timeS[i] = elapsed;
    const v = speedMps[i]!;
    const next = speedMps[(i + 1) % n]!;
    axMps2[i] = (next * next - v * v) / (2 * track.stepM);
    ayMps2[i] = v * v * track.curvaturePerM[i]!;
    elapsed += (2 * track.stepM) / (v + next);
  }
  return {
    source,
    lapNumber: 1,
    lapTimeS: elapsed,
    timeS,
    speedMps,
    throttle,
    brake,
    axMps2,
    ayMps2,
    steeringDeg: null,
    gear: null,
    rpm: null,
    xM: null,
    yM: null,
    derivedChannels: [],
  };
}

/** The reference's own trace as a driver lap (copies, so the test may change them). */
export function driverLapFromReference(track: TrackGrid, reference: LapResult): DriverLap {
  const t = reference.trace;
  return driverLapFromSpeeds(
    track,
    Float64Array.from(t.speedMps),
    Float64Array.from(t.throttle),
    Float64Array.from(t.brake),
    'reference copy',
  );
}
