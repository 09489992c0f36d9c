// The single-track model in time: lateral velocity, yaw rate and speed of a rigid car with front steer
// (Gillespie, Fundamentals of Vehicle Dynamics, SAE 1992, ch. 6; Rajamani, Vehicle Dynamics and Control,
// Springer 2006, ch. 2), axle forces linear in slip angle or saturating at each axle's friction ellipse,
// and its position relative to a path in curvilinear coordinates (station s, lateral error e, heading error).

import type { Car } from '../car/types.js';
import type { BicycleParams } from '../car/bicycle-params.js';
import { axleState, newAxleState, type AxleState } from '../car/bicycle-axles.js';
import { combinedShare, remainingShare } from '../car/point-mass.js';

export type AxleForceLaw = 'linear' | 'saturating';

/** Lateral force of one axle, N: C alpha while linear, else capacity * tanh(C alpha / capacity). */
export function axleLateralForceN(stiffnessNPerRad: number, slipRad: number, capacityN: number, law: AxleForceLaw): number {
  const linear = stiffnessNPerRad * slipRad;
  if (law === 'linear') return linear;
  if (!(capacityN > 0)) return 0;
  return capacityN * Math.tanh(linear / capacityN);
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

export function singleTrackModel(params: BicycleParams, car: Car, airDensityKgPerM3: number, law: AxleForceLaw, resistanceN: (speedMps: number) => number): SingleTrackModel {
  return { params, tyre: car.tyre, law, halfRhoLift: 0.5 * airDensityKgPerM3 * car.aero.liftAreaM2, resistanceN, axles: newAxleState() };
}

const ratio = (a: number, b: number) => (b > 0 ? Math.abs(a) / b : a === 0 ? 0 : Infinity);

/**
 * Body-frame derivatives of (vy, r, u). Loads follow the quasi-static load transfer at the commanded ax and at
 * ay = u r; each axle's lateral capacity shrinks by its longitudinal force on the friction ellipse.
 */
export function singleTrackForces(model: SingleTrackModel, lateralVelocityMps: number, yawRateRadPerS: number, speedMps: number, input: SingleTrackInput, out: SingleTrackForces): SingleTrackForces {
  const p = model.params;
  const u = Math.max(speedMps, 1);
  const vy = lateralVelocityMps;
  const r = yawRateRadPerS;
  const a = p.frontAxleToCgM;
  const b = p.cgToRearAxleM;
  const resistance = model.resistanceN(speedMps);
  const axCommand = (input.frontLongN + input.rearLongN - resistance) / p.massKg;
  const s = axleState(p, model.tyre, model.halfRhoLift * speedMps * speedMps, axCommand, u * r, model.axles);
  const n = model.tyre.ggExponent;
  const frontCap = s.frontLatCapN * remainingShare(ratio(input.frontLongN, s.frontLongCapN), n);
  const rearCap = s.rearLatCapN * remainingShare(ratio(input.rearLongN, s.rearLongCapN), n);
  const frontSlip = input.steerRad - Math.atan2(vy + a * r, u);
  const rearSlip = -Math.atan2(vy - b * r, u);
  const fyf = axleLateralForceN(p.corneringStiffnessFrontNPerRad, frontSlip, frontCap, model.law);
  const fyr = axleLateralForceN(p.corneringStiffnessRearNPerRad, rearSlip, rearCap, model.law);
  const cos = Math.cos(input.steerRad);
  const sin = Math.sin(input.steerRad);
  out.frontLatN = fyf;
  out.rearLatN = fyr;
  out.frontSlipRad = frontSlip;
  out.rearSlipRad = rearSlip;
  out.frontUse = combinedShare(ratio(input.frontLongN, s.frontLongCapN), ratio(fyf, s.frontLatCapN), n);
  out.rearUse = combinedShare(ratio(input.rearLongN, s.rearLongCapN), ratio(fyr, s.rearLatCapN), n);
  out.lateralVelocityRate = (fyf * cos + input.frontLongN * sin + fyr) / p.massKg - u * r;
  out.yawAcceleration = (a * (fyf * cos + input.frontLongN * sin) - b * fyr) / p.yawInertiaKgM2;
  out.speedRate = (input.frontLongN * cos - fyf * sin + input.rearLongN - resistance) / p.massKg + vy * r;
  return out;
}

/** Path-frame kinematics: ds/dt, de/dt and d(heading error)/dt on a path of curvature kappa at the car's station. */
export function pathRates(speedMps: number, lateralVelocityMps: number, yawRateRadPerS: number, lateralErrorM: number, headingErrorRad: number, curvaturePerM: number, out: Float64Array): Float64Array {
  const cos = Math.cos(headingErrorRad);
  const sin = Math.sin(headingErrorRad);
  const stationRate = (speedMps * cos - lateralVelocityMps * sin) / (1 - curvaturePerM * lateralErrorM);
  out[0] = stationRate;
  out[1] = speedMps * sin + lateralVelocityMps * cos;
  out[2] = yawRateRadPerS - curvaturePerM * stationRate;
  return out;
}
