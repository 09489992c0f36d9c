// The road-wheel steering trace of a reference lap: delta = L kappa + K ay, kinematic steer plus the understeer
// gradient's share (Gillespie, Fundamentals of Vehicle Dynamics, SAE 1992, ch. 6), so a driver or a sim rig can
// set their own steering against it. Positive = steering left, like the curvature.

import type { Car } from '../car/types.js';
import type { LapResult } from './types.js';
import { criticalSpeedMps, linearAxlesOf, understeerGradientRadPerMps2 } from '../car/understeer.js';
import { InputError } from '../errors.js';
import { radToDeg } from '../units.js';
import { distanceOf, note, speedsOf, type Note } from '../note.js';

/** Whether the car can give a steering trace (it has the wheelbase and both cornering stiffnesses). */
export const canTraceSteering = (car: Car): boolean => linearAxlesOf(car) !== null;

/** Steer angle at the road wheels, degrees, at every sample of the lap. */
export function steeringTraceDeg(result: LapResult, car: Car): Float64Array {
  const axles = linearAxlesOf(car);
  if (!axles) {
    throw new InputError(
      `car ${car.name}: the steering trace needs fields wheelbaseM, tyre.corneringStiffnessFrontNPerRad and tyre.corneringStiffnessRearNPerRad`,
    );
  }
  const gradient = understeerGradientRadPerMps2(axles);
  const t = result.trace;
  const out = new Float64Array(t.count);
  for (let i = 0; i < t.count; i++) out[i] = radToDeg(axles.wheelbaseM * t.curvaturePerM[i]! + gradient * t.ayMps2[i]!);
  return out;
}

/**
 * A warning when an oversteering car's reference goes faster than its critical speed sqrt(-L / K) (Gillespie,
 * SAE 1992, ch. 6), where the linear car is directionally unstable; null when it does not (or K >= 0).
 */
export function criticalSpeedWarning(result: LapResult, car: Car): Note | null {
  const axles = linearAxlesOf(car);
  if (!axles) return null;
  const critical = criticalSpeedMps(axles.wheelbaseM, understeerGradientRadPerMps2(axles));
  if (critical === null || result.maxSpeedMps <= critical) return null;
  const t = result.trace;
  let first = 0;
  while (first < t.count && t.speedMps[first]! <= critical) first++;
  return note`car ${car.name} oversteers and is unstable above its critical speed ${speedsOf([critical])}; the reference reaches ${speedsOf([result.maxSpeedMps])} (first above it at ${distanceOf(t.distanceM[first]!)})`;
}
