// Corner-limit speed at each sample: the highest speed at which v^2 |kappa| fits within the envelope's
// lateral limit at that speed (quasi-steady-state cornering, Brayshaw and Harrison 2005).

import type { Envelope } from '../car/envelope.js';

const CURVATURE_FLOOR_PER_M = 1e-7;

/** Largest speed with v^2 |kappa| <= lateral limit(v), by bisection on [0, top speed]. */
export function cornerLimitSpeedMps(envelope: Envelope, curvaturePerM: number): number {
  const top = envelope.topSpeedMps;
  const kappa = Math.abs(curvaturePerM);
  if (kappa < CURVATURE_FLOOR_PER_M) return top;
  const side = curvaturePerM >= 0 ? 1 : -1;
  if (top * top * kappa <= envelope.lateralLimitMps2(top, side)) return top;
  // Start from the limit without downforce's speed dependence, then bracket.
  let lo = 0;
  let hi = top;
  for (let k = 0; k < 40; k++) {
    const mid = 0.5 * (lo + hi);
    if (mid * mid * kappa <= envelope.lateralLimitMps2(mid, side)) lo = mid;
    else hi = mid;
    if (hi - lo < 1e-6) break;
  }
  return lo;
}

export function cornerLimitProfile(
  envelope: Envelope,
  curvaturePerM: Float64Array,
  out = new Float64Array(curvaturePerM.length),
): Float64Array {
  for (let i = 0; i < curvaturePerM.length; i++) out[i] = cornerLimitSpeedMps(envelope, curvaturePerM[i]!);
  return out;
}
