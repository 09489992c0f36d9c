// Cubic interpolating spline through centreline points, parametrised by cumulative chord length (periodic for a
// closed track, parabolic run-out ends for an open one), so sparse points resample onto a fine grid without the kinks of
// straight-line joins. Second-derivative form: de Boor, A Practical Guide to Splines (1978), ch. IV; the
// tridiagonal systems are solved with the banded solvers.

import { factorBanded, factorCyclicBanded } from '../numeric/banded.js';

export interface ChordSpline {
  closed: boolean;
  /** Knot parameters (cumulative chord), length n; the period is totalT when closed. */
  knotT: Float64Array;
  totalT: number;
  x: Float64Array;
  y: Float64Array;
  /** Second derivatives at the knots. */
  x2: Float64Array;
  y2: Float64Array;
}

/** Knot spacing h[i] = chord from point i to point i + 1 (to point 0 after the last when closed). */
function chordLengths(x: Float64Array, y: Float64Array, closed: boolean): Float64Array {
  const n = x.length;
  const count = closed ? n : n - 1;
  const h = new Float64Array(count);
  for (let i = 0; i < count; i++) {
    const j = i + 1 === n ? 0 : i + 1;
    h[i] = Math.hypot(x[j]! - x[i]!, y[j]! - y[i]!);
  }
  return h;
}

function secondDerivativeRhs(v: Float64Array, h: Float64Array, closed: boolean): Float64Array {
  const n = v.length;
  if (closed) {
    const rhs = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const prev = i === 0 ? n - 1 : i - 1;
      const next = i + 1 === n ? 0 : i + 1;
      rhs[i] = 6 * ((v[next]! - v[i]!) / h[i]! - (v[i]! - v[prev]!) / h[prev]!);
    }
    return rhs;
  }
  const rhs = new Float64Array(n - 2);
  for (let i = 1; i < n - 1; i++) rhs[i - 1] = 6 * ((v[i + 1]! - v[i]!) / h[i]! - (v[i]! - v[i - 1]!) / h[i - 1]!);
  return rhs;
}

/** Fits the spline; consecutive points must be distinct (the readers check that). */
export function chordSpline(x: Float64Array, y: Float64Array, closed: boolean): ChordSpline {
  const n = x.length;
  const h = chordLengths(x, y, closed);
  const knotT = new Float64Array(n);
  for (let i = 1; i < n; i++) knotT[i] = knotT[i - 1]! + h[i - 1]!;
  const totalT = closed ? knotT[n - 1]! + h[n - 1]! : knotT[n - 1]!;
  const x2 = new Float64Array(n);
  const y2 = new Float64Array(n);
  if (closed) {
    const { solve } = factorCyclicBanded(n, 1, (i, k) => (k === 0 ? 2 * (h[i === 0 ? n - 1 : i - 1]! + h[i]!) : h[i]!));
    solve(secondDerivativeRhs(x, h, true), x2);
    solve(secondDerivativeRhs(y, h, true), y2);
  } else if (n > 2) {
    // Parabolic run-out ends (x2[0] = x2[1], x2[n - 1] = x2[n - 2]): an end on a curve keeps its curvature,
    // where natural ends would force it to zero. Unknowns 1..n-2; the end terms fold into the diagonal.
    const last = n - 3;
    const { solve } = factorBanded(n - 2, 1, (j, k) => {
      if (k === 1) return h[j + 1]!;
      return 2 * (h[j]! + h[j + 1]!) + (j === 0 ? h[0]! : 0) + (j === last ? h[n - 2]! : 0);
    });
    x2.set(solve(secondDerivativeRhs(x, h, false)), 1);
    y2.set(solve(secondDerivativeRhs(y, h, false)), 1);
    x2[0] = x2[1]!;
    y2[0] = y2[1]!;
    x2[n - 1] = x2[n - 2]!;
    y2[n - 1] = y2[n - 2]!;
  }
  return { closed, knotT, totalT, x, y, x2, y2 };
}

/**
 * Samples the spline at m parameters t_j = j * totalT / m (closed) or j * totalT / (m - 1) (open), writing
 * positions, and linearly interpolated extra channels (widths) given at the knots.
 */
export function sampleSpline(
  spline: ChordSpline,
  m: number,
  outX: Float64Array,
  outY: Float64Array,
  channels: { values: Float64Array; out: Float64Array }[] = [],
): void {
  const { knotT, totalT, x, y, x2, y2, closed } = spline;
  const n = knotT.length;
  const dt = closed ? totalT / m : totalT / (m - 1);
  let i = 0;
  for (let j = 0; j < m; j++) {
    const t = j === m - 1 && !closed ? totalT : j * dt;
    while (i < n - 1 && knotT[i + 1]! <= t) i++;
    if (!closed && i === n - 1) i = n - 2;
    const next = i + 1 === n ? 0 : i + 1;
    const tNext = i + 1 === n ? totalT : knotT[i + 1]!;
    const hi = tNext - knotT[i]!;
    const a = tNext - t;
    const b = t - knotT[i]!;
    const ca = a / hi;
    const cb = b / hi;
    const cubicA = (a * a * a) / (6 * hi) - (hi * a) / 6;
    const cubicB = (b * b * b) / (6 * hi) - (hi * b) / 6;
    outX[j] = x[i]! * ca + x[next]! * cb + x2[i]! * cubicA + x2[next]! * cubicB;
    outY[j] = y[i]! * ca + y[next]! * cb + y2[i]! * cubicA + y2[next]! * cubicB;
    for (const channel of channels) channel.out[j] = channel.values[i]! * ca + channel.values[next]! * cb;
  }
}
