// The car a log shows: starting from the user's car, power and drag from the full-throttle stretches
// (./power-fit.ts), then grip, downforce and load sensitivity from the demonstrated boundary (./grip-fit.ts), then
// power and drag once more with the fitted grip (it decides which samples the tyres limit). Every other field is kept
// as given. The answer is an ordinary Car with the standard errors and correlations of the fit in its uncertainty
// block and a note of where each value came from; a value outside physical bounds fails the whole calibration.

import type { Ambient, Car, CarUncertainty } from '../car/types.js';
import { InputError } from '../errors.js';
import { readCarField, unitOf, writeCarField } from '../sweep/fields.js';
import type { CalibrationSamples } from './samples.js';
import type { LateralPathSummary } from './lateral-path.js';
import { DEFAULT_DRIVE_FIT, fitDrive, type DriveFit, type DriveFitOptions } from './power-fit.js';
import { DEFAULT_GRIP_FIT, fitGrip, GRIP_FIELDS, type GripFit, type GripFitOptions } from './grip-fit.js';
import { withDriveScaled } from './drive-scale.js';
import { outOfBounds, USEFUL_RELATIVE_POWER_SD } from './limits.js';
import { metricNoteText, type Note } from '../note.js';

export const POWER_FIELD = 'powertrain.maxPowerW';
export const DRAG_FIELD = 'aero.dragAreaM2';
/** Every field a calibration may fit. */
export const CALIBRATED_FIELDS: readonly string[] = [POWER_FIELD, DRAG_FIELD, ...GRIP_FIELDS];

export interface FittedValue {
  field: string;
  value: number;
  sd: number;
  base: number;
  unit: string;
}

export interface KeptValue {
  field: string;
  value: number;
  reason: Note;
}

export interface CalibrationResult {
  car: Car;
  fitted: FittedValue[];
  kept: KeptValue[];
  /** Sets of fields the log could not tell apart, and the one of each kept as given (the others fitted given it). */
  notSeparable: { fields: string[]; conditionIndex: number; kept: string }[];
  drive: DriveFit;
  grip: GripFit;
  /** Where a derived lateral acceleration came from (null: the log measured it). */
  lateralPath: LateralPathSummary | null;
  notes: Note[];
}

export interface CalibrateOptions {
  drive?: DriveFitOptions;
  grip?: GripFitOptions;
}

export function roundToError(value: number, sd: number): number {
  if (!(sd > 0) || !Number.isFinite(value)) return value;
  const digits = Math.max(0, 2 - Math.floor(Math.log10(sd)));
  return Number(value.toFixed(Math.min(digits, 12)));
}

function withFields(car: Car, values: readonly { field: string; value: number }[]): Car {
  let out = car;
  for (const { field, value } of values) out = writeCarField(out, field, value, 'calibration');
  return out;
}

/**
 * The drive and grip fits in turn, since each needs the other's answer (the drive force decides which samples the
 * tyres limit; the downforce sets the rolling resistance and the coasting): drive, grip from the samples the base
 * car's grip chooses, drive, grip again from the samples the first grip chooses, drive.
 */
function alternateFits(
  base: Car,
  ambient: Ambient,
  samples: CalibrationSamples,
  options: CalibrateOptions,
): { drive: DriveFit; grip: GripFit; gripped: Car } {
  const driveOptions = options.drive ?? DEFAULT_DRIVE_FIT;
  const gripOptions = options.grip ?? DEFAULT_GRIP_FIT;
  const drivenBy = (car: Car, fit: DriveFit) =>
    withFields(withDriveScaled(car, fit.driveScale), [{ field: DRAG_FIELD, value: fit.dragAreaM2 }]);
  const gripOf = (fit: GripFit) => fit.fields.map((field, k) => ({ field, value: fit.values[k]! }));
  const firstDrive = fitDrive(base, ambient, samples, driveOptions);
  const firstGrip = fitGrip(drivenBy(base, firstDrive), ambient, samples, gripOptions, drivenBy(base, firstDrive));
  const secondDrive = fitDrive(withFields(base, gripOf(firstGrip)), ambient, samples, driveOptions);
  const grip =
    firstGrip.fields.length === 0
      ? firstGrip
      : fitGrip(
          drivenBy(base, secondDrive),
          ambient,
          samples,
          gripOptions,
          withFields(drivenBy(base, secondDrive), gripOf(firstGrip)),
        );
  const gripped = withFields(base, gripOf(grip));
  const drive = fitDrive(gripped, ambient, samples, driveOptions);
  return { drive, grip, gripped };
}

/** Which values the log determined (with their standard errors) and which are kept as given, and why. */
function fittedAndKept(
  base: Car,
  drive: DriveFit,
  grip: GripFit,
): { fitted: FittedValue[]; kept: KeptValue[]; powerFitted: boolean } {
  const fitted: FittedValue[] = [];
  const kept: KeptValue[] = [];
  const basePower = base.powertrain.maxPowerW;
  const powerSd = drive.driveScaleSd * basePower;
  const powerFitted = powerSd <= USEFUL_RELATIVE_POWER_SD * drive.driveScale * basePower;
  if (powerFitted)
    fitted.push({
      field: POWER_FIELD,
      value: drive.driveScale * basePower,
      sd: powerSd,
      base: basePower,
      unit: unitOf(POWER_FIELD),
    });
  else
    kept.push({
      field: POWER_FIELD,
      value: basePower,
      reason: `too loosely determined by this log (standard error ${(100 * drive.driveScaleSd).toFixed(0)} % of the drive force)`,
    });
  if (drive.dragAreaSd !== null)
    fitted.push({
      field: DRAG_FIELD,
      value: drive.dragAreaM2,
      sd: drive.dragAreaSd,
      base: base.aero.dragAreaM2,
      unit: unitOf(DRAG_FIELD),
    });
  else
    kept.push({
      field: DRAG_FIELD,
      value: base.aero.dragAreaM2,
      reason:
        drive.notes.find((note) => metricNoteText(note).includes('drag')) ?? 'not separable from power in this log',
    });
  grip.fields.forEach((field, k) => {
    fitted.push({
      field,
      value: grip.values[k]!,
      sd: Math.sqrt(grip.covariance[k]![k]!),
      base: readCarField(base, field) ?? 0,
      unit: unitOf(field),
    });
  });
  for (const { field, reason } of grip.kept) kept.push({ field, value: readCarField(base, field) ?? 0, reason });

  return { fitted, kept, powerFitted };
}

/** The car with the fitted values (a fitted power scales the drive, gearing's torque curve rounded to 0.1 N m). */
function carWithFitted(gripped: Car, fitted: readonly FittedValue[], drive: DriveFit, powerFitted: boolean): Car {
  let car = powerFitted ? withDriveScaled(gripped, drive.driveScale) : gripped;
  car = withFields(car, fitted);
  const gearing = car.powertrain.gearing;
  if (powerFitted && gearing) {
    car = {
      ...car,
      powertrain: {
        ...car.powertrain,
        gearing: {
          ...gearing,
          torqueCurve: {
            ...gearing.torqueCurve,
            torqueNm: gearing.torqueCurve.torqueNm.map((t) => Math.round(t * 10) / 10),
          },
        },
      },
    };
  }
  return car;
}

export function calibrateCar(
  base: Car,
  ambient: Ambient,
  samples: CalibrationSamples,
  options: CalibrateOptions = {},
): CalibrationResult {
  if (base.model === 'bicycle' && base.aero.frontDownforceFraction === null) {
    // The fit tries downforce on every car; the bicycle model cannot place it on the axles without the balance.
    throw new InputError(
      `car ${base.name}: calibrating with the bicycle model fits the downforce, which needs field aero.frontDownforceFraction (the front axle's share); add it to the car file`,
    );
  }
  const { drive, grip, gripped } = alternateFits(base, ambient, samples, options);
  const notes = [...samples.notes, ...drive.notes, ...grip.notes];
  if (base.model === 'bicycle' && grip.fields.length > 0) {
    notes.push(
      'grip fitted on the point-mass envelope: with the bicycle model the load transfer between the wheels lowers the limits a little below what the log showed',
    );
  }

  const { fitted, kept, powerFitted } = fittedAndKept(base, drive, grip);
  const problems = fitted.flatMap(({ field, value }) => outOfBounds(field, value) ?? []);
  if (problems.length > 0)
    throw new InputError(`${samples.source}: calibration refused: ${problems.join('; ')}; nothing written`);

  // Values kept to the digits their standard errors justify (three significant digits of the error), errors to two.
  for (const f of fitted) {
    f.value = roundToError(f.value, f.sd);
    f.sd = Number(f.sd.toPrecision(2));
  }
  const car = {
    ...carWithFitted(gripped, fitted, drive, powerFitted),
    name: `${base.name} (fitted)`,
    uncertainty: uncertaintyOf(base, fitted, drive, grip, powerFitted),
    origin: originOf(base, samples, fitted, kept, drive, grip),
  };
  return {
    car,
    fitted,
    kept,
    notSeparable: grip.notSeparable.map((set) => ({
      fields: [...set.fields],
      conditionIndex: set.conditionIndex,
      kept: set.fields[set.fields.length - 1]!,
    })),
    drive,
    grip,
    lateralPath: samples.lateralPath,
    notes,
  };
}

/** Standard errors of the fitted fields and the correlations within each fit; the base car's own for the rest. */
function uncertaintyOf(
  base: Car,
  fitted: FittedValue[],
  drive: DriveFit,
  grip: GripFit,
  powerFitted: boolean,
): CarUncertainty {
  const fittedFields = new Set(fitted.map((f) => f.field));
  const sd: Record<string, number> = {};
  for (const [field, value] of Object.entries(base.uncertainty?.sd ?? {}))
    if (!fittedFields.has(field)) sd[field] = value;
  for (const f of fitted) sd[f.field] = f.sd;
  const correlation: { fields: [string, string]; r: number }[] = (base.uncertainty?.correlation ?? [])
    .filter(({ fields }) => !fittedFields.has(fields[0]) && !fittedFields.has(fields[1]))
    .map(({ fields, r }) => ({ fields: [fields[0], fields[1]], r }));
  const add = (a: string, b: string, r: number) => {
    if (Number.isFinite(r) && Math.abs(r) >= 0.01) correlation.push({ fields: [a, b], r: Math.round(r * 1000) / 1000 });
  };
  if (powerFitted && drive.dragAreaSd !== null) add(POWER_FIELD, DRAG_FIELD, drive.correlation);
  for (let j = 0; j < grip.fields.length; j++) {
    for (let k = j + 1; k < grip.fields.length; k++) {
      const cov = grip.covariance;
      add(grip.fields[j]!, grip.fields[k]!, cov[j]![k]! / Math.sqrt(cov[j]![j]! * cov[k]![k]!));
    }
  }
  return { sd, correlation };
}

function originOf(
  base: Car,
  samples: CalibrationSamples,
  fitted: FittedValue[],
  kept: KeptValue[],
  drive: DriveFit,
  grip: GripFit,
): Record<string, string> {
  const origin: Record<string, string> = { ...(base.origin ?? {}) };
  const driveText = `fitted from ${samples.source}: ${drive.durationS.toFixed(0)} s of full throttle in ${drive.stretches} stretch${drive.stretches === 1 ? '' : 'es'}`;
  const gripText = `fitted from ${samples.source}: ${grip.samples} samples near the limit in ${grip.clusters} corner passes`;
  for (const f of fitted) origin[f.field] = f.field === POWER_FIELD || f.field === DRAG_FIELD ? driveText : gripText;
  for (const k of kept) origin[k.field] = `kept from the base car: ${metricNoteText(k.reason)}`;
  return origin;
}
