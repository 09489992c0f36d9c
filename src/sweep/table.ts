// A sweep's results as plain records, rounded once to the digits the CSV keeps, so that the table printed
// after a run, the CSV and the table rebuilt from merged shards hold the same numbers; and the
// sensitivities around the baseline by central differences.

import type { CornerZone, LapResult } from '../solve/types.js';
import { mpsToKph } from '../units.js';
import { brakingPointM } from './braking-point.js';
import { outcomeWidth, VALUES_PER_CORNER } from './evaluate.js';
import { runValues, type RunKind, type SweepPlan } from './plan.js';
import { unitOf } from './fields.js';
import { roundToDigits } from '../numeric/round.js';

/** Digits kept after the point: lap time (s), braking point (m), speeds (km/h). */
export const DIGITS = { lapTimeS: 6, brakingPointM: 3, speedKph: 3 } as const;

export interface SweepCorner {
  /** Number of the corner the baseline zone serves, in the track's corner numbering. */
  corner: number;
  /** Unique label of the zone, used in column names: 'c3', or 'c3b' for a second zone of corner 3. */
  tag: string;
  name: string | null;
  /** Baseline braking point (between samples) and slowest point, m along the lap. */
  brakingPointM: number;
  minSpeedAtM: number;
}

export interface SweepMeta {
  trackName: string;
  trackLengthM: number;
  stepM: number;
  carName: string;
  mode: string;
  fields: string[];
  units: string[];
  /** NaN where the car file gives no value. */
  baseValues: number[];
  differenceSteps: number[];
  /** The --vary and --set texts as given. */
  variations: string[];
  settings: string[];
  totalRuns: number;
  corners: SweepCorner[];
}

export interface SweepRecord {
  run: number;
  kind: RunKind;
  /** For minus, plus and oat runs: the field that moves. */
  varies: string;
  values: number[];
  lapTimeS: number;
  /** Per corner; NaN where the corner needs no braking in this run. */
  brakingPointM: number[];
  entrySpeedKph: number[];
  minSpeedKph: number[];
}

export interface SweepTable {
  meta: SweepMeta;
  records: SweepRecord[];
}

export function cornersOf(baseline: LapResult): SweepCorner[] {
  return baseline.brakingZones.map((zone: CornerZone) => ({
    corner: zone.corner,
    tag: zone.tag,
    name: zone.cornerName,
    brakingPointM: roundToDigits(brakingPointM(baseline, zone), DIGITS.brakingPointM),
    minSpeedAtM: roundToDigits(zone.minSpeedAtM, DIGITS.brakingPointM),
  }));
}

export function sweepMeta(input: {
  trackName: string;
  trackLengthM: number;
  stepM: number;
  carName: string;
  plan: SweepPlan;
  settings: string[];
  corners: SweepCorner[];
}): SweepMeta {
  const { plan } = input;
  return {
    trackName: input.trackName,
    trackLengthM: input.trackLengthM,
    stepM: input.stepM,
    carName: input.carName,
    mode: plan.mode,
    fields: plan.fields,
    units: plan.fields.map(unitOf),
    baseValues: plan.baseValues,
    differenceSteps: plan.differenceSteps,
    variations: plan.variations.map((v) => v.text),
    settings: input.settings,
    totalRuns: plan.kinds.length,
    corners: input.corners,
  };
}

/** The field a minus, plus or one-at-a-time run moves ('' for the baseline and grid runs). */
export function variedField(plan: SweepPlan, run: number): string {
  return plan.fields[plan.varies[run]!] ?? '';
}

/** Records of runs [firstRun, firstRun + n) from the packed outcomes the pool returns. */
export function recordsFromOutcomes(
  plan: SweepPlan,
  cornerCount: number,
  outcomes: Float64Array,
  firstRun: number,
): SweepRecord[] {
  const resultWidth = outcomeWidth(cornerCount);
  const runs = outcomes.length / resultWidth;
  const records: SweepRecord[] = [];
  for (let r = 0; r < runs; r++) {
    const run = firstRun + r;
    const at = r * resultWidth;
    const record: SweepRecord = {
      run,
      kind: plan.kinds[run]!,
      varies: variedField(plan, run),
      values: Array.from(runValues(plan, run)),
      lapTimeS: roundToDigits(outcomes[at]!, DIGITS.lapTimeS),
      brakingPointM: [],
      entrySpeedKph: [],
      minSpeedKph: [],
    };
    for (let k = 0; k < cornerCount; k++) {
      const c = at + 1 + VALUES_PER_CORNER * k;
      record.brakingPointM.push(roundToDigits(outcomes[c]!, DIGITS.brakingPointM));
      record.entrySpeedKph.push(roundToDigits(mpsToKph(outcomes[c + 1]!), DIGITS.speedKph));
      record.minSpeedKph.push(roundToDigits(mpsToKph(outcomes[c + 2]!), DIGITS.speedKph));
    }
    records.push(record);
  }
  return records;
}

export type DifferenceScheme = 'central' | 'forward' | 'backward';

export interface Sensitivity {
  field: string;
  unit: string;
  /** Half-width of the difference pair, in the field's unit. */
  stepUsed: number;
  scheme: DifferenceScheme;
  /** Lap time change per unit of the field, s. */
  lapTimeSPerUnit: number;
  /** Per corner: braking point change per unit of the field, m (negative = earlier); null where a run did not brake there. */
  brakingPointMPerUnit: (number | null)[];
}

/** Sensitivities from the baseline and the minus / plus pairs of a complete sweep table. */
export function sensitivities(table: SweepTable): Sensitivity[] {
  const { meta, records } = table;
  const baseline = records.find((r) => r.kind === 'baseline');
  const result: Sensitivity[] = [];
  meta.fields.forEach((field, k) => {
    const minus = records.find((r) => r.kind === 'minus' && r.varies === field);
    const plus = records.find((r) => r.kind === 'plus' && r.varies === field);
    if (!minus || !plus || !baseline) return;
    const dx = plus.values[k]! - minus.values[k]!;
    if (!(dx > 0)) return;
    const base = meta.baseValues[k]!;
    const scheme: DifferenceScheme =
      minus.values[k] === base ? 'forward' : plus.values[k] === base ? 'backward' : 'central';
    result.push({
      field,
      unit: meta.units[k]!,
      stepUsed: meta.differenceSteps[k]!,
      scheme,
      lapTimeSPerUnit: (plus.lapTimeS - minus.lapTimeS) / dx,
      brakingPointMPerUnit: meta.corners.map((_, c) => {
        const shift = plus.brakingPointM[c]! - minus.brakingPointM[c]!;
        return Number.isFinite(shift) ? shift / dx : null;
      }),
    });
  });
  return result;
}
