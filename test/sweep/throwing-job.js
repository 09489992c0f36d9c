// A pool job for test/sweep/pool.test.ts, in plain JavaScript because worker threads load their job with Node's
// own import: it doubles its value and throws on a negative one, as a run that meets an internal error does.

export const throwingJob = {
  moduleUrl: import.meta.url,
  exportName: 'throwingJob',
  width: () => 1,
  run(context, values, out, offset) {
    if (values[0] < 0) throw new Error(`negative value ${values[0]}`);
    out[offset] = 2 * values[0];
  },
};
