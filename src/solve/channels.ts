// From a speed profile to the traces a driver reads, in one place and one pass (no allocation per sample): time,
// longitudinal and lateral acceleration; throttle as a pedal shows it, the share of the engine's drive at this
// speed and gear in use (a steady corner needs only what balances drag and rolling resistance); brake as the share
// of the tyres' braking left beside the cornering; grip use as the tyres' share of their friction limit; the
// power-limited state (the engine's full drive in use, the tyres with grip to spare); gear, and gear shifts as
// their own channel (the pedal stays where it was while the gearbox cuts the drive).

import type { Envelope } from '../car/envelope.js';
import type { Path } from '../track/types.js';
import type { LapTrace } from './types.js';

/** The engine's drive counts as fully in use (power-limited) from this share of it: the solver's steps reach the
 * drive limit only to rounding. */
export const POWER_LIMITED_SHARE = 0.995;

/**
 * Longitudinal acceleration at sample i: over the step to the next sample (constant acceleration between them); on
 * the last sample of an open stage, which has no step after it, the previous step's, clipped to what the envelope
 * allows at this sample's own lateral demand.
 */
function accelerationAt(
  path: Path,
  envelope: Envelope,
  speedMps: Float64Array,
  i: number,
  previousAxMps2: number,
): number {
  const n = speedMps.length;
  const speed = speedMps[i]!;
  if (i < (path.closed ? n : n - 1)) {
    const next = speedMps[i + 1 === n ? 0 : i + 1]!;
    return (next * next - speed * speed) / (2 * path.segmentLengthM[i]!);
  }
  if (i === 0) return 0;
  const ay = speed * speed * path.curvaturePerM[i]!;
  return Math.min(
    Math.max(previousAxMps2, -envelope.brakeLimitMps2(speed, ay)),
    Math.max(envelope.accelLimitMps2(speed, ay), -envelope.coastDecelMps2(speed)),
  );
}

/** Time over the step from sample i (constant acceleration: the mean of the two speeds), 0 past an open end. */
function stepTimeS(path: Path, speedMps: Float64Array, i: number): number {
  const n = speedMps.length;
  if (i >= (path.closed ? n : n - 1)) return 0;
  return (2 * path.segmentLengthM[i]!) / Math.max(speedMps[i]! + speedMps[i + 1 === n ? 0 : i + 1]!, 1e-9);
}

/** Share of the tyres' braking (left beside the cornering) in use at this speed, demand and acceleration. */
function brakeShare(envelope: Envelope, speed: number, ay: number, tyreAx: number, coast: number): number {
  const available = envelope.brakeLimitMps2(speed, ay) - coast;
  return available > 1e-9 ? Math.min(1, -tyreAx / available) : 1;
}

/** The lap time, the path's length and the brake channel alone: what a sweep or the line search needs. */
export function lapTimeAndBrake(
  path: Path,
  envelope: Envelope,
  speedMps: Float64Array,
  shift: Uint8Array,
): { lapTimeS: number; lengthM: number; brake: Float64Array } {
  const n = speedMps.length;
  const brake = new Float64Array(n);
  let elapsedS = 0;
  let travelledM = 0;
  let ax = 0;
  const segments = path.closed ? n : n - 1;
  for (let i = 0; i < n; i++) {
    const speed = speedMps[i]!;
    ax = accelerationAt(path, envelope, speedMps, i, ax);
    elapsedS += stepTimeS(path, speedMps, i);
    if (i < segments) travelledM += path.segmentLengthM[i]!;
    // Only a deceleration beyond drag and rolling resistance can be braking, and never during a shift.
    if (ax < 0 && !shift[i]) {
      const coast = envelope.coastDecelMps2(speed);
      if (ax + coast < 0)
        brake[i] = brakeShare(envelope, speed, speed * speed * path.curvaturePerM[i]!, ax + coast, coast);
    }
  }
  return { lapTimeS: elapsedS, lengthM: travelledM, brake };
}

export function lapChannels(
  path: Path,
  envelope: Envelope,
  speedMps: Float64Array,
  cornerLimitMps: Float64Array,
  stationM: Float64Array,
  shift: Uint8Array = new Uint8Array(speedMps.length),
): { trace: LapTrace; lapTimeS: number; lengthM: number } {
  const n = speedMps.length;
  const closed = path.closed;
  const kappa = path.curvaturePerM;
  const ds = path.segmentLengthM;
  const distanceM = new Float64Array(n);
  const timeS = new Float64Array(n);
  const axMps2 = new Float64Array(n);
  const ayMps2 = new Float64Array(n);
  const throttle = new Float64Array(n);
  const brake = new Float64Array(n);
  const gripUse = new Float64Array(n);
  const powerLimited = new Uint8Array(n);
  const gear = new Int8Array(n);
  let hasGears = false;
  let elapsedS = 0;
  let travelledM = 0;
  let ax = 0;
  const segments = closed ? n : n - 1;
  for (let i = 0; i < n; i++) {
    distanceM[i] = travelledM;
    timeS[i] = elapsedS;
    const speed = speedMps[i]!;
    const ay = speed * speed * kappa[i]!;
    ayMps2[i] = ay;
    ax = accelerationAt(path, envelope, speedMps, i, ax);
    elapsedS += stepTimeS(path, speedMps, i);
    if (i < segments) travelledM += ds[i]!;
    axMps2[i] = ax;
    const coast = envelope.coastDecelMps2(speed);
    const tyreAx = ax + coast;
    if (shift[i]) {
      throttle[i] = i > 0 ? throttle[i - 1]! : 1;
    } else if (tyreAx >= 0) {
      const driveMps2 = envelope.driveLimitMps2(speed);
      const share = driveMps2 > 1e-9 ? tyreAx / driveMps2 : tyreAx > 1e-9 ? 1 : 0;
      throttle[i] = Math.min(1, share);
      if (share >= POWER_LIMITED_SHARE) powerLimited[i] = 1;
    } else {
      brake[i] = brakeShare(envelope, speed, ay, tyreAx, coast);
    }
    gripUse[i] = envelope.gripUse(speed, ax, ay);
    const g = envelope.gearAt(speed);
    gear[i] = g;
    if (g > 0) hasGears = true;
  }
  const trace: LapTrace = {
    closed,
    count: n,
    distanceM,
    stationM,
    timeS,
    speedMps,
    axMps2,
    ayMps2,
    curvaturePerM: kappa,
    throttle,
    brake,
    gripUse,
    powerLimited,
    cornerLimitMps,
    gear,
    shift,
    hasGears,
  };
  return { trace, lapTimeS: elapsedS, lengthM: travelledM };
}
