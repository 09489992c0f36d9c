// Which parameters a log can tell apart: the collinearity diagnostics of Belsley, Kuh and Welsch (Regression
// Diagnostics, Wiley 1980, ch. 3) on the sensitivity matrix J (one row per sample, one column per parameter),
// each column scaled to unit length. A condition index d_max / d_j above 30 marks a near-dependence; the parameters
// with a variance-decomposition proportion above 0.5 on it are the ones the data cannot separate. A column with no
// length at all is a parameter the log says nothing about.

import { EigenvalueDecomposition, Matrix } from 'ml-matrix';

/** Belsley, Kuh and Welsch's threshold for a strong near-dependence. */
export const CONDITION_INDEX_LIMIT = 30;
/** Their threshold on a variance-decomposition proportion. */
export const PROPORTION_LIMIT = 0.5;
/** A column shorter than this share of the longest (both in units of the parameters' scales) carries no information. */
export const NO_INFORMATION_SHARE = 1e-6;

export interface Entanglement {
  conditionIndex: number;
  /** Indices of the parameters involved, in column order. */
  parameters: number[];
}

export interface Identifiability {
  /** Largest condition index of the scaled matrix (Infinity when a direction carries nothing at all). */
  conditionNumber: number;
  /** Columns without information. */
  uninformed: number[];
  entanglements: Entanglement[];
}

/** J^T J of a row-major sensitivity matrix. */
export function crossProduct(jacobian: Float64Array, p: number, rows: number): Matrix {
  const sums = new Float64Array(p * p);
  for (let i = 0; i < rows; i++) {
    for (let j = 0; j < p; j++) {
      const a = jacobian[i * p + j]!;
      if (a === 0) continue;
      for (let k = j; k < p; k++) sums[j * p + k]! += a * jacobian[i * p + k]!;
    }
  }
  const out = Matrix.zeros(p, p);
  for (let j = 0; j < p; j++) for (let k = j; k < p; k++) out.set(j, k, sums[j * p + k]!).set(k, j, sums[j * p + k]!);
  return out;
}

/** The diagnostics from J^T J (columns in units of each parameter's scale). */
export function identifiability(crossProductMatrix: Matrix): Identifiability {
  const p = crossProductMatrix.rows;
  const norms = Array.from({ length: p }, (_, k) => Math.sqrt(Math.max(0, crossProductMatrix.get(k, k))));
  const longest = Math.max(0, ...norms);
  const uninformed = norms.flatMap((norm, k) => (!(norm > NO_INFORMATION_SHARE * longest) ? [k] : []));
  const informed = norms.flatMap((_, k) => (uninformed.includes(k) ? [] : [k]));
  const q = informed.length;
  if (q <= 1) return { conditionNumber: q === 1 ? 1 : Infinity, uninformed, entanglements: [] };
  // Unit-length columns: the cross product becomes a matrix with a unit diagonal.
  const scaled = Matrix.zeros(q, q);
  for (let a = 0; a < q; a++) {
    for (let b = 0; b < q; b++) {
      const j = informed[a]!;
      const k = informed[b]!;
      scaled.set(a, b, crossProductMatrix.get(j, k) / (norms[j]! * norms[k]!));
    }
  }
  const eigen = new EigenvalueDecomposition(scaled, { assumeSymmetric: true });
  const values = eigen.realEigenvalues.map((value) => Math.max(value, 0));
  const vectors = eigen.eigenvectorMatrix;
  const largest = Math.max(...values);
  // Singular values of the scaled J are the square roots of these eigenvalues.
  const index = values.map((value) => (value > 0 ? Math.sqrt(largest / value) : Infinity));
  // Variance-decomposition proportions: phi_kj = v_kj^2 / d_j^2, normalised over j for each parameter k.
  const phi = (k: number, j: number) => {
    const v = vectors.get(k, j);
    return values[j]! > 0 ? (v * v) / values[j]! : v * v > 1e-24 ? Infinity : 0;
  };
  const entanglements: Entanglement[] = [];
  for (let j = 0; j < q; j++) {
    if (!(index[j]! > CONDITION_INDEX_LIMIT)) continue;
    const involved: number[] = [];
    for (let k = 0; k < q; k++) {
      let total = 0;
      let infinite = 0;
      for (let m = 0; m < q; m++) {
        const value = phi(k, m);
        if (value === Infinity) infinite++;
        else total += value;
      }
      const own = phi(k, j);
      const proportion = infinite > 0 ? (own === Infinity ? 1 / infinite : 0) : total > 0 ? own / total : 0;
      if (proportion > PROPORTION_LIMIT) involved.push(informed[k]!);
    }
    if (involved.length >= 2)
      entanglements.push({ conditionIndex: index[j]!, parameters: involved.sort((a, b) => a - b) });
  }
  entanglements.sort((a, b) => b.conditionIndex - a.conditionIndex);
  return { conditionNumber: Math.max(...index), uninformed, entanglements };
}

/** A condition index for messages. */
export function formatIndex(value: number): string {
  return Number.isFinite(value) ? (value >= 1e4 ? value.toExponential(1) : value.toFixed(0)) : 'infinite';
}
