// A pool job for test/sweep/pool.test.ts, in plain JavaScript because worker threads load their job with Node's
// own import: each run holds its thread for the context's spinMs (by the clock, as a long lap would) and writes
// three times its value and the number of the thread that solved it (0: the calling thread).

import { threadId } from 'node:worker_threads';

export const spinningJob = {
  moduleUrl: import.meta.url,
  exportName: 'spinningJob',
  width: () => 2,
  run(context, values, out, offset) {
    const until = performance.now() + context.spinMs;
    while (performance.now() < until);
    out[offset] = 3 * values[0];
    out[offset + 1] = threadId;
  },
};
