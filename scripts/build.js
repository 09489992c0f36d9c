// Builds dist/ with tsc and records a fingerprint of what the build read (path, size and modification time of
// every source file, the compiler settings and the lock file). With --if-stale the build is skipped when the
// fingerprint is unchanged: `npm run demo` then starts at once instead of paying several seconds of tsc
// (tsc's own incremental mode still costs seconds of CPU on a build with nothing to do).

import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const fingerprintFile = path.join(root, 'dist', '.source-fingerprint');
// What tsconfig.json's "include" names, plus the files whose change alters what tsc produces.
const sourceFolders = ['src', 'bench'];
const settingsFiles = ['tsconfig.json', 'package.json', 'package-lock.json'];

function listFiles(folder, out) {
  for (const entry of readdirSync(folder, { withFileTypes: true })) {
    const full = path.join(folder, entry.name);
    if (entry.isDirectory()) listFiles(full, out);
    else out.push(full);
  }
  return out;
}

function sourceFingerprint() {
  const files = [];
  for (const folder of sourceFolders) {
    const full = path.join(root, folder);
    if (existsSync(full)) listFiles(full, files);
  }
  for (const file of settingsFiles) {
    const full = path.join(root, file);
    if (existsSync(full)) files.push(full);
  }
  files.sort();
  const hash = createHash('sha256');
  for (const file of files) {
    const stat = statSync(file);
    hash.update(`${path.relative(root, file)}\0${stat.size}\0${stat.mtimeMs}\n`);
  }
  return hash.digest('hex');
}

function isFresh(fingerprint) {
  if (!existsSync(path.join(root, 'dist', 'src', 'cli', 'main.js'))) return false;
  try {
    return readFileSync(fingerprintFile, 'utf8').trim() === fingerprint;
  } catch {
    return false;
  }
}

const ifStale = process.argv.includes('--if-stale');
const before = sourceFingerprint();
if (ifStale && isFresh(before)) process.exit(0);
const tsc = createRequire(import.meta.url).resolve('typescript/bin/tsc');
const result = spawnSync(process.execPath, [tsc, '-p', 'tsconfig.json'], { cwd: root, stdio: 'inherit' });
if (result.status !== 0) process.exit(result.status ?? 1);
// A file edited while tsc ran leaves the fingerprint of the older state, so the next run builds again.
mkdirSync(path.dirname(fingerprintFile), { recursive: true });
writeFileSync(fingerprintFile, before + '\n');
