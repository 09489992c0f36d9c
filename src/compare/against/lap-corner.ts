// One lap's own figures for one corner: where and how it brakes (braking point, peak deceleration and how fast it
// builds, where the brake comes off against the apex), its entry, slowest and exit speeds, coasting and the time
// it takes over the corner's stretch. The pair and session views are built from these.

import type { CornerSpan } from '../../track/corners.js';
import type { TrackGrid } from '../../track/types.js';
import { wrapIndex } from '../../numeric/lap-index.js';
import { clockAt } from '../delta.js';
import { slowestPoint } from '../lap-samples.js';
import { coastingTime } from '../corner-phases.js';
import { mpsToKph } from '../../units.js';
import type { PairLap } from './pair-lap.js';

/** Deceleration counts as built up once it reaches this share of the zone's peak (common practice, no source). */
const BUILT_SHARE = 0.9;

export interface LapCornerFigures {
  /** Where the brake comes on, m along the lap; null where the lap does not brake for the corner. */
  brakingPointM: number | null;
  /** The braking point as metres before the corner's turn-in (negative: after it). */
  brakingBeforeTurnInM: number | null;
  /** Largest deceleration between the braking point and the release, m/s^2 (positive). */
  peakBrakingMps2: number | null;
  /** Time from the braking point to 90 % of that peak, s. */
  brakeBuildS: number | null;
  /** Where the brake comes off, m from the apex (negative = before it). */
  brakeReleaseFromApexM: number | null;
  /** How far past the turn-in the brake stays on (trail braking), m; 0 = released before turn-in. */
  trailBrakingM: number | null;
  entrySpeedKph: number;
  minSpeedKph: number;
  /** Where the slowest point falls, m from the apex (positive = after it). */
  minSpeedOffsetFromApexM: number;
  exitSpeedKph: number;
  /** Time with neither pedal over the threshold on the corner's stretch, s; null without pedal channels. */
  coastingS: number | null;
  /** Time over the corner's stretch, s. */
  cornerTimeS: number;
}

/** A lap's clock at a fractional unwrapped station, s. */
export function clockBetween(lap: PairLap, u: number, closed: boolean): number {
  const lo = Math.floor(u);
  const a = clockAt(lap.timeS, lap.lapTimeS, lo, closed);
  if (u === lo) return a;
  return a + (u - lo) * (clockAt(lap.timeS, lap.lapTimeS, lo + 1, closed) - a);
}

/** The figures of one lap for one corner; `brakeU` is its braking point (unwrapped fractional index) or null. */
export function lapCornerFigures(
  lap: PairLap,
  span: CornerSpan,
  ownStart: number,
  ownEnd: number,
  brakeU: number | null,
  track: TrackGrid,
  pedalThreshold: number,
): LapCornerFigures {
  const n = lap.speedMps.length;
  const step = track.stepM;
  const closed = track.closed;
  const slowest = slowestPoint(lap.speedMps, span.entryIndex, span.exitIndex, n);
  const braking = brakeU === null ? null : brakingFigures(lap, span, brakeU, n, closed, pedalThreshold);
  const foldM = (u: number) => (closed ? wrapIndex(u, n) * step : u * step);
  return {
    brakingPointM: brakeU === null ? null : foldM(brakeU),
    brakingBeforeTurnInM: brakeU === null ? null : (span.entryIndex - brakeU) * step,
    peakBrakingMps2: braking?.peakMps2 ?? null,
    brakeBuildS: braking?.buildS ?? null,
    brakeReleaseFromApexM: braking ? (braking.releaseU - span.apexIndex) * step : null,
    trailBrakingM: braking ? Math.max(0, braking.releaseU - span.entryIndex) * step : null,
    entrySpeedKph: mpsToKph(lap.speedMps[wrapIndex(span.entryIndex, n)]!),
    minSpeedKph: mpsToKph(slowest.value),
    minSpeedOffsetFromApexM: (slowest.index - span.apexIndex) * step,
    exitSpeedKph: mpsToKph(lap.speedMps[wrapIndex(span.exitIndex, n)]!),
    coastingS: lap.throttle
      ? coastingTime(lap.throttle, lap.brake, lap.timeS, lap.lapTimeS, ownStart, ownEnd, closed, pedalThreshold)
      : null,
    cornerTimeS: clockBetween(lap, ownEnd, closed) - clockBetween(lap, ownStart, closed),
  };
}

function brakingFigures(
  lap: PairLap,
  span: CornerSpan,
  brakeU: number,
  n: number,
  closed: boolean,
  threshold: number,
): { peakMps2: number; buildS: number; releaseU: number } {
  const onU = Math.ceil(brakeU);
  let releaseU = onU;
  while (releaseU < span.exitIndex && lap.brake[wrapIndex(releaseU, n)]! > threshold) releaseU++;
  let peakMps2 = 0;
  for (let u = Math.floor(brakeU); u <= releaseU; u++) peakMps2 = Math.max(peakMps2, -lap.axMps2[wrapIndex(u, n)]!);
  let builtU = releaseU;
  for (let u = onU; u <= releaseU; u++) {
    if (-lap.axMps2[wrapIndex(u, n)]! >= BUILT_SHARE * peakMps2) {
      builtU = u;
      break;
    }
  }
  return {
    peakMps2,
    buildS: Math.max(0, clockBetween(lap, builtU, closed) - clockBetween(lap, brakeU, closed)),
    releaseU,
  };
}
