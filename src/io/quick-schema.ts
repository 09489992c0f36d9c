// A small validator for the part of zod's API that the car file's schema uses, giving the issues zod 4 gives
// (code, path, English message, in zod's order) without loading zod: `reflap check` validates car files with it
// and starts in a fraction of the time, while every other command keeps zod itself. The same schema function
// builds both (read-car.ts); test/io/quick-schema.test.ts holds the two to the same verdicts and messages on
// valid and mutated car files. What it follows is zod 4's parse order: an object's keys in the schema's order,
// then its unknown keys as one issue; a value's type first, then its bounds only when the type held (length bounds
// run on anything with a length, as zod's do).

import type { Zod } from './lazy-libraries.js';

/** One problem, shaped as the car reader reads zod's issues (which, as zod hands them out, do not carry the input). */
export interface QuickIssue {
  code: 'invalid_type' | 'invalid_value' | 'too_small' | 'too_big' | 'unrecognized_keys';
  path: PropertyKey[];
  message: string;
  keys?: string[];
  /** False where the issue stops the bounds that follow (zod's "aborted" payload). */
  soft: boolean;
}

type QuickResult = { success: true; data: unknown } | { success: false; error: { issues: QuickIssue[] } };

type Bound = (value: unknown) => QuickIssue | null;

interface QuickSchema {
  optionalKey: boolean;
  run(value: unknown): QuickIssue[];
  /** What zod hands back for a value that passed: fresh records and arrays (a record drops a __proto__ key). */
  out(value: unknown): unknown;
  optional(): QuickSchema;
  finite(): QuickSchema;
  positive(): QuickSchema;
  nonnegative(): QuickSchema;
  gt(limit: number): QuickSchema;
  lt(limit: number): QuickSchema;
  min(limit: number): QuickSchema;
  max(limit: number): QuickSchema;
  safeParse(value: unknown): QuickResult;
}

/** zod's name for what a value is, as its English messages print it. */
function receivedName(input: unknown): string {
  if (typeof input === 'number') return Number.isNaN(input) ? 'NaN' : Number.isFinite(input) ? 'number' : String(input);
  if (input === null) return 'null';
  if (Array.isArray(input)) return 'array';
  return typeof input;
}

const quoted = (value: unknown): string => (typeof value === 'string' ? `"${value}"` : String(value));

function issue(code: QuickIssue['code'], message: string, soft: boolean): QuickIssue {
  return { code, path: [], message, soft };
}

function wrongType(expected: string, input: unknown): QuickIssue {
  return issue('invalid_type', `Invalid input: expected ${expected}, received ${receivedName(input)}`, false);
}

const isObject = (value: unknown): value is Record<string, unknown> =>
  typeof value === 'object' && value !== null && !Array.isArray(value);

/** Strings are measured in code points, as zod measures them. */
function lengthOf(value: { length: unknown }): unknown {
  return typeof value === 'string' ? [...value].length : value.length;
}

/** A bound on a length: runs on any value that has one, whatever its type (as zod's length checks do). */
function lengthBound(limit: number, atLeast: boolean): Bound {
  return (value) => {
    if (value === null || value === undefined || (value as { length?: unknown }).length === undefined) return null;
    const length = lengthOf(value as { length: unknown }) as number;
    if (atLeast ? length >= limit : length <= limit) return null;
    const origin = Array.isArray(value) ? 'array' : typeof value === 'string' ? 'string' : 'unknown';
    const unit = origin === 'array' ? ' items' : origin === 'string' ? ' characters' : '';
    const sign = atLeast ? '>=' : '<=';
    const text = unit ? `to have ${sign}${limit}${unit}` : `to be ${sign}${limit}`;
    return issue(
      atLeast ? 'too_small' : 'too_big',
      `Too ${atLeast ? 'small' : 'big'}: expected ${origin} ${text}`,
      true,
    );
  };
}

/** A bound on a number: runs only when the value is one. */
function numberBound(limit: number, above: boolean, inclusive: boolean): Bound {
  return (value) => {
    const v = value as number;
    if (above ? (inclusive ? v >= limit : v > limit) : inclusive ? v <= limit : v < limit) return null;
    const sign = (above ? '>' : '<') + (inclusive ? '=' : '');
    return issue(
      above ? 'too_small' : 'too_big',
      `Too ${above ? 'small' : 'big'}: expected number to be ${sign}${limit}`,
      true,
    );
  };
}

function withPrefix(key: PropertyKey, issues: QuickIssue[]): QuickIssue[] {
  for (const found of issues) found.path.unshift(key);
  return issues;
}

/** A schema from its type test, with the bounds that follow it (numeric bounds or length bounds by its kind). */
function schema(
  kind: 'number' | 'sized' | 'plain',
  parse: (value: unknown) => QuickIssue[],
  out: (value: unknown) => unknown = (value) => value,
  bounds: readonly Bound[] = [],
): QuickSchema {
  const isLength = kind === 'sized';
  const bounded = (bound: Bound) => schema(kind, parse, out, [...bounds, bound]);
  const self: QuickSchema = {
    optionalKey: false,
    out,
    run(value) {
      const issues = parse(value);
      const typeHeld = issues.every((found) => found.soft);
      for (const bound of bounds) {
        if (!isLength && !typeHeld) break;
        const found = bound(value);
        if (found) issues.push(found);
      }
      return issues;
    },
    optional() {
      return {
        ...self,
        optionalKey: true,
        run: (value) => (value === undefined ? [] : self.run(value)),
        out: (value) => (value === undefined ? undefined : out(value)),
      };
    },
    finite: () => self,
    positive: () => bounded(numberBound(0, true, false)),
    nonnegative: () => bounded(numberBound(0, true, true)),
    gt: (limit) => bounded(numberBound(limit, true, false)),
    lt: (limit) => bounded(numberBound(limit, false, false)),
    min: (limit) => bounded(isLength ? lengthBound(limit, true) : numberBound(limit, true, true)),
    max: (limit) => bounded(isLength ? lengthBound(limit, false) : numberBound(limit, false, true)),
    safeParse(value) {
      const issues = self.run(value);
      return issues.length === 0 ? { success: true, data: out(value) } : { success: false, error: { issues } };
    },
  };
  return self;
}

const number = () =>
  schema('number', (value) =>
    typeof value === 'number' && Number.isFinite(value) ? [] : [wrongType('number', value)],
  );

const string = () => schema('sized', (value) => (typeof value === 'string' ? [] : [wrongType('string', value)]));

function array(element: QuickSchema): QuickSchema {
  return schema(
    'sized',
    (value) => {
      if (!Array.isArray(value)) return [wrongType('array', value)];
      return value.flatMap((item, index) => withPrefix(index, element.run(item)));
    },
    (value) => (value as unknown[]).map((item) => element.out(item)),
  );
}

function strictObject(shape: Record<string, QuickSchema>): QuickSchema {
  const known = new Set(Object.keys(shape));
  return schema(
    'plain',
    (value) => {
      if (!isObject(value)) return [wrongType('object', value)];
      const issues: QuickIssue[] = [];
      for (const [key, field] of Object.entries(shape)) {
        if (field.optionalKey && !(key in value)) continue;
        issues.push(...withPrefix(key, field.run(value[key])));
      }
      const unknown = Object.keys(value).filter((key) => !known.has(key));
      if (unknown.length > 0) {
        const found = issue(
          'unrecognized_keys',
          `Unrecognized key${unknown.length > 1 ? 's' : ''}: ${unknown.map(quoted).join(', ')}`,
          true,
        );
        issues.push({ ...found, keys: unknown });
      }
      return issues;
    },
    (value) => {
      const copy: Record<string, unknown> = {};
      for (const [key, field] of Object.entries(shape))
        if (key in (value as object)) copy[key] = field.out((value as Record<string, unknown>)[key]);
      return copy;
    },
  );
}

function choice(values: readonly string[]): QuickSchema {
  const message =
    values.length === 1
      ? `Invalid input: expected ${quoted(values[0])}`
      : `Invalid option: expected one of ${values.map(quoted).join('|')}`;
  return schema('plain', (value) => (values.includes(value as string) ? [] : [issue('invalid_value', message, false)]));
}

/** The keys of a record that zod reads: all but one named __proto__, which it skips. */
const recordKeys = (value: object): string[] => Object.keys(value).filter((key) => key !== '__proto__');

/** A record of string keys. */
function record(_keys: QuickSchema, values: QuickSchema): QuickSchema {
  return schema(
    'plain',
    (value) => {
      if (!isObject(value)) return [wrongType('record', value)];
      return recordKeys(value).flatMap((key) => withPrefix(key, values.run(value[key])));
    },
    (value) => {
      const copy: Record<string, unknown> = {};
      for (const key of recordKeys(value as object)) copy[key] = values.out((value as Record<string, unknown>)[key]);
      return copy;
    },
  );
}

function tuple(items: readonly QuickSchema[]): QuickSchema {
  return schema(
    'plain',
    (value) => {
      if (!Array.isArray(value)) return [wrongType('tuple', value)];
      if (value.length < items.length)
        return [issue('too_small', `Too small: expected array to have >=${items.length} items`, false)];
      const issues =
        value.length > items.length
          ? [issue('too_big', `Too big: expected array to have <=${items.length} items`, false)]
          : [];
      items.forEach((item, index) => issues.push(...withPrefix(index, item.run(value[index]))));
      return issues;
    },
    (value) => items.map((item, index) => item.out((value as unknown[])[index])),
  );
}

const kit = { number, string, array, strictObject, enum: choice, record, tuple };

/**
 * The kit in zod's clothes: the car schema is written once against zod's types and built with either. Only the
 * calls that schema makes exist here; test/io/quick-schema.test.ts holds their results to zod's.
 */
export function quickSchemaKit(): Zod {
  return kit as unknown as Zod;
}
