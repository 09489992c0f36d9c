// Every test's temporary files go under one folder for the run, removed at the end, so the suite leaves nothing
// behind in the system's temporary folder (os.tmpdir() follows TMPDIR, in the test workers and the CLI runs alike).
// Each project of the run (vitest.config.ts) calls this; the first makes the folder and the others use it, since a
// folder inside a folder would make Chromium's socket path too long for the browser tests.

import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

export function setup(): () => void {
  if (process.env.REFLAP_TEST_FOLDER) return () => {};
  const folder = mkdtempSync(join(tmpdir(), 'reflap-tests-'));
  process.env.TMPDIR = folder;
  process.env.REFLAP_TEST_FOLDER = folder;
  return () => rmSync(folder, { recursive: true, force: true });
}
