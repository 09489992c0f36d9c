// Reads a corners file (written by `reflap corners --out`, then edited by the user) and checks it against the
// track it is used with; every problem names the file and the entry.

import { zodLibrary, type Zod } from './lazy-libraries.js';
import { InputError } from '../errors.js';
import type { TrackGrid } from '../track/types.js';
import type { CornerLayout } from '../track/corner-layout.js';
import { cornerLayoutFromSpec, CORNERS_FORMAT } from '../track/corner-spec.js';
import { readTextFile } from './read-text.js';
import { parseJsonText, zodMessage } from './track-json.js';

function cornersSchemaOf(z: Zod) {
  const station = z.number().finite();

  return z.strictObject({
    format: z.literal(CORNERS_FORMAT),
    track: z.string().optional(),
    lengthM: z.number().finite().positive().optional(),
    corners: z.array(
      z.strictObject({
        number: z.number().int().positive().optional(),
        name: z.string().min(1).nullable().optional(),
        direction: z.enum(['left', 'right']).optional(),
        entryM: station,
        apexM: station,
        exitM: station,
        radiusM: z.number().positive().nullable().optional(),
        marker: z.strictObject({ name: z.string().min(1), atM: station }).optional(),
      }),
    ),
    sectors: z.array(z.strictObject({ name: z.string().min(1).optional(), startM: station })).optional(),
  });
}

let cornersSchema: ReturnType<typeof cornersSchemaOf> | undefined;

export function parseCornersText(text: string, source: string, track: TrackGrid): CornerLayout {
  const data = parseJsonText(text, source);
  const parsed = (cornersSchema ??= cornersSchemaOf(zodLibrary())).safeParse(data);
  if (!parsed.success) throw new InputError(zodMessage(parsed.error, source));
  return cornerLayoutFromSpec(track, parsed.data, source);
}

export function readCornersFile(file: string, track: TrackGrid): CornerLayout {
  return parseCornersText(readTextFile(file, 'corners file', 'track'), file, track);
}
