// Logs written to files for tests that run the CLI: a circle of positions far from any bundled track.

import { writeFileSync } from 'node:fs';

/** 200 s at 10 Hz round a 100 m circle centred 5 km from the origin: a log that belongs to no test track. */
export function writeOffTrackLog(file: string): string {
  const rows = ['time_s,x_m,y_m,speed_mps'];
  for (let k = 0; k < 2000; k++)
    rows.push(
      `${(k * 0.1).toFixed(1)},${(5000 + 100 * Math.cos(k / 100)).toFixed(2)},${(5000 + 100 * Math.sin(k / 100)).toFixed(2)},30`,
    );
  writeFileSync(file, rows.join('\n') + '\n');
  return file;
}
