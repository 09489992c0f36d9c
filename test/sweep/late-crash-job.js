// A pool job for test/sweep/pool.test.ts, in plain JavaScript because worker threads load their job with Node's
// own import: it doubles its value, and the thread that loads it fails on its own 0.3 s later, between jobs, as a
// thread can (an error thrown from a timer).

import { isMainThread } from 'node:worker_threads';

// Only in a pool's thread: the test's own process imports this module too, to hand the job to the pool.
if (!isMainThread)
  setTimeout(() => {
    throw new Error('failed while waiting between jobs');
  }, 300);

export const lateCrashJob = {
  moduleUrl: import.meta.url,
  exportName: 'lateCrashJob',
  width: () => 1,
  run(context, values, out, offset) {
    out[offset] = 2 * values[0];
  },
};
