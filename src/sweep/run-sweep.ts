// A whole sweep (or one shard of it) from the base car and the variations: plan, baseline lap, runs across
// the worker pool, and the records in run order. The library entry behind `reflap sweep`.

import type { Path, TrackGrid } from '../track/types.js';
import type { LapResult } from '../solve/types.js';
import { planSweep, runCount, shardRange, type Shard, type SweepMode, type SweepPlan } from './plan.js';
import { defaultContext, outcomeWidth, solveSetup, sweepJob, writeOutcome, type SweepContext } from './evaluate.js';
import { runSetups, startWorkersEarly, type RunOptions } from './pool.js';
import { cornersOf, recordsFromOutcomes, sweepMeta, type SweepTable } from './table.js';
import type { SetupBase, Variation } from './settings.js';

export interface SweepInput {
  track: TrackGrid;
  /** The car and air every run starts from (after any --set). */
  base: SetupBase;
  variations: readonly Variation[];
  mode?: SweepMode;
  /** Texts of fixed changes already in `base`, recorded in the CSV. */
  settings?: readonly string[];
  startSpeedMps?: number;
  path?: Path;
  shard?: Shard;
  matchToleranceM?: number;
}

export interface SweepOutput {
  plan: SweepPlan;
  baseline: LapResult;
  /** Records of the runs in this shard (all runs when unsharded), in run order. */
  table: SweepTable;
  /** Whether the table holds every run of the sweep. */
  complete: boolean;
}

export function prepareSweep(input: SweepInput): { plan: SweepPlan; baseline: LapResult; context: SweepContext } {
  const plan = planSweep(input.base, input.variations, input.mode ?? 'grid');
  const partial = {
    track: input.track,
    base: input.base,
    fields: plan.fields,
    startSpeedMps: input.startSpeedMps ?? 0,
    ...(input.path ? { path: input.path } : {}),
  };
  const baseline = solveSetup(partial, plan.values.subarray(0, plan.fields.length), 'sweep baseline');
  const context = defaultContext({
    ...partial,
    corners: baseline.brakingZones,
    ...(input.matchToleranceM !== undefined ? { matchToleranceM: input.matchToleranceM } : {}),
  });
  return { plan, baseline, context };
}

export async function runSweep(input: SweepInput, options: RunOptions = {}): Promise<SweepOutput> {
  startWorkersEarly(sweepJob, options);
  const { plan, baseline, context } = prepareSweep(input);
  const total = runCount(plan);
  const { start, end } = input.shard ? shardRange(total, input.shard) : { start: 0, end: total };
  const outcomes = await solveShard(plan, baseline, context, start, end, options);
  const meta = sweepMeta({
    trackName: input.track.name,
    trackLengthM: input.track.lengthM,
    stepM: input.track.stepM,
    carName: input.base.car.name,
    plan,
    settings: [...(input.settings ?? [])],
    corners: cornersOf(baseline),
  });
  const records = recordsFromOutcomes(plan, context.corners.length, outcomes, start);
  return { plan, baseline, table: { meta, records }, complete: start === 0 && end === total };
}

/** The shard's outcomes; run 0 is the baseline already solved, so the pool gets only the runs after it. */
async function solveShard(
  plan: SweepPlan,
  baseline: LapResult,
  context: SweepContext,
  start: number,
  end: number,
  options: RunOptions,
): Promise<Float64Array> {
  const width = plan.fields.length;
  if (start > 0 || end <= start || width === 0)
    return runSetups(sweepJob, context, plan.values.slice(start * width, end * width), start, options);
  const resultWidth = outcomeWidth(context.corners.length);
  const { onProgress } = options;
  const rest = await runSetups(sweepJob, context, plan.values.slice(width, end * width), 1, {
    ...options,
    ...(onProgress ? { onProgress: (done: number, total: number) => onProgress(done + 1, total + 1) } : {}),
  });
  const outcomes = new Float64Array((end - start) * resultWidth);
  writeOutcome(context, baseline, outcomes, 0);
  outcomes.set(rest, resultWidth);
  return outcomes;
}
