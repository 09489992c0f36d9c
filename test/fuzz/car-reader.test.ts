// Property-based tests of the car reader (parseCarJson): any text gives a Car or a one-line InputError naming
// the file; every car that comes back passes validateCar (the limits the physics relies on).

import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { parseCarJson } from '../../src/io/read-car.js';
import { validateCar } from '../../src/car/validate.js';
import { anyJson, anyText, carFile, resultOrInputError, runs } from './generators.js';

const SOURCE = 'fuzz-car.json';

const FIELDS = [
  'massKg',
  'name',
  'model',
  'frontWeightFraction',
  'tyre.muLong',
  'tyre.muLat',
  'tyre.ggExponent',
  'aero.dragAreaM2',
  'aero.liftAreaM2',
  'powertrain.maxPowerW',
  'powertrain.drive',
  'powertrain.gearRatios',
  'powertrain.torqueCurve',
  'fuel.massKg',
  'brakes.maxDecelG',
  'tyre',
  'aero',
  'unknownKey',
  'tyre.grip',
];

/** A valid car file with one field deleted, replaced by any JSON value, or added where it does not belong. */
const mutatedCar = fc
  .record({
    car: carFile,
    field: fc.constantFrom(...FIELDS),
    value: fc.option(fc.oneof(fc.jsonValue({ maxDepth: 1 }), fc.constantFrom(-1, 0, 1e400, -0, 1e-320, '12', true)), {
      nil: undefined,
    }),
  })
  .map(({ car, field, value }) => {
    const copy = JSON.parse(JSON.stringify(car)) as Record<string, unknown>;
    const parts = field.split('.');
    let holder = copy;
    for (const part of parts.slice(0, -1)) {
      if (typeof holder[part] !== 'object' || holder[part] === null) holder[part] = {};
      holder = holder[part] as Record<string, unknown>;
    }
    const last = parts[parts.length - 1]!;
    if (value === undefined) delete holder[last];
    else holder[last] = value;
    return JSON.stringify(copy);
  });

describe('car reader fuzz', () => {
  it('any text, any JSON, valid and mutated car files', () => {
    const text = fc.oneof(
      anyText,
      anyJson.map((value) => JSON.stringify(value)),
      carFile.map((car) => JSON.stringify(car)),
      mutatedCar,
      mutatedCar,
    );
    let carsRead = 0;
    fc.assert(
      fc.property(text, (input) => {
        const car = resultOrInputError(() => parseCarJson(input, SOURCE), SOURCE);
        if (car) {
          expect(() => validateCar(car, SOURCE)).not.toThrow();
          carsRead++;
        }
      }),
      runs(1200, 20260617),
    );
    // The valid car files alone are a fifth of the cases.
    expect(carsRead).toBeGreaterThan(150);
    console.log(`car fuzz: cars read ${carsRead}`);
  });
});
