// A small closed segment track written to a file for tests that run the CLI: two 300 m straights joined by
// two half circles of 50 m radius (900 m around).

import { writeFileSync } from 'node:fs';
import { join } from 'node:path';

/** The oval as a segment track record (the file's content). */
export const TEST_OVAL = {
  name: 'test oval',
  closed: true,
  widthM: 12,
  segments: [
    { kind: 'straight' as const, lengthM: 300 },
    { kind: 'arc' as const, radiusM: 50, angleDeg: 180 },
    { kind: 'straight' as const, lengthM: 300 },
    { kind: 'arc' as const, radiusM: 50, angleDeg: 180 },
  ],
};

export function writeTestOval(folder: string, name = 'oval.json'): string {
  const file = join(folder, name);
  writeFileSync(file, JSON.stringify(TEST_OVAL));
  return file;
}
