// Builds dist/ with tsc and records a fingerprint of what the build read (path, size and modification time of
// every source file, the compiler settings and the lock file). With --if-stale the build is skipped when the
// fingerprint is unchanged: `npm run bench` and `npm test` then start at once instead of paying several seconds of
// tsc (tsc's own incremental record, dist/tsconfig.tsbuildinfo, still costs seconds of CPU on a build with nothing
// to do). A build that fails records nothing, so the next one runs again.

import { spawnSync } from 'node:child_process';
import { createRequire } from 'node:module';
import { recordFingerprint, root } from './source-fingerprint.js';
import { builtFrom, currentSources, fingerprintFile } from './build-freshness.js';

const ifStale = process.argv.includes('--if-stale');
const before = currentSources();
if (ifStale && builtFrom(before)) process.exit(0);
const tsc = createRequire(import.meta.url).resolve('typescript/bin/tsc');
const result = spawnSync(process.execPath, [tsc, '-p', 'tsconfig.json'], { cwd: root, stdio: 'inherit' });
if (result.status !== 0) process.exit(result.status ?? 1);
// A file edited while tsc ran leaves the fingerprint of the older state, so the next run builds again.
recordFingerprint(fingerprintFile, before);
