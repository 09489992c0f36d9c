// The parameter sets an uncertain car stands for: every field the car file gives a standard deviation for, drawn
// as a normal around its value (./design.ts), with the correlations the file gives, and held inside what the field
// may physically be. A drawn power scales the whole drive force (torque curve too), as a calibration fits it.

import { Matrix } from 'ml-matrix';
import type { Car, CarUncertainty } from '../car/types.js';
import { readCarField, writeCarField } from '../sweep/fields.js';
import { withDriveScaled } from '../calibrate/drive-scale.js';
import { normalDraws } from './design.js';

/** The default number of draws, and the seed every run uses unless told otherwise. */
export const DEFAULT_DRAWS = 64;
export const DEFAULT_DRAW_SEED = 1979;

export interface ParameterDraws {
  fields: string[];
  /** The car's own value of each field. */
  centre: number[];
  sd: number[];
  /** `count` rows of fields.length values. */
  values: Float64Array;
  count: number;
  /** How many drawn values were moved back inside their field's range. */
  clamped: number;
}

const POWER = 'powertrain.maxPowerW';

/** Lowest and highest value a drawn field may take (the car file's own limits, a hair inside the open ends). */
export function drawRange(field: string): [number, number] {
  const fractions = [
    'frontWeightFraction',
    'rollStiffnessFrontFraction',
    'aero.frontDownforceFraction',
    'brakes.frontBias',
  ];
  if (fractions.includes(field)) return [0.001, 0.999];
  if (field === 'powertrain.drivetrainEfficiency') return [0.01, 1];
  if (field === 'tyre.ggExponent') return [1, 10];
  if (field === 'aero.liftAreaM2') return [-Infinity, Infinity];
  const nonNegative = [
    'aero.dragAreaM2',
    'rollingResistanceCoeff',
    'tyre.loadSensitivity',
    'cgHeightM',
    'fuel.massKg',
    'fuel.burnKgPerLap',
    'powertrain.gearing.shiftTimeS',
  ];
  if (nonNegative.includes(field)) return [0, Infinity];
  // Everything else must stay positive: a small share of a typical value keeps the car a car.
  return [1e-6, Infinity];
}

/** The correlation matrix of `fields` from the car's pairs (identity where none is given). */
export function correlationMatrix(fields: readonly string[], uncertainty: CarUncertainty): Matrix | null {
  if (uncertainty.correlation.length === 0) return null;
  const matrix = Matrix.eye(fields.length, fields.length);
  for (const {
    fields: [a, b],
    r,
  } of uncertainty.correlation) {
    const i = fields.indexOf(a);
    const j = fields.indexOf(b);
    if (i < 0 || j < 0) continue;
    matrix.set(i, j, r);
    matrix.set(j, i, r);
  }
  return matrix;
}

/** The fields the car is uncertain about, in the order of its file. */
export function uncertainFields(car: Car): string[] {
  return Object.keys(car.uncertainty?.sd ?? {});
}

export function drawParameters(car: Car, count: number, seed = DEFAULT_DRAW_SEED): ParameterDraws {
  const uncertainty = car.uncertainty ?? { sd: {}, correlation: [] };
  const fields = uncertainFields(car);
  const centre = fields.map((field) => readCarField(car, field) ?? NaN);
  const sd = fields.map((field) => uncertainty.sd[field]!);
  const dims = fields.length;
  const z = dims > 0 ? normalDraws(count, dims, seed, correlationMatrix(fields, uncertainty)) : new Float64Array(0);
  const values = new Float64Array(count * dims);
  let clamped = 0;
  for (let i = 0; i < count; i++) {
    for (let d = 0; d < dims; d++) {
      const [lo, hi] = drawRange(fields[d]!);
      const raw = centre[d]! + sd[d]! * z[i * dims + d]!;
      const value = Math.min(hi, Math.max(lo, raw));
      if (value !== raw) clamped++;
      values[i * dims + d] = value;
    }
  }
  return { fields, centre, sd, values, count, clamped };
}

/** The car of one draw. A drawn power scales the whole drive force by its ratio to the car's own. */
export function applyDraw(car: Car, fields: readonly string[], values: ArrayLike<number>, where: string): Car {
  let out = car;
  fields.forEach((field, d) => {
    const value = values[d]!;
    if (field === POWER) out = withDriveScaled(out, value / car.powertrain.maxPowerW);
    else out = writeCarField(out, field, value, where);
  });
  return out;
}
