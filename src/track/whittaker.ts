// The Whittaker smoother with second differences on a uniform grid (Whittaker, Proc. Edinburgh Math. Soc. 41, 1923;
// Eilers, "A perfect smoother", Anal. Chem. 75 (2003) 3631-3636): z minimises sum w_i (y_i - z_i)^2 + lambda
// sum (second difference of z)^2, i.e. (W + lambda D2^T D2) z = W y, a pentadiagonal system solved in linear time
// (../numeric/banded.ts), cyclic on a closed lap. Its gain on a sine of wavenumber k with unit weights is
// 1 / (1 + lambda (2 - 2 cos k h)^2) (Eilers 2003), so lambda = (2 sin(pi h / L))^-4 puts the gain 1/2 at wavelength L.

import { factorBanded, factorCyclicBanded } from '../numeric/banded.js';

/** lambda whose gain is exactly 1/2 at the wavelength `cutoffM` on a grid of `stepM` (unit weights). */
export function whittakerLambda(stepM: number, cutoffM: number): number {
  return (2 * Math.sin((Math.PI * stepM) / cutoffM)) ** -4;
}

/** D2^T D2 entry (i, i + k), k = 0..2, of an open grid of n points (second differences on rows 0..n-3). */
function openPenalty(i: number, k: number, n: number): number {
  const c = [1, -2, 1];
  let sum = 0;
  for (let r = Math.max(0, i - 2); r <= Math.min(i, n - 3); r++) {
    const b = i + k - r;
    if (b <= 2) sum += c[i - r]! * c[b]!;
  }
  return sum;
}

/**
 * Smooths `values` with a gain of 1/2 at wavelength `cutoffM`; `weights` (default all 1) weigh each point's data, and a
 * point of weight 0 is filled in from its neighbours. On an open grid the ends follow a straight line (D2 annihilates
 * it); a closed grid wraps round.
 */
export function whittakerSmooth(
  values: Float64Array,
  stepM: number,
  cutoffM: number,
  closed: boolean,
  weights: Float64Array | null = null,
): Float64Array {
  const n = values.length;
  const lambda = whittakerLambda(stepM, cutoffM);
  const weight = (i: number) => (weights ? weights[i]! : 1);
  const rhs = new Float64Array(n);
  for (let i = 0; i < n; i++) rhs[i] = weight(i) * values[i]!;
  if (closed && n >= 6) {
    // Cyclic D2^T D2: 6 on the diagonal, -4 and 1 beside it.
    return factorCyclicBanded(n, 2, (i, k) =>
      k === 0 ? weight(i) + 6 * lambda : k === 1 ? -4 * lambda : lambda,
    ).solve(rhs);
  }
  return factorBanded(n, 2, (i, k) => (k === 0 ? weight(i) : 0) + lambda * openPenalty(i, k, n)).solve(rhs);
}
