// Factor and solve of a symmetric positive definite pentadiagonal matrix, plain or cyclic, in arrays allocated
// once and reused, at linear cost: the line search factors one such matrix per interior-point step.
// Method: the banded L D L^T (square-root-free Cholesky) factorisation (Golub and Van Loan, Matrix Computations,
// 4th ed., sections 4.1 and 4.3), which needs one division per row and none in the solves. On a cyclic band the
// corner entries couple the last two rows with the first columns; eliminating in the natural order fills those
// two rows of L completely and nothing else (the "arrowhead" fill of a bordered band), so L keeps its two
// sub-diagonals plus two dense rows, still O(n) numbers.

import type { PentaBand } from './penta-band.js';

/** Cyclic bands smaller than this have corner entries that meet the band itself; they go to the dense path. */
export const SMALLEST_CYCLIC_PENTA = 6;

export interface PentaFactor {
  count: number;
  cyclic: boolean;
  /** 1 / D[i][i], every row. */
  inversePivot: Float64Array;
  /** L[i][i - 1] and L[i][i - 2] of the band rows (all rows on a plain band, the first n - 2 on a cyclic one);
   * on a cyclic band sub1[n - 1] holds L[n-1][n-2]. L's diagonal is 1. */
  sub1: Float64Array;
  sub2: Float64Array;
  /** Cyclic only: L[n-2][j] and L[n-1][j] for j < n - 2, and the matrix's own entries there while factoring. */
  rowA: Float64Array;
  rowB: Float64Array;
  scratchA: Float64Array;
  scratchB: Float64Array;
}

/** A class, not an object literal, as the band (penta-band.ts says why). */
class Factor implements PentaFactor {
  readonly count: number;
  readonly cyclic: boolean;
  readonly inversePivot: Float64Array;
  readonly sub1: Float64Array;
  readonly sub2: Float64Array;
  readonly rowA: Float64Array;
  readonly rowB: Float64Array;
  readonly scratchA: Float64Array;
  readonly scratchB: Float64Array;

  constructor(count: number, cyclic: boolean) {
    const tail = cyclic ? count : 0;
    this.count = count;
    this.cyclic = cyclic;
    this.inversePivot = new Float64Array(count);
    this.sub1 = new Float64Array(count);
    this.sub2 = new Float64Array(count);
    this.rowA = new Float64Array(tail);
    this.rowB = new Float64Array(tail);
    this.scratchA = new Float64Array(tail);
    this.scratchB = new Float64Array(tail);
  }
}

export function pentaFactorFor(count: number, cyclic: boolean): PentaFactor {
  return new Factor(count, cyclic);
}

/** Factors the band into `factor`; false when the matrix is not (numerically) positive definite. */
export function factorPenta(band: PentaBand, factor: PentaFactor): boolean {
  const n = band.count;
  const { diag, off1, off2 } = band;
  const inv = factor.inversePivot;
  const l1 = factor.sub1;
  const l2 = factor.sub2;
  const bandRows = band.cyclic ? n - 2 : n;
  // Row i: a2 = A[i][i-2] and a1 = A[i][i-1] less the fill, each L D in one (L[i][k] D[k] = a_k).
  let previousL1 = 0;
  for (let i = 0; i < bandRows; i++) {
    const a2 = i >= 2 ? off2[i - 2]! : 0;
    const s2 = i >= 2 ? a2 * inv[i - 2]! : 0;
    const a1 = i >= 1 ? off1[i - 1]! - a2 * previousL1 : 0;
    const s1 = i >= 1 ? a1 * inv[i - 1]! : 0;
    const pivot = diag[i]! - s2 * a2 - s1 * a1;
    if (!(pivot > 0)) return false;
    l2[i] = s2;
    l1[i] = s1;
    inv[i] = 1 / pivot;
    previousL1 = s1;
  }
  if (!band.cyclic) return true;
  // The two dense rows: A[n-2][j] and A[n-1][j] (j < n - 2) are the wrapped corner entries and the band's last
  // reach into them; L[r][j] D[j] is that less the two band entries of column j.
  const rowA = factor.rowA;
  const rowB = factor.rowB;
  const uA = factor.scratchA;
  const uB = factor.scratchB;
  uA.fill(0);
  uB.fill(0);
  uA[0] = off2[n - 2]!;
  uA[n - 4]! += off2[n - 4]!;
  uA[n - 3]! += off1[n - 3]!;
  uB[0] = off1[n - 1]!;
  uB[1] = off2[n - 1]!;
  uB[n - 3]! += off2[n - 3]!;
  let pivotA = diag[n - 2]!;
  let pivotB = diag[n - 1]!;
  let crossAB = off1[n - 2]!;
  let a1 = 0;
  let a2 = 0;
  let b1 = 0;
  let b2 = 0;
  for (let j = 0; j < bandRows; j++) {
    // l1[0], l2[0] and l2[1] are zero, so the first two columns need no special case.
    const a = uA[j]! - a1 * l1[j]! - a2 * l2[j]!;
    const b = uB[j]! - b1 * l1[j]! - b2 * l2[j]!;
    const la = a * inv[j]!;
    const lb = b * inv[j]!;
    rowA[j] = la;
    rowB[j] = lb;
    pivotA -= a * la;
    pivotB -= b * lb;
    crossAB -= b * la;
    a2 = a1;
    a1 = a;
    b2 = b1;
    b1 = b;
  }
  if (!(pivotA > 0)) return false;
  inv[n - 2] = 1 / pivotA;
  const last1 = crossAB / pivotA;
  pivotB -= last1 * crossAB;
  if (!(pivotB > 0)) return false;
  l1[n - 1] = last1;
  inv[n - 1] = 1 / pivotB;
  return true;
}

/** Solves A x = rhs with a factor from factorPenta; out may be rhs itself. */
export function solvePenta(factor: PentaFactor, rhs: Float64Array, out: Float64Array): Float64Array {
  const n = factor.count;
  const inv = factor.inversePivot;
  const l1 = factor.sub1;
  const l2 = factor.sub2;
  const bandRows = factor.cyclic ? n - 2 : n;
  // Forward: L y = rhs (unit diagonal).
  let y2 = 0;
  let y1 = 0;
  for (let i = 0; i < bandRows; i++) {
    const y = rhs[i]! - l1[i]! * y1 - l2[i]! * y2;
    out[i] = y;
    y2 = y1;
    y1 = y;
  }
  let xA = 0;
  let xB = 0;
  if (factor.cyclic) {
    const rowA = factor.rowA;
    const rowB = factor.rowB;
    let yA = rhs[n - 2]!;
    let yB = rhs[n - 1]!;
    for (let j = 0; j < bandRows; j++) {
      yA -= rowA[j]! * out[j]!;
      yB -= rowB[j]! * out[j]!;
    }
    yB -= l1[n - 1]! * yA;
    // Backward: L^T x = D^-1 y, the dense rows first.
    xB = yB * inv[n - 1]!;
    xA = yA * inv[n - 2]! - l1[n - 1]! * xB;
    out[n - 1] = xB;
    out[n - 2] = xA;
  }
  const rowA = factor.rowA;
  const rowB = factor.rowB;
  let x1 = 0;
  let x2 = 0;
  for (let i = bandRows - 1; i >= 0; i--) {
    let x = out[i]! * inv[i]!;
    if (i + 1 < bandRows) x -= l1[i + 1]! * x1;
    if (i + 2 < bandRows) x -= l2[i + 2]! * x2;
    if (factor.cyclic) x -= rowA[i]! * xA + rowB[i]! * xB;
    out[i] = x;
    x2 = x1;
    x1 = x;
  }
  return out;
}
