// The AR(1) variance inflation of a mean against its textbook sum and against the scatter of the means of many
// synthetic AR(1) series, whose true variance of the mean is known in closed form.

import { describe, expect, it } from 'vitest';
import { ar1VarianceInflation, lag1Autocorrelation } from '../../src/calibrate/serial-correlation.js';
import { seededRandom } from '../../src/numeric/seeded-random.js';

/** x_t = rho x_{t-1} + e_t, e_t ~ N(0, 1), started in the stationary law N(0, 1 / (1 - rho^2)). */
function ar1Series(rho: number, n: number, gaussian: () => number): Float64Array {
  const x = new Float64Array(n);
  x[0] = gaussian() / Math.sqrt(1 - rho * rho);
  for (let t = 1; t < n; t++) x[t] = rho * x[t - 1]! + gaussian();
  return x;
}

describe('AR(1) variance inflation of a mean', () => {
  it('equals the sum 1 + 2 sum_{k=1}^{n-1} (1 - k/n) rho^k term by term', () => {
    // The variance of the mean of a stationary series with autocorrelations rho^k (Bartlett 1946; Wilks,
    // Statistical Methods in the Atmospheric Sciences, 2011, sec. 5.2.4), summed here without the closed form.
    for (const rho of [0.1, 0.5, 0.9, 0.99])
      for (const n of [2, 10, 200, 5000]) {
        let sum = 1;
        for (let k = 1; k < n; k++) sum += 2 * (1 - k / n) * rho ** k;
        expect(ar1VarianceInflation(rho, n)).toBeCloseTo(sum, 8);
      }
    // Large n: the effective sample size n (1 - rho) / (1 + rho) (Wilks 2011, eq. 5.12).
    expect(ar1VarianceInflation(0.8, 1e7)).toBeCloseTo(9, 4);
    expect(ar1VarianceInflation(0, 100)).toBe(1);
    expect(ar1VarianceInflation(-0.3, 100)).toBe(1);
  });

  it('matches the scatter of the means of 4000 synthetic series with rho = 0.9 and n = 200', () => {
    const { gaussian } = seededRandom(7);
    const rho = 0.9;
    const n = 200;
    const trials = 4000;
    let sum = 0;
    let squares = 0;
    for (let k = 0; k < trials; k++) {
      const x = ar1Series(rho, n, gaussian);
      let mean = 0;
      for (let t = 0; t < n; t++) mean += x[t]!;
      mean /= n;
      sum += mean;
      squares += mean * mean;
    }
    const empirical = (squares - (sum * sum) / trials) / (trials - 1);
    // Closed form: the stationary variance 1 / (1 - rho^2) over n, times the inflation (about 17.2 here).
    const predicted = (1 / (1 - rho * rho) / n) * ar1VarianceInflation(rho, n);
    // A variance from 4000 normal draws has a relative standard error sqrt(2 / 3999) = 2.2 %: 4 of them allowed.
    expect(Math.abs(empirical / predicted - 1)).toBeLessThan(4 * Math.sqrt(2 / (trials - 1)));
    // Without the inflation the variance would be 17 times too small: the check can fail.
    expect(empirical / (1 / (1 - rho * rho) / n)).toBeGreaterThan(10);
  });

  it('estimates rho from a long series, and counts neighbours only within a run', () => {
    const { gaussian } = seededRandom(11);
    const n = 20000;
    const x = ar1Series(0.7, n, gaussian);
    // The lag-1 estimate has a standard error of about sqrt((1 - rho^2) / n) = 0.005 (Bartlett 1946): 4 allowed.
    expect(Math.abs(lag1Autocorrelation(x, new Int32Array(n)) - 0.7)).toBeLessThan(0.02);
    // Independent runs of one sample each have no neighbours: no correlation to find.
    expect(
      lag1Autocorrelation(
        x,
        Int32Array.from({ length: n }, (_, i) => i),
      ),
    ).toBe(0);
  });
});
