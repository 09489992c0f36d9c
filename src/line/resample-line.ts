// A line given on other points (another grid spacing, or plane positions alone) onto a track's grid. Linear
// joins put kinks into the offsets, and the line's curvature (their second difference) turns them into spikes
// that the solver brakes for; so the offsets go through a cubic interpolating spline (periodic on a closed
// track), whose second derivative is continuous (de Boor, A Practical Guide to Splines, 1978, ch. IV), and
// positions through the chord-length spline of src/track/spline.ts, cut by each grid sample's normal.

import { factorBanded, factorCyclicBanded } from '../numeric/banded.js';
import { chordSpline, type ChordSpline } from '../track/spline.js';
import type { TrackGrid } from '../track/types.js';

/**
 * How far apart a line's points may be: the line may turn at most 0.5 rad (29 degrees) from one point to the next,
 * that is points at most half a radius apart (a chord h on a radius R turns the line by h / R). A cubic through
 * points that close keeps a circle's radius to within about 1 % (the spline's error on a circle goes as
 * (h / R)^4 / 384, de Boor ch. IV); beyond that a hairpin's apex falls between two points and the spline guesses.
 */
export const MAX_TURN_BETWEEN_POINTS_RAD = 0.5;

export interface WorstTurn {
  /** Index of the point (positions) or of the gap's first station (stations) with the largest turn. */
  index: number;
  turnRad: number;
  /** The spacing there, m. */
  gapM: number;
}

const wrapAngle = (a: number) => Math.atan2(Math.sin(a), Math.cos(a));

/** The largest turn between consecutive chords of a polyline of positions (wrapping when closed). */
export function worstPointTurn(x: Float64Array, y: Float64Array, closed: boolean): WorstTurn {
  const n = x.length;
  const worst: WorstTurn = { index: 0, turnRad: 0, gapM: 0 };
  for (let r = closed ? 0 : 1; r < (closed ? n : n - 1); r++) {
    const p = r === 0 ? n - 1 : r - 1;
    const q = r + 1 === n ? 0 : r + 1;
    const turn = Math.abs(
      wrapAngle(Math.atan2(y[q]! - y[r]!, x[q]! - x[r]!) - Math.atan2(y[r]! - y[p]!, x[r]! - x[p]!)),
    );
    if (turn > worst.turnRad) {
      worst.index = r;
      worst.turnRad = turn;
      worst.gapM = Math.max(Math.hypot(x[q]! - x[r]!, y[q]! - y[r]!), Math.hypot(x[r]! - x[p]!, y[r]! - y[p]!));
    }
  }
  return worst;
}

/** The largest turn of the track's centreline over a gap between consecutive stations (offsets given by station). */
export function worstStationTurn(track: TrackGrid, stationM: Float64Array): WorstTurn {
  const n = stationM.length;
  const count = track.distanceM.length;
  const sample = (s: number) => Math.min(count - 1, Math.max(0, Math.round(s / track.stepM)));
  const worst: WorstTurn = { index: 0, turnRad: 0, gapM: 0 };
  const segments = track.closed ? n : n - 1;
  for (let r = 0; r < segments; r++) {
    const from = sample(stationM[r]!);
    const to = r + 1 === n ? sample(stationM[0]!) + count : sample(stationM[r + 1]!);
    let turn = 0;
    for (let g = from; g < to; g++) turn += track.curvaturePerM[g % count]! * track.stepM;
    const gapM = r + 1 === n ? stationM[0]! + track.lengthM - stationM[r]! : stationM[r + 1]! - stationM[r]!;
    if (Math.abs(turn) > worst.turnRad) {
      worst.index = r;
      worst.turnRad = Math.abs(turn);
      worst.gapM = gapM;
    }
  }
  return worst;
}

/**
 * Offsets given at increasing stations (within one lap) onto the track's grid through a cubic spline in the
 * station: periodic over the lap on a closed track, with parabolic run-out ends on an open one.
 */
export function splineOffsets(track: TrackGrid, stationM: Float64Array, offsetM: Float64Array): Float64Array {
  const n = stationM.length;
  const closed = track.closed;
  const count = closed ? n : n - 1;
  const h = new Float64Array(count);
  for (let i = 0; i < count; i++)
    h[i] = i + 1 === n ? stationM[0]! + track.lengthM - stationM[i]! : stationM[i + 1]! - stationM[i]!;
  const slope = (i: number) => (offsetM[i + 1 === n ? 0 : i + 1]! - offsetM[i]!) / h[i]!;
  const second = new Float64Array(n);
  if (closed && n >= 3) {
    const rhs = new Float64Array(n);
    for (let i = 0; i < n; i++) rhs[i] = 6 * (slope(i) - slope(i === 0 ? n - 1 : i - 1));
    factorCyclicBanded(n, 1, (i, k) => (k === 0 ? 2 * (h[i === 0 ? n - 1 : i - 1]! + h[i]!) : h[i]!)).solve(
      rhs,
      second,
    );
  } else if (n > 2) {
    const last = n - 3;
    const rhs = new Float64Array(n - 2);
    for (let i = 1; i < n - 1; i++) rhs[i - 1] = 6 * (slope(i) - slope(i - 1));
    const { solve } = factorBanded(n - 2, 1, (j, k) =>
      k === 1 ? h[j + 1]! : 2 * (h[j]! + h[j + 1]!) + (j === 0 ? h[0]! : 0) + (j === last ? h[n - 2]! : 0),
    );
    second.set(solve(rhs), 1);
    second[0] = second[1]!;
    second[n - 1] = second[n - 2]!;
  }
  const grid = track.distanceM;
  const out = new Float64Array(grid.length);
  let k = closed ? n - 1 : 0;
  for (let g = 0; g < grid.length; g++) {
    let s = grid[g]!;
    // The interval [station k, station k + 1) holding s; on a closed track the last one wraps to the first row.
    if (closed && s < stationM[0]!) s += track.lengthM;
    while (k + 1 < n && stationM[k + 1]! <= s) k++;
    if (!closed) k = Math.min(k, n - 2);
    if (closed && s >= stationM[0]! && stationM[k]! > s) k = 0;
    const next = k + 1 === n ? 0 : k + 1;
    const hk = h[k]!;
    const a = (stationM[k]! + hk - s) / hk;
    const b = 1 - a;
    out[g] =
      a * offsetM[k]! +
      b * offsetM[next]! +
      (((a * a * a - a) * second[k]! + (b * b * b - b) * second[next]!) * (hk * hk)) / 6;
  }
  return out;
}

/** Position and first derivative of a chord spline at parameter t (within [knotT[i], knotT[i + 1]]). */
function evaluate(spline: ChordSpline, i: number, t: number, out: Float64Array): void {
  const { knotT, totalT, x, y, x2, y2 } = spline;
  const n = knotT.length;
  const next = i + 1 === n ? 0 : i + 1;
  const hi = (i + 1 === n ? totalT : knotT[i + 1]!) - knotT[i]!;
  const a = (knotT[i]! + hi - t) / hi;
  const b = 1 - a;
  const cubicA = ((a * a * a - a) * hi * hi) / 6;
  const cubicB = ((b * b * b - b) * hi * hi) / 6;
  out[0] = a * x[i]! + b * x[next]! + cubicA * x2[i]! + cubicB * x2[next]!;
  out[1] = a * y[i]! + b * y[next]! + cubicA * y2[i]! + cubicB * y2[next]!;
  const dA = ((-3 * a * a + 1) * hi) / 6;
  const dB = ((3 * b * b - 1) * hi) / 6;
  out[2] = (x[next]! - x[i]!) / hi + dA * x2[i]! + dB * x2[next]!;
  out[3] = (y[next]! - y[i]!) / hi + dA * y2[i]! + dB * y2[next]!;
}

export interface ProjectedLine {
  offsetM: Float64Array;
  /** Null when every grid sample's normal meets the line; else the first station where it does not, m. */
  lostAtM: number | null;
}

/**
 * Plane positions of a line (in the track's travel direction or against it) onto the track's grid: the offset
 * at each sample is where the sample's normal meets the line's chord-length spline, found by walking the line
 * forward from the previous sample's crossing and refining with Newton's method on the spline.
 */
export function projectLinePositions(track: TrackGrid, xIn: Float64Array, yIn: Float64Array): ProjectedLine {
  const count = track.distanceM.length;
  // Travel direction: the line's first points should head the way the centreline does near them.
  const psi0 = track.headingRad[0]!;
  let nearest = 0;
  for (let r = 1; r < xIn.length; r++)
    if (
      Math.hypot(xIn[r]! - track.xM[0]!, yIn[r]! - track.yM[0]!) <
      Math.hypot(xIn[nearest]! - track.xM[0]!, yIn[nearest]! - track.yM[0]!)
    )
      nearest = r;
  const ahead = (nearest + 1) % xIn.length;
  const reversed = (xIn[ahead]! - xIn[nearest]!) * Math.cos(psi0) + (yIn[ahead]! - yIn[nearest]!) * Math.sin(psi0) < 0;
  const x = reversed ? xIn.slice().reverse() : xIn;
  const y = reversed ? yIn.slice().reverse() : yIn;
  const spline = chordSpline(x, y, track.closed);
  const n = x.length;
  const offsetM = new Float64Array(count);
  const point = new Float64Array(4);
  // Signed distance of the line point at knot interval i, parameter t, ahead of sample g along its tangent.
  const along = (g: number, i: number, t: number) => {
    evaluate(spline, i, t, point);
    const psi = track.headingRad[g]!;
    return (point[0]! - track.xM[g]!) * Math.cos(psi) + (point[1]! - track.yM[g]!) * Math.sin(psi);
  };
  // Start: the knot nearest the first sample, stepped back until it is behind that sample.
  let i = reversed ? n - 1 - nearest : nearest;
  for (let back = 0; back < n && along(0, i, spline.knotT[i]!) > 0; back++)
    i = i === 0 ? (track.closed ? n - 1 : 0) : i - 1;
  let walked = 0;
  for (let g = 0; g < count; g++) {
    // Walk forward to the interval whose end is ahead of this sample's normal.
    let found = false;
    for (; walked <= n + 1; walked++) {
      const end = i + 1 === n ? spline.totalT : spline.knotT[i + 1]!;
      if (along(g, i, end) >= 0) {
        found = along(g, i, spline.knotT[i]!) <= 0;
        break;
      }
      if (i + 1 === n) {
        if (!track.closed) break;
        i = 0;
      } else i++;
    }
    if (!found) {
      // Off the end of an open line, or a normal that misses it: report where.
      return { offsetM, lostAtM: track.distanceM[g]! };
    }
    const start = spline.knotT[i]!;
    const end = i + 1 === n ? spline.totalT : spline.knotT[i + 1]!;
    // Newton on the tangential distance, kept inside the interval (it is monotone there for a resolved line).
    let t = 0.5 * (start + end);
    const psi = track.headingRad[g]!;
    const c = Math.cos(psi);
    const s = Math.sin(psi);
    for (let iteration = 0; iteration < 20; iteration++) {
      const f = along(g, i, t);
      const df = point[2]! * c + point[3]! * s;
      const step = df > 1e-9 ? f / df : 0;
      const nextT = Math.min(end, Math.max(start, t - step));
      if (Math.abs(nextT - t) < 1e-10) {
        t = nextT;
        break;
      }
      t = nextT;
    }
    evaluate(spline, i, t, point);
    offsetM[g] = -(point[0]! - track.xM[g]!) * s + (point[1]! - track.yM[g]!) * c;
  }
  return { offsetM, lostAtM: null };
}
