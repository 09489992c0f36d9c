// Offset-curve geometry and the banded box QP, checked against closed forms and against ml-matrix.

import { describe, expect, it } from 'vitest';
import { Matrix, solve as denseSolve } from 'ml-matrix';
import { lineCurvature, linePath, linePositions, offsetCurvature } from '../../src/line/geometry.js';
import { solveBoxQp } from '../../src/line/box-qp.js';
import { bandFromRows } from './band-fixtures.js';
import { corridorOf, defaultMarginM } from '../../src/line/corridor.js';
import { InputError } from '../../src/errors.js';
import { testCar } from '../helpers/cars.js';
import { cornerBetweenStraights, ring } from './hand-tracks.js';

describe('offset-curve geometry', () => {
  it('a constant offset from a circle is a concentric circle', () => {
    // Concentric circles: radius R - n for an offset n towards the centre (elementary geometry).
    const track = ring(100, 10, 2);
    for (const n of [-5, -2, 0, 3, 5]) {
      const offsets = new Float64Array(track.distanceM.length).fill(n);
      const kappa = lineCurvature(track, offsets);
      const path = linePath(track, offsets);
      const length = path.segmentLengthM.reduce((a, b) => a + b, 0);
      expect(kappa[17]).toBeCloseTo(1 / (100 - n), 12);
      // Circumference 2 pi (R - n).
      expect(length / (2 * Math.PI * (100 - n))).toBeCloseTo(1, 9);
      const { xM, yM } = linePositions(track, offsets);
      expect(Math.hypot(xM[40]!, yM[40]! - 100)).toBeCloseTo(100 - n, 9);
    }
  });

  it('a line at a constant slope across a straight has zero curvature and length h / cos', () => {
    // Pythagoras: a segment crossing dn over h has length sqrt(h^2 + dn^2).
    const track = cornerBetweenStraights(200, 30, Math.PI / 2, 10, 1);
    const offsets = new Float64Array(track.distanceM.length);
    for (let i = 0; i < 100; i++) offsets[i] = -4 + 0.05 * i;
    const kappa = lineCurvature(track, offsets);
    const path = linePath(track, offsets);
    expect(Math.abs(kappa[50]!)).toBeLessThan(1e-12);
    expect(path.segmentLengthM[50]).toBeCloseTo(Math.hypot(1, 0.05), 12);
  });

  it('the curvature formula matches the curvature of the plane curve c + n N computed by hand', () => {
    // Independent check: x(s), y(s) of the offset curve on a circle with n = A sin(s / L), curvature by
    // (x'y'' - y'x'') / (x'^2 + y'^2)^1.5 with analytic derivatives (standard differential geometry).
    const R = 80;
    const A = 3;
    const L = 20;
    for (const s of [1, 7, 13.5, 40]) {
      const th = s / R;
      const n = A * Math.sin(s / L);
      const dn = (A / L) * Math.cos(s / L);
      const ddn = -(A / (L * L)) * Math.sin(s / L);
      // c = R (sin th, 1 - cos th), N = (-sin th, cos th); p = c + n N, so p = (R - n)(sin th, -cos th) + (0, R).
      const r = R - n;
      const dr = -dn;
      const ddr = -ddn;
      const dx = dr * Math.sin(th) + (r * Math.cos(th)) / R;
      const dy = -dr * Math.cos(th) + (r * Math.sin(th)) / R;
      const ddx = ddr * Math.sin(th) + (2 * dr * Math.cos(th)) / R - (r * Math.sin(th)) / (R * R);
      const ddy = -ddr * Math.cos(th) + (2 * dr * Math.sin(th)) / R + (r * Math.cos(th)) / (R * R);
      const expected = (dx * ddy - dy * ddx) / Math.pow(dx * dx + dy * dy, 1.5);
      expect(offsetCurvature(n, dn, ddn, 1 / R, 0)).toBeCloseTo(expected, 12);
    }
  });
});

describe('corridor checks', () => {
  it('refuses a track without widths and says how to give them', () => {
    const track = { ...ring(100, 10, 2), widthLeftM: null, widthRightM: null };
    expect(() => corridorOf(track, 0.8)).toThrow(InputError);
    expect(() => corridorOf(track, 0.8)).toThrow(/--width-m/);
  });

  it('names the first distance where the margin does not fit', () => {
    const track = cornerBetweenStraights(100, 30, Math.PI / 2, 10, 1);
    track.widthLeftM![57] = 0.5;
    track.widthRightM![57] = 0.5;
    expect(() => corridorOf(track, 0.8)).toThrow(/at 57\.0 m .*less than twice the margin/);
  });

  it('names where an edge folds over itself', () => {
    // A turn of radius 4 m with 5 m of width on its inside: 5 * (1/4) >= 1.
    const track = cornerBetweenStraights(100, 4, Math.PI / 2, 10, 0.5);
    expect(() => corridorOf(track, 0)).toThrow(/at 100\.5 m the left edge folds over itself/);
  });

  it('takes half the car width plus 0.3 m as the default margin', () => {
    expect(defaultMarginM({ ...testCar(), widthM: 1.8 })).toBeCloseTo(1.2, 12);
    // Without a car width the margin is the stated default, 0.8 m.
    expect(defaultMarginM(testCar())).toBe(0.8);
  });
});

/** Dense reference: enumerate every active set of a small box QP and keep the best KKT point (ml-matrix solves). */
function bruteForceBoxQp(q: Matrix, c: number[], lower: number[], upper: number[]): number[] {
  const n = c.length;
  let best: number[] = [];
  let bestValue = Infinity;
  for (let code = 0; code < 3 ** n; code++) {
    const state: number[] = [];
    for (let i = 0, k = code; i < n; i++, k = Math.floor(k / 3)) state.push(k % 3);
    const free = state.map((s, i) => (s === 0 ? i : -1)).filter((i) => i >= 0);
    const x = state.map((s, i) => (s === 1 ? lower[i]! : s === 2 ? upper[i]! : 0));
    if (free.length > 0) {
      const a = new Matrix(free.length, free.length);
      const b = new Matrix(free.length, 1);
      free.forEach((i, r) => {
        let rhs = -c[i]!;
        for (let j = 0; j < n; j++) if (state[j] !== 0) rhs -= q.get(i, j) * x[j]!;
        b.set(r, 0, rhs);
        free.forEach((j, s) => a.set(r, s, q.get(i, j)));
      });
      const sol = denseSolve(a, b);
      free.forEach((i, r) => (x[i] = sol.get(r, 0)));
    }
    if (x.some((v, i) => v < lower[i]! - 1e-12 || v > upper[i]! + 1e-12)) continue;
    let value = 0;
    for (let i = 0; i < n; i++) {
      value += 2 * c[i]! * x[i]!;
      for (let j = 0; j < n; j++) value += x[i]! * q.get(i, j) * x[j]!;
    }
    if (value < bestValue) {
      bestValue = value;
      best = x;
    }
  }
  return best;
}

describe('banded box QP', () => {
  it('matches an exhaustive active-set search on small cyclic and plain pentadiagonal problems', () => {
    let seed = 7;
    const random = () => (seed = (seed * 16807) % 2147483647) / 2147483647;
    for (const cyclic of [true, false]) {
      for (let trial = 0; trial < 5; trial++) {
        const n = 7;
        // Q = sum of r r^T over three-wide residual rows (like the curvature model) plus a small diagonal.
        const { band, dense } = bandFromRows(n, cyclic, () => [random() - 0.5, 1 + random(), random() - 0.5], 0.01);
        const c = Array.from({ length: n }, () => 4 * (random() - 0.5));
        const lower = Array.from({ length: n }, () => -0.5 - random());
        const upper = Array.from({ length: n }, () => 0.5 + random());
        const expected = bruteForceBoxQp(dense, c, lower, upper);
        const { x, converged } = solveBoxQp(
          band,
          Float64Array.from(c),
          Float64Array.from(lower),
          Float64Array.from(upper),
          new Float64Array(n),
          { tolerance: 1e-14 },
        );
        expect(converged).toBe(true);
        for (let i = 0; i < n; i++) expect(x[i]).toBeCloseTo(expected[i]!, 6);
      }
    }
  });
});
