// Where each lap starts slowing for a corner, and the two laps' braking (or lift) points compared: the braking
// zone that sheds the most speed before the apex, placed where the brake crosses the pedal threshold.

import type { CornerSpan } from '../track/corners.js';
import { distanceAsTimeS } from './delta.js';
import { lastPeakIndex, minimumOver, type LapView } from './lap-samples.js';
import { interpolateOnLap } from '../numeric/interpolate.js';
import { wrapIndex } from '../numeric/lap-index.js';

/** A lap "slows" for a corner when it sheds at least this much speed without braking, m/s. */
const LIFT_DROP_MPS = 1;

/** The braking point of the corner on one lap (unwrapped, fractional index) or null when it does not brake for it. */
function brakingPoint(
  zones: readonly { startIndex: number }[],
  lap: LapView,
  span: CornerSpan,
  ownStart: number,
  n: number,
  threshold: number,
): number | null {
  let best: number | null = null;
  let bestDrop = 0;
  for (const zone of zones) {
    for (const u of [zone.startIndex - n, zone.startIndex, zone.startIndex + n]) {
      if (u < ownStart || u > span.apexIndex) continue;
      const drop = lap.speedMps[wrapIndex(u, n)]! - minimumOver(lap.speedMps, u, span.exitIndex, n).value;
      if (drop > bestDrop) {
        bestDrop = drop;
        best = u;
      }
    }
  }
  if (best === null || bestDrop < LIFT_DROP_MPS) return null;
  // Sub-sample place where the brake crosses the threshold, between the sample before and the first one on.
  const on = lap.brake[wrapIndex(best, n)]!;
  const before = lap.brake[wrapIndex(best - 1, n)]!;
  const frac = on > before ? (threshold - before) / (on - before) : 1;
  return best - 1 + Math.min(1, Math.max(0, frac));
}

/** Where a lap that does not brake starts slowing for the corner (the end of its speed peak), or null if it does not slow. */
function liftPoint(lap: LapView, ownStart: number, span: CornerSpan, n: number): number | null {
  const peakU = lastPeakIndex(lap.speedMps, ownStart, span.apexIndex, n);
  const drop = lap.speedMps[wrapIndex(peakU, n)]! - minimumOver(lap.speedMps, peakU, span.exitIndex, n).value;
  return drop >= LIFT_DROP_MPS ? peakU : null;
}

/** Both laps' braking points for one corner (unwrapped, fractional indices; null where a lap does not brake). */
export interface BrakingComparison {
  referenceBrake: number | null;
  driverBrake: number | null;
  /** The driver's lift point, where the driver does not brake (unwrapped index). */
  driverLift: number | null;
  brakingPointDeltaM: number | null;
  brakingPointDeltaS: number | null;
  liftPointDeltaM: number | null;
}

/**
 * The driver's braking point against the reference's for the corner (positive = later), in metres and in time at
 * the reference's speed there; where neither lap brakes, the lift points instead.
 */
export function compareBraking(
  referenceZones: readonly { startIndex: number }[],
  driverZones: readonly { startIndex: number }[],
  refView: LapView,
  drv: LapView,
  span: CornerSpan,
  ownStart: number,
  n: number,
  step: number,
  threshold: number,
): BrakingComparison {
  const refBrake = brakingPoint(referenceZones, refView, span, ownStart, n, threshold);
  const drvBrake = brakingPoint(driverZones, drv, span, ownStart, n, threshold);
  const refLift = refBrake === null ? liftPoint(refView, ownStart, span, n) : null;
  const drvLift = drvBrake === null ? liftPoint(drv, ownStart, span, n) : null;
  const refSlowU = refBrake ?? refLift;
  const drvSlowU = drvBrake ?? drvLift;
  let brakingPointDeltaM: number | null = null;
  let brakingPointDeltaS: number | null = null;
  if ((refBrake !== null || drvBrake !== null) && refSlowU !== null && drvSlowU !== null) {
    brakingPointDeltaM = (drvSlowU - refSlowU) * step;
    brakingPointDeltaS = distanceAsTimeS(brakingPointDeltaM, interpolateOnLap(refView.speedMps, refSlowU, n));
  }
  const liftPointDeltaM =
    refBrake === null && drvBrake === null && drvLift !== null && refLift !== null ? (drvLift - refLift) * step : null;
  return {
    referenceBrake: refBrake,
    driverBrake: drvBrake,
    driverLift: drvLift,
    brakingPointDeltaM,
    brakingPointDeltaS,
    liftPointDeltaM,
  };
}
