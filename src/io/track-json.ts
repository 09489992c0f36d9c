// Reads the segment description of a track (JSON: straights, arcs and transitions, with optional widths,
// corner names and a geo origin), validated with zod; unknown keys are errors that name them.

import path from 'node:path';
import type { z } from 'zod';
import { zodLibrary, type Zod } from './lazy-libraries.js';
import { InputError } from '../errors.js';
import type { TrackGrid } from '../track/types.js';
import { trackFromSegments } from '../track/segments.js';
import type { TrackReadOptions } from './track-read-options.js';

function trackSchemaOf(z: Zod) {
  const positive = z.number().finite().positive();

  const road = { gradePct: z.number().finite().optional(), bankDeg: z.number().finite().optional() };

  const segmentSchema = z.discriminatedUnion('kind', [
    z.strictObject({ kind: z.literal('straight'), lengthM: positive, ...road }),
    z.strictObject({
      kind: z.literal('arc'),
      ...road,
      radiusM: positive,
      angleDeg: z
        .number()
        .finite()
        .refine((v) => v !== 0, 'must not be 0'),
    }),
    z.strictObject({
      kind: z.literal('transition'),
      ...road,
      lengthM: positive,
      startCurvature: z.number().finite(),
      endCurvature: z.number().finite(),
    }),
  ]);

  return z.strictObject({
    name: z.string().min(1),
    description: z.string().optional(),
    closed: z.boolean(),
    widthM: positive.optional(),
    widthLeftM: positive.optional(),
    widthRightM: positive.optional(),
    startHeadingDeg: z.number().finite().optional(),
    origin: z.strictObject({ latDeg: z.number().min(-90).max(90), lonDeg: z.number().min(-180).max(180) }).optional(),
    corners: z.array(z.strictObject({ atM: z.number().finite().nonnegative(), name: z.string().min(1) })).optional(),
    segments: z.array(segmentSchema).min(1),
  });
}

let trackSchema: ReturnType<typeof trackSchemaOf> | undefined;

function fieldPath(parts: PropertyKey[]): string {
  let text = '';
  for (const part of parts)
    text += typeof part === 'number' ? `[${part}]` : text === '' ? String(part) : `.${String(part)}`;
  return text;
}

/** The first zod issue as "source: field: message". */
function issueMessage(issue: z.core.$ZodIssue): string {
  const where = fieldPath(issue.path);
  const prefix = where ? `${where}: ` : '';
  if (issue.code === 'unrecognized_keys') {
    const keys = issue.keys.map((key) => `'${key}'`).join(', ');
    return `${prefix}unknown key${issue.keys.length > 1 ? 's' : ''} ${keys}`;
  }
  if (issue.code === 'invalid_union' && where.endsWith('kind') === false && issue.path.length > 0) {
    return `${prefix}kind must be one of straight, arc, transition`;
  }
  return `${prefix}${issue.message}`;
}

/** Every schema problem after the file's name, each naming its field, joined by '; ' on the one line. */
export function zodMessage(error: z.ZodError, source: string): string {
  return `${source}: ${error.issues.map(issueMessage).join('; ')}`;
}

/** "line L, column C" for a JSON.parse message that gives a position. */
function jsonPlace(text: string, message: string): string {
  const match = /position (\d+)/.exec(message);
  if (!match) return '';
  const position = Number(match[1]);
  const before = text.slice(0, position);
  const line = before.split('\n').length;
  const column = position - before.lastIndexOf('\n');
  return `line ${line}, column ${column}: `;
}

/** JSON.parse with a one-line error that names the file and the line and column. */
export function parseJsonText(text: string, source: string): unknown {
  // A byte-order mark (editors on some systems write one) is not JSON; places are counted after it.
  const body = text.replace(/^\uFEFF/, '');
  try {
    return JSON.parse(body);
  } catch (error) {
    const message = error instanceof Error ? error.message : String(error);
    throw new InputError(`${source}: ${jsonPlace(body, message)}not valid JSON (${message.split('\n')[0]})`);
  }
}

export function parseTrackJson(text: string, source: string, options: TrackReadOptions): TrackGrid {
  const data = parseJsonText(text, source);
  const parsed = (trackSchema ??= trackSchemaOf(zodLibrary())).safeParse(data);
  if (!parsed.success) throw new InputError(zodMessage(parsed.error, source));
  const spec = parsed.data;
  const widthM = spec.widthM ?? options.widthM;
  if ((spec.widthLeftM === undefined) !== (spec.widthRightM === undefined) && spec.widthM === undefined) {
    throw new InputError(
      `${source}: ${spec.widthLeftM === undefined ? 'widthRightM' : 'widthLeftM'} given without the other side (or widthM)`,
    );
  }
  const closed = options.layout === 'auto' ? spec.closed : options.layout === 'closed';
  return trackFromSegments(
    {
      name: spec.name || path.basename(source, path.extname(source)),
      closed,
      widthM,
      widthLeftM: spec.widthLeftM,
      widthRightM: spec.widthRightM,
      segments: spec.segments,
      corners: spec.corners,
      geoOrigin: spec.origin ?? null,
      startHeadingDeg: spec.startHeadingDeg,
    },
    options.stepM,
    source,
  );
}
