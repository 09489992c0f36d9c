// Steady-state cornering of the linear single-track model (Gillespie, Fundamentals of Vehicle Dynamics, SAE 1992,
// ch. 6): understeer gradient K = Wf/Cf - Wr/Cr, steer angle delta = L/R + K ay, characteristic speed
// sqrt(L g / K) of an understeering car, critical speed sqrt(-L g / K) of an oversteering one, and the yaw-rate
// gain r/delta = V / (L + K V^2 / g). Inside, K is kept in rad per m/s^2 so no factor 57.3 or g appears.

import type { Car } from './types.js';
import { totalMassKg } from './point-mass.js';
import { STANDARD_GRAVITY_MPS2, radToDeg } from '../units.js';

/** |K| below this (rad per m/s^2, about 6e-9 deg/g) counts as neutral steer. */
const NEUTRAL_TOLERANCE = 1e-12;

export interface LinearAxles {
  massKg: number;
  wheelbaseM: number;
  frontWeightFraction: number;
  corneringStiffnessFrontNPerRad: number;
  corneringStiffnessRearNPerRad: number;
}

/** Understeer gradient, rad of steer per m/s^2 of lateral acceleration: (m_f / Cf - m_r / Cr). */
export function understeerGradientRadPerMps2(car: LinearAxles): number {
  const frontMassKg = car.massKg * car.frontWeightFraction;
  const rearMassKg = car.massKg - frontMassKg;
  const k = frontMassKg / car.corneringStiffnessFrontNPerRad - rearMassKg / car.corneringStiffnessRearNPerRad;
  return Math.abs(k) < NEUTRAL_TOLERANCE ? 0 : k;
}

/** The same gradient in the handbook's unit, degrees per g. */
export const understeerGradientDegPerG = (car: LinearAxles): number =>
  radToDeg(understeerGradientRadPerMps2(car) * STANDARD_GRAVITY_MPS2);

/** Road-wheel steer angle in steady cornering, rad: kinematic L kappa plus K ay (kappa and ay signed alike). */
export function steadyStateSteerRad(
  wheelbaseM: number,
  curvaturePerM: number,
  gradientRadPerMps2: number,
  ayMps2: number,
): number {
  return wheelbaseM * curvaturePerM + gradientRadPerMps2 * ayMps2;
}

/** Speed at which an understeering car needs twice its kinematic steer, m/s; null unless K > 0. */
export function characteristicSpeedMps(wheelbaseM: number, gradientRadPerMps2: number): number | null {
  return gradientRadPerMps2 > 0 ? Math.sqrt(wheelbaseM / gradientRadPerMps2) : null;
}

/** Speed above which an oversteering car is directionally unstable, m/s; null unless K < 0. */
export function criticalSpeedMps(wheelbaseM: number, gradientRadPerMps2: number): number | null {
  return gradientRadPerMps2 < 0 ? Math.sqrt(-wheelbaseM / gradientRadPerMps2) : null;
}

/** Steady-state yaw-rate gain r / delta, 1/s, at this speed (infinite at an oversteering car's critical speed). */
export function yawRateGainPerS(speedMps: number, wheelbaseM: number, gradientRadPerMps2: number): number {
  return speedMps / (wheelbaseM + gradientRadPerMps2 * speedMps * speedMps);
}

/** The linear model's inputs from a car, or null when it lacks the wheelbase or a cornering stiffness. */
export function linearAxlesOf(car: Car): LinearAxles | null {
  const { wheelbaseM } = car;
  const { corneringStiffnessFrontNPerRad: front, corneringStiffnessRearNPerRad: rear } = car.tyre;
  if (wheelbaseM === null || front === null || rear === null) return null;
  return {
    massKg: totalMassKg(car),
    wheelbaseM,
    frontWeightFraction: car.frontWeightFraction,
    corneringStiffnessFrontNPerRad: front,
    corneringStiffnessRearNPerRad: rear,
  };
}
