// The pool's kept threads: lent to one job at a time, kept between jobs, ended when their job fails. The pool and
// its threads run from the build (dist/), since worker threads load compiled modules.

import { afterAll, describe, expect, it } from 'vitest';
import { runSetups } from '../../dist/src/sweep/pool.js';
import { solvedThreadCount, stopWorkerThreads } from '../../dist/src/sweep/threads.js';
import { throwingJob } from './throwing-job.js';
import { lateCrashJob } from './late-crash-job.js';
import { spinningJob } from './spinning-job.js';
import { availableParallelism } from 'node:os';

const context = { fields: ['x'] };
const values = Float64Array.from({ length: 100 }, (_, k) => k);

afterAll(stopWorkerThreads);

describe('kept worker threads', () => {
  it('serve job after job, each run landing at its own place', async () => {
    const first = await runSetups(throwingJob, context, values, 0, { workers: 2 });
    expect(Array.from(first)).toEqual(Array.from(values, (x) => 2 * x));
    expect(solvedThreadCount()).toBe(2);
    // A second job with other values on the same threads.
    const second = await runSetups(
      throwingJob,
      context,
      values.map((x) => x + 0.5),
      0,
      { workers: 2 },
    );
    expect(second[99]).toBe(199);
    expect(solvedThreadCount()).toBe(2);
  });

  it('ends the threads of a job that failed and starts fresh ones for the next', async () => {
    const withNegative = values.map((x) => (x === 57 ? -1 : x));
    await expect(runSetups(throwingJob, context, withNegative, 0, { workers: 2 })).rejects.toThrow(
      /sweep worker: Error: negative value -1/,
    );
    expect(solvedThreadCount()).toBe(0);
    const after = await runSetups(throwingJob, context, values, 0, { workers: 2 });
    expect(after[57]).toBe(114);
    expect(solvedThreadCount()).toBe(2);
  });

  it('drops a kept thread that fails between jobs, and the process goes on', async () => {
    await stopWorkerThreads();
    const done = await runSetups(lateCrashJob, context, values, 0, { workers: 1 });
    expect(done[99]).toBe(198);
    expect(solvedThreadCount()).toBe(1);
    // The thread fails 0.3 s after it loaded the job, idle by then; an unheard 'error' event would be thrown here.
    await new Promise((resolve) => setTimeout(resolve, 800));
    expect(solvedThreadCount()).toBe(0);
    const after = await runSetups(throwingJob, context, values, 0, { workers: 1 });
    expect(after[99]).toBe(198);
  });

  it('ends every kept thread on request', async () => {
    await runSetups(throwingJob, context, values, 0, { workers: 1 });
    await stopWorkerThreads();
    expect(solvedThreadCount()).toBe(0);
  });

  // Left to the pool, runs that take long enough here (500 of 3 ms: about 1.3 s left after its first 0.2 s, over the
  // 0.8 s a fresh worker costs) go on here beside one worker per other core, each landing at its own place.
  it.skipIf(availableParallelism() < 2)('solve beside this thread when the pool starts them', async () => {
    await stopWorkerThreads();
    const runs = Float64Array.from({ length: 500 }, (_, k) => k);
    const out = await runSetups(spinningJob, { fields: ['x'], spinMs: 3 }, runs);
    const solvedBy = new Set<number>();
    runs.forEach((x, k) => {
      expect(out[2 * k]).toBe(3 * x);
      solvedBy.add(out[2 * k + 1]!);
    });
    expect(solvedBy.has(0)).toBe(true);
    expect(solvedBy.size).toBe(availableParallelism());
    expect(solvedThreadCount()).toBe(availableParallelism() - 1);
  });
});
