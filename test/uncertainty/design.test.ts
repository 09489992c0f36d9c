// The Latin hypercube and its normal scores against the properties McKay, Beckman and Conover (Technometrics 21,
// 1979) define it by, and the correlations a car file asks for.

import { describe, expect, it } from 'vitest';
import { Matrix } from 'ml-matrix';
import { latinHypercube, normalDraws } from '../../src/uncertainty/design.js';
import { applyDraw, drawParameters } from '../../src/uncertainty/draws.js';
import { testCar } from '../helpers/cars.js';

describe('Latin hypercube', () => {
  it('puts exactly one draw in each of the N strata of every parameter', () => {
    const count = 50;
    const dims = 4;
    const u = latinHypercube(count, dims, 11);
    for (let d = 0; d < dims; d++) {
      const strata = Array.from({ length: count }, (_, i) => Math.floor(u[i * dims + d]! * count)).sort(
        (a, b) => a - b,
      );
      expect(strata).toEqual(Array.from({ length: count }, (_, i) => i));
    }
  });

  it('gives the same draws for the same seed and others for another', () => {
    expect(Array.from(latinHypercube(20, 3, 5))).toEqual(Array.from(latinHypercube(20, 3, 5)));
    expect(Array.from(latinHypercube(20, 3, 5))).not.toEqual(Array.from(latinHypercube(20, 3, 6)));
  });

  it('imposes the asked correlation on normal margins', () => {
    // The sampling error of a correlation of 0.7 over 4000 draws is (1 - r^2) / sqrt(n) = 0.008 (Fisher 1915, from
    // memory); the margins of a Latin hypercube hit mean 0 and deviation 1 far closer than independent draws.
    const count = 4000;
    const z = normalDraws(
      count,
      2,
      3,
      new Matrix([
        [1, 0.7],
        [0.7, 1],
      ]),
    );
    let sx = 0,
      sy = 0,
      sxx = 0,
      syy = 0,
      sxy = 0;
    for (let i = 0; i < count; i++) {
      const x = z[2 * i]!;
      const y = z[2 * i + 1]!;
      sx += x;
      sy += y;
      sxx += x * x;
      syy += y * y;
      sxy += x * y;
    }
    const mx = sx / count;
    const my = sy / count;
    const r = (sxy / count - mx * my) / Math.sqrt((sxx / count - mx * mx) * (syy / count - my * my));
    expect(r).toBeGreaterThan(0.67);
    expect(r).toBeLessThan(0.73);
    expect(Math.abs(mx)).toBeLessThan(0.01);
    expect(Math.sqrt(sxx / count - mx * mx)).toBeCloseTo(1, 2);
  });
});

describe('parameter draws', () => {
  it("draws around the car file's values with its standard deviations, and holds them in range", () => {
    const car = {
      ...testCar({ muLat: 1.4, dragAreaM2: 0.05 }),
      uncertainty: { sd: { 'tyre.muLat': 0.05, 'aero.dragAreaM2': 0.1 }, correlation: [] },
    };
    const draws = drawParameters(car, 200, 9);
    expect(draws.fields).toEqual(['tyre.muLat', 'aero.dragAreaM2']);
    let mean = 0;
    let squares = 0;
    for (let i = 0; i < 200; i++) {
      mean += draws.values[2 * i]!;
      squares += draws.values[2 * i]! ** 2;
    }
    mean /= 200;
    expect(mean).toBeCloseTo(1.4, 2);
    expect(Math.sqrt(squares / 200 - mean * mean)).toBeCloseTo(0.05, 2);
    // A drag area of 0.05 with a deviation of 0.1 would go negative in about 30 % of draws: they are held at 0.
    for (let i = 0; i < 200; i++) expect(draws.values[2 * i + 1]!).toBeGreaterThanOrEqual(0);
    expect(draws.clamped).toBeGreaterThan(40);
  });

  it('scales the whole drive force of a car with gears when its power is drawn', () => {
    const base = testCar({ maxPowerW: 200_000 });
    const geared = {
      ...base,
      powertrain: {
        ...base.powertrain,
        gearing: {
          torqueCurve: { rpm: [1000, 6000], torqueNm: [200, 300] },
          gearRatios: [2, 1],
          finalDrive: 3,
          wheelRadiusM: 0.3,
          shiftTimeS: 0,
          maxRpm: 6000,
        },
      },
    };
    const drawn = applyDraw(geared, ['powertrain.maxPowerW'], [220_000], 'test');
    expect(drawn.powertrain.maxPowerW).toBeCloseTo(220_000, 6);
    expect(drawn.powertrain.gearing!.torqueCurve.torqueNm).toEqual([220, 330].map((t) => expect.closeTo(t, 9)));
  });
});
