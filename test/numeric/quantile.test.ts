// Quantiles and medians against Hyndman and Fan (1996), "Sample quantiles in statistical packages", type 7
// (the default of R's quantile() and NumPy's percentile()), and the textbook median.

import { describe, expect, it } from 'vitest';
import { median, quantileSorted, sampledMedian } from '../../src/numeric/quantile.js';

describe('quantileSorted', () => {
  it('interpolates between order statistics (Hyndman and Fan 1996, type 7)', () => {
    // Type 7 on 1, 2, 3, 4: position (n - 1) q = 2.94, so 3 + 0.94 = 3.94; the median of 1..4 is 2.5.
    const values = Float64Array.from([1, 2, 3, 4]);
    expect(quantileSorted(values, 0.98)).toBeCloseTo(3.94, 12);
    expect(quantileSorted(values, 0.5)).toBeCloseTo(2.5, 12);
    // Type 7 on 1..10 at q = 0.25: position 9 x 0.25 = 2.25, so 3 + 0.25 = 3.25 (R: quantile(1:10, 0.25), from memory).
    expect(
      quantileSorted(
        Float64Array.from({ length: 10 }, (_, i) => i + 1),
        0.25,
      ),
    ).toBeCloseTo(3.25, 12);
  });

  it('gives the extremes at 0 and 1 and NaN for no values', () => {
    const values = [-3, 0.5, 7];
    expect(quantileSorted(values, 0)).toBe(-3);
    expect(quantileSorted(values, 1)).toBe(7);
    expect(quantileSorted([], 0.5)).toBeNaN();
  });
});

describe('median', () => {
  it('is the middle value of an odd count and the mean of the two middle values of an even count', () => {
    // Textbook definition (e.g. NIST/SEMATECH e-Handbook of Statistical Methods, 1.3.5.1).
    expect(median([5, 1, 3])).toBe(3);
    expect(median(Float64Array.from([4, 1, 3, 2]))).toBe(2.5);
    expect(median([])).toBeNaN();
  });

  it('leaves its input in its order', () => {
    const values = Float64Array.from([3, 1, 2]);
    median(values);
    expect(Array.from(values)).toEqual([3, 1, 2]);
  });
});

describe('sampledMedian', () => {
  it('equals the median on a short channel', () => {
    expect(sampledMedian(Float64Array.from([9, 2, 7, 4]))).toBe(5.5);
  });

  it('is within one sample spacing of the true median of a long channel', () => {
    // 0, 1, ..., 999 999 shuffled deterministically: the median of 0..N-1 is (N - 1) / 2 (textbook).
    const count = 1_000_000;
    const values = new Float64Array(count);
    for (let i = 0; i < count; i++) values[i] = (i * 7919) % count;
    const step = Math.floor(count / 50_000);
    expect(Math.abs(sampledMedian(values) - (count - 1) / 2)).toBeLessThan(step * 50);
  });
});
