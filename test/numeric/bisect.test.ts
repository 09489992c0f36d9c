// Bisection for the largest value that holds, against closed forms and the error bound of Burden and Faires,
// Numerical Analysis (9th ed.), theorem 2.1: after k halvings of [a, b] the answer is within (b - a) / 2^k.

import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { largestHolding } from '../../src/numeric/bisect.js';

describe('largestHolding', () => {
  it('finds sqrt(c) as the largest x in [0, c + 1] with x^2 <= c, to the bound after k steps', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.01, max: 1e4, noNaN: true }), fc.integer({ min: 5, max: 60 }), (c, steps) => {
        const found = largestHolding((x) => x * x <= c, 0, c + 1, steps);
        expect(found * found).toBeLessThanOrEqual(c);
        expect(Math.sqrt(c) - found).toBeLessThanOrEqual((c + 1) / 2 ** steps + 1e-12 * c);
      }),
    );
  });

  it('stops once the bracket is no wider than the tolerance', () => {
    let calls = 0;
    const found = largestHolding(
      (x) => {
        calls++;
        return x <= 0.3;
      },
      0,
      1,
      60,
      1 / 64,
    );
    // Halving [0, 1] to a width of 1/64 takes six steps (1 / 2^6), worked by hand: the brackets end at
    // [0.296875, 0.3125], which holds 0.3.
    expect(calls).toBe(6);
    expect(found).toBe(0.296875);
  });
});
