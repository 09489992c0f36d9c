// A symmetric band of half-bandwidth 2 (pentadiagonal, plain or cyclic) and its product with a vector: the
// matrix of the racing line's quadratic programme (box-qp.ts) and of its factorisation (penta-cholesky.ts).

/** Q's band: diag[i] = Q[i][i], off1[i] = Q[i][i+1], off2[i] = Q[i][i+2] (indices modulo n when cyclic). */
export interface PentaBand {
  count: number;
  cyclic: boolean;
  diag: Float64Array;
  off1: Float64Array;
  off2: Float64Array;
}

// The line search's work records (this band, the factor, the interior-point workspace, the optimiser's scratch) are
// built by small classes, not object literals: V8 turns a literal's fields from constant to mutable the second time
// the literal runs, and threw away the compiled code of every step that had read such a record so far, which the
// first racing line of a run compiled twice. Instances of a class keep their fields as they are.

class Band implements PentaBand {
  readonly count: number;
  readonly cyclic: boolean;
  readonly diag: Float64Array;
  readonly off1: Float64Array;
  readonly off2: Float64Array;

  constructor(count: number, cyclic: boolean) {
    this.count = count;
    this.cyclic = cyclic;
    this.diag = new Float64Array(count);
    this.off1 = new Float64Array(count);
    this.off2 = new Float64Array(count);
  }
}

export function emptyBand(count: number, cyclic: boolean): PentaBand {
  return new Band(count, cyclic);
}

/** Row i of Q x, indices wrapping on a cyclic band and ending at the edges of a plain one. */
function rowProduct(band: PentaBand, x: Float64Array, i: number): number {
  const { count: n, cyclic, diag, off1, off2 } = band;
  let sum = diag[i]! * x[i]!;
  for (let k = 1; k <= 2; k++) {
    const off = k === 1 ? off1 : off2;
    if (cyclic || i + k < n) sum += off[i]! * x[(i + k) % n]!;
    if (cyclic || i - k >= 0) {
      const j = (i - k + n) % n;
      sum += off[j]! * x[j]!;
    }
  }
  return sum;
}

/** y = Q x. */
export function multiplyBand(
  band: PentaBand,
  x: Float64Array,
  out: Float64Array = new Float64Array(band.count),
): Float64Array {
  const { count: n, diag, off1, off2 } = band;
  if (n < 5) {
    // Wrapped entries of a tiny cyclic band land on the same places: add them one by one.
    for (let i = 0; i < n; i++) out[i] = rowProduct(band, x, i);
    return out;
  }
  for (let i = 2; i < n - 2; i++)
    out[i] =
      diag[i]! * x[i]! +
      off1[i]! * x[i + 1]! +
      off1[i - 1]! * x[i - 1]! +
      off2[i]! * x[i + 2]! +
      off2[i - 2]! * x[i - 2]!;
  out[0] = rowProduct(band, x, 0);
  out[1] = rowProduct(band, x, 1);
  out[n - 2] = rowProduct(band, x, n - 2);
  out[n - 1] = rowProduct(band, x, n - 1);
  return out;
}
