// Linear solvers for symmetric positive definite banded systems, plain and cyclic, at linear cost in n. As with
// ml-matrix's decomposition objects, a matrix is factored once (factorBanded, factorCyclicBanded) and the factor's
// solve(rhs, out?) serves every right-hand side.
//
// Storage. A banded matrix of half-bandwidth p is given by entry(i, k) = A[i][i + k] for k = 0..p (the upper
// half; symmetry gives the rest). The Cholesky factor A = L L^T is kept compactly, row by row, in one
// Float64Array of n * (p + 1) numbers: band[i * (p + 1) + k] = L[i][i - k]. No n-by-n storage anywhere.
// Method: banded Cholesky (Golub and Van Loan, Matrix Computations, 4th ed., algorithm 4.3.5), O(n p^2) to
// factor and O(n p) per right-hand side.
//
// Cyclic systems have the same band with indices taken modulo n: entry(i, k) = A[i][(i + k) mod n], so rows
// near the end reach round to the first columns (the corner blocks of a periodic spline or periodic smoother).
// They are solved by the Sherman-Morrison-Woodbury formula (Golub and Van Loan, section 2.1.4; the cyclic
// tridiagonal case is Numerical Recipes, 3rd ed., section 2.7.2). Write the corner block as E (rows 0..p-1,
// columns n-p..n-1). With alpha = |E| and U (n x p) holding sqrt(alpha) I in rows 0..p-1 and -E^T / sqrt(alpha)
// in rows n-p..n-1, A = B - U U^T, where B is A's band with alpha added to the first p diagonal entries and
// E^T E / alpha added to the last p-by-p block. B is banded and, being A plus a positive semidefinite term,
// positive definite whenever A is, so its Cholesky factor always exists. Then
//   A^-1 b = B^-1 b + Z C^-1 U^T B^-1 b,  Z = B^-1 U,  C = I - U^T Z  (p x p, symmetric positive definite),
// and the small capacitance matrix C is inverted once with ml-matrix. Factoring costs p + 1 banded solves;
// each solve costs one banded solve plus O(n p).

import type { Matrix } from 'ml-matrix';
import { mlMatrix } from './matrix-library.js';

/** entry(i, k) = A[i][i + k] for k = 0..halfBandwidth (cyclic solvers: column index taken modulo n). */
export type BandEntry = (i: number, offset: number) => number;

/** Solves A x = rhs; out may be rhs itself. */
export type BandedSolve = (rhs: Float64Array, out?: Float64Array) => Float64Array;

/** A factored banded matrix: factor once, solve for as many right-hand sides as needed. */
export interface BandedFactor {
  n: number;
  halfBandwidth: number;
  solve: BandedSolve;
}

/** Cholesky factor, band[i * (p + 1) + k] = L[i][i - k]. */
function choleskyBand(n: number, p: number, entry: BandEntry): Float64Array {
  const w = p + 1;
  const band = new Float64Array(n * w);
  for (let i = 0; i < n; i++) {
    const jStart = Math.max(0, i - p);
    for (let j = jStart; j <= i; j++) {
      // A[i][j] = A[j][i] = entry(j, i - j)
      let sum = entry(j, i - j);
      const mStart = Math.max(jStart, j - p);
      for (let m = mStart; m < j; m++) sum -= band[i * w + (i - m)]! * band[j * w + (j - m)]!;
      if (j === i) {
        if (!(sum > 0)) throw new RangeError(`banded matrix is not positive definite (pivot ${sum} at row ${i})`);
        band[i * w] = Math.sqrt(sum);
      } else {
        band[i * w + (i - j)] = sum / band[j * w]!;
      }
    }
  }
  return band;
}

/** Forward and backward substitution with a Cholesky band: L y = rhs, then L^T x = y. */
function substitute(band: Float64Array, n: number, p: number, rhs: Float64Array, out: Float64Array): Float64Array {
  const w = p + 1;
  if (rhs.length !== n || out.length !== n) throw new RangeError(`banded solve: expected vectors of length ${n}`);
  for (let i = 0; i < n; i++) {
    let sum = rhs[i]!;
    const mStart = Math.max(0, i - p);
    for (let m = mStart; m < i; m++) sum -= band[i * w + (i - m)]! * out[m]!;
    out[i] = sum / band[i * w]!;
  }
  // L^T[i][m] = L[m][i] for m = i + 1..i + p.
  for (let i = n - 1; i >= 0; i--) {
    let sum = out[i]!;
    const mEnd = Math.min(n - 1, i + p);
    for (let m = i + 1; m <= mEnd; m++) sum -= band[m * w + (m - i)]! * out[m]!;
    out[i] = sum / band[i * w]!;
  }
  return out;
}

/** Factors a symmetric positive definite banded matrix; throws RangeError when it is not positive definite. */
export function factorBanded(n: number, halfBandwidth: number, entry: BandEntry): BandedFactor {
  const band = choleskyBand(n, halfBandwidth, entry);
  return {
    n,
    halfBandwidth,
    solve: (rhs, out = new Float64Array(n)) => substitute(band, n, halfBandwidth, rhs, out),
  };
}

/** Dense copy of a cyclic band; entries that fall on the same place (tiny n) add up. */
function denseCyclic(n: number, p: number, entry: BandEntry): Matrix {
  const a = mlMatrix().Matrix.zeros(n, n);
  for (let i = 0; i < n; i++) {
    a.set(i, i, a.get(i, i) + entry(i, 0));
    for (let k = 1; k <= p; k++) {
      const j = (i + k) % n;
      const v = entry(i, k);
      a.set(i, j, a.get(i, j) + v);
      a.set(j, i, a.get(j, i) + v);
    }
  }
  return a;
}

/** A tiny cyclic system (n < 2p + 2, the corners meet the band) solved densely by LU. */
function denseCyclicFactor(n: number, p: number, entry: BandEntry): BandedFactor {
  const { LuDecomposition, Matrix } = mlMatrix();
  const lu = new LuDecomposition(denseCyclic(n, p, entry));
  return {
    n,
    halfBandwidth: p,
    solve: (rhs, out = new Float64Array(n)) => {
      if (rhs.length !== n || out.length !== n)
        throw new RangeError(`cyclic banded solve: expected vectors of length ${n}`);
      const x = lu.solve(Matrix.columnVector(Array.from(rhs)));
      for (let i = 0; i < n; i++) out[i] = x.get(i, 0);
      return out;
    },
  };
}

/**
 * Corner block E[t][s] = A[t][n - p + s] for t, s = 0..p-1; non-zero only where the cyclic offset k = t + p - s
 * is at most p, i.e. s >= t: entry(n - p + s, t + p - s) (row n-p+s reaching column t). With its norm alpha.
 */
function cornerBlock(n: number, p: number, entry: BandEntry): { e: Float64Array; alpha: number } {
  const e = new Float64Array(p * p);
  let norm2 = 0;
  for (let t = 0; t < p; t++) {
    for (let s = t; s < p; s++) {
      const v = entry(n - p + s, t + p - s);
      e[t * p + s] = v;
      norm2 += v * v;
    }
  }
  return { e, alpha: Math.sqrt(norm2) };
}

/** C^-1 for the capacitance matrix C = I - U^T Z (p x p), row-major. */
function capacitanceInverseOf(
  z: Float64Array,
  uTail: Float64Array,
  sqrtAlpha: number,
  n: number,
  p: number,
): Float64Array {
  const tailStart = n - p;
  const { CholeskyDecomposition, LuDecomposition, Matrix } = mlMatrix();
  const capacitance = Matrix.zeros(p, p);
  for (let a = 0; a < p; a++) {
    for (let b = 0; b < p; b++) {
      let sum = sqrtAlpha * z[b * n + a]!;
      for (let r = 0; r < p; r++) sum += uTail[r * p + a]! * z[b * n + tailStart + r]!;
      capacitance.set(a, b, (a === b ? 1 : 0) - sum);
    }
  }
  // Symmetrise away the rounding so ml-matrix's Cholesky accepts it.
  for (let a = 0; a < p; a++) {
    for (let b = a + 1; b < p; b++) {
      const mean = 0.5 * (capacitance.get(a, b) + capacitance.get(b, a));
      capacitance.set(a, b, mean);
      capacitance.set(b, a, mean);
    }
  }
  const identity = Matrix.eye(p, p);
  const cholesky = new CholeskyDecomposition(capacitance);
  const inverse = cholesky.isPositiveDefinite()
    ? cholesky.solve(identity)
    : new LuDecomposition(capacitance).solve(identity);
  const out = new Float64Array(p * p);
  for (let a = 0; a < p; a++) for (let b = 0; b < p; b++) out[a * p + b] = inverse.get(a, b);
  return out;
}

/** Factors a symmetric positive definite cyclic banded matrix (see the module header for the method). */
export function factorCyclicBanded(n: number, halfBandwidth: number, entry: BandEntry): BandedFactor {
  const p = halfBandwidth;
  if (p === 0) return factorBanded(n, 0, entry);
  if (n < 2 * p + 2) return denseCyclicFactor(n, p, entry);
  const { e, alpha } = cornerBlock(n, p, entry);
  if (alpha === 0) return factorBanded(n, p, entry);
  // Bottom-right addition G = E^T E / alpha (p x p, symmetric).
  const g = new Float64Array(p * p);
  for (let a = 0; a < p; a++) {
    for (let b = 0; b < p; b++) {
      let sum = 0;
      for (let t = 0; t < p; t++) sum += e[t * p + a]! * e[t * p + b]!;
      g[a * p + b] = sum / alpha;
    }
  }
  const tailStart = n - p;
  const inner = factorBanded(n, p, (i, k) => {
    if (i + k >= n) return 0; // the wrapped entries are carried by U U^T
    let v = entry(i, k);
    if (k === 0 && i < p) v += alpha;
    if (i >= tailStart) v += g[(i - tailStart) * p + (i + k - tailStart)]!;
    return v;
  });
  const sqrtAlpha = Math.sqrt(alpha);
  // U's tail rows: U[n - p + r][j] = -E[j][r] / sqrt(alpha); its first p rows are sqrt(alpha) I.
  const uTail = new Float64Array(p * p);
  for (let r = 0; r < p; r++) for (let j = 0; j < p; j++) uTail[r * p + j] = -e[j * p + r]! / sqrtAlpha;
  // Z = B^-1 U, column-major: z[j * n + i].
  const z = new Float64Array(p * n);
  const column = new Float64Array(n);
  for (let j = 0; j < p; j++) {
    column.fill(0);
    column[j] = sqrtAlpha;
    for (let r = 0; r < p; r++) column[tailStart + r] = uTail[r * p + j]!;
    inner.solve(column, z.subarray(j * n, (j + 1) * n));
  }
  const capacitanceInverse = capacitanceInverseOf(z, uTail, sqrtAlpha, n, p);
  const uty = new Float64Array(p);
  const solve: BandedSolve = (rhs, out = new Float64Array(n)) => {
    if (rhs.length !== n || out.length !== n)
      throw new RangeError(`cyclic banded solve: expected vectors of length ${n}`);
    inner.solve(rhs, out);
    // w = C^-1 U^T y, then x = y + Z w.
    for (let j = 0; j < p; j++) {
      let sum = sqrtAlpha * out[j]!;
      for (let r = 0; r < p; r++) sum += uTail[r * p + j]! * out[tailStart + r]!;
      uty[j] = sum;
    }
    for (let a = 0; a < p; a++) {
      let wa = 0;
      for (let b = 0; b < p; b++) wa += capacitanceInverse[a * p + b]! * uty[b]!;
      const zj = z.subarray(a * n, (a + 1) * n);
      for (let i = 0; i < n; i++) out[i]! += zj[i]! * wa;
    }
    return out;
  };
  return { n, halfBandwidth: p, solve };
}
