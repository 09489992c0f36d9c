// The quasi-steady-state speed profile (Brayshaw and Harrison, Proc. IMechE Part D 219 (2005); Siegler, Deakin
// and Crolla, SAE 2000-01-3563): the corner-limit speed everywhere, a forward pass under the acceleration limit,
// a backward pass under the braking limit, and the lower of the two. A closed lap starts both passes at its
// slowest corner-limit point, where the speed must equal that limit, which makes the lap periodic.

import type { Envelope } from '../car/envelope.js';
import type { Path } from '../track/types.js';
import { cornerLimitProfile } from './corner-limit.js';
import { pathRoad, type PathRoad, type RoadTerms } from './road-terms.js';
import { STANDARD_GRAVITY_MPS2 as G } from '../units.js';

export interface SpeedProfileOptions {
  /** Speed at the first sample of an open path, m/s (capped by its corner limit). */
  startSpeedMps: number;
  /** Time without drive at each upshift, s (0 = instant shifts). */
  shiftTimeS: number;
  /** Grade, bank and vertical curvature on the path's grid; null or absent = flat ground. */
  road?: RoadTerms | null;
}

export interface SpeedProfile {
  speedMps: Float64Array;
  cornerLimitMps: Float64Array;
  /** 1 on the steps where an upshift cuts the drive (and the speed follows the forward pass), else 0. */
  shift: Uint8Array;
  /** On flat ground, the braking limit at the lap's speed and lateral demand where the backward pass computed it
   * there (the entry of a braking step), m/s^2; 0 elsewhere. The brake channel reads each one rather than computing it
   * again, and is written over them in this array (channels.ts): one array fewer per lap, so a profile feeds one
   * channel pass (lapChannels or lapTimeAndBrake), never two. */
  brakeLimitMps2: Float64Array;
}

const MAX_PERIODIC_LAPS = 20;
/** A braking step's entry speed is solved to this share of itself (a few hundred units in the last place). */
const ROOT_TOLERANCE = 1e-13;
const PERIODIC_TOLERANCE_MPS = 1e-6;

function argMin(values: Float64Array): number {
  let best = 0;
  for (let i = 1; i < values.length; i++) if (values[i]! < values[best]!) best = i;
  return best;
}

function forwardPass(
  path: Path,
  envelope: Envelope,
  limit: Float64Array,
  first: number,
  firstSpeedMps: number,
  shiftTimeS: number,
  out: Float64Array,
  road: PathRoad | null,
  shiftOut: Uint8Array,
): void {
  const n = limit.length;
  const steps = path.closed ? n : n - 1;
  const kappa = path.curvaturePerM;
  const ds = path.segmentLengthM;
  shiftOut.fill(0);
  out[first] = firstSpeedMps;
  // Read back from the array, the speed is known to be a number: a loop variable started from an argument kept
  // the type of any value, and every step's speed was stored as a new number on the heap.
  let speed = out[first]!;
  let gear = envelope.gearAt(speed);
  let shiftLeftS = 0;
  // Sample i walks on from `first` (0 on an open path) and wraps past the last sample of a closed lap.
  for (let k = 0, i = path.closed ? first : 0; k < steps; k++, i = i + 1 === n ? 0 : i + 1) {
    const j = i + 1 === n ? 0 : i + 1;
    const lengthM = ds[i]!;
    const shifting = shiftLeftS > 0;
    // On a three-dimensional road the tyres carry the road's load and lateral force, and gravity pulls along it.
    const v2 = speed * speed;
    const lateral = road ? v2 * road.lateralPerV2[i]! - road.road.gravityLateralMps2[i]! : v2 * kappa[i]!;
    const load = road ? road.road.gravityNormalShare[i]! + (v2 * road.loadPerV2[i]!) / G : 1;
    // One call of the limit for both cases: V8 inlines each call site of it, and a second copy for the shifts
    // spent the budget that inlines the limit's own parts, leaving calls and heap numbers on every step.
    let accel = envelope.accelLimitMps2(speed, lateral, load);
    if (shifting) {
      // The shift may end part-way through this step: drive for the rest of it.
      const stepTimeS = lengthM / Math.max(speed, 0.5);
      const coastShare = Math.min(1, shiftLeftS / stepTimeS);
      accel = -coastShare * envelope.coastDecelMps2(speed, load) + (1 - coastShare) * accel;
      shiftLeftS -= stepTimeS;
      shiftOut[i] = 1;
    }
    if (road) accel -= road.road.gravityAlongMps2[i]!;
    let next = Math.sqrt(Math.max(0, speed * speed + 2 * accel * lengthM));
    if (next > limit[j]!) next = limit[j]!;
    if (shiftTimeS > 0 && !shifting) {
      // Upshift only on the way up, and keep the gear while the speed sags just below the shift point after
      // a shift, so the car does not hunt between two gears; downshifts (when slowing) cost nothing.
      const nextGear = envelope.gearAt(next);
      if (nextGear > gear && next > speed) shiftLeftS = shiftTimeS;
      if (nextGear > gear || next < speed - 1e-6) gear = nextGear;
    }
    out[j] = next;
    speed = next;
  }
}

/** Braking limit at a speed; on a three-dimensional road with its load and lateral force, and gravity along it. */
function brakeLimitAt(
  envelope: Envelope,
  speed: number,
  curvaturePerM: number,
  road: PathRoad | null,
  h: number,
): number {
  const v2 = speed * speed;
  // One call site, as in the forward pass (flat ground: load 1 and nothing along, which changes no bit).
  const lateral = road ? v2 * road.lateralPerV2[h]! - road.road.gravityLateralMps2[h]! : v2 * curvaturePerM;
  const load = road ? road.road.gravityNormalShare[h]! + (v2 * road.loadPerV2[h]!) / G : 1;
  const along = road ? road.road.gravityAlongMps2[h]! : 0;
  return envelope.brakeLimitMps2(speed, lateral, load) + along;
}

/**
 * Whether gravity down the slope outweighs the brakes at this speed. Coasting never decelerates more than braking
 * (the tyres' share of a braking limit is never negative under a positive load: Envelope), so where drag and rolling
 * resistance alone hold the car against the pull, as they do at speed on most descents, the braking limit need not be
 * computed: the answer is the same, for a fraction of the cost.
 */
function outpulled(envelope: Envelope, speed: number, curvaturePerM: number, road: PathRoad, h: number): boolean {
  const load = road.road.gravityNormalShare[h]! + (speed * speed * road.loadPerV2[h]!) / G;
  if (load > 0 && envelope.coastDecelMps2(speed, load) + road.road.gravityAlongMps2[h]! >= 0) return false;
  return brakeLimitAt(envelope, speed, curvaturePerM, road, h) < 0;
}

/**
 * Speed at the start of a braking step that ends at `exitSpeedMps`: the root of
 * v = sqrt(v_exit^2 + 2 b(v, v^2 kappa) ds), so the braking is limited by the lateral demand at the speed the
 * car actually has there (an explicit step would use the lower exit speed and ask for more than the envelope).
 * The explicit step bounds the root from above when b falls with speed; a bracketing secant closes in on it.
 * Where it has the braking limit at the speed returned, it leaves it in brakeOut[h] (each sample's entry is solved
 * once a lap, and the array starts at 0: see SpeedProfile).
 */
function brakingEntrySpeedMps(
  envelope: Envelope,
  exitSpeedMps: number,
  curvaturePerM: number,
  lengthM: number,
  road: PathRoad | null,
  h: number,
  brakeOut: Float64Array,
): number {
  const exitSquared = exitSpeedMps * exitSpeedMps;
  const twiceLengthM = 2 * lengthM;
  let lo = exitSpeedMps;
  let brakeLo = brakeLimitAt(envelope, exitSpeedMps, curvaturePerM, road, h);
  let hi = Math.sqrt(Math.max(0, exitSquared + twiceLengthM * brakeLo));
  let fLo = hi - lo;
  if (fLo <= 0) return hi;
  const brakeHi = brakeLimitAt(envelope, hi, curvaturePerM, road, h);
  let fHi = Math.sqrt(Math.max(0, exitSquared + twiceLengthM * brakeHi)) - hi;
  if (fHi >= 0) {
    brakeOut[h] = brakeHi;
    return hi;
  }
  // The Illinois variant of regula falsi (Dowell and Jarratt, BIT 11 (1971) 168-174): the end that stays put twice
  // running has its value halved, so both ends close in on the root, superlinearly, to rounding.
  let kept = 0;
  for (let k = 0; k < 100 && hi - lo > ROOT_TOLERANCE * hi; k++) {
    const mid = hi - (fHi * (hi - lo)) / (fHi - fLo);
    if (!(mid > lo && mid < hi)) break;
    const brakeMid = brakeLimitAt(envelope, mid, curvaturePerM, road, h);
    const fMid = Math.sqrt(Math.max(0, exitSquared + twiceLengthM * brakeMid)) - mid;
    if (fMid > 0) {
      lo = mid;
      brakeLo = brakeMid;
      fLo = fMid;
      if (kept === 1) fHi *= 0.5;
      kept = 1;
    } else if (fMid < 0) {
      hi = mid;
      fHi = fMid;
      if (kept === -1) fLo *= 0.5;
      kept = -1;
    } else return mid;
  }
  // The lower bracket never asks more of the envelope than it has.
  brakeOut[h] = brakeLo;
  return lo;
}

/**
 * The backward pass from `last`, where the speed is its corner limit, taking the lower of it and the forward pass
 * into `speed` as it goes (a braking step also drops the forward pass's shift gap there, which never happens). Where a
 * braking step's entry is the lap's speed, on flat ground, `brakeOut` keeps the braking limit computed there.
 */
function backwardPass(
  path: Path,
  envelope: Envelope,
  limit: Float64Array,
  last: number,
  out: Float64Array,
  road: PathRoad | null,
  shift: Uint8Array,
  brakeOut: Float64Array,
): void {
  const n = limit.length;
  const steps = path.closed ? n : n - 1;
  const kappa = path.curvaturePerM;
  const ds = path.segmentLengthM;
  // Read from the array, as the forward pass's first speed, so that the loop's speed stays a plain number.
  let speed = limit[last]!;
  if (speed < out[last]!) {
    out[last] = speed;
    shift[last] = 0;
  }
  // Sample i walks back from `last` (the last sample on an open path) and wraps past the first of a closed lap.
  for (let k = 0, i = path.closed ? last : n - 1; k < steps; k++, i = i === 0 ? n - 1 : i - 1) {
    const h = i === 0 ? n - 1 : i - 1;
    // Braking never lowers the speed backwards where the net braking at the exit speed is positive (always on flat
    // ground; downhill the pull may outweigh it), so an exit already at the entry's limit gives that limit without
    // solving for it: the straights at top speed and the arcs at their corner limit.
    let previous = limit[h]!;
    if (
      speed < previous ||
      (road && road.road.gravityAlongMps2[h]! < 0 && outpulled(envelope, speed, kappa[h]!, road, h))
    ) {
      previous = brakingEntrySpeedMps(envelope, speed, kappa[h]!, ds[h]!, road, h, brakeOut);
      // The channels read the braking limit on flat ground at the lap's own speed: it is kept only there.
      if (previous > limit[h]! || road) brakeOut[h] = 0;
      if (previous > limit[h]!) previous = limit[h]!;
    }
    if (previous < out[h]!) {
      out[h] = previous;
      shift[h] = 0;
    } else if (previous > out[h]!) brakeOut[h] = 0;
    speed = previous;
  }
}

export function solveSpeedProfile(path: Path, envelope: Envelope, options: SpeedProfileOptions): SpeedProfile {
  const n = path.curvaturePerM.length;
  const road = options.road ? pathRoad(options.road, path.curvaturePerM) : null;
  const cornerLimitMps = cornerLimitProfile(envelope, path.curvaturePerM, undefined, road);
  const speedMps = new Float64Array(n);
  const shift = new Uint8Array(n);
  const brakeLimitMps2 = new Float64Array(n);
  if (path.closed) {
    const slowest = argMin(cornerLimitMps);
    // The slowest corner limit may be out of the car's reach (a weak car whose top speed caps every limit, or
    // drag it cannot overcome at the limit): then a lap started there comes back slower. Start again from the
    // speed it came back with until the lap closes on itself.
    let startMps = cornerLimitMps[slowest]!;
    for (let lap = 0; lap < MAX_PERIODIC_LAPS; lap++) {
      forwardPass(path, envelope, cornerLimitMps, slowest, startMps, options.shiftTimeS, speedMps, road, shift);
      const backAt = speedMps[slowest]!;
      if (backAt >= startMps - PERIODIC_TOLERANCE_MPS) break;
      startMps = backAt;
    }
    backwardPass(path, envelope, cornerLimitMps, slowest, speedMps, road, shift, brakeLimitMps2);
  } else {
    forwardPass(
      path,
      envelope,
      cornerLimitMps,
      0,
      Math.min(options.startSpeedMps, cornerLimitMps[0]!),
      options.shiftTimeS,
      speedMps,
      road,
      shift,
    );
    backwardPass(path, envelope, cornerLimitMps, n - 1, speedMps, road, shift, brakeLimitMps2);
  }
  return { speedMps, cornerLimitMps, shift, brakeLimitMps2 };
}
