// The demo's output folder (`reflap demo --out`: the invented driver's log and pages), written once per test run
// and read by every test file that needs it, instead of a `demo` of its own in each (about 2.5 s of CPU apiece).
// It lives in the run's temporary folder (test/global-setup.ts), removed when the run ends, so no file of an older
// build is ever read. Test files only read it; what they write goes to folders of their own.

import { existsSync, mkdirSync, mkdtempSync, readFileSync, renameSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { runCli } from './cli.js';

/** How long a test file waits for another one that is writing the demo (the suite's hook timeout). */
const WAIT_LIMIT_MS = 120_000;

function sleep(ms: number): void {
  Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, ms);
}

/** The folder `reflap demo --out` wrote in this test run; the first caller of the run writes it. */
export function sharedDemoFolder(): string {
  // Outside a vitest run of this configuration there is no run folder: a fresh folder, shared by nothing.
  const runFolder = process.env.REFLAP_TEST_FOLDER ?? mkdtempSync(path.join(tmpdir(), 'reflap-demo-'));
  const folder = path.join(runFolder, 'shared-demo');
  const failure = `${folder}.failed`;
  // mkdir is atomic: the one caller that makes the lock writes the demo, the others wait for its folder.
  let writer = true;
  try {
    mkdirSync(`${folder}.lock`);
  } catch {
    writer = false;
  }
  if (writer) {
    const partial = `${folder}.partial`;
    const run = runCli(['demo', '--out', partial]);
    if (run.code !== 0) {
      writeFileSync(failure, run.stderr);
      throw new Error(`reflap demo for the shared demo folder: exit ${run.code}: ${run.stderr}`);
    }
    // Renamed only once complete, so a waiting file never sees half a demo.
    renameSync(partial, folder);
    return folder;
  }
  for (let waited = 0; !existsSync(folder); waited += 50) {
    if (existsSync(failure)) throw new Error(`the shared demo folder failed: ${readFileSync(failure, 'utf8')}`);
    if (waited > WAIT_LIMIT_MS) throw new Error(`the shared demo folder was not written within ${WAIT_LIMIT_MS} ms`);
    sleep(50);
  }
  return folder;
}
