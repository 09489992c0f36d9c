// The single-track (bicycle) model's parameters, resolved once from a Car: axle positions from the static
// weight split (Gillespie, Fundamentals of Vehicle Dynamics, SAE 1992, ch. 6: Wf = W b / L), and the list
// of fields a bicycle model cannot do without, so a car file that lacks several hears of all of them at once.

import type { Car, DrivenAxle } from './types.js';
import { InputError } from '../errors.js';
import { STANDARD_GRAVITY_MPS2 } from '../units.js';
import { totalMassKg } from './point-mass.js';

export interface BicycleParams {
  massKg: number;
  weightN: number;
  wheelbaseM: number;
  /** Distance from the front axle to the centre of gravity (a) and from it to the rear axle (b), m. */
  frontAxleToCgM: number;
  cgToRearAxleM: number;
  cgHeightM: number;
  frontWeightFraction: number;
  trackFrontM: number;
  trackRearM: number;
  rollStiffnessFrontFraction: number;
  frontDownforceFraction: number;
  brakeFrontBias: number;
  corneringStiffnessFrontNPerRad: number;
  corneringStiffnessRearNPerRad: number;
  /** Static load on one front tyre and on one rear tyre, N (the reference load of the load-sensitive mu). */
  staticTyreLoadFrontN: number;
  staticTyreLoadRearN: number;
  drive: DrivenAxle;
  /** Yaw moment of inertia, kg m^2: m a b (dynamic index 1, common practice; the car file does not give it). */
  yawInertiaKgM2: number;
}

/** The fields a bicycle model needs that this car leaves out, as car-file field names. */
export function bicycleMissingFields(car: Car): string[] {
  const wanted: [string, unknown][] = [
    ['cgHeightM', car.cgHeightM],
    ['wheelbaseM', car.wheelbaseM],
    ['trackFrontM', car.trackFrontM],
    ['trackRearM', car.trackRearM],
    ['rollStiffnessFrontFraction', car.rollStiffnessFrontFraction],
    ['tyre.corneringStiffnessFrontNPerRad', car.tyre.corneringStiffnessFrontNPerRad],
    ['tyre.corneringStiffnessRearNPerRad', car.tyre.corneringStiffnessRearNPerRad],
    // The aero balance matters only to a car with lift or downforce.
    ['aero.frontDownforceFraction', car.aero.liftAreaM2 === 0 ? 0 : car.aero.frontDownforceFraction],
    ['brakes.frontBias', car.brakes.frontBias],
  ];
  return wanted.filter(([, value]) => value === null || value === undefined).map(([name]) => name);
}

/** One line naming every missing field, or null when the car is complete for the bicycle model. */
export function bicycleIncompleteMessage(car: Car): string | null {
  const missing = bicycleMissingFields(car);
  if (missing.length === 0) return null;
  return `the bicycle model needs ${missing.length === 1 ? 'field' : 'fields'} ${missing.join(', ')}`;
}

/** Resolves the parameters; throws one InputError listing every missing field. */
export function bicycleParams(car: Car): BicycleParams {
  const problem = bicycleIncompleteMessage(car);
  if (problem) throw new InputError(`car ${car.name}: ${problem}`);
  const massKg = totalMassKg(car);
  const weightN = massKg * STANDARD_GRAVITY_MPS2;
  const wheelbaseM = car.wheelbaseM!;
  const cgToRearAxleM = car.frontWeightFraction * wheelbaseM;
  const frontAxleToCgM = wheelbaseM - cgToRearAxleM;
  return {
    massKg,
    weightN,
    wheelbaseM,
    frontAxleToCgM,
    cgToRearAxleM,
    cgHeightM: car.cgHeightM!,
    frontWeightFraction: car.frontWeightFraction,
    trackFrontM: car.trackFrontM!,
    trackRearM: car.trackRearM!,
    rollStiffnessFrontFraction: car.rollStiffnessFrontFraction!,
    frontDownforceFraction: car.aero.frontDownforceFraction ?? car.frontWeightFraction,
    brakeFrontBias: car.brakes.frontBias!,
    corneringStiffnessFrontNPerRad: car.tyre.corneringStiffnessFrontNPerRad!,
    corneringStiffnessRearNPerRad: car.tyre.corneringStiffnessRearNPerRad!,
    staticTyreLoadFrontN: (weightN * car.frontWeightFraction) / 2,
    staticTyreLoadRearN: (weightN * (1 - car.frontWeightFraction)) / 2,
    drive: car.powertrain.drive,
    yawInertiaKgM2: massKg * frontAxleToCgM * cgToRearAxleM,
  };
}
