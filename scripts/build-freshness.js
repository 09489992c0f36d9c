// What the build reads and whether dist/ was built from it as it is now (a fingerprint of paths, sizes and times:
// source-fingerprint.js). Shared by the build (scripts/build.js) and the demo's start (scripts/demo.js).

import { existsSync } from 'node:fs';
import path from 'node:path';
import { recordedFingerprintIs, root, sourceFingerprint } from './source-fingerprint.js';

export const fingerprintFile = path.join(root, 'dist', '.source-fingerprint');
// What tsconfig.json's "include" names, plus the files whose change alters what tsc produces.
const sourceFolders = ['src', 'bench'];
const settingsFiles = ['tsconfig.json', 'package.json', 'package-lock.json'];

/** The fingerprint of the build's sources as they are now. */
export function currentSources() {
  return sourceFingerprint(sourceFolders, settingsFiles);
}

/** Whether dist/ exists and was last built from sources with this fingerprint. */
export function builtFrom(fingerprint) {
  return (
    existsSync(path.join(root, 'dist', 'src', 'cli', 'main.js')) && recordedFingerprintIs(fingerprintFile, fingerprint)
  );
}
