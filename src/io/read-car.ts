// Reads and validates a car file (JSON) into a Car record in SI units. The schema is strict: unknown keys are
// errors that name them, so a typo in a field name cannot pass silently.

import { readTextFile } from './read-text.js';
import type { z } from 'zod';
import { zodLibrary, type Zod } from './lazy-libraries.js';
import { quickSchemaKit } from './quick-schema.js';
import { InputError } from '../errors.js';
import type { Car } from '../car/types.js';
import { bicycleIncompleteMessage } from '../car/bicycle-params.js';
import { validateCar } from '../car/validate.js';
import { originProblems, uncertaintyOf, uncertaintySchemas } from './car-uncertainty.js';

function carSchemaOf(z: Zod) {
  const positive = z.number().finite().positive();
  const nonNegative = z.number().finite().nonnegative();
  const fraction = z.number().finite().min(0).max(1);

  const blocks = uncertaintySchemas(z);
  const torqueCurveSchema = z.strictObject({
    rpm: z.array(positive).min(2),
    torqueNm: z.array(nonNegative).min(2),
  });

  return z.strictObject({
    name: z.string().min(1).max(200).optional(),
    model: z.enum(['point-mass', 'bicycle']).optional(),
    massKg: positive,
    frontWeightFraction: z.number().finite().gt(0).lt(1).optional(),
    cgHeightM: nonNegative.optional(),
    wheelbaseM: positive.optional(),
    widthM: positive.optional(),
    trackFrontM: positive.optional(),
    trackRearM: positive.optional(),
    rollStiffnessFrontFraction: fraction.optional(),
    rollingResistanceCoeff: nonNegative.max(0.2).optional(),
    tyre: z.strictObject({
      muLong: positive.max(5),
      muLat: positive.max(5),
      ggExponent: z.number().finite().min(1).max(10).optional(),
      loadSensitivity: nonNegative.max(1).optional(),
      corneringStiffnessFrontNPerRad: positive.optional(),
      corneringStiffnessRearNPerRad: positive.optional(),
    }),
    aero: z.strictObject({
      dragAreaM2: nonNegative,
      liftAreaM2: z.number().finite(),
      frontDownforceFraction: fraction.optional(),
    }),
    powertrain: z.strictObject({
      maxPowerW: positive,
      drive: z.enum(['rear', 'front', 'all']).optional(),
      torqueCurve: torqueCurveSchema.optional(),
      gearRatios: z.array(positive).min(1).optional(),
      finalDrive: positive.optional(),
      wheelRadiusM: positive.optional(),
      shiftTimeS: nonNegative.max(2).optional(),
      drivetrainEfficiency: z.number().finite().gt(0).max(1).optional(),
      maxRpm: positive.optional(),
    }),
    brakes: z
      .strictObject({
        maxDecelG: positive.optional(),
        frontBias: fraction.optional(),
      })
      .optional(),
    fuel: z
      .strictObject({
        massKg: nonNegative,
        burnKgPerLap: nonNegative.optional(),
      })
      .optional(),
    uncertainty: blocks.uncertainty.optional(),
    origin: blocks.origin.optional(),
  });
}

/**
 * Which validator reads the file: zod, or the quick one that gives zod's issues without loading zod (the check
 * command's, for its start-up; test/io/quick-schema.test.ts holds the two to the same results).
 */
export type CarValidator = 'zod' | 'quick';

const carSchemas: Partial<Record<CarValidator, ReturnType<typeof carSchemaOf>>> = {};

function carSchema(validator: CarValidator): ReturnType<typeof carSchemaOf> {
  return (carSchemas[validator] ??= carSchemaOf(validator === 'zod' ? zodLibrary() : quickSchemaKit()));
}

type CarFile = z.infer<ReturnType<typeof carSchemaOf>>;

/** The value at an issue's path in the file (undefined where the path leaves the file's records and arrays). */
function valueAt(root: unknown, path: readonly PropertyKey[]): unknown {
  let value = root;
  for (const key of path) {
    if (value === null || typeof value !== 'object' || !Object.hasOwn(value, key)) return undefined;
    value = (value as Record<PropertyKey, unknown>)[key];
  }
  return value;
}

/** One issue in words. The validators' issues do not carry the input, so a field of the wrong type is told from a
 * missing one by looking it up in the file. */
function describeIssue(issue: z.core.$ZodIssue, root: unknown): string {
  const path = issue.path.map(String).join('.');
  if (issue.code === 'unrecognized_keys') {
    const keys = issue.keys.map((key) => (path ? `${path}.${key}` : key));
    return `unknown field${keys.length > 1 ? 's' : ''} ${keys.join(', ')}`;
  }
  if (issue.code === 'invalid_type' && valueAt(root, issue.path) === undefined) return `missing required field ${path}`;
  return `field ${path || '(top level)'}: ${issue.message}`;
}

function gearingOf(powertrain: CarFile['powertrain'], source: string): Car['powertrain']['gearing'] {
  const { torqueCurve, gearRatios, finalDrive, wheelRadiusM } = powertrain;
  const given = [torqueCurve, gearRatios, finalDrive, wheelRadiusM].filter((value) => value !== undefined).length;
  if (given === 0) return null;
  if (given < 4) {
    const missing = [
      ['powertrain.torqueCurve', torqueCurve],
      ['powertrain.gearRatios', gearRatios],
      ['powertrain.finalDrive', finalDrive],
      ['powertrain.wheelRadiusM', wheelRadiusM],
    ]
      .filter(([, value]) => value === undefined)
      .map(([name]) => name);
    throw new InputError(`${source}: gearing needs ${missing.join(', ')} as well`);
  }
  const curve = torqueCurve!;
  if (curve.rpm.length !== curve.torqueNm.length) {
    throw new InputError(
      `${source}: field powertrain.torqueCurve: rpm has ${curve.rpm.length} values but torqueNm has ${curve.torqueNm.length}`,
    );
  }
  for (let i = 1; i < curve.rpm.length; i++) {
    if (!(curve.rpm[i]! > curve.rpm[i - 1]!))
      throw new InputError(`${source}: field powertrain.torqueCurve.rpm.${i}: rpm must increase`);
  }
  return {
    torqueCurve: { rpm: [...curve.rpm], torqueNm: [...curve.torqueNm] },
    gearRatios: [...gearRatios!],
    finalDrive: finalDrive!,
    wheelRadiusM: wheelRadiusM!,
    shiftTimeS: powertrain.shiftTimeS ?? 0,
    maxRpm: powertrain.maxRpm ?? curve.rpm[curve.rpm.length - 1]!,
  };
}

function carFromFile(data: CarFile, source: string): Car {
  return {
    name: data.name ?? 'unnamed car',
    model: data.model ?? 'point-mass',
    massKg: data.massKg,
    frontWeightFraction: data.frontWeightFraction ?? 0.5,
    cgHeightM: data.cgHeightM ?? null,
    wheelbaseM: data.wheelbaseM ?? null,
    widthM: data.widthM ?? null,
    trackFrontM: data.trackFrontM ?? null,
    trackRearM: data.trackRearM ?? null,
    rollStiffnessFrontFraction: data.rollStiffnessFrontFraction ?? null,
    rollingResistanceCoeff: data.rollingResistanceCoeff ?? 0.012,
    tyre: {
      muLong: data.tyre.muLong,
      muLat: data.tyre.muLat,
      ggExponent: data.tyre.ggExponent ?? 2,
      loadSensitivity: data.tyre.loadSensitivity ?? 0,
      corneringStiffnessFrontNPerRad: data.tyre.corneringStiffnessFrontNPerRad ?? null,
      corneringStiffnessRearNPerRad: data.tyre.corneringStiffnessRearNPerRad ?? null,
    },
    aero: {
      dragAreaM2: data.aero.dragAreaM2,
      liftAreaM2: data.aero.liftAreaM2,
      frontDownforceFraction: data.aero.frontDownforceFraction ?? null,
    },
    powertrain: {
      maxPowerW: data.powertrain.maxPowerW,
      drivetrainEfficiency: data.powertrain.drivetrainEfficiency ?? 0.9,
      drive: data.powertrain.drive ?? 'rear',
      gearing: gearingOf(data.powertrain, source),
    },
    brakes: {
      maxDecelG: data.brakes?.maxDecelG ?? null,
      frontBias: data.brakes?.frontBias ?? null,
    },
    fuel: {
      massKg: data.fuel?.massKg ?? 0,
      burnKgPerLap: data.fuel?.burnKgPerLap ?? 0,
    },
  };
}

/** Validates a parsed JSON value as a car; throws one InputError naming the file and the field. */
export function carFromJson(value: unknown, source: string, validator: CarValidator = 'zod'): Car {
  const parsed = carSchema(validator).safeParse(value);
  if (!parsed.success) {
    throw new InputError(`${source}: ${parsed.error.issues.map((issue) => describeIssue(issue, value)).join('; ')}`);
  }
  let car = carFromFile(parsed.data, source);
  const { uncertainty, origin } = parsed.data;
  if (uncertainty || origin) {
    const checked = uncertainty ? uncertaintyOf(uncertainty, car) : null;
    const problems = [...(checked?.problems ?? []), ...(origin ? originProblems(origin) : [])];
    if (problems.length > 0) throw new InputError(`${source}: ${problems.join('; ')}`);
    car = {
      ...car,
      ...(checked ? { uncertainty: checked.uncertainty } : {}),
      ...(origin ? { origin: { ...origin } } : {}),
    };
  }
  const incomplete = car.model === 'bicycle' ? bicycleIncompleteMessage(car) : null;
  if (incomplete) throw new InputError(`${source}: ${incomplete}`);
  return validateCar(car, source);
}

export function parseCarJson(text: string, source: string, validator: CarValidator = 'zod'): Car {
  let value: unknown;
  try {
    value = JSON.parse(text.replace(/^\uFEFF/, ''));
  } catch (error) {
    throw new InputError(`${source}: not valid JSON (${error instanceof Error ? error.message : String(error)})`);
  }
  return carFromJson(value, source, validator);
}

export function readCarFile(file: string): Car {
  return parseCarJson(readTextFile(file, 'car file', 'car'), file);
}
