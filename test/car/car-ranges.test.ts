// The plausible ranges of car fields (src/car/car-ranges.ts) take every real class of car and refuse the typos
// and overflows that used to turn into NaN laps. Figures of real classes are from memory, rounded.

import { describe, expect, it } from 'vitest';
import { carProblems } from '../../src/car/validate.js';
import { CAR_FIELD_RANGES } from '../../src/car/car-ranges.js';
import { readCarFile } from '../../src/io/read-car.js';
import { testCar } from '../helpers/cars.js';
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { projectRoot } from '../helpers/cli.js';

describe('car field ranges', () => {
  it('take a rental kart, a club saloon, a downforce prototype and a racing truck (from memory)', () => {
    const kart = testCar({ massKg: 160, maxPowerW: 6_500, mu: 1.0, dragAreaM2: 0.5 });
    const saloon = testCar({ massKg: 1_300, maxPowerW: 150_000, mu: 1.2, dragAreaM2: 0.7 });
    const prototype = testCar({ massKg: 800, maxPowerW: 750_000, mu: 1.8, dragAreaM2: 1.3, liftAreaM2: 4.5 });
    const truck = testCar({ massKg: 5_500, maxPowerW: 1_100_000, mu: 0.9, dragAreaM2: 8 });
    for (const car of [kart, saloon, prototype, truck]) expect(carProblems(car)).toEqual([]);
  });

  it('take every car file shipped with reflap', () => {
    const folder = join(projectRoot, 'cars');
    for (const file of readdirSync(folder).filter((name) => name.endsWith('.json')))
      expect(carProblems(readCarFile(join(folder, file)))).toEqual([]);
  });

  it('refuse a typo of three orders of magnitude and the largest double in each direction', () => {
    // 1300 kg typed as 1300000 (grams), and mu typed in percent.
    expect(carProblems(testCar({ massKg: 1_300_000 }))).toEqual([
      'field massKg must be between 20 and 20000 kg (got 1300000)',
    ]);
    expect(carProblems(testCar({ muLat: 120 }))[0]).toMatch(/^field tyre\.muLat must be between 0\.05 and 5/);
    expect(carProblems(testCar({ liftAreaM2: -1e308 }))[0]).toMatch(/^field aero\.liftAreaM2 must be between -10/);
    expect(carProblems(testCar({ maxPowerW: 1e308 }))[0]).toMatch(/^field powertrain\.maxPowerW must be above 0/);
  });

  it('check every field of the table, given or left out where it may be', () => {
    // Each required field set to NaN is named in the problems; each optional field left null is not.
    for (const range of CAR_FIELD_RANGES) {
      const car = structuredClone(testCar()) as unknown as Record<string, Record<string, unknown>>;
      const [group, key] = range.field.includes('.') ? range.field.split('.') : [null, range.field];
      const holder = group ? car[group]! : (car as unknown as Record<string, unknown>);
      holder[key!] = Number.NaN;
      expect(carProblems(car).join('; ')).toContain(`field ${range.field} must be`);
      if (range.optional) {
        holder[key!] = null;
        expect(carProblems(car)).toEqual([]);
      }
    }
  });
});
