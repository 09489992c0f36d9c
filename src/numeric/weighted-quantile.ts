// Quantiles of weighted samples that move continuously with the weights: the weighted Hyndman-Fan type 7
// estimator of Akinshin ("Weighted quantile estimators", arXiv:2304.07265, 2023), with Kish's effective sample
// size. With equal weights it is the type 7 quantile of src/numeric/quantile.ts; a weight of zero is the same as
// leaving the sample out, and a weight shrinking to zero fades the sample out without a jump.

/** Kish's effective sample size (sum w)^2 / sum w^2 of non-negative weights; 0 when they are all zero. */
export function effectiveSampleSize(weights: ArrayLike<number>, count = weights.length): number {
  let sum = 0;
  let sumSquares = 0;
  for (let i = 0; i < count; i++) {
    const w = weights[i]!;
    sum += w;
    sumSquares += w * w;
  }
  return sumSquares > 0 ? (sum * sum) / sumSquares : 0;
}

/**
 * The window of the weighted type 7 quantile: the share of the cumulative weight at which it starts, and its height
 * (n*), so that a value whose weight spans shares [a, b] has the coefficient F(b) - F(a), F(t) = clamp(t n* - h + 1).
 */
export function quantileWindow(effective: number, q: number): { h: number; effective: number } {
  return { h: (effective - 1) * q + 1, effective };
}

/** F(t) of the window: the share of the quantile's weight that lies below cumulative share t. */
export function windowShare(window: { h: number; effective: number }, share: number): number {
  return Math.min(1, Math.max(0, share * window.effective - window.h + 1));
}

/**
 * Quantile q (0-1) of `values` sorted in increasing order, with non-negative `weights` in the same order (the first
 * `count` of each); NaN when the weights sum to zero. Each value's coefficient is the mass that the uniform window
 * [(h - 1) / n*, h / n*], h = (n* - 1) q + 1, puts on its share of the cumulative weight.
 */
export function weightedQuantileSorted(
  values: ArrayLike<number>,
  weights: ArrayLike<number>,
  q: number,
  count = values.length,
): number {
  let total = 0;
  for (let i = 0; i < count; i++) total += weights[i]!;
  if (!(total > 0)) return NaN;
  const window = quantileWindow(effectiveSampleSize(weights, count), q);
  let result = 0;
  let cumulative = 0;
  let previous = 0;
  for (let i = 0; i < count; i++) {
    cumulative += weights[i]!;
    const share = windowShare(window, i === count - 1 ? 1 : cumulative / total);
    result += (share - previous) * values[i]!;
    previous = share;
    if (share >= 1) break;
  }
  return result;
}
