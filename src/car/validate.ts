// The limits a car record must respect to be driven (positive mass, grip and power, a weight split inside the
// axles, a friction-ellipse exponent of at least 1) for a car built or changed in code. A car file is held to the
// same limits by its schema in io/read-car.ts; the reader's fuzz test checks that the two agree.

import { InputError } from '../errors.js';
import type { Car } from './types.js';

/** Checks a car record built or changed in code (a sweep, a what-if) against the same limits as a car file. */
export function validateCar(car: Car, source: string): Car {
  const problems: string[] = [];
  const requirePositive = (value: number, field: string) => {
    if (!(Number.isFinite(value) && value > 0)) problems.push(`field ${field} must be positive (got ${value})`);
  };
  const requireNonNegative = (value: number, field: string) => {
    if (!(Number.isFinite(value) && value >= 0)) problems.push(`field ${field} must not be negative (got ${value})`);
  };
  requirePositive(car.massKg, 'massKg');
  requirePositive(car.tyre.muLong, 'tyre.muLong');
  requirePositive(car.tyre.muLat, 'tyre.muLat');
  requirePositive(car.powertrain.maxPowerW, 'powertrain.maxPowerW');
  requireNonNegative(car.aero.dragAreaM2, 'aero.dragAreaM2');
  requireNonNegative(car.fuel.massKg, 'fuel.massKg');
  requireNonNegative(car.rollingResistanceCoeff, 'rollingResistanceCoeff');
  if (!Number.isFinite(car.aero.liftAreaM2))
    problems.push(`field aero.liftAreaM2 must be a number (got ${car.aero.liftAreaM2})`);
  if (!(car.frontWeightFraction > 0 && car.frontWeightFraction < 1))
    problems.push(`field frontWeightFraction must be between 0 and 1 (got ${car.frontWeightFraction})`);
  if (!(car.tyre.ggExponent >= 1))
    problems.push(`field tyre.ggExponent must be at least 1 (got ${car.tyre.ggExponent})`);
  if (problems.length > 0) throw new InputError(`${source}: ${problems.join('; ')}`);
  return car;
}
