// The quasi-steady-state speed profile (Brayshaw and Harrison, Proc. IMechE Part D 219 (2005); Siegler, Deakin
// and Crolla, SAE 2000-01-3563): the corner-limit speed everywhere, a forward pass under the acceleration limit,
// a backward pass under the braking limit, and the lower of the two. A closed lap starts both passes at its
// slowest corner-limit point, where the speed must equal that limit, which makes the lap periodic.

import type { Envelope } from '../car/envelope.js';
import type { Path } from '../track/types.js';
import { cornerLimitProfile } from './corner-limit.js';

export interface SpeedProfileOptions {
  /** Speed at the first sample of an open path, m/s (capped by its corner limit). */
  startSpeedMps: number;
  /** Time without drive at each upshift, s (0 = instant shifts). */
  shiftTimeS: number;
}

export interface SpeedProfile {
  speedMps: Float64Array;
  cornerLimitMps: Float64Array;
}

const MAX_PERIODIC_LAPS = 20;
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
): void {
  const n = limit.length;
  const steps = path.closed ? n : n - 1;
  const kappa = path.curvaturePerM;
  const ds = path.segmentLengthM;
  out[first] = firstSpeedMps;
  let speed = firstSpeedMps;
  let gear = envelope.gearAt(speed);
  let shiftLeftS = 0;
  for (let k = 0; k < steps; k++) {
    const i = path.closed ? (first + k) % n : k;
    const j = i + 1 === n ? 0 : i + 1;
    const lengthM = ds[i]!;
    let accel: number;
    const shifting = shiftLeftS > 0;
    if (shifting) {
      // The shift may end part-way through this step: drive for the rest of it.
      const stepTimeS = lengthM / Math.max(speed, 0.5);
      const coastShare = Math.min(1, shiftLeftS / stepTimeS);
      accel =
        -coastShare * envelope.coastDecelMps2(speed) +
        (1 - coastShare) * envelope.accelLimitMps2(speed, speed * speed * kappa[i]!);
      shiftLeftS -= stepTimeS;
    } else {
      accel = envelope.accelLimitMps2(speed, speed * speed * kappa[i]!);
    }
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

/**
 * Speed at the start of a braking step that ends at `exitSpeedMps`: the root of
 * v = sqrt(v_exit^2 + 2 b(v, v^2 kappa) ds), so the braking is limited by the lateral demand at the speed the
 * car actually has there (an explicit step would use the lower exit speed and ask for more than the envelope).
 * The explicit step bounds the root from above when b falls with speed; a few secant steps close in on it.
 */
function brakingEntrySpeedMps(
  envelope: Envelope,
  exitSpeedMps: number,
  curvaturePerM: number,
  lengthM: number,
): number {
  const exitSquared = exitSpeedMps * exitSpeedMps;
  const residual = (speed: number) =>
    Math.sqrt(exitSquared + 2 * envelope.brakeLimitMps2(speed, speed * speed * curvaturePerM) * lengthM) - speed;
  let lo = exitSpeedMps;
  let hi = Math.sqrt(exitSquared + 2 * envelope.brakeLimitMps2(exitSpeedMps, exitSquared * curvaturePerM) * lengthM);
  let fLo = hi - lo;
  let fHi = residual(hi);
  if (fHi >= 0 || fLo <= 0) return hi;
  for (let k = 0; k < 8; k++) {
    const mid = hi - (fHi * (hi - lo)) / (fHi - fLo);
    const fMid = residual(mid);
    if (Math.abs(fMid) < 1e-9) return mid;
    if (fMid > 0) {
      lo = mid;
      fLo = fMid;
    } else {
      hi = mid;
      fHi = fMid;
    }
    if (hi - lo < 1e-9) break;
  }
  // The lower bracket never asks more of the envelope than it has.
  return lo;
}

function backwardPass(
  path: Path,
  envelope: Envelope,
  limit: Float64Array,
  last: number,
  lastSpeedMps: number,
  out: Float64Array,
): void {
  const n = limit.length;
  const steps = path.closed ? n : n - 1;
  const kappa = path.curvaturePerM;
  const ds = path.segmentLengthM;
  out[last] = lastSpeedMps;
  let speed = lastSpeedMps;
  for (let k = 0; k < steps; k++) {
    const i = path.closed ? (last - k + n) % n : n - 1 - k;
    const h = i === 0 ? n - 1 : i - 1;
    let previous = brakingEntrySpeedMps(envelope, speed, kappa[h]!, ds[h]!);
    if (previous > limit[h]!) previous = limit[h]!;
    out[h] = previous;
    speed = previous;
  }
}

export function solveSpeedProfile(path: Path, envelope: Envelope, options: SpeedProfileOptions): SpeedProfile {
  const n = path.curvaturePerM.length;
  const cornerLimitMps = cornerLimitProfile(envelope, path.curvaturePerM);
  const forward = new Float64Array(n);
  const backward = new Float64Array(n);
  if (path.closed) {
    const slowest = argMin(cornerLimitMps);
    // The slowest corner limit may be out of the car's reach (a weak car whose top speed caps every limit, or
    // drag it cannot overcome at the limit): then a lap started there comes back slower. Start again from the
    // speed it came back with until the lap closes on itself.
    let startMps = cornerLimitMps[slowest]!;
    for (let lap = 0; lap < MAX_PERIODIC_LAPS; lap++) {
      forwardPass(path, envelope, cornerLimitMps, slowest, startMps, options.shiftTimeS, forward);
      const backAt = forward[slowest]!;
      if (backAt >= startMps - PERIODIC_TOLERANCE_MPS) break;
      startMps = backAt;
    }
    backwardPass(path, envelope, cornerLimitMps, slowest, cornerLimitMps[slowest]!, backward);
  } else {
    forwardPass(
      path,
      envelope,
      cornerLimitMps,
      0,
      Math.min(options.startSpeedMps, cornerLimitMps[0]!),
      options.shiftTimeS,
      forward,
    );
    backwardPass(path, envelope, cornerLimitMps, n - 1, cornerLimitMps[n - 1]!, backward);
  }
  for (let i = 0; i < n; i++) if (backward[i]! < forward[i]!) forward[i] = backward[i]!;
  return { speedMps: forward, cornerLimitMps };
}
