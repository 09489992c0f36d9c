// Reads a demonstrated-envelope JSON file (written by `reflap envelope`), validated with a zod schema so a bad
// field is named in one line.

import { readTextFile } from './read-text.js';
import { zodLibrary, type Zod } from './lazy-libraries.js';
import { InputError } from '../errors.js';
import type { DemonstratedEnvelopeRecord } from '../car/demonstrated-envelope.js';
import { MAX_ACCEL_MPS2, MAX_COAST_QUADRATIC_PER_M, MAX_SPEED_MPS } from '../car/plausible.js';

/** The envelope file's schema; strict objects: an unknown key is a typo or a file from elsewhere, named rather than
 * ignored. */
function envelopeSchemaOf(z: Zod) {
  const acceleration = z.number().finite().positive().max(MAX_ACCEL_MPS2);
  const speed = z.number().finite().max(MAX_SPEED_MPS);
  const band = z.strictObject({
    speedMps: speed.nonnegative(),
    samples: z.number().int().nonnegative(),
    brakeMps2: acceleration,
    accelMps2: z.number().finite().min(-MAX_ACCEL_MPS2).max(MAX_ACCEL_MPS2),
    leftMps2: acceleration,
    rightMps2: acceleration,
  });

  return z.strictObject({
    format: z.literal('reflap-demonstrated-envelope'),
    version: z.literal(1),
    source: z.string(),
    quantile: z.number().gt(0).lte(1),
    bandWidthMps: speed.positive(),
    topSpeedMps: speed.positive(),
    coast: z.strictObject({
      constantMps2: z.number().finite().nonnegative().max(MAX_ACCEL_MPS2),
      quadraticPerM: z.number().finite().nonnegative().max(MAX_COAST_QUADRATIC_PER_M),
      fitted: z.boolean(),
    }),
    bands: z.array(band).min(1),
    notes: z.array(z.string()).optional(),
  });
}

let schema: ReturnType<typeof envelopeSchemaOf> | undefined;

export function parseEnvelopeJson(text: string, source: string): DemonstratedEnvelopeRecord {
  let data: unknown;
  try {
    data = JSON.parse(text.replace(/^\uFEFF/, ''));
  } catch (error) {
    throw new InputError(`${source}: not valid JSON (${(error as Error).message})`);
  }
  const parsed = (schema ??= envelopeSchemaOf(zodLibrary())).safeParse(data);
  if (!parsed.success) {
    const issue = parsed.error.issues[0]!;
    const where = issue.path.length > 0 ? issue.path.join('.') : 'top level';
    if (issue.code === 'unrecognized_keys') {
      const keys = issue.keys.map((key) => (issue.path.length > 0 ? `${where}.${key}` : key));
      throw new InputError(`${source}: unknown field${keys.length > 1 ? 's' : ''} ${keys.join(', ')}`);
    }
    throw new InputError(`${source}: field ${where}: ${issue.message}`);
  }
  return parsed.data as DemonstratedEnvelopeRecord;
}

export function readEnvelopeFile(file: string): DemonstratedEnvelopeRecord {
  return parseEnvelopeJson(readTextFile(file, 'envelope file', 'envelope'), file);
}
