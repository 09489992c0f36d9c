// Lap indices against the floored modulo of Knuth, The Art of Computer Programming vol. 1, 1.2.4 (eq. 1):
// x mod y = x - y floor(x / y), which is in [0, y) for y > 0.

import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { lapIndex, wrapDistanceM, wrapIndex } from '../../src/numeric/lap-index.js';

const knuthMod = (x: number, y: number) => x - y * Math.floor(x / y);

describe('wrapIndex', () => {
  it('equals x - n floor(x / n) for any integer and any lap length', () => {
    fc.assert(
      fc.property(fc.integer({ min: -1_000_000, max: 1_000_000 }), fc.integer({ min: 1, max: 10_000 }), (k, n) => {
        const wrapped = wrapIndex(k, n);
        // `+ 0` compares -0 and 0 as one index, as an array does.
        expect(wrapped + 0).toBe(knuthMod(k, n) + 0);
        expect(wrapped).toBeGreaterThanOrEqual(0);
        expect(wrapped).toBeLessThan(n);
      }),
    );
  });

  it('runs round a lap of 5 either way (worked by hand)', () => {
    expect([-6, -5, -1, 0, 4, 5, 11].map((k) => wrapIndex(k, 5) + 0)).toEqual([4, 0, 4, 0, 4, 0, 1]);
  });
});

describe('lapIndex', () => {
  it('wraps on a closed lap and holds the ends of an open path (worked by hand)', () => {
    expect([-2, -1, 0, 3, 4, 5, 9].map((k) => lapIndex(k, 5, true) + 0)).toEqual([3, 4, 0, 3, 4, 0, 4]);
    expect([-2, -1, 0, 3, 4, 5, 9].map((k) => lapIndex(k, 5, false))).toEqual([0, 0, 0, 3, 4, 4, 4]);
  });
});

describe('wrapDistanceM', () => {
  it('brings any station into [0, lengthM) by a whole number of laps (Knuth 1.2.4 on reals)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e6, max: 1e6, noNaN: true }),
        fc.double({ min: 1, max: 1e4, noNaN: true }),
        (distanceM, lengthM) => {
          const wrapped = wrapDistanceM(distanceM, lengthM);
          expect(wrapped).toBeGreaterThanOrEqual(0);
          expect(wrapped).toBeLessThan(lengthM);
          const laps = (distanceM - wrapped) / lengthM;
          expect(Math.abs(laps - Math.round(laps))).toBeLessThan(1e-6);
        },
      ),
    );
  });

  it('puts 5,900 m on a 5,793 m lap at 107 m and -10 m at 5,783 m (worked by hand)', () => {
    expect(wrapDistanceM(5900, 5793)).toBeCloseTo(107, 9);
    expect(wrapDistanceM(-10, 5793)).toBeCloseTo(5783, 9);
  });
});
