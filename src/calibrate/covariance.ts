// Covariance of fitted parameters. Samples of a log are not independent: one straight or one corner shares its
// sensor bias and its smoothing, so besides the classical formula (sigma^2 (X^T X)^-1 for least squares, the inverse
// information for maximum likelihood) the sandwich A^-1 B A^-1 is formed with B summed over clusters of samples
// (Liang and Zeger, Biometrika 73 (1986) 13-22; small-sample factor CR1, Cameron and Miller, J. Human Resources 50
// (2015) 317-372). With few clusters the sandwich is too small; as those authors advise, its intervals take Student's
// t with G - 1 degrees of freedom, here folded into the variance as (t_{G-1} / z)^2 at 95 % so that two standard
// errors keep their meaning. Each parameter gets the larger of the two variances, so the answer never claims more
// than either formula grants.

import { Matrix } from 'ml-matrix';
import { normalQuantile, studentQuantile } from '../numeric/normal.js';

/** Clusters needed before the cluster sandwich is trusted at all. */
export const MIN_CLUSTERS = 5;

/**
 * B = G / (G - 1) * factor * sum over clusters of (sum of the scores) (sum of the scores)^T.
 * `scores` holds `width` numbers per sample, `cluster` the cluster of each sample (0..clusters-1).
 */
export function clusterScoreProduct(
  scores: Float64Array,
  width: number,
  cluster: Int32Array,
  clusters: number,
  factor = 1,
): Matrix {
  const sums = new Float64Array(clusters * width);
  const n = cluster.length;
  for (let i = 0; i < n; i++) {
    const g = cluster[i]!;
    if (g < 0) continue;
    for (let k = 0; k < width; k++) sums[g * width + k]! += scores[i * width + k]!;
  }
  const products = new Float64Array(width * width);
  for (let g = 0; g < clusters; g++) {
    for (let j = 0; j < width; j++) {
      const sj = sums[g * width + j]!;
      if (sj === 0) continue;
      for (let k = 0; k < width; k++) products[j * width + k]! += sj * sums[g * width + k]!;
    }
  }
  const scale = clusters > 1 ? (clusters / (clusters - 1)) * factor : factor;
  const b = Matrix.zeros(width, width);
  for (let j = 0; j < width; j++) for (let k = 0; k < width; k++) b.set(j, k, products[j * width + k]! * scale);
  return b;
}

/** A^-1 B A^-1 for a symmetric A^-1. */
export function sandwich(breadInverse: Matrix, meat: Matrix): Matrix {
  return breadInverse.mmul(meat).mmul(breadInverse);
}

/** Factor on a cluster-robust variance with G clusters: (t_{G-1}(0.975) / z(0.975))^2. */
export function fewClustersFactor(clusters: number): number {
  return (studentQuantile(0.975, clusters - 1) / normalQuantile(0.975)) ** 2;
}

/** Each diagonal the larger of the two; correlations from the robust matrix where it is trusted, else the classical. */
export function conservativeCovariance(classical: Matrix, robust: Matrix | null, clusters: number): Matrix {
  const p = classical.rows;
  const shape = robust ?? classical;
  const factor = robust ? fewClustersFactor(clusters) : 1;
  const sd = new Float64Array(p);
  for (let k = 0; k < p; k++) sd[k] = Math.sqrt(Math.max(classical.get(k, k), robust ? factor * robust.get(k, k) : 0));
  const out = Matrix.zeros(p, p);
  for (let j = 0; j < p; j++) {
    for (let k = 0; k < p; k++) {
      const denominator = Math.sqrt(shape.get(j, j) * shape.get(k, k));
      const r = j === k ? 1 : denominator > 0 ? shape.get(j, k) / denominator : 0;
      out.set(j, k, r * sd[j]! * sd[k]!);
    }
  }
  return out;
}

/** Correlation matrix of a covariance matrix (zero where a variance is zero). */
export function correlationOf(covariance: Matrix): Matrix {
  const p = covariance.rows;
  const out = Matrix.zeros(p, p);
  for (let j = 0; j < p; j++) {
    for (let k = 0; k < p; k++) {
      const denominator = Math.sqrt(covariance.get(j, j) * covariance.get(k, k));
      out.set(j, k, j === k ? 1 : denominator > 0 ? covariance.get(j, k) / denominator : 0);
    }
  }
  return out;
}
