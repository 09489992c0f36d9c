// Two laps on one distance grid, corner by corner: each lap's own figures (lap-corner.ts) and the differences,
// first lap minus second, with the sign conventions of the reference comparison (positive braking-point delta =
// the first lap brakes later; positive time = the first lap loses). The lap is shared among the corners as the
// reference comparison shares it (../corner-phases.ts), so the corners' times add up to the lap-time difference.

import type { TrackGrid } from '../../track/types.js';
import { wrapIndex } from '../../numeric/lap-index.js';
import { cornerLayoutOf } from '../../track/corner-layout.js';
import { compareBraking } from '../braking-points.js';
import { ownershipBounds, phaseTimesLost } from '../corner-phases.js';
import { lapCornerFigures, clockBetween, type LapCornerFigures } from './lap-corner.js';
import type { PairLap } from './pair-lap.js';

export interface CornerPair {
  id: number;
  name: string | null;
  entryM: number;
  apexM: number;
  exitM: number;
  /** The stretch of the lap this corner owns, m (folded onto the lap). */
  ownStartM: number;
  ownEndM: number;
  first: LapCornerFigures;
  second: LapCornerFigures;
  /** First lap's braking point minus the second's, m (positive = later); null where neither brakes. */
  brakingPointDeltaM: number | null;
  /** The same as time at the second lap's speed there, s. */
  brakingPointDeltaS: number | null;
  /** First lap's brake release minus the second's, m (positive = held further into the corner). */
  brakeReleaseDeltaM: number | null;
  entrySpeedDeltaKph: number;
  minSpeedDeltaKph: number;
  exitSpeedDeltaKph: number;
  /** Time the first lap loses (positive) or gains against the second, by phase and in all, s. */
  entryTimeLostS: number;
  middleTimeLostS: number;
  exitTimeLostS: number;
  timeLostS: number;
}

export interface PairOptions {
  /** Pedal share above which a pedal counts as pressed, 0-1. */
  pedalThreshold: number;
  /** Corner stretches to use (unwrapped station indices, one more than the corners); default: split for these two laps. */
  bounds?: readonly number[];
}

const difference = (a: number | null, b: number | null) => (a === null || b === null ? null : a - b);

/** Both laps' corners and their differences, and the stretch bounds they were measured over. */
export function pairCorners(
  track: TrackGrid,
  first: PairLap,
  second: PairLap,
  options: PairOptions,
): { corners: CornerPair[]; bounds: readonly number[] } {
  const n = track.distanceM.length;
  const step = track.stepM;
  const closed = track.closed;
  for (const lap of [first, second])
    if (lap.timeS.length !== n)
      throw new Error(`${lap.label} has ${lap.timeS.length} stations but the track grid has ${n}`);
  const spans = cornerLayoutOf(track).corners;
  const bounds = options.bounds ?? ownershipBounds(spans, second, first, n, step, closed);
  const deltaAt = (u: number) => clockBetween(first, u, closed) - clockBetween(second, u, closed);
  const fold = (u: number) => (closed ? wrapIndex(u, n) * step : u * step);
  const corners = spans.map((span, c): CornerPair => {
    const ownStart = bounds[c]!;
    const ownEnd = bounds[c + 1]!;
    const braking = compareBraking(
      second.brakingStarts,
      first.brakingStarts,
      second,
      first,
      span,
      ownStart,
      n,
      step,
      options.pedalThreshold,
    );
    const a = lapCornerFigures(first, span, ownStart, ownEnd, braking.driverBrake, track, options.pedalThreshold);
    const b = lapCornerFigures(second, span, ownStart, ownEnd, braking.referenceBrake, track, options.pedalThreshold);
    const lost = phaseTimesLost(span, ownStart, ownEnd, deltaAt);
    return {
      id: span.id,
      name: span.name,
      entryM: span.entryM,
      apexM: span.apexM,
      exitM: span.exitM,
      ownStartM: fold(ownStart),
      ownEndM: fold(ownEnd),
      first: a,
      second: b,
      brakingPointDeltaM: braking.brakingPointDeltaM,
      brakingPointDeltaS: braking.brakingPointDeltaS,
      brakeReleaseDeltaM: difference(a.brakeReleaseFromApexM, b.brakeReleaseFromApexM),
      entrySpeedDeltaKph: a.entrySpeedKph - b.entrySpeedKph,
      minSpeedDeltaKph: a.minSpeedKph - b.minSpeedKph,
      exitSpeedDeltaKph: a.exitSpeedKph - b.exitSpeedKph,
      entryTimeLostS: lost.entryS,
      middleTimeLostS: lost.middleS,
      exitTimeLostS: lost.exitS,
      timeLostS: lost.entryS + lost.middleS + lost.exitS,
    };
  });
  return { corners, bounds };
}

/** A lap's time over each corner's stretch minus another's, on given bounds, s. */
export function stretchTimesLostS(
  track: TrackGrid,
  first: PairLap,
  second: PairLap,
  bounds: readonly number[],
): number[] {
  const closed = track.closed;
  const out: number[] = [];
  for (let c = 0; c + 1 < bounds.length; c++) {
    const lost = (lap: PairLap) => clockBetween(lap, bounds[c + 1]!, closed) - clockBetween(lap, bounds[c]!, closed);
    out.push(lost(first) - lost(second));
  }
  return out;
}
