// `--line auto|FILE` for the commands that run a reference lap: auto optimises a racing line for the car
// (minimum time), a file gives the line's offsets from the centreline (read by src/io/read-line.ts).

import type { Ambient, Car } from '../../car/types.js';
import type { Path, TrackGrid } from '../../track/types.js';
import { racingLine } from '../../line/racing-line.js';
import { linePath } from '../../line/geometry.js';
import { readLineFile } from '../../io/read-line.js';

export function resolveLinePath(line: string, track: TrackGrid, car: Car, ambient: Ambient): Path {
  if (line === 'auto') return racingLine(track, car, { ambient }).path;
  return linePath(track, readLineFile(line, track));
}
