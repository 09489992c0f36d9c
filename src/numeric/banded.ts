// Linear solvers for symmetric positive definite banded systems, plain and cyclic, at linear cost in n.
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

import { CholeskyDecomposition, LuDecomposition, Matrix } from 'ml-matrix';

/** entry(i, k) = A[i][i + k] for k = 0..halfBandwidth (cyclic solvers: column index taken modulo n). */
export type BandEntry = (i: number, offset: number) => number;

export type BandedSolve = (rhs: Float64Array, out?: Float64Array) => Float64Array;

export interface BandedFactor {
  n: number;
  halfBandwidth: number;
  /** Cholesky factor, band[i * (p + 1) + k] = L[i][i - k]. */
  band: Float64Array;
}

export interface CyclicBandedFactor {
  n: number;
  halfBandwidth: number;
  /** Factor of the banded matrix B = A + U U^T (see the module header); null when n is too small for the band trick. */
  inner: BandedFactor | null;
  /** Z = B^-1 U, column-major: z[j * n + i]. */
  z: Float64Array;
  /** U's non-zero rows: the first p rows are sqrt(alpha) I; the last p rows are stored here, u[r * p + j]. */
  sqrtAlpha: number;
  uTail: Float64Array;
  /** C^-1, p x p row-major. */
  capacitanceInverse: Float64Array;
  /** Dense fallback for tiny systems (n < 2p + 2). */
  dense: Matrix | null;
}

/** Factors a symmetric positive definite banded matrix; throws RangeError when it is not positive definite. */
export function factorBanded(n: number, halfBandwidth: number, entry: BandEntry): BandedFactor {
  const p = halfBandwidth;
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
  return { n, halfBandwidth: p, band };
}

/** Solves A x = rhs with a factor from factorBanded; out may be rhs itself. */
export function solveBanded(
  factor: BandedFactor,
  rhs: Float64Array,
  out: Float64Array = new Float64Array(factor.n),
): Float64Array {
  const { n, band } = factor;
  const p = factor.halfBandwidth;
  const w = p + 1;
  if (rhs.length !== n || out.length !== n) throw new RangeError(`banded solve: expected vectors of length ${n}`);
  // Forward: L y = rhs.
  for (let i = 0; i < n; i++) {
    let sum = rhs[i]!;
    const mStart = Math.max(0, i - p);
    for (let m = mStart; m < i; m++) sum -= band[i * w + (i - m)]! * out[m]!;
    out[i] = sum / band[i * w]!;
  }
  // Backward: L^T x = y; L^T[i][m] = L[m][i] for m = i + 1..i + p.
  for (let i = n - 1; i >= 0; i--) {
    let sum = out[i]!;
    const mEnd = Math.min(n - 1, i + p);
    for (let m = i + 1; m <= mEnd; m++) sum -= band[m * w + (m - i)]! * out[m]!;
    out[i] = sum / band[i * w]!;
  }
  return out;
}

export function bandedSolver(n: number, halfBandwidth: number, entry: BandEntry): BandedSolve {
  const factor = factorBanded(n, halfBandwidth, entry);
  return (rhs, out) => solveBanded(factor, rhs, out);
}

/** Dense copy of a cyclic band; entries that fall on the same place (tiny n) add up. */
function denseCyclic(n: number, p: number, entry: BandEntry): Matrix {
  const a = Matrix.zeros(n, n);
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

/** Factors a symmetric positive definite cyclic banded matrix (see the module header for the method). */
export function factorCyclicBanded(n: number, halfBandwidth: number, entry: BandEntry): CyclicBandedFactor {
  const p = halfBandwidth;
  if (p === 0) {
    return {
      n,
      halfBandwidth: p,
      inner: factorBanded(n, 0, entry),
      z: new Float64Array(0),
      sqrtAlpha: 0,
      uTail: new Float64Array(0),
      capacitanceInverse: new Float64Array(0),
      dense: null,
    };
  }
  if (n < 2 * p + 2) {
    const dense = denseCyclic(n, p, entry);
    return {
      n,
      halfBandwidth: p,
      inner: null,
      z: new Float64Array(0),
      sqrtAlpha: 0,
      uTail: new Float64Array(0),
      capacitanceInverse: new Float64Array(0),
      dense,
    };
  }
  // Corner block E[t][s] = A[t][n - p + s] for t, s = 0..p-1; non-zero only where the cyclic offset
  // k = t + p - s is at most p, i.e. s >= t: entry(n - p + s, t + p - s) (row n-p+s reaching column t).
  const e = new Float64Array(p * p);
  let norm2 = 0;
  for (let t = 0; t < p; t++) {
    for (let s = t; s < p; s++) {
      const v = entry(n - p + s, t + p - s);
      e[t * p + s] = v;
      norm2 += v * v;
    }
  }
  const alpha = Math.sqrt(norm2);
  if (alpha === 0) {
    const inner = factorBanded(n, p, entry);
    return {
      n,
      halfBandwidth: p,
      inner,
      z: new Float64Array(0),
      sqrtAlpha: 0,
      uTail: new Float64Array(0),
      capacitanceInverse: new Float64Array(0),
      dense: null,
    };
  }
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
  const modifiedEntry: BandEntry = (i, k) => {
    if (i + k >= n) return 0; // the wrapped entries are carried by U U^T
    let v = entry(i, k);
    if (k === 0 && i < p) v += alpha;
    if (i >= tailStart) v += g[(i - tailStart) * p + (i + k - tailStart)]!;
    return v;
  };
  const inner = factorBanded(n, p, modifiedEntry);
  const sqrtAlpha = Math.sqrt(alpha);
  // U's tail rows: U[n - p + r][j] = -E[j][r] / sqrt(alpha).
  const uTail = new Float64Array(p * p);
  for (let r = 0; r < p; r++) for (let j = 0; j < p; j++) uTail[r * p + j] = -e[j * p + r]! / sqrtAlpha;
  const z = new Float64Array(p * n);
  const column = new Float64Array(n);
  for (let j = 0; j < p; j++) {
    column.fill(0);
    column[j] = sqrtAlpha;
    for (let r = 0; r < p; r++) column[tailStart + r] = uTail[r * p + j]!;
    solveBanded(inner, column, z.subarray(j * n, (j + 1) * n));
  }
  // C = I - U^T Z.
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
  const capacitanceInverse = new Float64Array(p * p);
  for (let a = 0; a < p; a++) for (let b = 0; b < p; b++) capacitanceInverse[a * p + b] = inverse.get(a, b);
  return { n, halfBandwidth: p, inner, z, sqrtAlpha, uTail, capacitanceInverse, dense: null };
}

/** Solves A x = rhs with a factor from factorCyclicBanded; out may be rhs itself. */
export function solveCyclicBanded(
  factor: CyclicBandedFactor,
  rhs: Float64Array,
  out: Float64Array = new Float64Array(factor.n),
): Float64Array {
  const { n, inner, z, uTail, capacitanceInverse, sqrtAlpha } = factor;
  const p = factor.halfBandwidth;
  if (rhs.length !== n || out.length !== n)
    throw new RangeError(`cyclic banded solve: expected vectors of length ${n}`);
  if (factor.dense) {
    const x = new LuDecomposition(factor.dense).solve(Matrix.columnVector(Array.from(rhs)));
    for (let i = 0; i < n; i++) out[i] = x.get(i, 0);
    return out;
  }
  solveBanded(inner!, rhs, out);
  if (sqrtAlpha === 0) return out;
  const tailStart = n - p;
  // w = C^-1 U^T y, then x = y + Z w.
  const uty = new Float64Array(p);
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
}

export function cyclicBandedSolver(n: number, halfBandwidth: number, entry: BandEntry): BandedSolve {
  const factor = factorCyclicBanded(n, halfBandwidth, entry);
  return (rhs, out) => solveCyclicBanded(factor, rhs, out);
}
