// One draw of an uncertain reference, run by the sweep's machinery (in the main thread or a worker): the car of the
// draw, its reference lap, and a fixed-width row of numbers: the sweep's own (lap time, each baseline braking zone),
// the speed at every `traceStride`-th station, and, when a driver's lap is compared, per corner the time lost, the
// claims its finding would make (a bit mask over CLAIM_KINDS), the braking-point gap and the slowest-speed gap.

import type { DriverLap } from '../compare/types.js';
import type { CompareOptions } from '../compare/compare-options.js';
import { DEFAULT_COMPARE_OPTIONS } from '../compare/compare-options.js';
import { compareLaps } from '../compare/compare-laps.js';
import { cornerLayoutOf } from '../track/corner-layout.js';
import { CLAIM_KINDS, cornerClaims, phaseClaim, type ClaimKind } from '../compare/findings.js';
import type { CornerComparison } from '../compare/types.js';
import { ambientFrom } from '../car/ambient.js';
import { buildEnvelope } from '../car/build-envelope.js';
import { simulate } from '../solve/simulate.js';
import type { TrackGrid } from '../track/types.js';
import { outcomeWidth, writeOutcome, type SweepContext } from '../sweep/evaluate.js';
import type { PoolJob } from '../sweep/pool.js';
import { applyDraw } from './draws.js';

export interface DrawSpec {
  /** The speed trace is kept at every traceStride-th station. */
  traceStride: number;
  /** The driver's lap each draw's reference is compared with; null when only the reference is wanted. */
  driver: DriverLap | null;
  compare: Partial<CompareOptions>;
}

/** The context of a draw run: a sweep's, with what the draws add. */
export type DrawContext = SweepContext & { draw: DrawSpec };

/** Numbers per compared corner: time lost, claims, braking-point gap (m), slowest-speed gap (km/h). */
export const VALUES_PER_COMPARED_CORNER = 4;

export function traceSamples(stations: number, stride: number): number {
  return Math.ceil(stations / stride);
}

export function comparedCornerCount(track: TrackGrid, spec: DrawSpec): number {
  return spec.driver ? cornerLayoutOf(track).corners.length : 0;
}

export function drawOutcomeWidth(context: DrawContext): number {
  return (
    outcomeWidth(context.corners.length) +
    traceSamples(context.track.distanceM.length, context.draw.traceStride) +
    VALUES_PER_COMPARED_CORNER * comparedCornerCount(context.track, context.draw)
  );
}

/** The claims of a corner's finding as a bit mask: the clauses it would name, or where its time goes. */
export function claimMask(corner: CornerComparison, options: Partial<CompareOptions>): number {
  const findings = { ...DEFAULT_COMPARE_OPTIONS, ...options }.findings;
  const claims = cornerClaims(corner, findings);
  let mask = 0;
  const set = (kind: ClaimKind) => (mask |= 1 << CLAIM_KINDS.indexOf(kind));
  for (const claim of claims) set(claim.kind);
  set(phaseClaim(corner).kind);
  return mask;
}

export function evaluateDraw(
  context: DrawContext,
  values: ArrayLike<number>,
  out: Float64Array,
  offset: number,
  where: string,
): void {
  const car = applyDraw(context.base.car, context.fields, values, where);
  const ambient = ambientFrom(context.base.air);
  const envelope = buildEnvelope(car, ambient);
  const lap = simulate(context.track, car, {
    ambient,
    envelope,
    startSpeedMps: context.startSpeedMps,
    ...(context.path ? { path: context.path } : {}),
  });
  writeOutcome(context, lap, out, offset);
  let at = offset + outcomeWidth(context.corners.length);
  const speed = lap.trace.speedMps;
  for (let i = 0; i < speed.length; i += context.draw.traceStride) out[at++] = speed[i]!;
  const driver = context.draw.driver;
  if (!driver) return;
  const result = compareLaps(context.track, car, lap, driver, envelope, context.draw.compare);
  for (const corner of result.corners) {
    out[at++] = corner.timeLostS;
    out[at++] = claimMask(corner, context.draw.compare);
    out[at++] = corner.brakingPointDeltaM ?? Number.NaN;
    out[at++] = corner.minSpeedDeltaKph;
  }
}

/** The draws of an uncertain reference, for the pool (src/sweep/pool.ts). */
export const drawJob: PoolJob<DrawContext> = {
  moduleUrl: import.meta.url,
  exportName: 'drawJob',
  width: drawOutcomeWidth,
  run: evaluateDraw,
};
