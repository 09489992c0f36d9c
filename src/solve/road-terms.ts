// The road's share in every limit, in one place: the inclined-plane and banked-curve force balances of any
// mechanics or vehicle-dynamics textbook, applied at each sample of the quasi-steady-state solver. Road frame: the
// normal n tilted by the bank t, the lateral axis along the surface. With
// grade a, path curvature k (horizontal) and vertical curvature kv:
//   normal force / m   = g cos a cos t + v^2 (k sin t + kv cos t)        (crest unloads, compression and bank load)
//   lateral force / m  = v^2 (k cos t - kv sin t) - g cos a sin t        (bank carries part of the turn)
//   along the path     = tyre force / m - g sin a                        (climbing costs, descending helps)
// A flat track has no RoadTerms and the solver takes its flat branch, so flat lap times are unchanged.

import type { RoadProfile } from '../track/road-profile.js';
import { STANDARD_GRAVITY_MPS2 as G } from '../units.js';

/** Per-sample trigonometry of the road, computed once per lap so the passes only multiply and add. */
export interface RoadTerms {
  /** g sin(grade): the pull of gravity back along the path, m/s^2. */
  gravityAlongMps2: Float64Array;
  /** cos(grade) cos(bank): gravity's share pressing into the road. */
  gravityNormalShare: Float64Array;
  /** g cos(grade) sin(bank): gravity along the surface towards the low (left, for positive bank) side, m/s^2. */
  gravityLateralMps2: Float64Array;
  sinBank: Float64Array;
  cosBank: Float64Array;
  verticalCurvaturePerM: Float64Array;
  /** 1 where every term above equals the sample before's (a constant grade, bank and vertical curvature), else 0. */
  sameAsBefore: Uint8Array;
}

const computed = new WeakMap<RoadProfile, RoadTerms>();

/** The road terms of a profile, computed once per profile (a track's profile is itself found once per grid), so a
 * sweep or a line search that solves the same road many times pays for its trigonometry once. */
export function roadTerms(profile: RoadProfile): RoadTerms {
  let terms = computed.get(profile);
  if (!terms) {
    terms = roadTermsOnce(profile);
    computed.set(profile, terms);
  }
  return terms;
}

function roadTermsOnce(profile: RoadProfile): RoadTerms {
  const n = profile.gradeRad.length;
  const terms: RoadTerms = {
    gravityAlongMps2: new Float64Array(n),
    gravityNormalShare: new Float64Array(n),
    gravityLateralMps2: new Float64Array(n),
    sinBank: new Float64Array(n),
    cosBank: new Float64Array(n),
    verticalCurvaturePerM: profile.verticalCurvaturePerM.slice(),
    sameAsBefore: new Uint8Array(n),
  };
  for (let i = 0; i < n; i++) {
    const grade = profile.gradeRad[i]!;
    const bank = profile.bankRad[i]!;
    terms.gravityAlongMps2[i] = G * Math.sin(grade);
    terms.gravityNormalShare[i] = Math.cos(grade) * Math.cos(bank);
    terms.gravityLateralMps2[i] = G * Math.cos(grade) * Math.sin(bank);
    terms.sinBank[i] = Math.sin(bank);
    terms.cosBank[i] = Math.cos(bank);
    if (i > 0 && grade === profile.gradeRad[i - 1] && bank === profile.bankRad[i - 1])
      terms.sameAsBefore[i] = terms.verticalCurvaturePerM[i] === terms.verticalCurvaturePerM[i - 1] ? 1 : 0;
  }
  return terms;
}

/** Normal force as a share of the weight on level ground, at sample i, speed squared v2 and path curvature k. */
export function roadLoadFactor(road: RoadTerms, i: number, v2: number, curvaturePerM: number): number {
  return (
    road.gravityNormalShare[i]! +
    (v2 * (curvaturePerM * road.sinBank[i]! + road.verticalCurvaturePerM[i]! * road.cosBank[i]!)) / G
  );
}

/** The road along one driven path: its curvature folded into the two speed-squared coefficients of the load and
 * the lateral force, once per solve, so each step of the passes reads two numbers where it would compute them. */
export interface PathRoad {
  road: RoadTerms;
  /** k sin(bank) + kv cos(bank), 1/m: times v^2 / g, the load the speed adds. */
  loadPerV2: Float64Array;
  /** k cos(bank) - kv sin(bank), 1/m: times v^2, less the gravity's lateral share, the lateral force per unit mass
   * the tyres must give along the surface, signed as the curvature. */
  lateralPerV2: Float64Array;
}

const alongPaths = new WeakMap<Float64Array, PathRoad>();

/** The road along the path of this curvature, computed once per path (a sweep solves the same path many times). */
export function pathRoad(road: RoadTerms, curvaturePerM: Float64Array): PathRoad {
  const known = alongPaths.get(curvaturePerM);
  if (known && known.road === road) return known;
  const along = pathRoadOnce(road, curvaturePerM);
  alongPaths.set(curvaturePerM, along);
  return along;
}

function pathRoadOnce(road: RoadTerms, curvaturePerM: Float64Array): PathRoad {
  const n = curvaturePerM.length;
  const loadPerV2 = new Float64Array(n);
  const lateralPerV2 = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const k = curvaturePerM[i]!;
    // The same products in the same order as roadLoadFactor: the same limits to the last bit.
    loadPerV2[i] = k * road.sinBank[i]! + road.verticalCurvaturePerM[i]! * road.cosBank[i]!;
    lateralPerV2[i] = k * road.cosBank[i]! - road.verticalCurvaturePerM[i]! * road.sinBank[i]!;
  }
  return { road, loadPerV2, lateralPerV2 };
}
