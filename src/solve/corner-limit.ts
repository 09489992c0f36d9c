// Corner-limit speed at each sample: the highest speed at which v^2 |kappa| fits within the envelope's
// lateral limit at that speed (quasi-steady-state cornering, Brayshaw and Harrison 2005).

import type { Envelope } from '../car/envelope.js';
import { roadLateralMps2, roadLoadFactor, type RoadTerms } from './road-terms.js';

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

/** Whether speed v holds sample i of a three-dimensional road: tyres on the ground, lateral force within the limit. */
function holdsOnRoad(envelope: Envelope, road: RoadTerms, i: number, v: number, curvaturePerM: number): boolean {
  const v2 = v * v;
  const load = roadLoadFactor(road, i, v2, curvaturePerM);
  if (!(load > 0)) return false;
  const lateral = roadLateralMps2(road, i, v2, curvaturePerM);
  return Math.abs(lateral) <= envelope.lateralLimitMps2(v, lateral >= 0 ? 1 : -1, load);
}

/** Largest speed that holds sample i of a three-dimensional road, by bisection on [0, top speed]. */
export function roadCornerLimitSpeedMps(envelope: Envelope, road: RoadTerms, i: number, curvaturePerM: number): number {
  const top = envelope.topSpeedMps;
  if (holdsOnRoad(envelope, road, i, top, curvaturePerM)) return top;
  // The car is taken to hold the road at rest (a bank within the tyres' grip: 45 degrees with mu >= 1).
  let lo = 0;
  let hi = top;
  for (let k = 0; k < 60; k++) {
    const mid = 0.5 * (lo + hi);
    if (holdsOnRoad(envelope, road, i, mid, curvaturePerM)) lo = mid;
    else hi = mid;
    if (hi - lo < 1e-6) break;
  }
  return lo;
}

export function cornerLimitProfile(
  envelope: Envelope,
  curvaturePerM: Float64Array,
  out = new Float64Array(curvaturePerM.length),
  road: RoadTerms | null = null,
): Float64Array {
  if (road) {
    for (let i = 0; i < curvaturePerM.length; i++)
      out[i] = roadCornerLimitSpeedMps(envelope, road, i, curvaturePerM[i]!);
    return out;
  }
  for (let i = 0; i < curvaturePerM.length; i++) out[i] = cornerLimitSpeedMps(envelope, curvaturePerM[i]!);
  return out;
}
