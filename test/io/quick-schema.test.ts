// The quick validator that `reflap check` reads car files with is held to zod 4 itself (the reference library
// every other command validates with): on valid car files and on files mutated anywhere (a field deleted, given
// another value of any type, an unknown key added), the car read, or the one-line message, is the same.

import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { InputError } from '../../src/errors.js';
import { carFromJson, type CarValidator } from '../../src/io/read-car.js';
import { quickSchemaKit } from '../../src/io/quick-schema.js';
import { zodLibrary } from '../../src/io/lazy-libraries.js';
import { runs } from '../fuzz/generators.js';

const SOURCE = 'car.json';

/** Every field the car file may hold, the uncertainty and origin blocks included (an invented car). */
const FULL_CAR = {
  name: 'Quillon test hatch',
  model: 'bicycle',
  massKg: 1100,
  frontWeightFraction: 0.55,
  cgHeightM: 0.5,
  wheelbaseM: 2.5,
  widthM: 1.8,
  trackFrontM: 1.5,
  trackRearM: 1.48,
  rollStiffnessFrontFraction: 0.6,
  rollingResistanceCoeff: 0.012,
  tyre: {
    muLong: 1.2,
    muLat: 1.25,
    ggExponent: 2,
    loadSensitivity: 0.05,
    corneringStiffnessFrontNPerRad: 90000,
    corneringStiffnessRearNPerRad: 110000,
  },
  aero: { dragAreaM2: 0.7, liftAreaM2: 0.2, frontDownforceFraction: 0.45 },
  powertrain: {
    maxPowerW: 110000,
    drive: 'front',
    torqueCurve: { rpm: [1000, 4000, 6500], torqueNm: [120, 200, 170] },
    gearRatios: [3.5, 2.1, 1.4, 1.0],
    finalDrive: 4.1,
    wheelRadiusM: 0.3,
    shiftTimeS: 0.2,
    drivetrainEfficiency: 0.88,
    maxRpm: 6800,
  },
  brakes: { maxDecelG: 1.1, frontBias: 0.65 },
  fuel: { massKg: 40, burnKgPerLap: 1.5 },
  uncertainty: { sd: { massKg: 10, 'tyre.muLat': 0.05 }, correlation: [{ fields: ['massKg', 'tyre.muLat'], r: 0.2 }] },
  origin: { massKg: 'weighed', 'tyre.muLat': 'from a skidpad run' },
};

/** Values of every JSON type and the edges the schema's bounds sit on (and two that JSON cannot spell). */
const awkward = fc.oneof(
  fc.constantFrom<unknown>(
    -1,
    0,
    -0,
    1,
    0.5,
    1e-320,
    5,
    5.0001,
    Infinity,
    -Infinity,
    NaN,
    '',
    'x',
    'bicycle',
    'rear',
    'a'.repeat(201),
    '\u{1F3CE}'.repeat(150),
    true,
    null,
    [],
    [1],
    [1, 2],
    [3, 2, 1],
    ['massKg', 'tyre.muLat'],
    ['a', 'b', 'c'],
    {},
    { length: 1 },
    { length: 'x' },
    { massKg: 1 },
  ),
  fc.jsonValue({ maxDepth: 2 }),
);

type Json = Record<string, unknown> | unknown[];

/** Every place in a JSON tree, as a list of keys from the top. */
function placesOf(value: unknown, at: (string | number)[] = []): (string | number)[][] {
  if (typeof value !== 'object' || value === null) return [at];
  const keys: (string | number)[] = Array.isArray(value) ? value.map((_, k) => k) : Object.keys(value);
  return [at, ...keys.flatMap((key) => placesOf((value as Record<string | number, unknown>)[key], [...at, key]))];
}

const PLACES = placesOf(FULL_CAR);

interface Mutation {
  place: (string | number)[];
  action: 'delete' | 'set' | 'add';
  value: unknown;
  key: string;
}

const mutation: fc.Arbitrary<Mutation> = fc.record({
  place: fc.constantFrom(...PLACES),
  action: fc.constantFrom('delete', 'set', 'set', 'add'),
  value: awkward,
  key: fc.constantFrom('grip', '__proto__', 'constructor', 'massKg', '0'),
});

/** Sets an own property, even one named __proto__ (as JSON.parse makes it). */
function setOwn(holder: Json, key: string | number, value: unknown): void {
  Object.defineProperty(holder, key, { value, enumerable: true, writable: true, configurable: true });
}

function mutated(mutations: Mutation[]): unknown {
  let car: unknown = structuredClone(FULL_CAR);
  for (const { place, action, value, key } of mutations) {
    if (place.length === 0) {
      if (action === 'set') car = value;
      continue;
    }
    let holder: unknown = car;
    for (const part of place.slice(0, -1)) holder = (holder as Record<string | number, unknown> | null)?.[part];
    if (typeof holder !== 'object' || holder === null) continue;
    const last = place[place.length - 1]!;
    const target = holder as Json;
    if (action === 'delete') {
      if (Array.isArray(target) && typeof last === 'number') target.splice(last, 1);
      else delete (target as Record<string, unknown>)[last];
    } else if (action === 'set') setOwn(target, last, value);
    else {
      const inner = (target as Record<string | number, unknown>)[last];
      if (typeof inner === 'object' && inner !== null && !Array.isArray(inner)) setOwn(inner as Json, key, value);
    }
  }
  return car;
}

function outcome(value: unknown, validator: CarValidator): { car: unknown } | { problem: string } {
  try {
    return { car: carFromJson(value, SOURCE, validator) };
  } catch (error) {
    if (error instanceof InputError) return { problem: error.message };
    throw error;
  }
}

describe('quick car validation against zod', () => {
  it('reads the full car and both bundled cars as zod does', () => {
    const bundled = ['brackle-club.json', 'tarnfell-gt.json'].map(
      (name) =>
        JSON.parse(readFileSync(fileURLToPath(new URL(`../../cars/${name}`, import.meta.url)), 'utf8')) as unknown,
    );
    for (const car of [FULL_CAR, ...bundled]) {
      const quick = outcome(car, 'quick');
      expect(quick).toHaveProperty('car');
      expect(quick).toEqual(outcome(car, 'zod'));
    }
  });

  it('gives the car or the message zod gives on car files mutated anywhere, one to three times', () => {
    let refused = 0;
    fc.assert(
      fc.property(fc.array(mutation, { minLength: 1, maxLength: 3 }), (mutations) => {
        const value = mutated(mutations);
        const zod = outcome(value, 'zod');
        if ('problem' in zod) refused++;
        expect(outcome(value, 'quick')).toEqual(zod);
      }),
      runs(800, 1804),
    );
    // The mutations mostly break the file: the comparison is of messages, not only of cars read.
    expect(refused).toBeGreaterThan(500);
  });

  it("words each kind of problem as zod 4's English messages do", () => {
    const z = zodLibrary();
    const quick = quickSchemaKit();
    const cases: [string, (kit: typeof z) => { safeParse(value: unknown): unknown }, unknown][] = [
      ['number under an open bound', (k) => k.number().positive(), 0],
      ['number over a closed bound', (k) => k.number().max(5), 6],
      ['not finite', (k) => k.number(), Infinity],
      ['short array', (k) => k.array(k.number()).min(2), [1]],
      ['string for an array', (k) => k.array(k.number()).min(2), 'a'],
      ['long string', (k) => k.string().max(3), 'abcd'],
      ['enum', (k) => k.enum(['rear', 'front']), 'side'],
      ['tuple too long', (k) => k.tuple([k.string(), k.string()]), ['a', 'b', 'c']],
      ['record of numbers', (k) => k.record(k.string(), k.number()), { a: 'x', b: 1 }],
      ['unknown keys', (k) => k.strictObject({ a: k.number() }), { b: 1, c: 2 }],
    ];
    const shown = (result: unknown) => {
      const { success, error } = result as { success: boolean; error?: { issues: object[] } };
      return JSON.stringify({ success, issues: error?.issues }, ['success', 'issues', 'code', 'path', 'message']);
    };
    for (const [label, build, value] of cases) {
      const expected = shown(build(z).safeParse(value));
      const got = shown(build(quick).safeParse(value));
      expect(got, label).toBe(expected);
    }
    // One message written out, as zod 4's English locale words it (its locales/en.ts).
    expect(JSON.stringify(quick.number().positive().safeParse(0))).toContain('Too small: expected number to be >0');
  });
});

describe('a wrong type is not a missing field', () => {
  // The validators' issues do not carry the input (zod 4's issues as handed out), so the reader looks the field up
  // in the file: a field present with the wrong type is named with what was expected, a field absent is missing.
  it.each(['zod', 'quick'] as const)('with %s', (validator) => {
    const wrongType = { ...FULL_CAR, massKg: 'heavy', tyre: { ...FULL_CAR.tyre, muLat: null } };
    const problem = outcome(wrongType, validator);
    expect(problem).toHaveProperty('problem');
    const message = (problem as { problem: string }).problem;
    expect(message).toContain('field massKg: Invalid input: expected number, received string');
    expect(message).toContain('field tyre.muLat: Invalid input: expected number, received null');
    expect(message).not.toContain('missing required field massKg');
    const { massKg: _mass, ...withoutMass } = FULL_CAR;
    expect(outcome(withoutMass, validator)).toEqual({ problem: `${SOURCE}: missing required field massKg` });
  });
});
