// The single-track model in time: lateral velocity, yaw rate and speed of a rigid car with front steer
// (Gillespie, Fundamentals of Vehicle Dynamics, SAE 1992, ch. 6; Rajamani, Vehicle Dynamics and Control,
// Springer 2006, ch. 2), axle forces linear in slip angle or saturating at each axle's friction ellipse,
// and its position relative to a path in curvilinear coordinates (station s, lateral error e, heading error).

import type { Car } from '../car/types.js';
import type { BicycleParams } from '../car/bicycle-params.js';
import { axleState, newAxleState, type AxleState } from '../car/bicycle-axles.js';
import { combinedShare, remainingShare } from '../car/point-mass.js';

export type AxleForceLaw = 'linear' | 'saturating' | 'brush';

/**
 * Lateral force of one axle, N, for a slip angle and the axle's capacity (peak force) at that instant:
 * - 'linear': C alpha;
 * - 'saturating': capacity * tanh(C alpha / capacity), which approaches the capacity only as the slip grows without
 *   bound (common practice for a smooth saturating tyre);
 * - 'brush': the Fiala brush tyre with one friction coefficient, C tan(alpha) (1 - z + z^2 / 3) with
 *   z = |C tan(alpha)| / (3 capacity), i.e. capacity (3z - 3z^2 + z^3), reaching the capacity at the finite slip
 *   tan(alpha_sl) = 3 capacity / C and flat beyond (Pacejka, Tire and Vehicle Dynamics, 2nd ed. 2006, sec. 3.2; the
 *   tyre law of Kapania and Gerdes, Vehicle System Dynamics 53 (2015)).
 */
export function axleLateralForceN(
  stiffnessNPerRad: number,
  slipRad: number,
  capacityN: number,
  law: AxleForceLaw,
): number {
  if (law === 'linear') return stiffnessNPerRad * slipRad;
  if (!(capacityN > 0)) return 0;
  if (law === 'saturating') return capacityN * Math.tanh((stiffnessNPerRad * slipRad) / capacityN);
  const linear = stiffnessNPerRad * Math.tan(slipRad);
  const z = Math.abs(linear) / (3 * capacityN);
  if (z >= 1) return Math.sign(slipRad) * capacityN;
  return capacityN * Math.sign(slipRad) * z * (3 - 3 * z + z * z);
}

/** The slip angle from which an axle gives (nearly) all its capacity, rad: the brush tyre's full-sliding angle. */
export function axlePeakSlipRad(stiffnessNPerRad: number, capacityN: number, law: AxleForceLaw): number {
  if (law === 'linear') return Infinity;
  if (law === 'saturating') return (Math.atanh(0.95) * capacityN) / stiffnessNPerRad;
  return Math.atan((3 * capacityN) / stiffnessNPerRad);
}

/**
 * The slip angle at which an axle gives forceN (magnitude, the inverse of axleLateralForceN), rad; the demand is
 * held at `maxShare` of the capacity at most (the tanh law reaches the capacity only at infinite slip).
 */
export function axleSlipForForceRad(
  stiffnessNPerRad: number,
  forceN: number,
  capacityN: number,
  law: AxleForceLaw,
  maxShare: number,
): number {
  if (law === 'linear') return forceN / stiffnessNPerRad;
  if (!(capacityN > 0)) return 0;
  const share = Math.min(Math.abs(forceN) / capacityN, maxShare);
  if (law === 'saturating')
    return (Math.sign(forceN) * capacityN * Math.atanh(Math.min(share, 0.999))) / stiffnessNPerRad;
  // 1 - (1 - z)^3 = share, the brush curve's inverse in closed form.
  const z = 1 - Math.cbrt(1 - share);
  return Math.sign(forceN) * Math.atan((3 * capacityN * z) / stiffnessNPerRad);
}

export interface SingleTrackInput {
  steerRad: number;
  /** Longitudinal tyre force at the front and rear axle, N (positive = drive, negative = brake). */
  frontLongN: number;
  rearLongN: number;
}

/** Forces and derivatives at one instant, filled in place so the integrator's inner loop does not allocate. */
export interface SingleTrackForces {
  frontLatN: number;
  rearLatN: number;
  frontSlipRad: number;
  rearSlipRad: number;
  /** Combined use of each axle's friction ellipse (1 = saturated). */
  frontUse: number;
  rearUse: number;
  lateralVelocityRate: number;
  yawAcceleration: number;
  speedRate: number;
}

export const newSingleTrackForces = (): SingleTrackForces => ({
  frontLatN: 0,
  rearLatN: 0,
  frontSlipRad: 0,
  rearSlipRad: 0,
  frontUse: 0,
  rearUse: 0,
  lateralVelocityRate: 0,
  yawAcceleration: 0,
  speedRate: 0,
});

export interface SingleTrackModel {
  params: BicycleParams;
  tyre: Car['tyre'];
  law: AxleForceLaw;
  halfRhoLift: number;
  /** Drag plus rolling resistance at this speed, N. */
  resistanceN(speedMps: number): number;
  /** Axle loads and capacities at the last evaluation. */
  axles: AxleState;
}

export function singleTrackModel(
  params: BicycleParams,
  car: Car,
  airDensityKgPerM3: number,
  law: AxleForceLaw,
  resistanceN: (speedMps: number) => number,
): SingleTrackModel {
  return {
    params,
    tyre: car.tyre,
    law,
    halfRhoLift: 0.5 * airDensityKgPerM3 * car.aero.liftAreaM2,
    resistanceN,
    axles: newAxleState(),
  };
}

const ratio = (a: number, b: number) => (b > 0 ? Math.abs(a) / b : a === 0 ? 0 : Infinity);

/**
 * Body-frame derivatives of (vy, r, u). Loads follow the quasi-static load transfer at the commanded ax and at
 * ay = u r; each axle's lateral capacity shrinks by its longitudinal force on the friction ellipse.
 */
export function singleTrackForces(
  model: SingleTrackModel,
  lateralVelocityMps: number,
  yawRateRadPerS: number,
  speedMps: number,
  input: SingleTrackInput,
  out: SingleTrackForces,
): SingleTrackForces {
  const p = model.params;
  const u = Math.max(speedMps, 1);
  const vy = lateralVelocityMps;
  const r = yawRateRadPerS;
  const a = p.frontAxleToCgM;
  const b = p.cgToRearAxleM;
  const resistance = model.resistanceN(speedMps);
  const n = model.tyre.ggExponent;
  const frontSlip = input.steerRad - Math.atan2(vy + a * r, u);
  const rearSlip = -Math.atan2(vy - b * r, u);
  const cos = Math.cos(input.steerRad);
  const sin = Math.sin(input.steerRad);
  // The loads follow the body's accelerations (quasi-static load transfer); these depend on the lateral forces,
  // which depend on the loads: two passes, the first at the commanded ax and at ay = u r, the second at the
  // accelerations the first pass's forces give (so the front tyres' cornering drag Fyf sin(delta) counts).
  let axMps2 = (input.frontLongN + input.rearLongN - resistance) / p.massKg;
  let ayMps2 = u * r;
  let fyf = 0;
  let fyr = 0;
  let s = model.axles;
  for (let pass = 0; pass < 2; pass++) {
    s = axleState(p, model.tyre, model.halfRhoLift * speedMps * speedMps, axMps2, ayMps2, model.axles);
    const frontCap = s.frontLatCapN * remainingShare(ratio(input.frontLongN, s.frontLongCapN), n);
    const rearCap = s.rearLatCapN * remainingShare(ratio(input.rearLongN, s.rearLongCapN), n);
    fyf = axleLateralForceN(p.corneringStiffnessFrontNPerRad, frontSlip, frontCap, model.law);
    fyr = axleLateralForceN(p.corneringStiffnessRearNPerRad, rearSlip, rearCap, model.law);
    axMps2 = (input.frontLongN * cos - fyf * sin + input.rearLongN - resistance) / p.massKg;
    ayMps2 = (fyf * cos + input.frontLongN * sin + fyr) / p.massKg;
  }
  out.frontLatN = fyf;
  out.rearLatN = fyr;
  out.frontSlipRad = frontSlip;
  out.rearSlipRad = rearSlip;
  out.frontUse = combinedShare(ratio(input.frontLongN, s.frontLongCapN), ratio(fyf, s.frontLatCapN), n);
  out.rearUse = combinedShare(ratio(input.rearLongN, s.rearLongCapN), ratio(fyr, s.rearLatCapN), n);
  out.lateralVelocityRate = ayMps2 - u * r;
  out.yawAcceleration = (a * (fyf * cos + input.frontLongN * sin) - b * fyr) / p.yawInertiaKgM2;
  out.speedRate = axMps2 + vy * r;
  return out;
}

/** Path-frame kinematics: ds/dt, de/dt and d(heading error)/dt on a path of curvature kappa at the car's station. */
export function pathRates(
  speedMps: number,
  lateralVelocityMps: number,
  yawRateRadPerS: number,
  lateralErrorM: number,
  headingErrorRad: number,
  curvaturePerM: number,
  out: Float64Array,
): Float64Array {
  const cos = Math.cos(headingErrorRad);
  const sin = Math.sin(headingErrorRad);
  const stationRate = (speedMps * cos - lateralVelocityMps * sin) / (1 - curvaturePerM * lateralErrorM);
  out[0] = stationRate;
  out[1] = speedMps * sin + lateralVelocityMps * cos;
  out[2] = yawRateRadPerS - curvaturePerM * stationRate;
  return out;
}
