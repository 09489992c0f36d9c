// Linear interpolation against its defining property: it reproduces a straight line exactly (any numerical
// analysis text, e.g. Burden and Faires, Numerical Analysis, 3.1: the degree-1 Lagrange polynomial).

import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { interpolateOnLap, lerp } from '../../src/numeric/interpolate.js';

describe('lerp', () => {
  it('gives the ends at t = 0 and 1 and the straight line between', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e6, max: 1e6, noNaN: true }),
        fc.double({ min: -1e6, max: 1e6, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        (a, b, t) => {
          // `+ 0` reads -0 and 0 as one value.
          expect(lerp(a, b, 0) + 0).toBe(a + 0);
          expect(Math.abs(lerp(a, b, t) - (a * (1 - t) + b * t))).toBeLessThanOrEqual(
            1e-12 * (Math.abs(a) + Math.abs(b) + 1),
          );
        },
      ),
    );
    expect(lerp(2, 10, 0.25)).toBe(4);
  });
});

describe('interpolateOnLap', () => {
  const n = 8;
  // Samples of the line y = 3 i + 2 on a lap of 8 stations.
  const line = Float64Array.from({ length: n }, (_, i) => 3 * i + 2);

  it('reproduces a straight line between stations', () => {
    expect(interpolateOnLap(line, 2.5, n)).toBeCloseTo(3 * 2.5 + 2, 12);
    expect(interpolateOnLap(line, 0, n)).toBe(2);
  });

  it('wraps round the lap: between the last station and the first, and from unwrapped indices', () => {
    // Between station 7 (23) and station 0 (2), a quarter of the way: 23 + 0.25 (2 - 23) = 17.75 (by hand).
    expect(interpolateOnLap(line, 7.25, n)).toBeCloseTo(17.75, 12);
    expect(interpolateOnLap(line, 7.25 - n, n)).toBeCloseTo(17.75, 12);
    expect(interpolateOnLap(line, 2.5 + 2 * n, n)).toBeCloseTo(9.5, 12);
  });
});
