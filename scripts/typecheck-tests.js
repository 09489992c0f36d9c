// Type-checks the tests (test/tsconfig.json, which takes in the sources they import) unless nothing they read has
// changed since the last check that passed: `npm test` run again after a change to docs or data skips about 13 s
// of tsc. The record lives under node_modules/.cache, so a clean install checks again.

import { spawnSync } from 'node:child_process';
import { createRequire } from 'node:module';
import path from 'node:path';
import { recordedFingerprintIs, recordFingerprint, root, sourceFingerprint } from './source-fingerprint.js';

const record = path.join(root, 'node_modules', '.cache', 'reflap', 'test-types.fingerprint');
const before = sourceFingerprint(['src', 'test'], ['tsconfig.json', 'package.json', 'package-lock.json']);
if (recordedFingerprintIs(record, before)) process.exit(0);
const tsc = createRequire(import.meta.url).resolve('typescript/bin/tsc');
const result = spawnSync(process.execPath, [tsc, '-p', 'test/tsconfig.json'], { cwd: root, stdio: 'inherit' });
if (result.status !== 0) process.exit(result.status ?? 1);
recordFingerprint(record, before);
