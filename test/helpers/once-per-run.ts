// An expensive fixture written once per test run and read by every test file that needs it, in the run's temporary
// folder (test/global-setup.ts), removed when the run ends, so no file of an older build is ever read. The first
// caller of the run writes it; the others, in either vitest worker, wait for it. Test files only read it.

import { existsSync, mkdirSync, mkdtempSync, readFileSync, renameSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';

/** How long a test file waits for another one that is writing the fixture (the suite's hook timeout). */
const WAIT_LIMIT_MS = 120_000;

function sleep(ms: number): void {
  Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, ms);
}

/** The path of the fixture NAME of this run: `write(partial)` writes it at `partial` (a file or a folder) or throws. */
export function writtenOncePerRun(name: string, write: (partial: string) => void): string {
  // Outside a vitest run of this configuration there is no run folder: a fresh folder, shared by nothing.
  const runFolder = process.env.REFLAP_TEST_FOLDER ?? mkdtempSync(path.join(tmpdir(), 'reflap-fixture-'));
  const target = path.join(runFolder, name);
  const failure = `${target}.failed`;
  // mkdir is atomic: the one caller that makes the lock writes the fixture, the others wait for it.
  let writer = true;
  try {
    mkdirSync(`${target}.lock`);
  } catch {
    writer = false;
  }
  if (writer) {
    const partial = `${target}.partial`;
    try {
      write(partial);
    } catch (error) {
      writeFileSync(failure, String(error));
      throw error;
    }
    // Renamed only once complete, so a waiting file never sees half a fixture.
    renameSync(partial, target);
    return target;
  }
  for (let waited = 0; !existsSync(target); waited += 50) {
    if (existsSync(failure)) throw new Error(`the shared ${name} failed: ${readFileSync(failure, 'utf8')}`);
    if (waited > WAIT_LIMIT_MS) throw new Error(`the shared ${name} was not written within ${WAIT_LIMIT_MS} ms`);
    sleep(50);
  }
  return target;
}
