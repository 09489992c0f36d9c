// Numbers in JSON rounded to what the inputs support: four decimals from 0.01 up, four significant digits below
// (the rule stated in src/report/json-numbers.ts); every expected value below is worked by hand from its input.

import { describe, expect, it } from 'vitest';
import { jsonNumber, roundedNumbers } from '../../src/report/json-numbers.js';
import { transientJson } from '../../src/report/transient-summary.js';
import type { TransientCheck } from '../../src/solve/transient.js';

describe('roundedNumbers', () => {
  it('rounds every number of a nested record and leaves the rest as it is', () => {
    const record = { a: 77.84178363305436, b: [1300.9298977416086, 'x', { c: 0.0012345678 }], d: true, e: null, f: 3 };
    expect(roundedNumbers(record)).toEqual({
      a: 77.8418,
      b: [1300.9299, 'x', { c: 0.001235 }],
      d: true,
      e: null,
      f: 3,
    });
    expect(jsonNumber(-2.4641536903551926)).toBe(-2.4642);
  });

  it("gives the transient check's JSON no number with more than four decimals", () => {
    const check = {
      completed: true,
      drivable: false,
      verdict: 'not drivable as computed',
      referenceLapTimeS: 77.84178363305436,
      followedLapTimeS: 78.6664427109062,
      maxDeviationM: 3.65525792994454,
      maxDeviationAtM: 1314.135895159293,
      deviationLimitSource: 'fixed',
      maxDeviationShare: 6.96142833300638,
      maxDeviationShareAtM: 1300.9298977416086,
      deviationAtShareM: -2.4641536903551926,
      roomAtShareM: 0.3539724281397603,
      speedAtShareMps: 16.39678978993947,
      referenceSpeedAtShareMps: 16.216668130243097,
      maxSteerDeg: 18.86054011117552,
      saturation: [{ fromM: 1117.6756845955588, toM: 1261.3027523685837, axle: 'both', peakUse: 0.9998871185195639 }],
    } as unknown as TransientCheck;
    const json = JSON.stringify(transientJson(check));
    expect(json).not.toMatch(/\d\.\d{5,}/);
    expect(transientJson(check).saturation[0]).toEqual({
      fromM: 1117.6757,
      toM: 1261.3028,
      axle: 'both',
      peakUse: 0.9999,
    });
  });
});
