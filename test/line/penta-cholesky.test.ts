// The pentadiagonal L D L^T solve and the interior-point box QP on systems of realistic size: the solve against
// ml-matrix's dense solve (a general-purpose reference library), the QP against the Karush-Kuhn-Tucker conditions,
// which are necessary and sufficient for a convex QP (Nocedal and Wright, Numerical Optimization, 2nd ed.,
// theorem 16.4), and against a problem whose answer is known in closed form.

import { describe, expect, it } from 'vitest';
import { Matrix, solve as denseSolve } from 'ml-matrix';
import { solveBoxQp } from '../../src/line/box-qp.js';
import { emptyBand, multiplyBand } from '../../src/line/penta-band.js';
import { bandFromRows } from './band-fixtures.js';
import { factorPenta, pentaFactorFor, solvePenta } from '../../src/line/penta-cholesky.js';

/** A second difference with random weights in each row, like a curvature residual of a line on the grid. */
function randomBand(n: number, cyclic: boolean, seed: number, ridge: number) {
  let state = seed;
  const random = () => (state = (state * 16807) % 2147483647) / 2147483647;
  return bandFromRows(n, cyclic, () => [1 + random(), -2 - random(), 1 + random()], ridge);
}

describe('pentadiagonal L D L^T against ml-matrix dense solve', () => {
  it.each([
    [6, true],
    [7, true],
    [40, true],
    [301, true],
    [5, false],
    [40, false],
    [301, false],
  ])('n = %i, cyclic %s', (n, cyclic) => {
    const { band, dense } = randomBand(n, cyclic, 11 + n, 1e-3);
    const factor = pentaFactorFor(n, cyclic);
    expect(factorPenta(band, factor)).toBe(true);
    const rhs = Float64Array.from({ length: n }, (_, i) => Math.sin(0.37 * i) + 0.5);
    const x = solvePenta(factor, rhs, new Float64Array(n));
    const reference = denseSolve(dense, Matrix.columnVector(Array.from(rhs)));
    let num = 0;
    let den = 0;
    for (let i = 0; i < n; i++) {
      num += (x[i]! - reference.get(i, 0)) ** 2;
      den += reference.get(i, 0) ** 2;
    }
    // Both are backward-stable solves of one SPD system (Golub and Van Loan, section 4.2): they agree to rounding
    // times the condition number, which the ridge of 1e-3 keeps below about 1e8 at these sizes.
    expect(Math.sqrt(num / den)).toBeLessThan(1e-7);
  });

  it('refuses a matrix that is not positive definite', () => {
    const { band } = randomBand(20, true, 5, 1e-3);
    band.diag[7] = -1;
    expect(factorPenta(band, pentaFactorFor(20, true))).toBe(false);
  });
});

describe('interior-point box QP', () => {
  it.each([true, false])('meets the KKT conditions on 2,000 variables (cyclic %s)', (cyclic) => {
    const n = 2000;
    const { band } = randomBand(n, cyclic, 3, 1e-4);
    const q = Float64Array.from({ length: n }, (_, i) => 0.3 * Math.sin(0.011 * i) + 0.05 * Math.cos(0.3 * i));
    const lower = Float64Array.from({ length: n }, (_, i) => -4 - Math.sin(0.004 * i));
    const upper = Float64Array.from({ length: n }, (_, i) => 4 + Math.cos(0.005 * i));
    // A box of no width fixes its variable there.
    lower[500] = upper[500] = 1.25;
    const { x, converged, iterations } = solveBoxQp(band, q, lower, upper, new Float64Array(n), { tolerance: 1e-12 });
    expect(converged).toBe(true);
    expect(iterations).toBeLessThan(60);
    const gradient = multiplyBand(band, x);
    let atBounds = 0;
    let largestGradient = 0;
    for (let i = 0; i < n; i++) gradient[i]! += q[i]!;
    for (let i = 0; i < n; i++) largestGradient = Math.max(largestGradient, Math.abs(gradient[i]!));
    for (let i = 0; i < n; i++) {
      expect(x[i]).toBeGreaterThanOrEqual(lower[i]!);
      expect(x[i]).toBeLessThanOrEqual(upper[i]!);
      if (i === 500) continue;
      const g = gradient[i]!;
      const slack = 1e-6;
      // Stationarity with the bound's multiplier: a free variable has g = 0; at the lower bound g >= 0, at the upper
      // bound g <= 0 (theorem 16.4 of Nocedal and Wright for a bound-constrained convex QP).
      if (x[i]! - lower[i]! < slack) expect(g).toBeGreaterThan(-1e-6 * largestGradient);
      else if (upper[i]! - x[i]! < slack) expect(g).toBeLessThan(1e-6 * largestGradient);
      else expect(Math.abs(g)).toBeLessThan(1e-6 * largestGradient);
      if (x[i]! - lower[i]! < slack || upper[i]! - x[i]! < slack) atBounds++;
    }
    expect(x[500]).toBe(1.25);
    // The box binds somewhere, or the check above would test only an unconstrained solve.
    expect(atBounds).toBeGreaterThan(10);
  });

  it('puts a ring of free points halfway between bounds that pull both ways: the closed form x = (a + b) / 2', () => {
    // Minimise sum (x_i - a)^2 + (x_i - b)^2 = 2 x_i^2 - 2 (a + b) x_i + const, each point alone: x = (a + b) / 2
    // inside the box, or the nearer bound (calculus; from memory).
    const n = 500;
    const band = emptyBand(n, true);
    band.diag.fill(2);
    const q = new Float64Array(n).fill(-(1 + 2));
    const lower = Float64Array.from({ length: n }, (_, i) => (i % 3 === 0 ? 1.6 : -5));
    const upper = Float64Array.from({ length: n }, (_, i) => (i % 3 === 1 ? 1.2 : 5));
    const { x } = solveBoxQp(band, q, lower, upper, new Float64Array(n), { tolerance: 1e-14 });
    for (let i = 0; i < n; i++) expect(x[i]).toBeCloseTo(i % 3 === 0 ? 1.6 : i % 3 === 1 ? 1.2 : 1.5, 6);
  });
});
