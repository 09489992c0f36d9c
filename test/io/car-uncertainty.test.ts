// The uncertainty block and origin notes of a car file: read, refused with one message naming the place, and
// written back by the car-file writer so that reading the written file gives the same car.

import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { parseCarJson } from '../../src/io/read-car.js';
import { carFileJson } from '../../src/report/car-file.js';
import { isInputError } from '../../src/errors.js';
import { projectRoot } from '../helpers/cli.js';

const base = {
  name: 'uncertain test car',
  massKg: 900,
  tyre: { muLong: 1.3, muLat: 1.4 },
  aero: { dragAreaM2: 0.7, liftAreaM2: 1.5 },
  powertrain: { maxPowerW: 200000 },
};

function message(text: object): string {
  try {
    parseCarJson(JSON.stringify(text), 'car.json');
  } catch (error) {
    expect(isInputError(error)).toBe(true);
    return (error as Error).message;
  }
  return '';
}

describe('car uncertainty block', () => {
  it('reads standard deviations, correlations and origin notes', () => {
    const car = parseCarJson(
      JSON.stringify({
        ...base,
        uncertainty: {
          sd: { 'tyre.muLat': 0.05, 'aero.liftAreaM2': 0.3 },
          correlation: [{ fields: ['tyre.muLat', 'aero.liftAreaM2'], r: -0.6 }],
        },
        origin: { 'tyre.muLat': 'from the tyre maker (invented)' },
      }),
      'car.json',
    );
    expect(car.uncertainty).toEqual({
      sd: { 'tyre.muLat': 0.05, 'aero.liftAreaM2': 0.3 },
      correlation: [{ fields: ['tyre.muLat', 'aero.liftAreaM2'], r: -0.6 }],
    });
    expect(car.origin).toEqual({ 'tyre.muLat': 'from the tyre maker (invented)' });
  });

  it('names an unknown field and the nearest known one', () => {
    expect(message({ ...base, uncertainty: { sd: { 'tyre.muLta': 0.05 } } })).toBe(
      "car.json: field uncertainty.sd: unknown field 'tyre.muLta' (did you mean 'tyre.muLat'?)",
    );
  });

  it('refuses an uncertain field the car file gives no value for', () => {
    expect(message({ ...base, uncertainty: { sd: { 'powertrain.gearing.finalDrive': 0.1 } } })).toBe(
      "car.json: field uncertainty.sd: 'powertrain.gearing.finalDrive' is uncertain but the car file gives it no value",
    );
  });

  it('refuses a negative standard deviation, naming the field', () => {
    expect(message({ ...base, uncertainty: { sd: { 'tyre.muLat': -0.05 } } })).toMatch(
      /^car\.json: field uncertainty\.sd\.tyre\.muLat: /,
    );
  });

  it('refuses a correlation of a field without a standard deviation, and correlations that contradict one another', () => {
    expect(
      message({
        ...base,
        uncertainty: {
          sd: { 'tyre.muLat': 0.05 },
          correlation: [{ fields: ['tyre.muLat', 'aero.liftAreaM2'], r: 0.5 }],
        },
      }),
    ).toBe("car.json: field uncertainty.correlation.0: 'aero.liftAreaM2' has no standard deviation in uncertainty.sd");
    // a and b nearly the same, b and c nearly the same, but a and c opposite: no such three quantities exist.
    const sd = { 'tyre.muLat': 0.05, 'tyre.muLong': 0.05, 'aero.liftAreaM2': 0.3 };
    const correlation = [
      { fields: ['tyre.muLat', 'tyre.muLong'], r: 0.9 },
      { fields: ['tyre.muLong', 'aero.liftAreaM2'], r: 0.9 },
      { fields: ['tyre.muLat', 'aero.liftAreaM2'], r: -0.9 },
    ];
    expect(message({ ...base, uncertainty: { sd, correlation } })).toBe(
      'car.json: field uncertainty.correlation: the correlations contradict one another (their matrix is not positive definite)',
    );
  });
});

describe('car file writer', () => {
  it('writes a car that reads back the same, for both shipped cars and an uncertain one', () => {
    for (const file of ['cars/brackle-club.json', 'cars/tarnfell-gt.json']) {
      const car = parseCarJson(readFileSync(`${projectRoot}${file}`, 'utf8'), file);
      expect(parseCarJson(carFileJson(car), 'written')).toEqual(car);
    }
    const uncertain = parseCarJson(
      JSON.stringify({ ...base, uncertainty: { sd: { 'tyre.muLat': 0.05 } }, origin: { 'tyre.muLat': 'guessed' } }),
      'car.json',
    );
    expect(parseCarJson(carFileJson(uncertain), 'written')).toEqual(uncertain);
  });
});
