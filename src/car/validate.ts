// One validation of a car record, used by the car file reader and by the library's entry points alike: every
// numeric field is a finite number inside its plausible range (car-ranges.ts), the enumerations hold one of their
// values, and a gearbox model is complete and consistent. A script that passes a wrong record gets an InputError
// naming the field, never a TypeError or a NaN lap.

import { InputError } from '../errors.js';
import type { Car } from './types.js';
import { isRecord } from '../is-record.js';
import { CAR_FIELD_RANGES, GEARING_RANGES, inRange, rangeText, type FieldRange } from './car-ranges.js';

/** The value at a path of keys, or undefined where any part of the path is missing. */
function valueAt(record: Record<string, unknown>, path: readonly string[]): unknown {
  let value: unknown = record;
  for (const key of path) {
    if (!isRecord(value)) return undefined;
    value = value[key];
  }
  return value;
}

const shown = (value: unknown): string => (typeof value === 'string' ? JSON.stringify(value) : String(value));

function checkNumber(value: unknown, r: FieldRange, name: string, problems: string[]): void {
  if (inRange(value, r)) return;
  if (typeof value !== 'number') problems.push(`field ${name} must be a number (got ${shown(value)})`);
  else problems.push(`field ${name} must be ${rangeText(r)} (got ${value})`);
}

function checkGearing(gearing: unknown, problems: string[]): void {
  if (gearing === null || gearing === undefined) return;
  if (!isRecord(gearing)) {
    problems.push('field powertrain.gearing must be a gearbox record or null');
    return;
  }
  const { gearRatios, torqueCurve } = gearing;
  if (!Array.isArray(gearRatios) || gearRatios.length === 0) problems.push('field powertrain.gearRatios needs a ratio');
  else
    gearRatios.forEach((ratio, k) =>
      checkNumber(ratio, GEARING_RANGES.gearRatio, `powertrain.gearRatios.${k}`, problems),
    );
  checkNumber(gearing['finalDrive'], GEARING_RANGES.finalDrive, 'powertrain.finalDrive', problems);
  checkNumber(gearing['wheelRadiusM'], GEARING_RANGES.wheelRadiusM, 'powertrain.wheelRadiusM', problems);
  checkNumber(gearing['shiftTimeS'], GEARING_RANGES.shiftTimeS, 'powertrain.shiftTimeS', problems);
  checkNumber(gearing['maxRpm'], GEARING_RANGES.maxRpm, 'powertrain.maxRpm', problems);
  const rpm = isRecord(torqueCurve) ? torqueCurve['rpm'] : undefined;
  const torque = isRecord(torqueCurve) ? torqueCurve['torqueNm'] : undefined;
  if (!Array.isArray(rpm) || !Array.isArray(torque) || rpm.length < 2 || rpm.length !== torque.length) {
    problems.push('field powertrain.torqueCurve needs rpm and torqueNm of the same length, at least 2 each');
    return;
  }
  rpm.forEach((value, k) => checkNumber(value, GEARING_RANGES.rpm, `powertrain.torqueCurve.rpm.${k}`, problems));
  torque.forEach((value, k) =>
    checkNumber(value, GEARING_RANGES.torqueNm, `powertrain.torqueCurve.torqueNm.${k}`, problems),
  );
  for (let k = 1; k < rpm.length; k++) {
    if (!((rpm[k] as number) > (rpm[k - 1] as number)))
      problems.push(`field powertrain.torqueCurve.rpm.${k}: rpm must increase`);
  }
}

function checkChoice(value: unknown, name: string, choices: readonly string[], problems: string[]): void {
  if (typeof value !== 'string' || !choices.includes(value))
    problems.push(`field ${name} must be one of ${choices.join(', ')} (got ${shown(value)})`);
}

// Split once: a sweep checks every one of its runs' cars before it solves any.
const RANGE_PATHS = CAR_FIELD_RANGES.map((r) => r.field.split('.'));
const DRIVE_PATH = ['powertrain', 'drive'];
const GEARING_PATH = ['powertrain', 'gearing'];

/** Every problem of a car record, as message parts; empty when the record can be driven. */
export function carProblems(car: unknown): string[] {
  if (!isRecord(car)) return [`a car must be a record (got ${car === null ? 'null' : typeof car})`];
  const problems: string[] = [];
  for (const group of ['tyre', 'aero', 'powertrain', 'brakes', 'fuel']) {
    if (!isRecord(car[group])) problems.push(`field ${group} must be a record (got ${shown(car[group])})`);
  }
  if (problems.length > 0) return problems;
  if (typeof car['name'] !== 'string') problems.push(`field name must be a string (got ${shown(car['name'])})`);
  for (let k = 0; k < CAR_FIELD_RANGES.length; k++) {
    const r = CAR_FIELD_RANGES[k]!;
    const value = valueAt(car, RANGE_PATHS[k]!);
    if (r.optional && (value === null || value === undefined)) continue;
    checkNumber(value, r, r.field, problems);
  }
  checkChoice(car['model'], 'model', ['point-mass', 'bicycle'], problems);
  checkChoice(valueAt(car, DRIVE_PATH), 'powertrain.drive', ['rear', 'front', 'all'], problems);
  checkGearing(valueAt(car, GEARING_PATH), problems);
  return problems;
}

/**
 * Checks a car record (read from a file, built or changed in code) against the plausible ranges; throws one
 * InputError naming every wrong field. `source` may be a function, for a name that costs something to write and is
 * needed only when the car is wrong.
 */
export function validateCar(car: Car, source: string | (() => string)): Car {
  const problems = carProblems(car);
  if (problems.length > 0)
    throw new InputError(`${typeof source === 'string' ? source : source()}: ${problems.join('; ')}`);
  return car;
}
