// Builds dist/ with tsc and records a fingerprint of what the build read (path, size and modification time of
// every source file, the compiler settings and the lock file). With --if-stale the build is skipped when the
// fingerprint is unchanged: `npm run bench` and `npm test` then start at once instead of paying several seconds of
// tsc (tsc's own incremental record, dist/tsconfig.tsbuildinfo, still costs seconds of CPU on a build with nothing
// to do). A build that fails records nothing, so the next one runs again.

import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync, rmSync } from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import { recordFingerprint, root } from './source-fingerprint.js';
import { builtFrom, currentSources, fingerprintFile } from './build-freshness.js';

/** Whether a compiled file of src/ or bench/ is missing from dist/: tsc's incremental record says only what it built
 * last, so an output deleted since (by hand, or by a tool cleaning one folder) would stay missing. */
function outputMissing() {
  const missingIn = (folder) =>
    readdirSync(path.join(root, folder), { withFileTypes: true }).some((entry) => {
      const relative = path.join(folder, entry.name);
      if (entry.isDirectory()) return missingIn(relative);
      if (!entry.name.endsWith('.ts') || entry.name.endsWith('.d.ts')) return false;
      return !existsSync(path.join(root, 'dist', relative.replace(/\.ts$/, '.js')));
    });
  return ['src', 'bench'].some(missingIn);
}

const ifStale = process.argv.includes('--if-stale');
const before = currentSources();
if (ifStale && builtFrom(before)) process.exit(0);
if (outputMissing()) rmSync(path.join(root, 'dist', 'tsconfig.tsbuildinfo'), { force: true });
const tsc = createRequire(import.meta.url).resolve('typescript/bin/tsc');
const result = spawnSync(process.execPath, [tsc, '-p', 'tsconfig.json'], { cwd: root, stdio: 'inherit' });
if (result.status !== 0) process.exit(result.status ?? 1);
// A file edited while tsc ran leaves the fingerprint of the older state, so the next run builds again.
recordFingerprint(fingerprintFile, before);
