// A small closed segment track written to a file for tests that run the CLI: two 300 m straights joined by
// two half circles of 50 m radius (900 m around).

import { writeFileSync } from 'node:fs';
import { join } from 'node:path';

export function writeTestOval(folder: string, name = 'oval.json'): string {
  const file = join(folder, name);
  writeFileSync(
    file,
    JSON.stringify({
      name: 'test oval',
      closed: true,
      widthM: 12,
      segments: [
        { kind: 'straight', lengthM: 300 },
        { kind: 'arc', radiusM: 50, angleDeg: 180 },
        { kind: 'straight', lengthM: 300 },
        { kind: 'arc', radiusM: 50, angleDeg: 180 },
      ],
    }),
  );
  return file;
}
