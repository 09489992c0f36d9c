// Reads a demonstrated-envelope JSON file (written by `reflap envelope`), validated with a zod schema so a bad
// field is named in one line.

import { readTextFile } from './read-text.js';
import { z } from 'zod';
import { InputError } from '../errors.js';
import type { DemonstratedEnvelopeRecord } from '../car/demonstrated-envelope.js';

const positive = z.number().finite().positive();
const band = z.object({
  speedMps: z.number().finite().nonnegative(),
  samples: z.number().int().nonnegative(),
  brakeMps2: positive,
  accelMps2: z.number().finite(),
  leftMps2: positive,
  rightMps2: positive,
});

const schema = z.object({
  format: z.literal('reflap-demonstrated-envelope'),
  version: z.literal(1),
  source: z.string(),
  quantile: z.number().gt(0).lte(1),
  bandWidthMps: positive,
  topSpeedMps: positive,
  coast: z.object({
    constantMps2: z.number().finite().nonnegative(),
    quadraticPerM: z.number().finite().nonnegative(),
    fitted: z.boolean(),
  }),
  bands: z.array(band).min(1),
  notes: z.array(z.string()).optional(),
});

export function parseEnvelopeJson(text: string, source: string): DemonstratedEnvelopeRecord {
  let data: unknown;
  try {
    data = JSON.parse(text.replace(/^\uFEFF/, ''));
  } catch (error) {
    throw new InputError(`${source}: not valid JSON (${(error as Error).message})`);
  }
  const parsed = schema.safeParse(data);
  if (!parsed.success) {
    const issue = parsed.error.issues[0]!;
    const where = issue.path.length > 0 ? issue.path.join('.') : 'top level';
    throw new InputError(`${source}: field ${where}: ${issue.message}`);
  }
  return parsed.data as DemonstratedEnvelopeRecord;
}

export function readEnvelopeFile(file: string): DemonstratedEnvelopeRecord {
  return parseEnvelopeJson(readTextFile(file, 'envelope file', 'envelope'), file);
}
