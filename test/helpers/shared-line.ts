// The racing line of a track and a car, as `reflap line --out` writes it, computed once per test run and handed to
// the commands of every test file that drives the same reference (`--line FILE`) instead of each run computing the
// same minimum-time line again (about 0.3 s of CPU a run on the demo circuit). `line` computes the line `--line auto`
// does (the same objective, margin and car), so a test whose subject is not the line keeps the racing line's
// reference; the tests of the line itself and of `--line auto` compute it (test/line/, test/cli/line.test.ts).

import path from 'node:path';
import { runCli } from './cli.js';
import { writtenOncePerRun } from './once-per-run.js';

/** The line CSV of TRACK and CAR (files) written in this test run; the first caller of the run writes it. */
export function sharedLineFile(track: string, car: string): string {
  const name = `line-${path.basename(track, path.extname(track))}-${path.basename(car, path.extname(car))}.csv`;
  return writtenOncePerRun(name, (partial) => {
    const run = runCli(['line', '--track', track, '--car', car, '--out', partial]);
    if (run.code !== 0) throw new Error(`reflap line for ${name}: exit ${run.code}: ${run.stderr}`);
  });
}

/** The `--line FILE` arguments that drive a reference on the shared line of TRACK and CAR. */
export const sharedLineArgs = (track: string, car: string): string[] => ['--line', sharedLineFile(track, car)];

/** `--track TRACK --car CAR` with the reference on their shared line. */
export const onSharedLine = (track: string, car: string): string[] => [
  ...['--track', track, '--car', car],
  ...sharedLineArgs(track, car),
];
