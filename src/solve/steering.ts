// The road-wheel steering trace of a reference lap: delta = L kappa + K ay, kinematic steer plus the understeer
// gradient's share (Gillespie, Fundamentals of Vehicle Dynamics, SAE 1992, ch. 6), so a driver or a sim rig can
// set their own steering against it. Positive = steering left, like the curvature.

import type { Car } from '../car/types.js';
import type { LapResult } from './types.js';
import { linearAxlesOf, understeerGradientRadPerMps2 } from '../car/understeer.js';
import { InputError } from '../errors.js';
import { radToDeg } from '../units.js';

/** Whether the car can give a steering trace (it has the wheelbase and both cornering stiffnesses). */
export const canTraceSteering = (car: Car): boolean => linearAxlesOf(car) !== null;

/** Steer angle at the road wheels, degrees, at every sample of the lap. */
export function steeringTraceDeg(result: LapResult, car: Car): Float64Array {
  const axles = linearAxlesOf(car);
  if (!axles) {
    throw new InputError(`car ${car.name}: the steering trace needs fields wheelbaseM, tyre.corneringStiffnessFrontNPerRad and tyre.corneringStiffnessRearNPerRad`);
  }
  const gradient = understeerGradientRadPerMps2(axles);
  const t = result.trace;
  const out = new Float64Array(t.count);
  for (let i = 0; i < t.count; i++) out[i] = radToDeg(axles.wheelbaseM * t.curvaturePerM[i]! + gradient * t.ayMps2[i]!);
  return out;
}
