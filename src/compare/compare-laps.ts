// A driver's lap against the reference lap of the same car, corner by corner, on the track's distance grid.
// The lap is partitioned among the corners (each owns its approach, the corner and the run out of it, split on
// the straights where both laps stop accelerating), so the corners' time losses add up to the lap-time gap.

import type { Envelope } from '../car/envelope.js';
import type { LapResult } from '../solve/types.js';
import type { TrackGrid } from '../track/types.js';
import type { ComparisonResult, CornerComparison, DriverLap, GripStretch } from './types.js';
import { findBrakingZones } from '../solve/braking-zones.js';
import { detectCorners, DEFAULT_CORNER_OPTIONS, type CornerDetectionOptions, type CornerSpan } from './corners.js';
import { movingAverage } from './derive.js';
import { clockAt, distanceAsTimeS, timeDeltaS } from './delta.js';
import { rankFindings, DEFAULT_FINDING_OPTIONS, type FindingOptions } from './findings.js';
import { mpsToKph } from '../units.js';

export interface CompareOptions {
  corners: CornerDetectionOptions;
  findings: FindingOptions;
  /** Pedal share above which a pedal counts as pressed (coasting = neither pressed), 0-1. */
  pedalThreshold: number;
  /** Grip use below which the driver leaves grip unused while the reference is on the limit. */
  unusedBelow: number;
  /** Grip use above which the driver exceeds the envelope. */
  exceededAbove: number;
  /** Reference grip use from which it counts as on the limit. */
  referenceOnLimit: number;
  /** Shortest stretch of unused or exceeded grip worth reporting, m. */
  minStretchM: number;
  /** Lap time on the driver's demonstrated envelope, and on the car model, when known (for the two gaps). */
  demonstratedLapTimeS: number | null;
  carModelLapTimeS: number | null;
  referenceEnvelopeKind: string;
}

export const DEFAULT_COMPARE_OPTIONS: CompareOptions = {
  corners: DEFAULT_CORNER_OPTIONS,
  findings: DEFAULT_FINDING_OPTIONS,
  pedalThreshold: 0.05,
  unusedBelow: 0.85,
  exceededAbove: 1.05,
  referenceOnLimit: 0.95,
  minStretchM: 8,
  demonstratedLapTimeS: null,
  carModelLapTimeS: null,
  referenceEnvelopeKind: 'car model',
};

/** Speed tolerance that decides where a straight's speed peak ends, m/s (covers logger noise). */
const PEAK_TOLERANCE_MPS = 0.5;
/** A lap "slows" for a corner when it sheds at least this much speed without braking, m/s. */
const LIFT_DROP_MPS = 1;
/** The split between two corners sits this far before the earlier of the two laps' speed peaks, m. */
const SPLIT_MARGIN_M = 10;

interface LapView {
  speedMps: Float64Array;
  timeS: Float64Array;
  lapTimeS: number;
  brake: Float64Array;
}

export function compareLaps(
  track: TrackGrid,
  car: { name: string },
  reference: LapResult,
  driver: DriverLap,
  envelope: Envelope,
  options: Partial<CompareOptions> = {},
): ComparisonResult {
  const settings = { ...DEFAULT_COMPARE_OPTIONS, ...options };
  const n = track.distanceM.length;
  const step = track.stepM;
  const closed = track.closed;
  for (const [name, values] of [['time', driver.timeS], ['speed', driver.speedMps], ['ax', driver.axMps2], ['ay', driver.ayMps2]] as const) {
    if (values.length !== n) throw new Error(`driver lap ${name} has ${values.length} stations but the track grid has ${n}`);
  }
  if (reference.trace.count !== n) throw new Error(`reference lap has ${reference.trace.count} samples but the track grid has ${n}`);
  const ref = reference.trace;
  const deltaS = timeDeltaS(driver.timeS, ref.timeS);
  const notes: string[] = [];

  const driverBrake = driver.brake ?? estimatedPedal(driver, envelope, 'brake');
  if (!driver.brake) notes.push('the log has no brake channel: braking points are estimated from the deceleration');
  const driverGripUse = new Float64Array(n);
  for (let i = 0; i < n; i++) driverGripUse[i] = envelope.gripUse(driver.speedMps[i]!, driver.axMps2[i]!, driver.ayMps2[i]!);
  const smoothHalf = Math.round(2.5 / step);
  const driverGripSmooth = movingAverage(driverGripUse, smoothHalf, closed);
  const referenceGripSmooth = movingAverage(ref.gripUse, smoothHalf, closed);

  const drv: LapView = { speedMps: driver.speedMps, timeS: driver.timeS, lapTimeS: driver.lapTimeS, brake: driverBrake };
  const refView: LapView = { speedMps: ref.speedMps, timeS: ref.timeS, lapTimeS: reference.lapTimeS, brake: ref.brake };
  const stationM = track.distanceM;
  const driverZones = findBrakingZones({ closed, count: n, speedMps: driver.speedMps, stationM, brake: driverBrake });
  const referenceZones = reference.brakingZones;

  const spans = detectCorners(track, settings.corners);
  if (spans.length === 0) notes.push('no corners found on this track: the whole lap is reported as one stretch');
  const bounds = ownershipBounds(spans, refView, drv, n, step, closed);
  const at = (values: Float64Array, u: number) => values[((u % n) + n) % n]!;
  const deltaAt = (u: number) => clockAt(driver.timeS, driver.lapTimeS, u, closed) - clockAt(ref.timeS, reference.lapTimeS, u, closed);

  const corners: CornerComparison[] = spans.map((span, c) => {
    const ownStart = bounds[c]!;
    const ownEnd = bounds[c + 1]!;
    const entryMid = clampIndex(Math.round((span.entryIndex + span.apexIndex) / 2), ownStart, ownEnd);
    const exitMid = clampIndex(Math.round((span.apexIndex + span.exitIndex) / 2), entryMid, ownEnd);
    const refBrake = brakingPoint(referenceZones, refView, span, ownStart, n, settings.pedalThreshold);
    const drvBrake = brakingPoint(driverZones, drv, span, ownStart, n, settings.pedalThreshold);
    const refLift = refBrake === null ? liftPoint(refView, ownStart, span, n) : null;
    const drvLift = drvBrake === null ? liftPoint(drv, ownStart, span, n) : null;
    const refSlowU = refBrake ?? refLift;
    const drvSlowU = drvBrake ?? drvLift;
    let brakingPointDeltaM: number | null = null;
    let brakingPointDeltaS: number | null = null;
    if ((refBrake !== null || drvBrake !== null) && refSlowU !== null && drvSlowU !== null) {
      brakingPointDeltaM = (drvSlowU - refSlowU) * step;
      brakingPointDeltaS = distanceAsTimeS(brakingPointDeltaM, interpolate(ref.speedMps, refSlowU, n));
    }
    const liftPointDeltaM = refBrake === null && drvBrake === null && drvLift !== null && refLift !== null ? (drvLift - refLift) * step : null;

    const refMin = slowestPoint(ref.speedMps, span.entryIndex, span.exitIndex, n);
    const drvMin = slowestPoint(driver.speedMps, span.entryIndex, span.exitIndex, n);
    const entryLost = deltaAt(entryMid) - deltaAt(ownStart);
    const middleLost = deltaAt(exitMid) - deltaAt(entryMid);
    const exitLost = deltaAt(ownEnd) - deltaAt(exitMid);
    const coastingS = driver.throttle && driver.brake ? coastingTime(driver.throttle, driver.brake, driver.timeS, driver.lapTimeS, ownStart, ownEnd, closed, settings.pedalThreshold) : null;
    const referenceCoastingS = coastingS === null ? null : coastingTime(ref.throttle, ref.brake, ref.timeS, reference.lapTimeS, ownStart, ownEnd, closed, settings.pedalThreshold);
    const grip = gripFigures(driverGripUse, driverGripSmooth, span.entryIndex, span.exitIndex, n);
    const referenceGrip = gripFigures(ref.gripUse, referenceGripSmooth, span.entryIndex, span.exitIndex, n);
    const fold = (u: number) => (closed ? (((u % n) + n) % n) * step : Math.min(Math.max(u, 0), n - 1) * step);
    const foldM = (u: number | null) => (u === null ? null : closed ? (((u * step) % track.lengthM) + track.lengthM) % track.lengthM : u * step);
    return {
      id: span.id,
      name: span.name,
      entryM: span.entryM,
      apexM: span.apexM,
      exitM: span.exitM,
      brakingPointDeltaM,
      brakingPointDeltaS,
      referenceBrakingPointM: foldM(refBrake),
      driverBrakingPointM: foldM(drvBrake),
      entrySpeedDriverKph: mpsToKph(at(driver.speedMps, span.entryIndex)),
      entrySpeedReferenceKph: mpsToKph(at(ref.speedMps, span.entryIndex)),
      minSpeedDriverKph: mpsToKph(drvMin.value),
      minSpeedReferenceKph: mpsToKph(refMin.value),
      minSpeedDeltaKph: mpsToKph(drvMin.value - refMin.value),
      minSpeedOffsetFromApexM: (drvMin.index - span.apexIndex) * step,
      exitSpeedDriverKph: mpsToKph(at(driver.speedMps, span.exitIndex)),
      exitSpeedReferenceKph: mpsToKph(at(ref.speedMps, span.exitIndex)),
      entryTimeLostS: entryLost,
      middleTimeLostS: middleLost,
      exitTimeLostS: exitLost,
      timeLostS: entryLost + middleLost + exitLost,
      coastingS,
      meanGripUse: grip.mean,
      peakGripUse: grip.peak,
      stretches: gripStretches(driverGripSmooth, referenceGripSmooth, ownStart, ownEnd, n, step, fold, settings),
      ownStartM: fold(ownStart),
      ownEndM: fold(ownEnd),
      referenceMinSpeedOffsetFromApexM: (refMin.index - span.apexIndex) * step,
      driverLiftPointM: foldM(drvLift),
      liftPointDeltaM,
      referenceCoastingS,
      referenceMeanGripUse: referenceGrip.mean,
      referencePeakGripUse: referenceGrip.peak,
    };
  });

  return {
    trackName: track.name,
    carName: car.name,
    driverLapTimeS: driver.lapTimeS,
    referenceLapTimeS: reference.lapTimeS,
    demonstratedLapTimeS: settings.demonstratedLapTimeS,
    deltaS,
    driverGripUse,
    corners,
    findings: rankFindings(corners, settings.findings),
    notes,
    referenceEnvelopeKind: settings.referenceEnvelopeKind,
    carModelLapTimeS: settings.carModelLapTimeS,
    stepM: step,
  };
}

const clampIndex = (value: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, value));

function interpolate(values: Float64Array, u: number, n: number): number {
  const lo = Math.floor(u);
  const frac = u - lo;
  const a = values[((lo % n) + n) % n]!;
  const b = values[(((lo + 1) % n) + n) % n]!;
  return a + frac * (b - a);
}

function minimumOver(values: Float64Array, from: number, to: number, n: number): { value: number; index: number } {
  let value = Infinity;
  let index = from;
  for (let u = from; u <= to; u++) {
    const v = values[((u % n) + n) % n]!;
    if (v < value) {
      value = v;
      index = u;
    }
  }
  return { value, index };
}

/** Speed within this of the minimum counts as the same slowest stretch, m/s (a constant-radius arc, logger noise). */
const SLOWEST_TOLERANCE_MPS = 0.15;

/** The slowest point of [from, to]: the minimum, placed at the middle of the stretch around it that stays that slow. */
function slowestPoint(values: Float64Array, from: number, to: number, n: number): { value: number; index: number } {
  const min = minimumOver(values, from, to, n);
  const limit = min.value + SLOWEST_TOLERANCE_MPS;
  let lo = min.index;
  let hi = min.index;
  while (lo > from && values[(((lo - 1) % n) + n) % n]! <= limit) lo--;
  while (hi < to && values[(((hi + 1) % n) + n) % n]! <= limit) hi++;
  return { value: min.value, index: Math.round((lo + hi) / 2) };
}

/** Last index of [from, to] whose speed is within the tolerance of the stretch's peak: where the lap stops gaining. */
function lastPeakIndex(speed: Float64Array, from: number, to: number, n: number): number {
  let peak = -Infinity;
  for (let u = from; u <= to; u++) peak = Math.max(peak, speed[((u % n) + n) % n]!);
  let last = from;
  for (let u = from; u <= to; u++) if (speed[((u % n) + n) % n]! >= peak - PEAK_TOLERANCE_MPS) last = u;
  return last;
}

/**
 * Where each corner's stretch begins (unwrapped indices, one more than the corners: bounds[c] to bounds[c + 1]).
 * Between two corners the split sits just before the earlier of the two laps' speed peaks on the straight, so a
 * slow exit is charged to the corner before it and an early lift or brake to the corner after it.
 */
function ownershipBounds(spans: CornerSpan[], ref: LapView, drv: LapView, n: number, step: number, closed: boolean): number[] {
  const count = spans.length;
  if (count === 0) return closed ? [0, n] : [0, n - 1];
  const margin = Math.round(SPLIT_MARGIN_M / step);
  const splitBetween = (exitU: number, entryU: number) => {
    if (entryU <= exitU) return Math.round((exitU + entryU) / 2);
    const peak = Math.min(lastPeakIndex(ref.speedMps, exitU, entryU, n), lastPeakIndex(drv.speedMps, exitU, entryU, n));
    return clampIndex(peak - margin, exitU, entryU);
  };
  const splits: number[] = [];
  for (let c = 0; c + 1 < count; c++) splits.push(splitBetween(spans[c]!.exitIndex, spans[c + 1]!.entryIndex));
  if (!closed) return [0, ...splits, n - 1];
  // The split after the last corner also starts the first corner's stretch, one lap earlier.
  const last = splitBetween(spans[count - 1]!.exitIndex, spans[0]!.entryIndex + n);
  return [last - n, ...splits, last];
}

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
      const drop = lap.speedMps[((u % n) + n) % n]! - minimumOver(lap.speedMps, u, span.exitIndex, n).value;
      if (drop > bestDrop) {
        bestDrop = drop;
        best = u;
      }
    }
  }
  if (best === null || bestDrop < LIFT_DROP_MPS) return null;
  // Sub-sample place where the brake crosses the threshold, between the sample before and the first one on.
  const on = lap.brake[((best % n) + n) % n]!;
  const before = lap.brake[(((best - 1) % n) + n) % n]!;
  const frac = on > before ? (threshold - before) / (on - before) : 1;
  return best - 1 + Math.min(1, Math.max(0, frac));
}

/** Where a lap that does not brake starts slowing for the corner (the end of its speed peak), or null if it does not slow. */
function liftPoint(lap: LapView, ownStart: number, span: CornerSpan, n: number): number | null {
  const peakU = lastPeakIndex(lap.speedMps, ownStart, span.apexIndex, n);
  const drop = lap.speedMps[((peakU % n) + n) % n]! - minimumOver(lap.speedMps, peakU, span.exitIndex, n).value;
  return drop >= LIFT_DROP_MPS ? peakU : null;
}

function coastingTime(throttle: Float64Array, brake: Float64Array, timeS: Float64Array, lapTimeS: number, from: number, to: number, closed: boolean, threshold: number): number {
  const n = timeS.length;
  let total = 0;
  for (let u = from; u < to; u++) {
    const i = ((u % n) + n) % n;
    if (throttle[i]! <= threshold && brake[i]! <= threshold) total += clockAt(timeS, lapTimeS, u + 1, closed) - clockAt(timeS, lapTimeS, u, closed);
  }
  return total;
}

function gripFigures(raw: Float64Array, smooth: Float64Array, from: number, to: number, n: number): { mean: number; peak: number } {
  let sum = 0;
  let peak = 0;
  let count = 0;
  for (let u = from; u <= to; u++) {
    const i = ((u % n) + n) % n;
    const value = raw[i]!;
    if (!Number.isFinite(value)) continue;
    sum += value;
    count++;
    if (smooth[i]! > peak) peak = smooth[i]!;
  }
  return { mean: count > 0 ? sum / count : 0, peak };
}

function gripStretches(
  driverSmooth: Float64Array,
  referenceGrip: Float64Array,
  from: number,
  to: number,
  n: number,
  step: number,
  fold: (u: number) => number,
  settings: CompareOptions,
): GripStretch[] {
  const stretches: GripStretch[] = [];
  const minSamples = Math.max(1, Math.round(settings.minStretchM / step));
  let kind: GripStretch['kind'] | null = null;
  let start = from;
  let sum = 0;
  const close = (end: number) => {
    if (kind && end - start >= minSamples) stretches.push({ startM: fold(start), endM: fold(end), kind, meanGripUse: sum / (end - start), lengthM: (end - start) * step });
  };
  for (let u = from; u <= to; u++) {
    const i = ((u % n) + n) % n;
    const driverUse = driverSmooth[i]!;
    const current: GripStretch['kind'] | null =
      u === to
        ? null
        : driverUse > Math.max(settings.exceededAbove, referenceGrip[i]! + settings.exceededAbove - 1)
          ? 'exceeded'
          : driverUse < settings.unusedBelow && referenceGrip[i]! >= settings.referenceOnLimit
            ? 'unused'
            : null;
    if (current !== kind) {
      close(u);
      kind = current;
      start = u;
      sum = 0;
    }
    if (kind) sum += driverUse;
  }
  return stretches;
}

/** Throttle or brake share estimated from the logged acceleration, for logs without pedal channels. */
export function estimatedPedal(driver: DriverLap, envelope: Envelope, pedal: 'throttle' | 'brake'): Float64Array {
  const n = driver.speedMps.length;
  const ax = movingAverage(driver.axMps2, 2, true);
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const speed = driver.speedMps[i]!;
    const ay = driver.ayMps2[i]!;
    const coast = envelope.coastDecelMps2(speed);
    const tyreAx = ax[i]! + coast;
    if (pedal === 'brake' && tyreAx < 0) {
      const available = envelope.brakeLimitMps2(speed, ay) - coast;
      out[i] = available > 1e-9 ? Math.min(1, -tyreAx / available) : 1;
    } else if (pedal === 'throttle' && tyreAx > 0) {
      const available = envelope.accelLimitMps2(speed, ay) + coast;
      out[i] = available > 1e-9 ? Math.min(1, tyreAx / available) : 1;
    }
  }
  return out;
}
