// The path a driver drove, estimated from the position fixes of several laps in the track's frame: each fix placed
// on the centreline (station s, signed offset n), all laps pooled, and the offset n(s) smoothed over distance by a
// weighted Whittaker smoother (Whittaker 1923; Eilers, "A perfect smoother", Anal. Chem. 75 (2003) 3631-3636, which
// gives it for differences of any order) whose penalty is the change of the path's lateral acceleration from station
// to station, v^2 (kc + n'')' to first order: third differences of n, shifted by the centreline's own change of
// curvature and weighted by v^4. Penalising n'' itself (second differences) would pull the path's curvature
// towards the centreline's, whose steps at the ends of each arc a driver smooths out; weighing by v^4 smooths the
// fast stretches harder, where position noise would weigh most in v^2 kappa. The smoothing is chosen by generalised
// cross-validation (Craven and Wahba, Numer. Math. 31 (1979) 377-403), and the path's curvature taken with the exact
// formula for a curve given by offsets from a reference curve (../../line/geometry.ts).

import type { TrackGrid } from '../../track/types.js';
import { factorBanded, factorCyclicBanded } from '../../numeric/banded.js';
import { lineCurvature } from '../../line/geometry.js';
import { wrapIndex } from '../../numeric/lap-index.js';

/** The shortest cut-off wavelength tried, m: a car's path does not swing across the track and back within less (a
 * corner's turn-in to apex is 20 m or more on the tightest hairpins; common practice, no source). */
export const MIN_PATH_CUTOFF_M = 20;
/** The longest tried, m: longer than the longest corner of a club circuit, so the path's swing through a corner is
 * smoothed away before the search ends. */
export const MAX_PATH_CUTOFF_M = 400;
/** Candidate cut-offs per doubling of the wavelength. */
const CUTOFFS_PER_OCTAVE = 6;

export interface DriverPathFixes {
  /** Unwrapped distance along the track of each fix of the session, m (src/compare/place-session.ts). */
  progressM: Float64Array;
  /** Signed offset from the centreline of each fix, m, positive to the left. */
  offsetM: Float64Array;
  /** Fix ranges to pool, inclusive, one per lap. */
  laps: readonly { startIndex: number; endIndex: number }[];
  /** The laps' speed on the grid, m/s: the penalty weighs the change of curvature by v^2 so that it is the change of
   * the lateral acceleration v^2 kappa that is smoothed (null: curvature alone). */
  speedMps?: Float64Array | null;
}

export interface DriverPath {
  /** The driver's offset from the centreline on the track's grid, m, positive to the left. */
  offsetM: Float64Array;
  /** Signed curvature of that path on the grid, 1/m. */
  curvaturePerM: Float64Array;
  /** Position scatter across the track about the path (standard deviation), m: the log's stated noise. */
  noiseM: number;
  /** Wavelength at which the smoother passes half of the offset, m. */
  cutoffM: number;
  /** Standard deviation of the curvature that the noise alone leaves in the path, 1/m (white noise, mean density). */
  curvatureSdPerM: number;
  /** Fixes pooled, and fixes per metre of track. */
  fixes: number;
  fixesPerM: number;
}

/**
 * The data term of the least squares, sum_i (y_i - z(s_i))^2 with z read between the two stations about each fix by
 * linear interpolation: a tridiagonal matrix (diagonal and the entry to the next station), its right-hand side, and
 * the sum of the squared offsets, accumulated once over every fix.
 */
interface DataTerm {
  diagonal: Float64Array;
  next: Float64Array;
  rhs: Float64Array;
  squares: number;
  fixes: number;
}

function dataTerm(track: TrackGrid, fixes: DriverPathFixes): DataTerm {
  const n = track.distanceM.length;
  const h = track.stepM;
  const diagonal = new Float64Array(n);
  const next = new Float64Array(n);
  const rhs = new Float64Array(n);
  let squares = 0;
  let total = 0;
  for (const lap of fixes.laps) {
    for (let i = lap.startIndex; i <= lap.endIndex; i++) {
      const u = fixes.progressM[i]! / h;
      let j = Math.floor(u);
      const t = u - j;
      if (track.closed) j = wrapIndex(j, n);
      else if (j < 0 || j > n - 1 || (j === n - 1 && t > 0)) continue;
      const k = j + 1 === n ? (track.closed ? 0 : j) : j + 1;
      const y = fixes.offsetM[i]!;
      diagonal[j]! += (1 - t) * (1 - t);
      diagonal[k]! += t * t;
      next[j]! += t * (1 - t);
      rhs[j]! += (1 - t) * y;
      rhs[k]! += t * y;
      squares += y * y;
      total++;
    }
  }
  return { diagonal, next, rhs, squares, fixes: total };
}

/** sum_i (y_i - z(s_i))^2 from the data term: squares - 2 z.rhs + z^T A z. */
function residualSquares(data: DataTerm, z: Float64Array, closed: boolean): number {
  const n = z.length;
  let quadratic = 0;
  for (let j = 0; j < n; j++) {
    const k = j + 1 === n ? (closed ? 0 : -1) : j + 1;
    quadratic += data.diagonal[j]! * z[j]! * z[j]! - 2 * z[j]! * data.rhs[j]!;
    if (k >= 0) quadratic += 2 * data.next[j]! * z[j]! * z[k]!;
  }
  return Math.max(0, data.squares + quadratic);
}

/** (2 sin(pi k / n))^2 for k = 0..n-1: the eigenvalues of the cyclic -D2, whose powers give D2^T D2 and D3^T D3. */
function differenceEigenvalues(n: number): Float64Array {
  const out = new Float64Array(n);
  for (let k = 0; k < n; k++) out[k] = (2 * Math.sin((Math.PI * k) / n)) ** 2;
  return out;
}

/** Third differences: row r is -n[r-1] + 3 n[r] - 3 n[r+1] + n[r+2], the second difference's change from r to r+1. */
const D3 = [-1, 3, -3, 1];

/** lambda whose gain is 1/2 at wavelength cutoffM (unit weights): lambda (2 sin(pi h / L))^6 = 1. */
function curvatureLambda(stepM: number, cutoffM: number): number {
  return (2 * Math.sin((Math.PI * stepM) / cutoffM)) ** -6;
}

/**
 * The offset z minimising scale sum_i (y_i - z(s_i))^2 + lambda sum_r v_r^4 (D3 z + c)_r^2 with
 * c_r = h^2 (kc[r+1] - kc[r]): the change of the path's curvature from station to station (kc + z'' to first order)
 * is penalised, not z'' itself, so heavy smoothing keeps the curves the centreline has and smooths only the driver's
 * departures from them. `roughness` holds v^4 scaled to a mean of 1.
 */
function smoothOffset(
  data: DataTerm,
  scale: number,
  roughness: Float64Array,
  kc: Float64Array,
  h: number,
  lambda: number,
  closed: boolean,
): Float64Array {
  const n = data.rhs.length;
  const band = new Float64Array(n * 4);
  const rhs = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    band[j * 4] = data.diagonal[j]! * scale;
    band[j * 4 + 1] = data.next[j]! * scale;
    rhs[j] = data.rhs[j]! * scale;
  }
  const first = closed ? 0 : 1;
  const last = closed ? n - 1 : n - 3;
  for (let r = first; r <= last; r++) {
    const c = h * h * (kc[(r + 1) % n]! - kc[r]!);
    const rowLambda = lambda * roughness[r]!;
    for (let a = 0; a < 4; a++) {
      const i = closed ? wrapIndex(r - 1 + a, n) : r - 1 + a;
      rhs[i]! -= rowLambda * D3[a]! * c;
      for (let b = a; b < 4; b++) {
        // Entry (i, i + (b - a)) of the band, upper half, indices taken round the lap when closed.
        band[i * 4 + (b - a)]! += rowLambda * D3[a]! * D3[b]!;
      }
    }
  }
  const entry = (i: number, k: number) => band[i * 4 + k]!;
  return (closed ? factorCyclicBanded(n, 3, entry) : factorBanded(n, 3, entry)).solve(rhs);
}

/** v^4 scaled to a mean of 1 (all 1 without speeds): the cut-off holds where v^4 is at its mean along the lap. */
function roughnessWeights(speedMps: Float64Array | null, n: number): Float64Array {
  const out = new Float64Array(n).fill(1);
  if (!speedMps) return out;
  let sum = 0;
  for (let j = 0; j < n; j++) sum += out[j] = speedMps[j]! ** 4;
  if (!(sum > 0)) return out.fill(1);
  for (let j = 0; j < n; j++) out[j]! *= n / sum;
  return out;
}

/**
 * The driver's path from the pooled fixes, or null where they are sparser than one per 5 m. The data term is scaled
 * by the mean number of fixes per station, so the cut-off holds at the mean density of fixes; the hat matrix's trace
 * in the GCV score is that of the same smoother with every weight at the mean (the circulant case, whose eigenvalues
 * are known in closed form): exact for evenly spread fixes and close where the density varies slowly.
 */
export function driverPath(track: TrackGrid, fixes: DriverPathFixes): DriverPath | null {
  const n = track.distanceM.length;
  const h = track.stepM;
  const data = dataTerm(track, fixes);
  const N = data.fixes;
  // Fewer than four fixes per shortest wavelength tried (pooled over the laps) cannot show a swing of that length.
  if (n < 8 || N * (MIN_PATH_CUTOFF_M / 4) < track.lengthM) return null;
  const meanCount = N / n;
  const roughness = roughnessWeights(fixes.speedMps ?? null, n);
  const eigen = differenceEigenvalues(n);

  let best: { score: number; cutoffM: number; smooth: Float64Array; rss: number; trace: number } | null = null;
  const steps = Math.ceil(CUTOFFS_PER_OCTAVE * Math.log2(MAX_PATH_CUTOFF_M / MIN_PATH_CUTOFF_M));
  for (let c = 0; c <= steps; c++) {
    const cutoffM = MIN_PATH_CUTOFF_M * 2 ** (c / CUTOFFS_PER_OCTAVE);
    if (cutoffM < 4 * h) continue;
    const lambda = curvatureLambda(h, cutoffM);
    const smooth = smoothOffset(data, 1 / meanCount, roughness, track.curvaturePerM, h, lambda, track.closed);
    const rss = residualSquares(data, smooth, track.closed);
    let trace = 0;
    for (let k = 0; k < n; k++) trace += 1 / (1 + lambda * eigen[k]! ** 3);
    if (trace >= N) continue;
    const score = (N * rss) / (N - trace) ** 2;
    if (!best || score < best.score) best = { score, cutoffM, smooth, rss, trace };
  }
  if (!best) return null;
  const noiseM = Math.sqrt(best.rss / (N - best.trace));
  // The curvature's noise: a station's share of the data has variance noise^2 / (fixes per station); the smoother
  // passes each wavenumber with gain g_k and the second difference multiplies it by (2 sin(pi k / n))^2 / h^2.
  const lambda = curvatureLambda(h, best.cutoffM);
  let variance = 0;
  for (let k = 0; k < n; k++) {
    const gain = 1 / (1 + lambda * eigen[k]! ** 3);
    variance += gain * gain * eigen[k]! ** 2;
  }
  const curvatureSdPerM = Math.sqrt(((variance / n) * (noiseM * noiseM)) / meanCount) / (h * h);
  return {
    offsetM: best.smooth,
    curvaturePerM: lineCurvature(track, best.smooth),
    noiseM,
    cutoffM: best.cutoffM,
    curvatureSdPerM,
    fixes: N,
    fixesPerM: N / (n * h),
  };
}
