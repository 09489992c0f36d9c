// One sweep run: apply a parameter set to the base car, solve the lap, and report the lap time and each
// baseline corner's braking point and slowest speed in a fixed-width row of numbers (NaN: corner not braked).
// The same code runs in the main thread and in the worker threads, so a run gives the same digits anywhere.

import type { BrakingZone, LapResult } from '../solve/types.js';
import type { Path, TrackGrid } from '../track/types.js';
import { simulate, simulateLapTime, type LapTimeResult } from '../solve/simulate.js';
import { applyCheckedSetup, applySetup, type SetupBase } from './settings.js';
import { DEFAULT_MATCH_TOLERANCE_M, matchBrakingZones } from './match-zones.js';
import { brakingPointM } from './braking-point.js';
import type { PoolJob } from './pool.js';

/** Everything a run needs besides its parameter values; sent to each worker once. */
export interface SweepContext {
  track: TrackGrid;
  base: SetupBase;
  fields: string[];
  /** The baseline's braking zones: the corners each run is reported against. */
  corners: BrakingZone[];
  startSpeedMps: number;
  path?: Path;
  matchToleranceM: number;
}

/** Numbers per run: lap time, then per corner braking point (m), entry speed and slowest speed (m/s). */
export const VALUES_PER_CORNER = 3;

export function outcomeWidth(cornerCount: number): number {
  return 1 + VALUES_PER_CORNER * cornerCount;
}

export function solveSetup(
  context: Pick<SweepContext, 'track' | 'base' | 'fields' | 'startSpeedMps' | 'path'>,
  values: ArrayLike<number>,
  where: string,
): LapResult {
  const { car, ambient } = applySetup(context.base, context.fields, values, where);
  return simulate(context.track, car, {
    ambient,
    startSpeedMps: context.startSpeedMps,
    ...(context.path ? { path: context.path } : {}),
  });
}

/** The same lap as solveSetup in the solver's lap-time mode (the lap time and the braking points a run reports), for
 * a run whose values were checked when it was planned. */
function solveSetupLapTime(context: SweepContext, values: ArrayLike<number>, where: string): LapTimeResult {
  const { car, ambient } = applyCheckedSetup(context.base, context.fields, values, where);
  return simulateLapTime(context.track, car, {
    ambient,
    startSpeedMps: context.startSpeedMps,
    ...(context.path ? { path: context.path } : {}),
  });
}

/** Writes one run's outcome into `out` at `offset` (outcomeWidth(corners) numbers). */
export function writeOutcome(
  context: Pick<SweepContext, 'corners' | 'matchToleranceM'>,
  result: LapResult | LapTimeResult,
  out: Float64Array,
  offset: number,
): void {
  const corners = context.corners;
  out[offset] = result.lapTimeS;
  const matching = matchBrakingZones(
    corners,
    result.brakingZones,
    result.track.lengthM,
    result.track.closed,
    context.matchToleranceM,
  );
  for (let k = 0; k < corners.length; k++) {
    const c = matching.changedIndexOf[k]!;
    const zone = c >= 0 ? result.brakingZones[c]! : null;
    const at = offset + 1 + VALUES_PER_CORNER * k;
    out[at] = zone ? brakingPointM(result, zone) : Number.NaN;
    out[at + 1] = zone ? zone.entrySpeedMps : Number.NaN;
    out[at + 2] = zone ? zone.minSpeedMps : Number.NaN;
  }
}

export function evaluateRun(
  context: SweepContext,
  values: ArrayLike<number>,
  out: Float64Array,
  offset: number,
  where = 'sweep run',
): void {
  writeOutcome(context, solveSetupLapTime(context, values, where), out, offset);
}

/** A sweep's runs for the pool (./pool.ts). */
export const sweepJob: PoolJob<SweepContext> = {
  moduleUrl: import.meta.url,
  exportName: 'sweepJob',
  width: (context) => outcomeWidth(context.corners.length),
  run: evaluateRun,
};

export function defaultContext(
  partial: Omit<SweepContext, 'matchToleranceM'> & { matchToleranceM?: number },
): SweepContext {
  return { ...partial, matchToleranceM: partial.matchToleranceM ?? DEFAULT_MATCH_TOLERANCE_M };
}
