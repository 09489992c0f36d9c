// One run of a pool job, solved in the thread that calls it: the same code in the calling thread and in a worker,
// so a run gives the same digits and the same name in its messages wherever it is solved.

import type { PoolContext, PoolJob } from './pool.js';

/** Solves run `r` of `values` (context.fields.length numbers a run) into its place in `out` (job.width a run);
 * `firstRun` numbers the runs of `values` in messages. */
export function solveRun<C extends PoolContext>(
  job: PoolJob<C>,
  context: C,
  values: Float64Array,
  firstRun: number,
  r: number,
  out: Float64Array,
): void {
  const width = context.fields.length;
  const resultWidth = job.width(context);
  job.run(context, values.subarray(r * width, (r + 1) * width), out, r * resultWidth, `sweep run ${firstRun + r}`);
}
