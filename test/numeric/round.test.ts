// Rounding against ECMA-262 Number.prototype.toFixed (the decimal digits of the exact binary value, the larger
// n on a tie, applied to |x|) and IEEE 754 binary64 values.

import { describe, expect, it } from 'vitest';
import { roundToDigits } from '../../src/numeric/round.js';

describe('roundToDigits', () => {
  it('rounds the exact binary value: 1.005 is stored as 1.00499999999999989... and rounds down', () => {
    // IEEE 754 binary64 nearest to 1.005 is 1.00499999999999989341858963598497211933135986328125.
    expect(roundToDigits(1.005, 2)).toBe(1);
    expect(roundToDigits(3.14159, 3)).toBe(3.142);
  });

  it('rounds a tie away from zero, alike for a value and its negative', () => {
    // 2.5 and 0.125 are exact in binary, so these are true ties (ECMA-262: the larger n, applied to |x|).
    expect(roundToDigits(2.5, 0)).toBe(3);
    expect(roundToDigits(-2.5, 0)).toBe(-3);
    expect(roundToDigits(0.125, 2)).toBe(0.13);
    expect(roundToDigits(-0.125, 2)).toBe(-0.13);
  });

  it('gives +0 for a rounded zero and passes non-finite values through', () => {
    expect(Object.is(roundToDigits(-0.0001, 2), 0)).toBe(true);
    expect(roundToDigits(Number.POSITIVE_INFINITY, 2)).toBe(Number.POSITIVE_INFINITY);
    expect(roundToDigits(Number.NaN, 2)).toBeNaN();
  });
});
