import { describe, expect, it } from 'vitest';
import { closestField, editDistance, readCarField } from '../../src/sweep/fields.js';
import {
  applySettings,
  parseSetting,
  parseValueSpec,
  parseVariation,
  variationValues,
} from '../../src/sweep/settings.js';
import { planSweep, parseShard, shardRange } from '../../src/sweep/plan.js';
import { InputError } from '../../src/errors.js';
import { testCar } from '../helpers/cars.js';

const air = { airTempC: 20, pressureHpa: 1000 };
const base = { car: { ...testCar({ massKg: 1400 }), fuel: { massKg: 30, burnKgPerLap: 2.5 } }, air };

/** Runs fn and returns the InputError's message, failing the test if it throws anything else or nothing. */
function inputErrorOf(fn: () => unknown): string {
  try {
    fn();
  } catch (error) {
    expect(error).toBeInstanceOf(InputError);
    const message = (error as Error).message;
    expect(message).not.toContain('\n');
    return message;
  }
  throw new Error('expected an InputError');
}

describe('edit distance', () => {
  // Levenshtein (1966); the textbook pair kitten -> sitting needs 3 edits.
  it('gives the textbook distances', () => {
    expect(editDistance('kitten', 'sitting')).toBe(3);
    expect(editDistance('', 'abc')).toBe(3);
    expect(editDistance('flaw', 'lawn')).toBe(2);
  });
  it('suggests the closest field', () => {
    expect(closestField('mass')).toBe('massKg');
    expect(closestField('tyre.mulat')).toBe('tyre.muLat');
    expect(closestField('liftArea')).toBe('aero.liftAreaM2');
    expect(closestField('airTemp')).toBe('airTempC');
  });
});

describe('--set values', () => {
  it('reads absolute, difference and percent values', () => {
    expect(parseValueSpec('1400', 'x')).toEqual({ kind: 'absolute', amount: 1400 });
    expect(parseValueSpec('+20', 'x')).toEqual({ kind: 'delta', amount: 20 });
    expect(parseValueSpec('-5%', 'x')).toEqual({ kind: 'percent', amount: -5 });
    expect(parseValueSpec('(-0.5)', 'x')).toEqual({ kind: 'absolute', amount: -0.5 });
  });

  it('applies them to the car and the air', () => {
    const changed = applySettings(base, [
      parseSetting('massKg=+20'),
      parseSetting('tyre.muLat=-5%'),
      parseSetting('airTempC=35'),
      parseSetting('fuel.massKg=10'),
    ]);
    expect(changed.car.massKg).toBe(1420);
    expect(changed.car.tyre.muLat).toBeCloseTo(1.14, 12);
    expect(changed.car.fuel.massKg).toBe(10);
    expect(changed.ambient.airTempC).toBe(35);
    // Ideal gas: rho = p / (R T), R = 287.05 J/(kg K) (ISO 2533): 100000 / (287.05 * 308.15) = 1.1305 kg/m^3.
    expect(changed.ambient.airDensityKgPerM3).toBeCloseTo(1.1305, 4);
    // The base car is left as it was.
    expect(base.car.massKg).toBe(1400);
    expect(readCarField(base.car, 'tyre.muLat')).toBe(1.2);
  });

  it('refuses an unknown field with the closest name', () => {
    expect(inputErrorOf(() => parseSetting('tyre.mulat=1.3'))).toMatch(
      /unknown field 'tyre.mulat'; did you mean 'tyre.muLat'/,
    );
    expect(inputErrorOf(() => parseVariation('masKg=1:2:1'))).toMatch(/did you mean 'massKg'/);
  });

  it('refuses a change that makes the car invalid', () => {
    expect(inputErrorOf(() => applySettings(base, [parseSetting('massKg=-1500')]))).toMatch(
      /massKg must be between 20 and 20000 kg/,
    );
    expect(inputErrorOf(() => applySettings(base, [parseSetting('fuel.massKg=-40')]))).toMatch(
      /fuel.massKg must be between 0 and 2000 kg/,
    );
    expect(inputErrorOf(() => applySettings(base, [parseSetting('airTempC=95')]))).toMatch(/airTempC/);
    expect(inputErrorOf(() => parseSetting('massKg=heavy'))).toMatch(/not a number/);
    expect(inputErrorOf(() => parseSetting('massKg=5%'))).toMatch(/ambiguous/);
  });

  it('refuses a relative change of a field the car file leaves empty', () => {
    expect(inputErrorOf(() => applySettings(base, [parseSetting('cgHeightM=+0.1')]))).toMatch(/no value to change/);
    expect(applySettings(base, [parseSetting('cgHeightM=0.4')]).car.cgHeightM).toBe(0.4);
  });
});

describe('--vary ranges', () => {
  it('walks from FROM to TO inclusive without float noise', () => {
    expect(variationValues(base, parseVariation('tyre.muLat=1.0:1.3:0.1'))).toEqual([1, 1.1, 1.2, 1.3]);
    expect(variationValues(base, parseVariation('massKg=+0:+40:20'))).toEqual([1400, 1420, 1440]);
    expect(variationValues(base, parseVariation('massKg=-10%:+10%:10%'))).toEqual([1260, 1400, 1540]);
    expect(variationValues(base, parseVariation('airTempC=40:10:-15'))).toEqual([40, 25, 10]);
  });

  it('refuses a zero step or a step with the wrong sign', () => {
    expect(inputErrorOf(() => parseVariation('massKg=1300:1500:0'))).toMatch(/step is zero/);
    expect(inputErrorOf(() => parseVariation('massKg=1300:1500:-10'))).toMatch(/wrong sign/);
    expect(inputErrorOf(() => parseVariation('massKg=1500:1300:10'))).toMatch(/wrong sign/);
    expect(inputErrorOf(() => parseVariation('massKg=1300:1500'))).toMatch(/FROM:TO:STEP/);
  });

  it('refuses a change in percent of a field that is 0 (every run would be the same)', () => {
    const noDownforce = { ...base, car: { ...base.car, aero: { ...base.car.aero, liftAreaM2: 0 } } };
    expect(inputErrorOf(() => variationValues(noDownforce, parseVariation('aero.liftAreaM2=-10%:+10%:5%')))).toMatch(
      /percent of 0/,
    );
    expect(variationValues(noDownforce, parseVariation('aero.liftAreaM2=+0:+1:0.5'))).toEqual([0, 0.5, 1]);
  });

  it('refuses a sweep that reaches an invalid car before running anything', () => {
    expect(inputErrorOf(() => planSweep(base, [parseVariation('massKg=0:100:50')], 'grid'))).toMatch(
      /massKg must be between 20 and 20000 kg/,
    );
  });

  it('orders grid runs with the last field fastest, after the baseline and the difference pairs', () => {
    const plan = planSweep(
      base,
      [parseVariation('massKg=1400:1420:20'), parseVariation('tyre.muLat=1.1:1.3:0.1')],
      'grid',
    );
    expect(plan.kinds.slice(0, 5)).toEqual(['baseline', 'minus', 'plus', 'minus', 'plus']);
    const grid = [];
    for (let r = 5; r < plan.kinds.length; r++) grid.push(Array.from(plan.values.subarray(2 * r, 2 * r + 2)));
    expect(grid).toEqual([
      [1400, 1.1],
      [1400, 1.2],
      [1400, 1.3],
      [1420, 1.1],
      [1420, 1.2],
      [1420, 1.3],
    ]);
    // Central-difference pairs at the sweep's own step around the baseline.
    expect(Array.from(plan.values.subarray(2, 4))).toEqual([1380, 1.2]);
    expect(Array.from(plan.values.subarray(8, 10))).toEqual([1400, 1.3]);
  });

  it('falls back to a one-sided difference where one side leaves the limits', () => {
    const empty = { ...base, car: { ...base.car, fuel: { massKg: 0, burnKgPerLap: 1 } } };
    const plan = planSweep(empty, [parseVariation('fuel.massKg=0:40:10')], 'one-at-a-time');
    expect(plan.kinds.slice(0, 3)).toEqual(['baseline', 'minus', 'plus']);
    expect(plan.values[1]).toBe(0);
    expect(plan.values[2]).toBe(10);
  });
});

describe('shards', () => {
  it('splits the runs into contiguous blocks that cover each run once', () => {
    const total = 1003;
    const seen = new Uint8Array(total);
    for (let i = 1; i <= 7; i++) {
      const { start, end } = shardRange(total, parseShard(`${i}/7`));
      expect(end - start === 143 || end - start === 144).toBe(true);
      for (let r = start; r < end; r++) seen[r]!++;
    }
    expect(seen.every((count) => count === 1)).toBe(true);
  });
  it('refuses shards outside 1..N', () => {
    expect(inputErrorOf(() => parseShard('0/4'))).toMatch(/count from 1/);
    expect(inputErrorOf(() => parseShard('5/4'))).toMatch(/between 1 and 4/);
    expect(inputErrorOf(() => parseShard('two'))).toMatch(/I\/N/);
  });
});
