// Whittaker-Henderson smoothing of a sampled centreline: the smoothed series z minimises
//   sum (z_i - y_i)^2 + lambda * sum (second difference of z)^2,
// i.e. solves (I + lambda D^T D) z = y, a pentadiagonal system (cyclic for a closed track). Whittaker 1923,
// "On a new method of graduation", Proc. Edinburgh Math. Soc. 41; Eilers 2003, "A perfect smoother",
// Analytical Chemistry 75(14). Its transfer function is 1 / (1 + lambda (2 - 2 cos w)^2) ~ 1 / (1 + lambda w^4),
// so with w = 2 pi h / wavelength the response is one half at wavelength 2 pi h lambda^(1/4): we set
// lambda = (smoothingM / (2 pi h))^4 so that smoothingM is the wavelength at half response. Longer waves pass
// almost untouched (at 2 x smoothingM the response is 0.94), shorter ones are cut with the fourth power.

import { factorBanded, factorCyclicBanded, type BandedSolve } from '../numeric/banded.js';

/** Penalty weight for a half-response wavelength smoothingM on a grid of step stepM (second differences). */
export function smoothingLambda(smoothingM: number, stepM: number): number {
  return (smoothingM / (2 * Math.PI * stepM)) ** 4;
}

const SECOND_DIFFERENCE = [1, -2, 1];

/** (D^T D)[i][i + k] for the open second-difference operator D (rows [1, -2, 1]) on n points. */
function openPenaltyEntry(n: number, i: number, k: number): number {
  const c0 = SECOND_DIFFERENCE;
  let sum = 0;
  // Row r of D touches columns r, r + 1, r + 2.
  for (let r = Math.max(0, i + k - 2); r <= Math.min(i, n - 3); r++) sum += c0[i - r]! * c0[i + k - r]!;
  return sum;
}

const CYCLIC_PENALTY = [6, -4, 1];

/**
 * Returns a solver for (I + lambda D^T D) z = y, factored once, for several series (x and y) on the same grid.
 * Needs n >= 3 for an open series.
 */
export function whittakerSmoother(n: number, lambda: number, closed: boolean): BandedSolve {
  if (closed) return factorCyclicBanded(n, 2, (_i, k) => (k === 0 ? 1 : 0) + lambda * CYCLIC_PENALTY[k]!).solve;
  return factorBanded(n, 2, (i, k) => (i + k >= n ? 0 : (k === 0 ? 1 : 0) + lambda * openPenaltyEntry(n, i, k))).solve;
}
