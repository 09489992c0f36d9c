// Every test's temporary files go under one folder for the run, removed at the end, so the suite leaves nothing
// behind in the system's temporary folder (os.tmpdir() follows TMPDIR, in the test workers and the CLI runs alike).

import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

export function setup(): () => void {
  const folder = mkdtempSync(join(tmpdir(), 'reflap-tests-'));
  process.env.TMPDIR = folder;
  return () => rmSync(folder, { recursive: true, force: true });
}
