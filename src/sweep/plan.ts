// The list of runs a sweep makes, in a fixed order so that any shard of it, on any machine, numbers its
// runs the same way: the baseline, the central-difference pairs around it, then the grid or the one-at-a-time runs.

import { InputError } from '../errors.js';
import {
  applySetup,
  baseValueOf,
  MAX_SWEEP_RUNS,
  tidy,
  variationValues,
  type SetupBase,
  type Variation,
} from './settings.js';

export type SweepMode = 'grid' | 'one-at-a-time';

/** baseline: the car as given; minus / plus: the pair for one field's central difference; grid / oat: the sweep itself. */
export type RunKind = 'baseline' | 'minus' | 'plus' | 'grid' | 'oat';

export const RUN_KINDS: readonly RunKind[] = ['baseline', 'minus', 'plus', 'grid', 'oat'];

export interface SweepPlan {
  mode: SweepMode;
  fields: string[];
  /** Baseline value of each field (NaN where the car gives none). */
  baseValues: number[];
  /** Half-width of each field's difference pair in the field's units (0: no sensitivity for the field). */
  differenceSteps: number[];
  /** Run kinds and values, run r at kinds[r] and values[r * fields.length + k]. */
  kinds: RunKind[];
  /** Index of the field a minus, plus or one-at-a-time run moves; -1 for the baseline and grid runs. */
  varies: Int16Array;
  values: Float64Array;
  variations: Variation[];
}

export function runCount(plan: SweepPlan): number {
  return plan.kinds.length;
}

export function runValues(plan: SweepPlan, run: number): Float64Array {
  const width = plan.fields.length;
  return plan.values.subarray(run * width, (run + 1) * width);
}

function isValid(base: SetupBase, fields: string[], values: number[]): boolean {
  try {
    applySetup(base, fields, values, 'check');
    return true;
  } catch (error) {
    if (error instanceof InputError) return false;
    throw error;
  }
}

/**
 * Builds the plan. Every run is checked against the car's limits before any is solved, so an invalid
 * setup (a negative mass) fails at once as a one-line error instead of in a worker after an hour.
 */
export function planSweep(base: SetupBase, variations: readonly Variation[], mode: SweepMode): SweepPlan {
  if (variations.length === 0) throw new InputError('--vary: give at least one FIELD=FROM:TO:STEP');
  const fields = variations.map((v) => v.field);
  const duplicate = fields.find((field, k) => fields.indexOf(field) !== k);
  if (duplicate) throw new InputError(`--vary ${duplicate}: the field is varied twice`);
  const axes = variations.map((v) => variationValues(base, v));
  const baseValues = fields.map((field) => baseValueOf(base, field) ?? Number.NaN);
  const width = fields.length;

  const kinds: RunKind[] = [];
  const varied: number[] = [];
  const rows: number[][] = [];
  const push = (kind: RunKind, values: number[], field = -1) => {
    kinds.push(kind);
    varied.push(field);
    rows.push(values);
  };
  push('baseline', baseValues.slice());

  // One pair per field, each the sweep's own step from the baseline; a side that leaves the car's limits
  // (fuel below zero) is replaced by the baseline, giving a one-sided difference there.
  const differenceSteps = variations.map((variation, k) => {
    const baseValue = baseValues[k]!;
    if (!Number.isFinite(baseValue)) return 0;
    return variation.kind === 'percent' ? Math.abs((baseValue * variation.step) / 100) : Math.abs(variation.step);
  });
  for (let k = 0; k < width; k++) {
    const h = differenceSteps[k]!;
    if (h === 0) continue;
    for (const [kind, sign] of [
      ['minus', -1],
      ['plus', 1],
    ] as const) {
      const values = baseValues.slice();
      values[k] = tidy(baseValues[k]! + sign * h);
      push(kind, isValid(base, fields, values) ? values : baseValues.slice(), k);
    }
  }

  if (mode === 'grid') {
    let total = 1;
    for (const axis of axes) total *= axis.length;
    if (total > MAX_SWEEP_RUNS)
      throw new InputError(
        `--vary: the grid has ${total} runs, more than ${MAX_SWEEP_RUNS}; use larger steps or --mode one-at-a-time`,
      );
    const counter = new Array<number>(width).fill(0);
    for (let r = 0; r < total; r++) {
      push(
        'grid',
        counter.map((i, k) => axes[k]![i]!),
      );
      // The last field turns fastest, like nested loops written in the order of the --vary options.
      for (let k = width - 1; k >= 0; k--) {
        counter[k]!++;
        if (counter[k]! < axes[k]!.length) break;
        counter[k] = 0;
      }
    }
  } else {
    for (let k = 0; k < width; k++) {
      if (!Number.isFinite(baseValues[k]!) && width > 1) {
        throw new InputError(
          `--vary ${fields[k]}: the car file gives no value for it, so the other fields have no baseline to hold it at; use --mode grid`,
        );
      }
      for (const value of axes[k]!) {
        const values = baseValues.slice();
        values[k] = value;
        push('oat', values, k);
      }
    }
  }

  for (let r = 0; r < rows.length; r++) {
    if (kinds[r] === 'minus' || kinds[r] === 'plus' || kinds[r] === 'baseline') continue;
    applySetup(base, fields, rows[r]!, `--vary (${kinds[r] === 'grid' ? 'grid' : 'one-at-a-time'} run ${r})`);
  }
  const values = new Float64Array(rows.length * width);
  rows.forEach((row, r) => values.set(row, r * width));
  return {
    mode,
    fields,
    baseValues,
    differenceSteps,
    kinds,
    varies: Int16Array.from(varied),
    values,
    variations: [...variations],
  };
}

export interface Shard {
  /** 0-based shard number. */
  index: number;
  count: number;
}

/** Parses `--shard I/N` with I counted from 1, the way array jobs number their tasks. */
export function parseShard(text: string): Shard {
  const match = /^\s*(\d+)\s*\/\s*(\d+)\s*$/.exec(text);
  if (!match) throw new InputError(`--shard: '${text}' should read I/N, e.g. 2/8`);
  const index = Number(match[1]);
  const count = Number(match[2]);
  if (count < 1) throw new InputError(`--shard: N must be at least 1 (got ${count})`);
  if (index < 1 || index > count)
    throw new InputError(`--shard: I must be between 1 and ${count} (got ${index}); shards count from 1`);
  return { index: index - 1, count };
}

/** The runs of one shard: a contiguous block, so that shards differ in size by at most one run. */
export function shardRange(total: number, shard: Shard): { start: number; end: number } {
  return {
    start: Math.floor((shard.index * total) / shard.count),
    end: Math.floor(((shard.index + 1) * total) / shard.count),
  };
}
