// From a speed profile to the traces a driver reads, in one place and one pass (no allocation per sample): time,
// longitudinal and lateral acceleration; throttle as a pedal shows it, the share of the engine's drive at this
// speed and gear in use (a steady corner needs only what balances drag and rolling resistance); brake as the share
// of the tyres' braking left beside the cornering; grip use as the tyres' share of their friction limit; the
// power-limited state (the engine's full drive in use, the tyres with grip to spare); gear, and gear shifts as
// their own channel (the pedal stays where it was while the gearbox cuts the drive).

import type { Envelope } from '../car/envelope.js';
import type { Path } from '../track/types.js';
import type { LapTrace } from './types.js';
import type { SpeedProfile } from './speed-profile.js';

/** The engine's drive counts as fully in use (power-limited) from this share of it: the solver's steps reach the
 * drive limit only to rounding. */
export const POWER_LIMITED_SHARE = 0.995;

/**
 * Longitudinal acceleration at the last sample of an open stage, which has no step after it: the previous step's,
 * clipped to what the envelope allows at this sample's own lateral demand. Every other sample takes the constant
 * acceleration over the step to the next one, (v_next^2 - v^2) / (2 ds), computed in the loops themselves.
 */
function openEndAccelerationMps2(envelope: Envelope, speed: number, curvaturePerM: number, previousAxMps2: number) {
  const ay = speed * speed * curvaturePerM;
  return Math.min(
    Math.max(previousAxMps2, -envelope.brakeLimitMps2(speed, ay)),
    Math.max(envelope.accelLimitMps2(speed, ay), -envelope.coastDecelMps2(speed)),
  );
}

/** Share of the tyres' braking (left beside the cornering) in use at this speed, demand and acceleration; `known` is
 * the braking limit there where the solver has it (SpeedProfile), else 0: a known limit of 0 or less is computed here
 * again, so the marker changes no value. */
function brakeShare(envelope: Envelope, speed: number, ay: number, tyreAx: number, coast: number, known: number) {
  const available = (known > 0 ? known : envelope.brakeLimitMps2(speed, ay)) - coast;
  return available > 1e-9 ? Math.min(1, -tyreAx / available) : 1;
}

/** Length of the path's steps (the last sample's step back to the first on a closed lap), m. */
function pathLengthM(path: Path, n: number): number {
  const segments = path.closed ? n : n - 1;
  let travelledM = 0;
  for (let i = 0; i < segments; i++) travelledM += path.segmentLengthM[i]!;
  return travelledM;
}

// The per-sample loops below live in functions of their own that end on a plain return: V8 compiles a long loop
// while it runs (on-stack replacement), before the code after it has ever run, and code after the loop that then
// lacks type feedback (building the result's record) sent every call back to the interpreter.

/** Fills the brake channel over the solver's braking limits (SpeedProfile), each read first; returns the lap time. */
function brakeLoop(path: Path, envelope: Envelope, profile: SpeedProfile, brake: Float64Array) {
  const { speedMps, shift } = profile;
  const n = speedMps.length;
  const kappa = path.curvaturePerM;
  const ds = path.segmentLengthM;
  const segments = path.closed ? n : n - 1;
  let elapsedS = 0;
  let ax = 0;
  for (let i = 0; i < n; i++) {
    const speed = speedMps[i]!;
    const knownBrakeMps2 = brake[i]!;
    brake[i] = 0;
    if (i < segments) {
      // Constant acceleration over the step: the mean of the two speeds gives its time.
      const next = speedMps[i + 1 === n ? 0 : i + 1]!;
      ax = (next * next - speed * speed) / (2 * ds[i]!);
      elapsedS += (2 * ds[i]!) / Math.max(speed + next, 1e-9);
    } else ax = i === 0 ? 0 : openEndAccelerationMps2(envelope, speed, kappa[i]!, ax);
    // Only a deceleration beyond drag and rolling resistance can be braking, and never during a shift.
    if (ax < 0 && !shift[i]) {
      const coast = envelope.coastDecelMps2(speed);
      if (ax + coast < 0)
        brake[i] = brakeShare(envelope, speed, speed * speed * kappa[i]!, ax + coast, coast, knownBrakeMps2);
    }
  }
  return elapsedS;
}

/** The lap time, the path's length and the brake channel alone: what a sweep or the line search needs. */
export function lapTimeAndBrake(
  path: Path,
  envelope: Envelope,
  profile: SpeedProfile,
): { lapTimeS: number; lengthM: number; brake: Float64Array } {
  const n = profile.speedMps.length;
  const brake = profile.brakeLimitMps2;
  const lapTimeS = brakeLoop(path, envelope, profile, brake);
  return { lapTimeS, lengthM: pathLengthM(path, n), brake };
}

type ChannelArrays = Pick<
  LapTrace,
  'distanceM' | 'timeS' | 'axMps2' | 'ayMps2' | 'throttle' | 'brake' | 'gripUse' | 'powerLimited' | 'gear'
>;

/** The channels of a lap of `count` samples, zeroed but the brake channel, which the channel loop writes over the
 * solver's braking limits in `brake`. A class rather than an object literal: V8 turns a literal's fields from
 * constant to mutable the second time it runs, and threw away the channel loop's compiled code on the second lap of
 * every run (the racing line's first: its centreline lap, then its line's). */
class Channels implements ChannelArrays {
  readonly distanceM: Float64Array;
  readonly timeS: Float64Array;
  readonly axMps2: Float64Array;
  readonly ayMps2: Float64Array;
  readonly throttle: Float64Array;
  readonly brake: Float64Array;
  readonly gripUse: Float64Array;
  readonly powerLimited: Uint8Array;
  readonly gear: Int8Array;

  constructor(count: number, brake: Float64Array) {
    this.distanceM = new Float64Array(count);
    this.timeS = new Float64Array(count);
    this.axMps2 = new Float64Array(count);
    this.ayMps2 = new Float64Array(count);
    this.throttle = new Float64Array(count);
    this.brake = brake;
    this.gripUse = new Float64Array(count);
    this.powerLimited = new Uint8Array(count);
    this.gear = new Int8Array(count);
  }
}

/** Fills every channel of `out` from the speed profile, the brake channel over the solver's braking limits
 * (SpeedProfile), each read first. */
function channelLoop(path: Path, envelope: Envelope, profile: SpeedProfile, out: ChannelArrays) {
  const { speedMps, shift } = profile;
  const n = speedMps.length;
  const kappa = path.curvaturePerM;
  const ds = path.segmentLengthM;
  const { distanceM, timeS, axMps2, ayMps2, throttle, brake, gripUse, powerLimited, gear } = out;
  let elapsedS = 0;
  let travelledM = 0;
  let ax = 0;
  const segments = path.closed ? n : n - 1;
  for (let i = 0; i < n; i++) {
    distanceM[i] = travelledM;
    timeS[i] = elapsedS;
    const speed = speedMps[i]!;
    const knownBrakeMps2 = brake[i]!;
    brake[i] = 0;
    const ay = speed * speed * kappa[i]!;
    ayMps2[i] = ay;
    if (i < segments) {
      const next = speedMps[i + 1 === n ? 0 : i + 1]!;
      ax = (next * next - speed * speed) / (2 * ds[i]!);
      elapsedS += (2 * ds[i]!) / Math.max(speed + next, 1e-9);
      travelledM += ds[i]!;
    } else ax = i === 0 ? 0 : openEndAccelerationMps2(envelope, speed, kappa[i]!, ax);
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
      brake[i] = brakeShare(envelope, speed, ay, tyreAx, coast, knownBrakeMps2);
    }
    gripUse[i] = envelope.gripUse(speed, ax, ay);
    gear[i] = envelope.gearAt(speed);
  }
  return elapsedS;
}

function anyGear(gear: Int8Array): boolean {
  for (let i = 0; i < gear.length; i++) if (gear[i]! > 0) return true;
  return false;
}

export function lapChannels(
  path: Path,
  envelope: Envelope,
  profile: SpeedProfile,
  stationM: Float64Array,
): { trace: LapTrace; lapTimeS: number; lengthM: number } {
  const { speedMps, cornerLimitMps, shift } = profile;
  const n = speedMps.length;
  const channels = new Channels(n, profile.brakeLimitMps2);
  const lapTimeS = channelLoop(path, envelope, profile, channels);
  const { distanceM, timeS, axMps2, ayMps2, throttle, brake, gripUse, powerLimited, gear } = channels;
  const trace: LapTrace = {
    closed: path.closed,
    count: n,
    distanceM,
    stationM,
    timeS,
    speedMps,
    axMps2,
    ayMps2,
    curvaturePerM: path.curvaturePerM,
    throttle,
    brake,
    gripUse,
    powerLimited,
    cornerLimitMps,
    gear,
    shift,
    hasGears: anyGear(gear),
  };
  return { trace, lapTimeS, lengthM: pathLengthM(path, n) };
}
