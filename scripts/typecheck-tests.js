// Type-checks the tests (test/tsconfig.json) unless nothing they read has changed since the last check that passed:
// `npm test` run again after a change to docs or data skips the check. The tests see src through the declarations
// the build writes (a project reference), so src is checked once, by the build, and this script builds first where
// dist/ is stale: a check against the declarations of an older src would pass what the current one fails. The
// record and tsc's own incremental record live under node_modules/.cache, so a clean install checks everything.

import { spawnSync } from 'node:child_process';
import { createRequire } from 'node:module';
import path from 'node:path';
import { recordedFingerprintIs, recordFingerprint, root, sourceFingerprint } from './source-fingerprint.js';
import { builtFrom, currentSources } from './build-freshness.js';

const node = (args) => spawnSync(process.execPath, args, { cwd: root, stdio: 'inherit' }).status ?? 1;

if (!builtFrom(currentSources())) {
  const status = node([path.join(root, 'scripts', 'build.js')]);
  if (status !== 0) process.exit(status);
}
const record = path.join(root, 'node_modules', '.cache', 'reflap', 'test-types.fingerprint');
// What test/tsconfig.json takes in: the tests, the docs' example scripts, and src (through the build).
const before = sourceFingerprint(
  ['src', 'test', 'docs/examples'],
  ['tsconfig.json', 'package.json', 'package-lock.json'],
);
if (recordedFingerprintIs(record, before)) process.exit(0);
const status = node([createRequire(import.meta.url).resolve('typescript/bin/tsc'), '-p', 'test/tsconfig.json']);
if (status !== 0) process.exit(status);
recordFingerprint(record, before);
