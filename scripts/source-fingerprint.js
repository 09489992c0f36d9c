// A fingerprint of what a step read (path, size and modification time of every file under some folders, plus a
// few single files), so a step whose inputs have not changed since it last succeeded can be skipped. Used by the
// build (scripts/build.js) and the tests' type-check (scripts/typecheck-tests.js).

import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

export const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

function listFiles(folder, out) {
  for (const entry of readdirSync(folder, { withFileTypes: true })) {
    const full = path.join(folder, entry.name);
    if (entry.isDirectory()) listFiles(full, out);
    else out.push(full);
  }
  return out;
}

/** The fingerprint of every file under `folders` and of `files` (paths relative to the project's root). */
export function sourceFingerprint(folders, files) {
  const found = [];
  for (const folder of folders) {
    const full = path.join(root, folder);
    if (existsSync(full)) listFiles(full, found);
  }
  for (const file of files) {
    const full = path.join(root, file);
    if (existsSync(full)) found.push(full);
  }
  found.sort();
  const hash = createHash('sha256');
  for (const file of found) {
    const stat = statSync(file);
    hash.update(`${path.relative(root, file)}\0${stat.size}\0${stat.mtimeMs}\n`);
  }
  return hash.digest('hex');
}

/** Whether `record` holds `fingerprint` (the step last succeeded on the same inputs). */
export function recordedFingerprintIs(record, fingerprint) {
  try {
    return readFileSync(record, 'utf8').trim() === fingerprint;
  } catch {
    return false;
  }
}

export function recordFingerprint(record, fingerprint) {
  mkdirSync(path.dirname(record), { recursive: true });
  writeFileSync(record, fingerprint + '\n');
}
