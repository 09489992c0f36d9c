// Every numeric field of a car at, just inside and beyond each edge of its stated range (src/car/car-ranges.ts,
// docs/robustness.md), and NaN, the infinities, -0, 1e308, 1e-300, a number written as text: through the library
// (simulate with the record) and through the CLI (simulate with the car file). The promise each time (issue 17):
// a value the range refuses is one line naming the file and the field, exit 2, nothing written; a value it admits
// drives a lap whose every output number is finite.

import { mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { CAR_FIELD_RANGES, GEARING_RANGES, type FieldRange } from '../../src/car/car-ranges.js';
import { InputError } from '../../src/errors.js';
import { readCarFile } from '../../src/io/read-car.js';
import { simulate } from '../../src/solve/simulate.js';
import { trackFromSegments } from '../../src/track/segments.js';
import type { Car } from '../../src/car/types.js';
import { projectRoot, runCli } from '../helpers/cli.js';
import { TEST_OVAL, writeTestOval } from '../helpers/tracks.js';
import { admits, edgeValues, runs, type EdgeValue } from './generators.js';
import { expectSoundLap } from './lap-checks.js';

// The demo car with a gearbox, so every field, the gearing's included, is present.
const carFile = path.join(projectRoot, 'cars', 'tarnfell-gt.json');
const baseCar = readCarFile(carFile);
const baseJson = readFileSync(carFile, 'utf8');
// A small closed track at a coarse step: the edges are about the car, not the grid.
const track = trackFromSegments(TEST_OVAL, 4, 'test oval');

/** A field as the car record holds it (the gearbox sits under powertrain.gearing) and as the file spells it. */
interface FieldPlace {
  range: FieldRange;
  /** Path of keys in the Car record; a number indexes an array (the first ratio, the first rpm). */
  recordPath: (string | number)[];
  filePath: (string | number)[];
}

const gearingPlace = (range: FieldRange, key: string, index?: number): FieldPlace => {
  const tail = index === undefined ? [key] : [key, index];
  const inCurve = key === 'rpm' || key === 'torqueNm';
  return {
    range,
    recordPath: ['powertrain', 'gearing', ...(inCurve ? ['torqueCurve'] : []), ...tail],
    filePath: ['powertrain', ...(inCurve ? ['torqueCurve'] : []), ...tail],
  };
};

const places: FieldPlace[] = [
  ...CAR_FIELD_RANGES.map((range) => ({ range, recordPath: range.field.split('.'), filePath: range.field.split('.') })),
  gearingPlace(GEARING_RANGES.gearRatio, 'gearRatios', 0),
  gearingPlace(GEARING_RANGES.finalDrive, 'finalDrive'),
  gearingPlace(GEARING_RANGES.wheelRadiusM, 'wheelRadiusM'),
  gearingPlace(GEARING_RANGES.shiftTimeS, 'shiftTimeS'),
  gearingPlace(GEARING_RANGES.maxRpm, 'maxRpm'),
  // The last point of the curves: the rpm must still rise to it, so its lower edges are refused either way.
  gearingPlace(GEARING_RANGES.rpm, 'rpm', 7),
  gearingPlace(GEARING_RANGES.torqueNm, 'torqueNm', 0),
];

function setAt(holder: unknown, keys: (string | number)[], value: unknown): void {
  let at = holder as Record<string | number, unknown>;
  for (const key of keys.slice(0, -1)) at = at[key] as Record<string | number, unknown>;
  at[keys.at(-1)!] = value;
}

/** The field's name as a message gives it: the dotted path, array indices included. */
const fieldName = (place: FieldPlace) =>
  place.range.field.startsWith('powertrain.') && place.recordPath.includes('gearing')
    ? place.filePath.join('.')
    : place.range.field;

/**
 * Paths of the nulls in a JSON value other than absent names (a corner without a name): JSON.stringify writes NaN
 * and the infinities as null, so a null where a number belongs is a number that was not finite.
 */
function unnamedNulls(value: unknown, at = ''): string[] {
  if (value === null) return /name$/i.test(at) ? [] : [at];
  if (typeof value !== 'object') return [];
  return Object.entries(value).flatMap(([key, inner]) => unnamedNulls(inner, `${at}.${key}`));
}

/** An InputError of one line naming `source` and the field. */
function expectRefusal(message: string, source: string, field: string): void {
  expect(message.split('\n')).toHaveLength(1);
  expect(message).toContain(source);
  expect(message).toContain(field);
}

/** Runs a value through simulate: 'refused' (with the checks on the message) or 'driven' (with the lap checked). */
function throughLibrary(place: FieldPlace, edge: EdgeValue): 'refused' | 'driven' {
  const car = structuredClone(baseCar);
  setAt(car, place.recordPath, edge.value);
  try {
    expectSoundLap(simulate(track, car as Car));
    return 'driven';
  } catch (error) {
    if (!(error instanceof InputError)) throw error;
    expectRefusal(error.message, 'simulate: car', fieldName(place));
    return 'refused';
  }
}

describe('car fields at the edges of their ranges, through the library', () => {
  it('refuses every value outside the range by name and drives every value inside it to a finite lap', () => {
    const wrong: string[] = [];
    let driven = 0;
    for (const place of places)
      for (const edge of edgeValues(place.range)) {
        const outcome = throughLibrary(place, edge);
        // Inside the range a value may still be refused for a rule between fields (rpm must rise), never outside.
        if (outcome === 'driven') driven++;
        if (outcome === 'driven' && !admits(place.range, edge.value))
          wrong.push(`${fieldName(place)} = ${edge.label} (${String(edge.value)}) was driven`);
      }
    expect(wrong).toEqual([]);
    // Each field admits at least its two bounds and the two values just inside them.
    expect(driven).toBeGreaterThanOrEqual(places.length * 3);
  });

  it('any two or three fields at their edges at once: refused by name, or a finite lap', () => {
    const pick = fc
      .array(
        fc.record({ place: fc.constantFrom(...places), edge: fc.nat() }).map(({ place, edge }) => {
          const values = edgeValues(place.range);
          return { place, edge: values[edge % values.length]! };
        }),
        { minLength: 2, maxLength: 3 },
      )
      .filter((changes) => new Set(changes.map((c) => c.place)).size === changes.length);
    fc.assert(
      fc.property(pick, (changes) => {
        const car = structuredClone(baseCar);
        for (const { place, edge } of changes) setAt(car, place.recordPath, edge.value);
        const outside = changes.filter(({ place, edge }) => !admits(place.range, edge.value));
        try {
          expectSoundLap(simulate(track, car as Car));
          expect(outside.map(({ place }) => fieldName(place))).toEqual([]);
        } catch (error) {
          if (!(error instanceof InputError)) throw error;
          expect(error.message.split('\n')).toHaveLength(1);
          // Every field out of its range is named in the one message.
          for (const { place } of outside) expect(error.message).toContain(fieldName(place));
        }
      }),
      runs(150, 20261204),
    );
  });
});

describe('car fields at the edges of their ranges, through the CLI', () => {
  const work = mkdtempSync(path.join(tmpdir(), 'reflap-car-edges-'));
  const oval = writeTestOval(work);

  it('simulate with the car file: exit 2, one line naming the file and field, nothing written; or a finite lap', () => {
    const cases = fc.record({ place: fc.constantFrom(...places), edge: fc.nat() }).map(({ place, edge }) => {
      const values = edgeValues(place.range);
      return { place, edge: values[edge % values.length]! };
    });
    let index = 0;
    fc.assert(
      fc.property(cases, ({ place, edge }) => {
        const folder = path.join(work, `case-${index++}`);
        mkdirSync(folder);
        const car = JSON.parse(baseJson) as unknown;
        // The file is written with the value's own spelling: NaN and Infinity make it a file that is not JSON.
        const marker = '"__edge_value__"';
        setAt(car, place.filePath, '__edge_value__');
        const file = path.join(folder, 'car.json');
        writeFileSync(file, JSON.stringify(car, null, 2).replace(marker, edge.json));
        const trace = path.join(folder, 'out', 'lap.csv');
        const run = runCli([
          'simulate',
          '--track',
          oval,
          '--car',
          file,
          '--step-m',
          '4',
          '--line',
          'centreline',
          '--json',
          '--out',
          trace,
        ]);
        if (run.code === 2) {
          // NaN and Infinity have no JSON spelling: the file is refused as JSON, at its line, before any field.
          const notJson = ['NaN', 'Infinity', '-Infinity'].includes(edge.json);
          expectRefusal(run.stderr.trimEnd(), file, notJson ? '' : place.filePath.join('.'));
          expect(readdirSync(folder)).toEqual(['car.json']);
          return;
        }
        expect({ code: run.code, stderr: run.stderr }).toEqual({ code: 0, stderr: '' });
        expect(admits(place.range, edge.value)).toBe(true);
        expect(run.stdout).not.toMatch(/NaN|Infinity/);
        expect(unnamedNulls(JSON.parse(run.stdout))).toEqual([]);
        const cells = readFileSync(trace, 'utf8').trim().split('\n').slice(1).join(',').split(',');
        expect(cells.filter((cell) => !Number.isFinite(Number(cell)) || cell === '')).toEqual([]);
      }),
      runs(60, 20261205),
    );
    rmSync(work, { recursive: true, force: true });
  });
});
