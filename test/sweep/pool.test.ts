// The pool's kept threads: lent to one job at a time, kept between jobs, ended when their job fails. The pool and
// its threads run from the build (dist/), since worker threads load compiled modules.

import { afterAll, describe, expect, it } from 'vitest';
import { runSetups } from '../../dist/src/sweep/pool.js';
import { solvedThreadCount, stopWorkerThreads } from '../../dist/src/sweep/threads.js';
import { throwingJob } from './throwing-job.js';
import { lateCrashJob } from './late-crash-job.js';

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
});
