// Box-constrained convex quadratic programme with a symmetric band of half-bandwidth 2 (pentadiagonal, plain
// or cyclic): minimise x^T Q x + 2 q^T x subject to lower <= x <= upper.
// Method: Bertsekas' projected Newton method ("Projected Newton methods for optimization problems with simple
// constraints", SIAM J. Control Optim. 20 (1982) 221-246): variables held at a bound by the gradient take a
// scaled gradient step, the others a Newton step, and a projected Armijo search keeps every iterate feasible
// and descending. Holding a variable replaces its row and column by the identity, so the Newton system keeps
// its band and is solved by the banded Cholesky (src/numeric/banded.ts) at linear cost.

import { bandedSolver, cyclicBandedSolver, type BandEntry } from '../numeric/banded.js';

/** Q's band: diag[i] = Q[i][i], off1[i] = Q[i][i+1], off2[i] = Q[i][i+2] (indices modulo n when cyclic). */
export interface PentaBand {
  count: number;
  cyclic: boolean;
  diag: Float64Array;
  off1: Float64Array;
  off2: Float64Array;
}

export function emptyBand(count: number, cyclic: boolean): PentaBand {
  return { count, cyclic, diag: new Float64Array(count), off1: new Float64Array(count), off2: new Float64Array(count) };
}

/** y = Q x. */
export function multiplyBand(
  band: PentaBand,
  x: Float64Array,
  out: Float64Array = new Float64Array(band.count),
): Float64Array {
  const { count: n, cyclic, diag, off1, off2 } = band;
  for (let i = 0; i < n; i++) out[i] = diag[i]! * x[i]!;
  for (let i = 0; i < n; i++) {
    const j1 = i + 1;
    const j2 = i + 2;
    if (cyclic || j1 < n) {
      const j = j1 % n;
      out[i]! += off1[i]! * x[j]!;
      out[j]! += off1[i]! * x[i]!;
    }
    if (cyclic || j2 < n) {
      const j = j2 % n;
      out[i]! += off2[i]! * x[j]!;
      out[j]! += off2[i]! * x[i]!;
    }
  }
  return out;
}

export interface BoxQpResult {
  x: Float64Array;
  iterations: number;
  converged: boolean;
}

function objectiveOf(band: PentaBand, q: Float64Array, x: Float64Array, work: Float64Array): number {
  multiplyBand(band, x, work);
  let sum = 0;
  for (let i = 0; i < x.length; i++) sum += x[i]! * (work[i]! + 2 * q[i]!);
  return sum;
}

/**
 * Solves the box QP from a starting point (clipped into the box), to a step below toleranceX. Each iterate is
 * feasible and lowers the objective, so stopping early still gives a usable point.
 */
export function solveBoxQp(
  band: PentaBand,
  q: Float64Array,
  lower: Float64Array,
  upper: Float64Array,
  start: Float64Array,
  maxIterations = 30,
  toleranceX = 1e-6,
): BoxQpResult {
  const n = band.count;
  const x = new Float64Array(n);
  for (let i = 0; i < n; i++) x[i] = Math.min(upper[i]!, Math.max(lower[i]!, start[i]!));
  const gradient = new Float64Array(n);
  const step = new Float64Array(n);
  const trial = new Float64Array(n);
  const work = new Float64Array(n);
  const binding = new Uint8Array(n);
  let value = objectiveOf(band, q, x, work);
  let converged = false;
  let iterations = 0;
  for (; iterations < maxIterations; iterations++) {
    // Half the gradient of x^T Q x + 2 q^T x.
    multiplyBand(band, x, gradient);
    for (let i = 0; i < n; i++) gradient[i]! += q[i]!;
    // Bertsekas' epsilon-binding set: at (or within epsilon, in metres, of) a bound the gradient pushes against.
    const epsilon = 1e-3;
    for (let i = 0; i < n; i++) {
      const g = gradient[i]!;
      binding[i] = (x[i]! <= lower[i]! + epsilon && g > 0) || (x[i]! >= upper[i]! - epsilon && g < 0) ? 1 : 0;
      step[i] = binding[i] ? -g / band.diag[i]! : -g;
    }
    // Newton step on the free variables: the reduced band, with identity rows and columns for the binding ones.
    const entry: BandEntry = (i, k) => {
      if (k === 0) return binding[i] ? 1 : band.diag[i]!;
      const j = (i + k) % n;
      if (binding[i] || binding[j]) return 0;
      return k === 1 ? band.off1[i]! : band.off2[i]!;
    };
    const solve = band.cyclic ? cyclicBandedSolver(n, 2, entry) : bandedSolver(n, 2, entry);
    const newton = solve(step);
    for (let i = 0; i < n; i++) step[i] = binding[i] ? step[i]! : newton[i]!;
    // Projected search along the step with Armijo's rule (Bertsekas, SIAM J. Control Optim. 20 (1982) 221-246).
    let accepted = false;
    let largestMove = 0;
    let fullMove = -1;
    for (let alpha = 1; alpha > 1e-6; alpha *= 0.5) {
      let predicted = 0;
      largestMove = 0;
      for (let i = 0; i < n; i++) {
        const next = Math.min(upper[i]!, Math.max(lower[i]!, x[i]! + alpha * step[i]!));
        trial[i] = next;
        predicted += 2 * gradient[i]! * (x[i]! - next);
        largestMove = Math.max(largestMove, Math.abs(next - x[i]!));
      }
      if (fullMove < 0) fullMove = largestMove;
      if (fullMove < toleranceX) break;
      const trialValue = objectiveOf(band, q, trial, work);
      if (value - trialValue >= 1e-4 * predicted && trialValue <= value) {
        x.set(trial);
        value = trialValue;
        accepted = true;
        break;
      }
    }
    if (fullMove < toleranceX) {
      converged = true;
      break;
    }
    if (!accepted || largestMove < toleranceX) {
      converged = accepted;
      iterations++;
      break;
    }
  }
  return { x, iterations, converged };
}
