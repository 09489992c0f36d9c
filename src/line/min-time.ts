// A line that lowers the lap time for one car, with the lap solver in the loop. After the two-step idea of
// Kapania, Subosits and Gerdes (J. Dyn. Sys., Meas., Control 138 (2016)): alternate (1) the speed profile on the
// current line (simulate) and (2) a path update weighted by that profile. The update minimises
//   F = sum k_i^2 / K0 + w sum (l_i / v_i) / T0,
// the minimum-curvature objective traded against the time the current speeds take over the path's length
// (K0 and T0 make each term 1 on the reference line). Where the car is slow, a metre costs more time, so the
// length term pulls hardest there; the curvature term keeps the corner speeds up. This is the compromise
// between the minimum-curvature and the shortest path that Braghin et al. (Computers & Structures 86 (2008))
// scan with one weight, here with the weights taken from the speed profile. The solver decides: each
// candidate line is driven and kept only if its lap is faster than the best so far. The first best is the
// minimum-curvature line, so the result is never slower than it.
// (Tried and dropped: a smaller curvature weight where the car is below its corner limit; it gave slower laps.)

import type { Car, Ambient } from '../car/types.js';
import type { Envelope } from '../car/envelope.js';
import type { TrackGrid } from '../track/types.js';
import type { LapResult } from '../solve/types.js';
import { simulate, simulateLapTime, type LapTimeResult, type SimulateOptions } from '../solve/simulate.js';
import type { Corridor } from './corridor.js';
import { linePath } from './geometry.js';
import { optimiseOffsets, type OffsetWeights } from './optimise-offsets.js';

export interface MinimumTimeOptions {
  ambient: Ambient;
  envelope: Envelope;
  startSpeedMps: number;
  /** Alternations of speed profile and path update (default 3; fewer when a round brings nothing). */
  rounds?: number;
  /** Length weights w tried in the first round. */
  lengthWeights?: readonly number[];
}

export interface MinimumTimeResult {
  offsetM: Float64Array;
  lap: LapResult;
  /** Laps driven by the solver during the search (the start's lap counts only when driven here). */
  evaluations: number;
  /** Length weight of the last candidate kept, or null when none beat the start. */
  lengthWeight: number | null;
}

/** Length weights of the first round; later rounds try the best one and its half again, on new weights.
 * On the open-track set at 2 m, the first round's winners were 2 to 8 and later rounds added under 0.5 s. */
const FIRST_ROUND_LENGTH_WEIGHTS = [1, 2, 4, 8] as const;

/** A lap the search has driven: in full (LapResult) or in the solver's lap-time mode (LapTimeResult). */
export type DrivenLap = LapResult | LapTimeResult;

const speedsOf = (lap: DrivenLap): Float64Array => ('trace' in lap ? lap.trace.speedMps : lap.speedMps);

/** The line's lap with every channel. */
export function driveLine(track: TrackGrid, car: Car, offsetM: Float64Array, options: MinimumTimeOptions): LapResult {
  return simulate(track, car, driveOptions(track, offsetM, options));
}

/** The line's lap time and speeds alone (the solver's lap-time mode): what a candidate line needs. */
export function driveLineLapTime(
  track: TrackGrid,
  car: Car,
  offsetM: Float64Array,
  options: MinimumTimeOptions,
): LapTimeResult {
  return simulateLapTime(track, car, driveOptions(track, offsetM, options));
}

function driveOptions(track: TrackGrid, offsetM: Float64Array, options: MinimumTimeOptions): SimulateOptions {
  return {
    ambient: options.ambient,
    envelope: options.envelope,
    path: linePath(track, offsetM),
    startSpeedMps: options.startSpeedMps,
  };
}

/** Step (2)'s weights from step (1)'s lap, each term scaled to 1 on the reference line. */
export function timeWeights(lap: DrivenLap, lengthWeight: number): OffsetWeights {
  const speedMps = speedsOf(lap);
  const count = speedMps.length;
  const segments = lap.path.segmentLengthM;
  let curvatureSum = 0;
  for (let i = 0; i < count; i++) curvatureSum += lap.path.curvaturePerM[i]! ** 2;
  const curvature = new Float64Array(count).fill(1 / (curvatureSum || 1));
  const length = new Float64Array(segments.length);
  let timeSum = 0;
  for (let i = 0; i < segments.length; i++) {
    const j = i + 1 === count ? 0 : i + 1;
    length[i] = 2 / (Math.max(speedMps[i]!, 1) + Math.max(speedMps[j]!, 1));
    timeSum += length[i]! * segments[i]!;
  }
  for (let i = 0; i < length.length; i++) length[i] = length[i]! / (timeSum || 1);
  return { curvature, length, lengthWeight };
}

/** Starts from `start` (normally the minimum-curvature line); `startLap` is the lap on it, if already driven. */
export function minimumTimeOffsets(
  track: TrackGrid,
  car: Car,
  corridor: Corridor,
  start: Float64Array,
  options: MinimumTimeOptions,
  startLap?: DrivenLap,
): MinimumTimeResult {
  let bestOffsets = start;
  let bestLap: DrivenLap = startLap ?? driveLineLapTime(track, car, start, options);
  let evaluations = startLap ? 0 : 1;
  const rounds = options.rounds ?? 3;
  let lengthWeights: readonly number[] = options.lengthWeights ?? FIRST_ROUND_LENGTH_WEIGHTS;
  let keptWeight: number | null = null;
  for (let round = 0; round < rounds; round++) {
    const reference = bestLap;
    const referenceOffsets = bestOffsets;
    let improved = false;
    let bestWeight = lengthWeights[0]!;
    for (const lengthWeight of lengthWeights) {
      const weights = timeWeights(reference, lengthWeight);
      const candidate = optimiseOffsets(track, corridor, weights, referenceOffsets, {
        maxIterations: 12,
        relativeTolerance: 1e-6,
      }).offsetM;
      const lap = driveLineLapTime(track, car, candidate, options);
      evaluations++;
      if (lap.lapTimeS < bestLap.lapTimeS) {
        bestLap = lap;
        bestOffsets = candidate;
        bestWeight = lengthWeight;
        keptWeight = lengthWeight;
        improved = true;
      }
    }
    if (!improved) break;
    lengthWeights = [bestWeight, bestWeight / 2];
  }
  // The candidates were driven for their lap time alone; the line kept is driven once more with every channel.
  const lap = 'trace' in bestLap ? bestLap : driveLine(track, car, bestOffsets, options);
  return { offsetM: bestOffsets, lap, evaluations, lengthWeight: keptWeight };
}
