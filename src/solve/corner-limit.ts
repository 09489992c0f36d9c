// Corner-limit speed at each sample: the highest speed at which v^2 |kappa| fits within the envelope's
// lateral limit at that speed (quasi-steady-state cornering, Brayshaw and Harrison 2005). An envelope with a closed
// form for it (the point mass) gives it to rounding, and the last units in the last place are settled against the
// limit itself, so the speed is the largest double that holds, as a search to rounding would find it; any other is
// solved by the Illinois variant of regula falsi (Dowell and Jarratt, BIT 11 (1971) 168-174) on a bracket.

import type { Envelope } from '../car/envelope.js';
import { roadLoadFactor, type PathRoad } from './road-terms.js';
import { STANDARD_GRAVITY_MPS2 as G } from '../units.js';

const CURVATURE_FLOOR_PER_M = 1e-7;
/** The bracket is closed to this share of the speed (a few hundred units in the last place). */
const ROOT_TOLERANCE = 1e-13;
const MAX_STEPS = 100;
/** v +- v 2^-53 is the neighbouring double (half to one unit in the last place, rounded to the nearest). */
const HALF_EPSILON = Number.EPSILON / 2;
const SETTLE_STEPS = 8;

/** The largest double near sqrt(squared) at which `holds` is true, or null if it is not within a few units. */
function settled(squared: number | null | undefined, holds: (speedMps: number) => boolean): number | null {
  if (squared === null || squared === undefined || !(squared < Infinity)) return null;
  let v = Math.sqrt(squared);
  let held = holds(v);
  for (let k = 0; k < SETTLE_STEPS && !held; k++) {
    v -= v * HALF_EPSILON;
    held = holds(v);
  }
  if (!held) return null;
  for (let k = 0; k < SETTLE_STEPS; k++) {
    const up = v + v * HALF_EPSILON;
    if (!holds(up)) break;
    v = up;
  }
  return v;
}

/**
 * Largest speed in [0, top] where `margin` (>= 0 where the speed holds, falling through zero once) is still >= 0,
 * given margin(0) >= 0 > margin(top): Illinois regula falsi on the bracket, then the last holding end.
 */
function largestHolding(margin: (speedMps: number) => number, topMps: number, topMargin: number, zeroMargin: number) {
  let lo = 0;
  let hi = topMps;
  let fLo = zeroMargin;
  let fHi = topMargin;
  let kept = 0;
  for (let k = 0; k < MAX_STEPS && hi - lo > ROOT_TOLERANCE * hi; k++) {
    let mid = hi - (fHi * (hi - lo)) / (fHi - fLo);
    // A margin that is not finite or a step that lands on an end falls back to halving.
    if (!(mid > lo && mid < hi)) mid = 0.5 * (lo + hi);
    const fMid = margin(mid);
    if (fMid >= 0) {
      lo = mid;
      fLo = fMid;
      if (kept === 1) fHi *= 0.5;
      kept = 1;
    } else {
      hi = mid;
      fHi = fMid;
      if (kept === -1) fLo *= 0.5;
      kept = -1;
    }
  }
  return lo;
}

/** Largest speed with v^2 |kappa| <= lateral limit(v), on [0, top speed]; `topLateralMps2` is the lateral limit at
 * top speed on the curve's side, which a caller solving many samples computes once. */
export function cornerLimitSpeedMps(
  envelope: Envelope,
  curvaturePerM: number,
  topLateralMps2 = envelope.lateralLimitMps2(envelope.topSpeedMps, curvaturePerM >= 0 ? 1 : -1),
): number {
  const top = envelope.topSpeedMps;
  const kappa = Math.abs(curvaturePerM);
  if (kappa < CURVATURE_FLOOR_PER_M) return top;
  const side = curvaturePerM >= 0 ? 1 : -1;
  const topMargin = topLateralMps2 - top * top * kappa;
  if (topMargin >= 0) return top;
  const closed = settled(
    envelope.cornerSpeedSquaredEstimate?.(1, 0, 0, kappa),
    (v) => v * v * kappa <= envelope.lateralLimitMps2(v, side),
  );
  if (closed !== null && closed <= top) return closed;
  return largestHolding(
    (v) => envelope.lateralLimitMps2(v, side) - v * v * kappa,
    top,
    topMargin,
    envelope.lateralLimitMps2(0, side),
  );
}

/**
 * The corner limit of each sample of a three-dimensional road in turn, with one margin function for the whole lap
 * (a closure per sample is garbage per sample). The road's load and lateral force at speed v are
 * l0 + l1 v^2 / g and d1 v^2 - d0 with the path's coefficients (PathRoad), the load being the number roadLoadFactor
 * gives.
 */
function roadLimitSolver(envelope: Envelope, along: PathRoad): (i: number, curvaturePerM: number) => number {
  const road = along.road;
  const { gravityNormalShare, gravityLateralMps2, sinBank, verticalCurvaturePerM } = road;
  const { loadPerV2, lateralPerV2 } = along;
  // The sample being solved: its load l0 + l1 v^2 / g and lateral force d1 v^2 - d0.
  let load0 = 1;
  let loadPerSpeed2 = 0;
  let lateral0 = 0;
  let lateralPerSpeed2 = 0;
  /** How far within the lateral limit speed v holds the sample (negative: it does not); -1 where the tyres leave
   * the ground. */
  const margin = (v: number): number => {
    const v2 = v * v;
    const load = load0 + (v2 * loadPerSpeed2) / G;
    if (!(load > 0)) return -1;
    const lateral = v2 * lateralPerSpeed2 - lateral0;
    return envelope.lateralLimitMps2(v, lateral >= 0 ? 1 : -1, load) - Math.abs(lateral);
  };
  const holds = (v: number) => margin(v) >= 0;
  return (i, curvaturePerM) => {
    // A level, unbanked sample without vertical curvature is flat ground: the same limit, the same way.
    if (
      gravityNormalShare[i] === 1 &&
      sinBank[i] === 0 &&
      verticalCurvaturePerM[i] === 0 &&
      gravityLateralMps2[i] === 0
    )
      return cornerLimitSpeedMps(envelope, curvaturePerM);
    const top = envelope.topSpeedMps;
    // Straight and level across (no curvature, no bank): the tyres are asked for no lateral force at any speed, so
    // only leaving the ground over a crest can limit the speed (the straights of a hilly lap, most of its samples).
    // Tested before the margin's numbers are set: each is a number boxed on the heap, garbage on every sample.
    if (curvaturePerM === 0 && sinBank[i] === 0 && roadLoadFactor(road, i, top * top, 0) > 0) return top;
    load0 = gravityNormalShare[i]!;
    loadPerSpeed2 = loadPerV2[i]!;
    lateral0 = gravityLateralMps2[i]!;
    lateralPerSpeed2 = lateralPerV2[i]!;
    const topMargin = margin(top);
    if (topMargin >= 0) return top;
    const closed = settled(
      envelope.cornerSpeedSquaredEstimate?.(load0, loadPerSpeed2 / G, -lateral0, lateralPerSpeed2),
      holds,
    );
    if (closed !== null && closed <= top) return closed;
    // The car is taken to hold the road at rest (a bank within the tyres' grip: 45 degrees with mu >= 1).
    return largestHolding(margin, top, topMargin, Math.max(0, margin(0)));
  };
}

export function cornerLimitProfile(
  envelope: Envelope,
  curvaturePerM: Float64Array,
  out = new Float64Array(curvaturePerM.length),
  along: PathRoad | null = null,
): Float64Array {
  if (along) {
    const sameRoad = along.road.sameAsBefore;
    const limitAt = roadLimitSolver(envelope, along);
    // As on flat ground, a sample whose curvature and road are those of the one before has its limit.
    for (let i = 0; i < curvaturePerM.length; i++)
      out[i] =
        i > 0 && curvaturePerM[i] === curvaturePerM[i - 1] && sameRoad[i] === 1
          ? out[i - 1]!
          : limitAt(i, curvaturePerM[i]!);
    return out;
  }
  // An arc holds one curvature over many samples: its limit is solved once. A real centreline's curvature changes at
  // every sample, most of them taken at top speed: the lateral limit there is computed once for each side.
  const top = envelope.topSpeedMps;
  const topLeftMps2 = envelope.lateralLimitMps2(top, 1);
  const topRightMps2 = envelope.lateralLimitMps2(top, -1);
  let lastKappa = NaN;
  let lastLimit = 0;
  for (let i = 0; i < curvaturePerM.length; i++) {
    const kappa = curvaturePerM[i]!;
    if (kappa !== lastKappa) {
      lastKappa = kappa;
      lastLimit = cornerLimitSpeedMps(envelope, kappa, kappa >= 0 ? topLeftMps2 : topRightMps2);
    }
    out[i] = lastLimit;
  }
  return out;
}
