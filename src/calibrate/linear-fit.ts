// Ordinary least squares y = X b with the covariance of b: the textbook sigma^2 (X^T X)^-1 with sigma^2 the
// residual variance over n - p degrees of freedom (e.g. Draper and Smith, Applied Regression Analysis, 3rd ed.
// 1998, ch. 5), set beside the cluster-robust sandwich (./covariance.ts).

import { Matrix, inverse } from 'ml-matrix';
import { MIN_CLUSTERS, clusterScoreProduct, conservativeCovariance, sandwich } from './covariance.js';

export interface LinearFit {
  coefficients: number[];
  /** The covariance the answer carries (./covariance.ts conservativeCovariance). */
  covariance: Matrix;
  classicalCovariance: Matrix;
  robustCovariance: Matrix | null;
  residuals: Float64Array;
  residualSd: number;
  count: number;
  clusters: number;
}

/**
 * `design` holds p numbers per row (row-major); rows whose cluster is negative are left out. Throws when X^T X is
 * singular (a column without information).
 */
export function ordinaryLeastSquares(
  design: Float64Array,
  y: Float64Array,
  p: number,
  cluster: Int32Array,
  clusters: number,
): LinearFit {
  const n = y.length;
  const sums = new Float64Array(p * p);
  const xty = new Float64Array(p);
  let count = 0;
  for (let i = 0; i < n; i++) {
    if (cluster[i]! < 0) continue;
    count++;
    for (let j = 0; j < p; j++) {
      const xj = design[i * p + j]!;
      xty[j]! += xj * y[i]!;
      for (let k = j; k < p; k++) sums[j * p + k]! += xj * design[i * p + k]!;
    }
  }
  const xtx = Matrix.zeros(p, p);
  for (let j = 0; j < p; j++) for (let k = j; k < p; k++) xtx.set(j, k, sums[j * p + k]!).set(k, j, sums[j * p + k]!);
  if (count <= p) throw new Error(`least squares needs more than ${p} samples (got ${count})`);
  const xtxInverse = inverse(xtx);
  const b = xtxInverse.mmul(Matrix.columnVector(Array.from(xty))).getColumn(0);
  const residuals = new Float64Array(n);
  const scores = new Float64Array(n * p);
  let sumSquares = 0;
  for (let i = 0; i < n; i++) {
    if (cluster[i]! < 0) continue;
    let fitted = 0;
    for (let j = 0; j < p; j++) fitted += design[i * p + j]! * b[j]!;
    const e = y[i]! - fitted;
    residuals[i] = e;
    sumSquares += e * e;
    for (let j = 0; j < p; j++) scores[i * p + j] = design[i * p + j]! * e;
  }
  const variance = sumSquares / (count - p);
  const classicalCovariance = xtxInverse.clone().mul(variance);
  const robustCovariance =
    clusters >= MIN_CLUSTERS
      ? sandwich(xtxInverse, clusterScoreProduct(scores, p, cluster, clusters, (count - 1) / (count - p)))
      : null;
  return {
    coefficients: b,
    covariance: conservativeCovariance(classicalCovariance, robustCovariance, clusters),
    classicalCovariance,
    robustCovariance,
    residuals,
    residualSd: Math.sqrt(variance),
    count,
    clusters,
  };
}
