// The setup fields a what-if or a sweep may change: dotted paths into the Car record, plus the air.
// Reading and writing go through these paths so the CLI, the worker threads and the CSV share one naming.

import type { Car } from '../car/types.js';
import { InputError } from '../errors.js';

/** Air fields: they feed ambientFrom(), not the car. */
export const AMBIENT_FIELDS = ['airTempC', 'pressureHpa'] as const;
export type AmbientField = (typeof AMBIENT_FIELDS)[number];

/** Numeric leaves of the Car record, by dotted path, with the unit a change is counted in. */
export const CAR_FIELDS: Readonly<Record<string, string>> = {
  massKg: 'kg',
  frontWeightFraction: '1',
  cgHeightM: 'm',
  wheelbaseM: 'm',
  widthM: 'm',
  trackFrontM: 'm',
  trackRearM: 'm',
  rollStiffnessFrontFraction: '1',
  rollingResistanceCoeff: '1',
  'tyre.muLong': '1',
  'tyre.muLat': '1',
  'tyre.ggExponent': '1',
  'tyre.loadSensitivity': '1/N',
  'tyre.corneringStiffnessFrontNPerRad': 'N/rad',
  'tyre.corneringStiffnessRearNPerRad': 'N/rad',
  'aero.dragAreaM2': 'm^2',
  'aero.liftAreaM2': 'm^2',
  'aero.frontDownforceFraction': '1',
  'powertrain.maxPowerW': 'W',
  'powertrain.drivetrainEfficiency': '1',
  'powertrain.gearing.finalDrive': '1',
  'powertrain.gearing.wheelRadiusM': 'm',
  'powertrain.gearing.shiftTimeS': 's',
  'powertrain.gearing.maxRpm': 'rpm',
  'brakes.maxDecelG': 'g',
  'brakes.frontBias': '1',
  'fuel.massKg': 'kg',
  'fuel.burnKgPerLap': 'kg/lap',
};

const AMBIENT_UNITS: Readonly<Record<AmbientField, string>> = { airTempC: '°C', pressureHpa: 'hPa' };

export const ALL_FIELDS: readonly string[] = [...Object.keys(CAR_FIELDS), ...AMBIENT_FIELDS];

export function isAmbientField(field: string): field is AmbientField {
  return (AMBIENT_FIELDS as readonly string[]).includes(field);
}

export function unitOf(field: string): string {
  return isAmbientField(field) ? AMBIENT_UNITS[field] : (CAR_FIELDS[field] ?? '');
}

/** Levenshtein edit distance, for "did you mean" hints. */
export function editDistance(a: string, b: string): number {
  const previous = new Array<number>(b.length + 1);
  for (let j = 0; j <= b.length; j++) previous[j] = j;
  for (let i = 1; i <= a.length; i++) {
    let diagonal = previous[0]!;
    previous[0] = i;
    for (let j = 1; j <= b.length; j++) {
      const above = previous[j]!;
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      previous[j] = Math.min(above + 1, previous[j - 1]! + 1, diagonal + cost);
      diagonal = above;
    }
  }
  return previous[b.length]!;
}

/** The known field nearest to `name`: by edit distance, case-insensitively, also against the last path part. */
export function closestField(name: string): string {
  const lower = name.toLowerCase();
  let best = ALL_FIELDS[0]!;
  let bestScore = Infinity;
  for (const field of ALL_FIELDS) {
    const whole = editDistance(lower, field.toLowerCase());
    const leaf = editDistance(lower, field.slice(field.lastIndexOf('.') + 1).toLowerCase()) + 0.5;
    const score = Math.min(whole, leaf);
    if (score < bestScore) {
      bestScore = score;
      best = field;
    }
  }
  return best;
}

/** Throws a one-line InputError naming the closest known field when `field` is not one. */
export function checkField(field: string, where: string): void {
  if (ALL_FIELDS.includes(field)) return;
  throw new InputError(
    `${where}: unknown field '${field}'; did you mean '${closestField(field)}'? (see docs/setup-sweeps.md for the list)`,
  );
}

/** The car's current value of a car field; null where the car file gives none (e.g. no gearing). */
export function readCarField(car: Car, field: string): number | null {
  let node: unknown = car;
  for (const part of field.split('.')) {
    if (node === null || typeof node !== 'object') return null;
    node = (node as Record<string, unknown>)[part];
  }
  return typeof node === 'number' ? node : null;
}

/** A copy of the car with one field set; copies only the records on the path, so the rest is shared. */
export function writeCarField(car: Car, field: string, value: number, where: string): Car {
  const parts = field.split('.');
  const write = (node: Record<string, unknown>, depth: number): Record<string, unknown> => {
    const key = parts[depth]!;
    if (depth === parts.length - 1) return { ...node, [key]: value };
    const child = node[key];
    if (child === null || typeof child !== 'object') {
      throw new InputError(
        `${where}: the car gives no '${parts.slice(0, depth + 1).join('.')}' record, so '${field}' cannot be set`,
      );
    }
    return { ...node, [key]: write(child as Record<string, unknown>, depth + 1) };
  };
  return write(car as unknown as Record<string, unknown>, 0) as unknown as Car;
}
