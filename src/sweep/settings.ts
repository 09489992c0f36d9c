// Parsing of setup changes (`FIELD=VALUE`, `FIELD=FROM:TO:STEP`) and their application to a car and its air.
// A value is absolute (1400), a signed difference (+20, -0.1) or a signed percentage (+5%, -5%).

import type { Ambient, Car } from '../car/types.js';
import { ambientFrom } from '../car/ambient.js';
import { validateCar } from '../car/validate.js';
import { InputError } from '../errors.js';
import { checkField, isAmbientField, readCarField, writeCarField } from './fields.js';

export type ValueKind = 'absolute' | 'delta' | 'percent';

export interface ValueSpec {
  kind: ValueKind;
  amount: number;
}

/** One `--set FIELD=VALUE`. */
export interface Setting {
  field: string;
  value: ValueSpec;
  text: string;
}

/** One `--vary FIELD=FROM:TO:STEP`; from, to and step count in the same kind (absolute, delta or percent). */
export interface Variation {
  field: string;
  kind: ValueKind;
  from: number;
  to: number;
  step: number;
  text: string;
}

/** The air a setup starts from; ambientFrom() turns it into densities and the power factor. */
export interface AirInputs {
  airTempC: number;
  pressureHpa: number;
}

/** The car and air every change is counted from. */
export interface SetupBase {
  car: Car;
  air: AirInputs;
}

/** Most runs a single sweep may plan, so a typo in a step does not start a week-long job. */
export const MAX_SWEEP_RUNS = 1_000_000;

const NUMBER = /^[+-]?(\d+(\.\d*)?|\.\d+)(e[+-]?\d+)?$/i;

function parseNumber(text: string, where: string): number {
  const trimmed = text.trim();
  if (!NUMBER.test(trimmed)) throw new InputError(`${where}: '${text}' is not a number`);
  return Number(trimmed);
}

/** Parses one value: `1400` absolute, `+20` / `-20` a difference, `+5%` / `-5%` a percentage, `(-0.5)` a negative absolute. */
export function parseValueSpec(text: string, where: string): ValueSpec {
  const trimmed = text.trim();
  if (trimmed === '') throw new InputError(`${where}: missing value`);
  if (trimmed.startsWith('(') && trimmed.endsWith(')')) {
    return { kind: 'absolute', amount: parseNumber(trimmed.slice(1, -1), where) };
  }
  const signed = trimmed.startsWith('+') || trimmed.startsWith('-');
  if (trimmed.endsWith('%')) {
    if (!signed)
      throw new InputError(
        `${where}: '${text}' is ambiguous; write +${trimmed} or -${trimmed} for a change in percent`,
      );
    return { kind: 'percent', amount: parseNumber(trimmed.slice(0, -1), where) };
  }
  return { kind: signed ? 'delta' : 'absolute', amount: parseNumber(trimmed, where) };
}

function splitAssignment(text: string, where: string): { field: string; rest: string } {
  const at = text.indexOf('=');
  if (at <= 0) throw new InputError(`${where}: '${text}' should read FIELD=VALUE`);
  const field = text.slice(0, at).trim();
  checkField(field, where);
  return { field, rest: text.slice(at + 1) };
}

export function parseSetting(text: string, where = '--set'): Setting {
  const { field, rest } = splitAssignment(text, where);
  return { field, value: parseValueSpec(rest, `${where} ${field}`), text };
}

export function parseVariation(text: string, where = '--vary'): Variation {
  const { field, rest } = splitAssignment(text, where);
  const place = `${where} ${field}`;
  const parts = rest.split(':');
  if (parts.length !== 3) throw new InputError(`${place}: '${rest}' should read FROM:TO:STEP`);
  const from = parseValueSpec(parts[0]!, place);
  const to = parseValueSpec(parts[1]!, place);
  if (from.kind !== to.kind) {
    throw new InputError(`${place}: FROM and TO must both be absolute, both signed differences or both percentages`);
  }
  const stepText = parts[2]!.trim();
  const stepIsPercent = stepText.endsWith('%');
  if (stepIsPercent && from.kind !== 'percent')
    throw new InputError(`${place}: a step in percent needs FROM and TO in percent`);
  const step = parseNumber(stepIsPercent ? stepText.slice(0, -1) : stepText, place);
  if (step === 0) throw new InputError(`${place}: step is zero`);
  if ((to.amount - from.amount) * step < 0) {
    throw new InputError(`${place}: step ${step} has the wrong sign to go from ${from.amount} to ${to.amount}`);
  }
  return { field, kind: from.kind, from: from.amount, to: to.amount, step, text };
}

/** Keeps 12 significant digits so that 0.1 + 0.2 style noise does not leak into CSV columns. */
export function tidy(value: number): number {
  return value === 0 ? 0 : Number(value.toPrecision(12));
}

/** The amounts a variation walks through, from FROM to TO inclusive (TO kept when the steps land on it). */
export function variationAmounts(variation: Variation): number[] {
  const span = (variation.to - variation.from) / variation.step;
  const count = Math.floor(span + 1e-9) + 1;
  if (count > MAX_SWEEP_RUNS)
    throw new InputError(`--vary ${variation.field}: ${count} values is more than ${MAX_SWEEP_RUNS}`);
  const amounts: number[] = [];
  for (let i = 0; i < count; i++) amounts.push(tidy(variation.from + i * variation.step));
  return amounts;
}

export function resolveValue(base: number | null, spec: ValueSpec, where: string): number {
  if (spec.kind === 'absolute') return spec.amount;
  if (base === null)
    throw new InputError(`${where}: the car file gives no value to change; set an absolute value instead`);
  if (spec.kind === 'percent' && base === 0 && spec.amount !== 0) {
    throw new InputError(
      `${where}: a change in percent of 0 leaves it 0; set an absolute value or a signed difference instead`,
    );
  }
  return tidy(spec.kind === 'delta' ? base + spec.amount : base * (1 + spec.amount / 100));
}

/** The baseline value of a field (car or air). */
export function baseValueOf(base: SetupBase, field: string): number | null {
  return isAmbientField(field) ? base.air[field] : readCarField(base.car, field);
}

/** The absolute values a variation walks through. */
export function variationValues(base: SetupBase, variation: Variation): number[] {
  const baseValue = baseValueOf(base, variation.field);
  return variationAmounts(variation).map((amount) =>
    resolveValue(baseValue, { kind: variation.kind, amount }, `--vary ${variation.field}`),
  );
}

/** The base's air as inputs, from an Ambient the loaders built. */
export function airInputsOf(ambient: Ambient): AirInputs {
  return { airTempC: ambient.airTempC, pressureHpa: ambient.pressureHpa };
}

function checkAir(air: AirInputs, where: string): void {
  if (!(air.airTempC > -60 && air.airTempC < 70))
    throw new InputError(`${where}: airTempC ${air.airTempC} °C is outside -60 to 70 °C`);
  if (!(air.pressureHpa > 300 && air.pressureHpa < 1200))
    throw new InputError(`${where}: pressureHpa ${air.pressureHpa} hPa is outside 300 to 1200 hPa`);
}

/** The car and air with absolute `values` put into `fields`, not yet checked. */
function writeSetup(
  base: SetupBase,
  fields: readonly string[],
  values: ArrayLike<number>,
  where: string,
): { car: Car; air: AirInputs; airChanged: boolean } {
  let car = base.car;
  const air: AirInputs = { ...base.air };
  let airChanged = false;
  for (let k = 0; k < fields.length; k++) {
    const field = fields[k]!;
    const value = values[k]!;
    // NaN stands for "as the car file gives it" (a field the file leaves empty, in the baseline run).
    if (Number.isNaN(value)) continue;
    if (!Number.isFinite(value)) throw new InputError(`${where}: ${field} = ${value} is not a finite number`);
    if (isAmbientField(field)) {
      air[field] = value;
      airChanged = true;
    } else {
      car = writeCarField(car, field, value, where);
    }
  }
  return { car, air, airChanged };
}

/**
 * The car and air with absolute `values` put into `fields`; the changed car is validated again, so a
 * change that makes it invalid (a negative mass, mu of zero) is a one-line InputError naming the field.
 * A NaN value leaves its field as the base has it.
 */
export function applySetup(
  base: SetupBase,
  fields: readonly string[],
  values: ArrayLike<number>,
  where: string,
): { car: Car; ambient: Ambient } {
  const { car, air, airChanged } = writeSetup(base, fields, values, where);
  const checked =
    car === base.car
      ? car
      : validateCar(car, () => `${where} (${fields.map((f, k) => `${f}=${values[k]}`).join(', ')})`);
  if (airChanged) checkAir(air, where);
  return { car: checked, ambient: ambientFrom(air) };
}

/**
 * applySetup for a run whose values were checked before any run was solved: planSweep passes every run through
 * applySetup, and a stint's fuel loads stay between an empty and the starting tank. The solver still checks the car
 * at its entry (simulate, simulateLapTime), so checking here as well would check every run's car twice.
 */
export function applyCheckedSetup(
  base: SetupBase,
  fields: readonly string[],
  values: ArrayLike<number>,
  where: string,
): { car: Car; ambient: Ambient } {
  const { car, air } = writeSetup(base, fields, values, where);
  return { car, ambient: ambientFrom(air) };
}

/** Applies `--set` settings one after another (a later one sees the earlier ones). */
export function applySettings(
  base: SetupBase,
  settings: readonly Setting[],
): { car: Car; ambient: Ambient; fields: string[]; values: number[] } {
  let current: SetupBase = base;
  const fields: string[] = [];
  const values: number[] = [];
  for (const setting of settings) {
    const value = resolveValue(baseValueOf(current, setting.field), setting.value, `--set ${setting.field}`);
    fields.push(setting.field);
    values.push(value);
    const applied = applySetup(current, [setting.field], [value], `--set ${setting.text}`);
    current = {
      car: applied.car,
      air: isAmbientField(setting.field) ? { ...current.air, [setting.field]: value } : current.air,
    };
  }
  return { ...applySetup(base, fields, values, '--set'), fields, values };
}

/** The base every run starts from: the loaded car and air with fixed `--set` changes applied. */
export function setupBaseFrom(car: Car, ambient: Ambient, settings: readonly Setting[]): SetupBase {
  const loaded: SetupBase = { car, air: airInputsOf(ambient) };
  if (settings.length === 0) return loaded;
  const fixed = applySettings(loaded, settings);
  return { car: fixed.car, air: airInputsOf(fixed.ambient) };
}
