// Pentadiagonal test systems built as the curvature model builds its own: Q = sum of r_i r_i^T over three-wide
// residual rows r_i (columns i - 1, i, i + 1, wrapping when cyclic) plus a ridge, both as a band and as a dense
// ml-matrix for the reference solves.

import { Matrix } from 'ml-matrix';
import { emptyBand, type PentaBand } from '../../src/line/penta-band.js';

export function bandFromRows(
  n: number,
  cyclic: boolean,
  rowOf: (i: number) => [number, number, number],
  ridge: number,
): { band: PentaBand; dense: Matrix } {
  const band = emptyBand(n, cyclic);
  const dense = Matrix.zeros(n, n);
  for (let i = 0; i < n; i++) {
    const r = rowOf(i);
    const cols = [i - 1, i, i + 1].map((j) => (cyclic ? (j + n) % n : j));
    for (let a = 0; a < 3; a++)
      for (let b = 0; b < 3; b++) {
        const ja = cols[a]!;
        const jb = cols[b]!;
        if (ja < 0 || jb < 0 || ja >= n || jb >= n) continue;
        dense.set(ja, jb, dense.get(ja, jb) + r[a]! * r[b]!);
      }
  }
  for (let i = 0; i < n; i++) {
    dense.set(i, i, dense.get(i, i) + ridge);
    band.diag[i] = dense.get(i, i);
    band.off1[i] = cyclic || i + 1 < n ? dense.get(i, (i + 1) % n) : 0;
    band.off2[i] = cyclic || i + 2 < n ? dense.get(i, (i + 2) % n) : 0;
  }
  return { band, dense };
}
