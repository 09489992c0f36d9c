// Serially correlated samples carry less information than their count: the variance of the mean of n samples of a
// stationary AR(1) series with lag-1 autocorrelation rho is (sigma^2 / n) [1 + 2 sum_{k=1}^{n-1} (1 - k/n) rho^k]
// (Bartlett, J. Royal Statistical Society Suppl. 8 (1946) 27-41; the effective sample size n (1 - rho) / (1 + rho)
// of the large-n limit, e.g. Wilks, Statistical Methods in the Atmospheric Sciences, 3rd ed. 2011, eq. 5.12).

/**
 * Lag-1 autocorrelation of a series cut into runs: pairs of neighbours count only within one run (`run[i]` is the
 * run of sample i; samples of a run are consecutive), about the mean of the whole series.
 */
export function lag1Autocorrelation(values: ArrayLike<number>, run: ArrayLike<number>): number {
  const n = values.length;
  let mean = 0;
  for (let i = 0; i < n; i++) mean += values[i]!;
  mean /= n;
  let lagged = 0;
  let squares = 0;
  for (let i = 0; i < n; i++) {
    const d = values[i]! - mean;
    squares += d * d;
    if (i + 1 < n && run[i + 1] === run[i]) lagged += d * (values[i + 1]! - mean);
  }
  return squares > 0 ? lagged / squares : 0;
}

/** The factor on sigma^2 / n for the mean of n samples of an AR(1) series: the sum above in closed form. */
export function ar1VarianceInflation(rho: number, n: number): number {
  if (!(n > 1) || !(rho > 0)) return 1;
  const r = Math.min(rho, 0.999);
  const geometric = r / (1 - r) - (r * (1 - Math.pow(r, n))) / (n * (1 - r) * (1 - r));
  return 1 + 2 * geometric;
}
