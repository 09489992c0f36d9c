// The demo's output folder (`reflap demo --out`: the invented driver's log and pages), written once per test run
// and read by every test file that needs it, instead of a `demo` of its own in each (about 2.5 s of CPU apiece).

import { runCli } from './cli.js';
import { writtenOncePerRun } from './once-per-run.js';

/** The folder `reflap demo --out` wrote in this test run; the first caller of the run writes it. */
export function sharedDemoFolder(): string {
  return writtenOncePerRun('shared-demo', (partial) => {
    const run = runCli(['demo', '--out', partial]);
    if (run.code !== 0) throw new Error(`reflap demo for the shared demo folder: exit ${run.code}: ${run.stderr}`);
  });
}
