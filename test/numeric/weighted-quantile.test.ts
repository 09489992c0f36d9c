// The weighted quantile against its definition (Akinshin, "Weighted quantile estimators", arXiv:2304.07265, 2023):
// equal weights give the Hyndman-Fan type 7 quantile, a zero weight is the same as leaving the sample out, a weight
// shrinking to zero fades the sample out continuously, and Kish's effective sample size of equal weights is the count.

import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { effectiveSampleSize, weightedQuantileSorted } from '../../src/numeric/weighted-quantile.js';
import { quantileSorted } from '../../src/numeric/quantile.js';

const sortedOf = (values: number[]) => Float64Array.from(values).sort();

describe('weighted quantile', () => {
  it('with equal weights is the type 7 quantile: 1..10 at 0.98 is 9.82', () => {
    // Hyndman and Fan (1996), definition 7: h = (n - 1) p + 1 = 9.82, x(9) + 0.82 (x(10) - x(9)) = 9.82.
    const values = sortedOf([1, 2, 3, 4, 5, 6, 7, 8, 9, 10]);
    expect(weightedQuantileSorted(values, new Float64Array(10).fill(3), 0.98)).toBeCloseTo(9.82, 12);
    // The median of an even count is the mean of the middle two (Hyndman and Fan 1996, definition 7).
    expect(weightedQuantileSorted(values, new Float64Array(10).fill(1), 0.5)).toBeCloseTo(5.5, 12);
  });

  it('equals type 7 on any sample with equal weights (property)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -100, max: 100, noNaN: true }), { minLength: 1, maxLength: 60 }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        (raw, q) => {
          const values = sortedOf(raw);
          const weighted = weightedQuantileSorted(values, new Float64Array(values.length).fill(1), q);
          // Akinshin (2023): the weighted type 7 estimator reduces to type 7 for equal weights.
          expect(weighted).toBeCloseTo(quantileSorted(values, q), 9);
        },
      ),
      { numRuns: 200 },
    );
  });

  it('a zero weight is the same as leaving the sample out, and a weight near zero is near that', () => {
    // Akinshin (2023), the requirements of a weighted estimator: zero weight removes an element, and the estimate
    // is continuous in the weights.
    const values = sortedOf([0.5, 1.1, 2.3, 2.9, 4.4, 5.0, 7.7, 8.1]);
    const weights = Float64Array.from([1, 0.4, 2, 1, 0, 1.5, 1, 0.7]);
    const without = weightedQuantileSorted(
      values.filter((_, i) => i !== 4),
      weights.filter((_, i) => i !== 4),
      0.9,
    );
    expect(weightedQuantileSorted(values, weights, 0.9)).toBeCloseTo(without, 12);
    for (const epsilon of [1e-3, 1e-6]) {
      weights[4] = epsilon;
      expect(Math.abs(weightedQuantileSorted(values, weights, 0.9) - without)).toBeLessThan(50 * epsilon);
    }
  });

  it('stays within the sample and ignores a common scale of the weights', () => {
    fc.assert(
      fc.property(
        fc.array(
          fc.tuple(fc.double({ min: -10, max: 10, noNaN: true }), fc.double({ min: 0.01, max: 5, noNaN: true })),
          {
            minLength: 1,
            maxLength: 40,
          },
        ),
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.double({ min: 0.1, max: 10, noNaN: true }),
        (pairs, q, scale) => {
          pairs.sort((a, b) => a[0] - b[0]);
          const values = Float64Array.from(pairs, (p) => p[0]);
          const weights = Float64Array.from(pairs, (p) => p[1]);
          const result = weightedQuantileSorted(values, weights, q);
          // A quantile lies between the smallest and the largest value (definition of a quantile).
          expect(result).toBeGreaterThanOrEqual(values[0]! - 1e-9);
          expect(result).toBeLessThanOrEqual(values[values.length - 1]! + 1e-9);
          // Only the weights' shares count (Akinshin 2023: weights are normalised).
          const scaled = weightedQuantileSorted(
            values,
            weights.map((w) => w * scale),
            q,
          );
          expect(scaled).toBeCloseTo(result, 9);
        },
      ),
      { numRuns: 200 },
    );
  });

  it("Kish's effective sample size: n for equal weights, 1 for one weight, (sum w)^2 / sum w^2", () => {
    // Kish, "Survey Sampling" (1965): n_eff = (sum w)^2 / sum w^2.
    expect(effectiveSampleSize(new Float64Array(25).fill(0.3))).toBeCloseTo(25, 12);
    expect(effectiveSampleSize(Float64Array.from([0, 0, 2, 0]))).toBeCloseTo(1, 12);
    expect(effectiveSampleSize(Float64Array.from([1, 2, 3]))).toBeCloseTo(36 / 14, 12);
    expect(weightedQuantileSorted(Float64Array.from([1, 2]), Float64Array.from([0, 0]), 0.5)).toBeNaN();
  });
});
