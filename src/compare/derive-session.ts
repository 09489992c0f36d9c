// Accelerations of a log that has positions (and perhaps speed) but no accelerometer: one derivation for the whole
// session, which `compare`, `envelope` and the report all read. The irregular samples are first interpolated
// linearly onto a uniform time grid (one per stretch between gaps, at the log's mean interval), then differentiated
// with Savitzky-Golay filters (src/numeric/savitzky-golay.ts). The window follows from the log's rate and its
// measured noise: the smallest window whose predicted output noise, sigma * sqrt(sum w_k^2) / dt^d (the variance
// of a linear least-squares estimate, Savitzky and Golay 1964), is at most the target below. The noise itself is
// measured as the residual of a short cubic fit, corrected by the fit's own leverage: E[r^2] = sigma^2 (1 - w_0).

import {
  savitzkyGolayFilter,
  applySavitzkyGolay,
  savitzkyGolayCutoffShare,
  type SavitzkyGolayFilter,
} from '../numeric/savitzky-golay.js';
import { chooseHalfWidth, pooledNoise } from './derive-window.js';
import type { TelemetrySession } from '../telemetry/types.js';
import { sampledMedian } from '../numeric/quantile.js';
import { lerp } from '../numeric/interpolate.js';
import { distanceOf, note, type Note } from '../note.js';

export interface DeriveOptions {
  /** Largest standard deviation of a derived acceleration the window may leave, m/s^2. */
  targetNoiseMps2: number;
  /** Shortest and longest half-window, s: the longest is about half a corner, beyond which corners blur away. */
  minHalfWindowS: number;
  maxHalfWindowS: number;
  /** Fewer samples per second than this cannot resolve a corner's acceleration. */
  minRateHz: number;
  /** A gap in moving data longer than this hides a whole corner, s. */
  maxGapS: number;
}

/** Target 0.15 m/s^2 (about 0.015 g): a high quantile of noisy samples overstates the limit by up to about twice
 * the noise, so this keeps the envelope fit within about 3 % of a 1 g limit (our own choice); a log whose noise
 * stays above twice the target over the longest window is not trusted. Half-windows 0.25-2.5 s and the gap limit of 2 s: a
 * corner takes a few seconds at club speeds (from memory); 5 Hz gives about ten samples over a short corner. */
export const DEFAULT_DERIVE: DeriveOptions = {
  targetNoiseMps2: 0.15,
  minHalfWindowS: 0.25,
  maxHalfWindowS: 2.5,
  minRateHz: 5,
  maxGapS: 2,
};

/** What the derivation found and chose, for the notes and the docs' worked numbers. */
export interface DerivationQuality {
  meanRateHz: number;
  /** Longest interval between samples while moving, s, and the session time where it starts. */
  longestGapS: number;
  longestGapAtS: number;
  positionNoiseM: number;
  speedNoiseMps: number | null;
  /** Half-windows of the lateral (positions) and longitudinal (speed, or positions) filters, s. */
  lateralHalfWindowS: number;
  longitudinalHalfWindowS: number;
  /** Approximate -3 dB cut-off of the lateral filter, Hz (Schafer 2011). */
  lateralCutoffHz: number;
  /** Predicted standard deviation of the derived accelerations, m/s^2. */
  lateralNoiseMps2: number;
  longitudinalNoiseMps2: number;
  /** Problems that make the derived accelerations untrustworthy, one line each; empty when they can be trusted. */
  problems: string[];
}

export interface DerivedSession {
  session: TelemetrySession;
  /** Channels this derivation filled in. */
  derived: string[];
  /** Null when nothing was derived here (the log has both accelerations, or no positions). */
  quality: DerivationQuality | null;
}

const POSITION_ORDER = 3;
const SPEED_ORDER = 2;
/** Below this speed the heading of the path is not defined well enough for a lateral acceleration, m/s. */
const MIN_HEADING_SPEED_MPS = 3;
const MOVING_SPEED_MPS = 5;

/** Stretches of the log between gaps (each gridded on its own: interpolating across a gap would invent a straight
 * line), the longest gap while moving, and the time the stretches cover. */
interface GappedRuns {
  runs: { from: number; to: number }[];
  coveredS: number;
  longestGapS: number;
  longestGapAtS: number;
  medianIntervalS: number;
}

function gappedRuns(session: TelemetrySession, xM: Float64Array, yM: Float64Array): GappedRuns {
  const t = session.timeS;
  const n = session.count;
  const intervals = new Float64Array(n - 1);
  for (let i = 1; i < n; i++) intervals[i - 1] = t[i]! - t[i - 1]!;
  const medianIntervalS = sampledMedian(intervals);
  const splitS = Math.max(0.5, 5 * medianIntervalS);
  const runs: { from: number; to: number }[] = [];
  let from = 0;
  let longestGapS = 0;
  let longestGapAtS = t[0]!;
  let coveredS = 0;
  for (let i = 1; i <= n; i++) {
    const gap = i < n ? t[i]! - t[i - 1]! : Infinity;
    if (i < n && gap > longestGapS) {
      const movedMps = Math.hypot(xM[i]! - xM[i - 1]!, yM[i]! - yM[i - 1]!) / gap;
      if (movedMps >= MOVING_SPEED_MPS) {
        longestGapS = gap;
        longestGapAtS = t[i - 1]!;
      }
    }
    if (gap > splitS) {
      runs.push({ from, to: i - 1 });
      coveredS += t[i - 1]! - t[from]!;
      from = i;
    }
  }
  return { runs, coveredS, longestGapS, longestGapAtS, medianIntervalS };
}

/** Why the derived accelerations cannot be trusted, one line each: too few samples, a gap longer than a corner,
 * noise the longest window cannot bring down. */
function derivationProblems(
  meanRateHz: number,
  gaps: GappedRuns,
  positionNoiseM: number,
  lateralNoiseMps2: number,
  options: DeriveOptions,
): string[] {
  const problems: string[] = [];
  if (meanRateHz < options.minRateHz)
    problems.push(
      `${meanRateHz.toFixed(1)} samples per second is too few to derive accelerations (at least ${options.minRateHz} are needed)`,
    );
  if (gaps.longestGapS > options.maxGapS)
    problems.push(
      `a ${gaps.longestGapS.toFixed(1)} s gap in the log at ${gaps.longestGapAtS.toFixed(1)} s is longer than a corner (${options.maxGapS} s)`,
    );
  if (lateralNoiseMps2 > 2 * options.targetNoiseMps2)
    problems.push(
      `position noise of ${positionNoiseM.toFixed(2)} m at ${meanRateHz.toFixed(0)} Hz leaves ${lateralNoiseMps2.toFixed(2)} m/s^2 of noise in the lateral acceleration even over a ${(2 * options.maxHalfWindowS).toFixed(0)} s window`,
    );
  return problems;
}

interface RunFilters {
  positionSmooth: SavitzkyGolayFilter;
  positionCurve: SavitzkyGolayFilter;
  speedSlope: SavitzkyGolayFilter | null;
}

/** Speed and the tangential and normal accelerations on one uniform stretch. */
function accelerationsOfRun(
  grid: UniformRun,
  filters: RunFilters,
  stepS: number,
): { speed: Float64Array; along: Float64Array; across: Float64Array } {
  const count = grid.x.length;
  const vx = applySavitzkyGolay(filters.positionSmooth, grid.x, stepS);
  const vy = applySavitzkyGolay(filters.positionSmooth, grid.y, stepS);
  const axWorld = applySavitzkyGolay(filters.positionCurve, grid.x, stepS);
  const ayWorld = applySavitzkyGolay(filters.positionCurve, grid.y, stepS);
  const dvdt = filters.speedSlope && grid.v ? applySavitzkyGolay(filters.speedSlope, grid.v, stepS) : null;
  const speed = new Float64Array(count);
  const along = new Float64Array(count);
  const across = new Float64Array(count);
  for (let k = 0; k < count; k++) {
    const pathSpeed = Math.hypot(vx[k]!, vy[k]!);
    const v = grid.v ? Math.max(0, grid.v[k]!) : pathSpeed;
    speed[k] = v;
    if (pathSpeed < MIN_HEADING_SPEED_MPS) {
      along[k] = dvdt ? dvdt[k]! : 0;
      continue;
    }
    // Tangential and normal parts of the acceleration vector; with a speed channel the normal part is
    // v^2 times the path's curvature (the Doppler speed is far less noisy than the positions' own).
    const cross = vx[k]! * ayWorld[k]! - vy[k]! * axWorld[k]!;
    along[k] = dvdt ? dvdt[k]! : (vx[k]! * axWorld[k]! + vy[k]! * ayWorld[k]!) / pathSpeed;
    across[k] = grid.v ? (cross / (pathSpeed * pathSpeed * pathSpeed)) * v * v : cross / pathSpeed;
  }
  return { speed, along, across };
}

export function deriveSessionAccelerations(
  session: TelemetrySession,
  options: DeriveOptions = DEFAULT_DERIVE,
): DerivedSession {
  const { xM, yM } = session;
  if ((session.axMps2 && session.ayMps2) || !xM || !yM || session.count < 8) {
    return { session, derived: [], quality: null };
  }
  const t = session.timeS;
  const n = session.count;
  const gaps = gappedRuns(session, xM, yM);
  const { runs } = gaps;
  const stepS = gaps.coveredS > 0 ? gaps.coveredS / Math.max(1, n - runs.length) : gaps.medianIntervalS;
  const grids = runs.map((run) => uniformRun(session, run.from, run.to, stepS));

  const positionNoiseM = pooledNoise(
    grids.flatMap((g) => [g.x, g.y]),
    stepS,
  );
  const speedNoiseMps = session.speedMps
    ? pooledNoise(
        grids.map((g) => g.v!),
        stepS,
      )
    : null;
  const minHalf = Math.max(2, Math.round(options.minHalfWindowS / stepS));
  const maxHalf = Math.max(minHalf, Math.round(options.maxHalfWindowS / stepS));
  const lateral = chooseHalfWidth(positionNoiseM, stepS, 2, minHalf, maxHalf, options.targetNoiseMps2);
  const longitudinal =
    speedNoiseMps !== null
      ? chooseHalfWidth(speedNoiseMps, stepS, 1, minHalf, maxHalf, options.targetNoiseMps2)
      : lateral;
  const meanRateHz = 1 / stepS;
  const problems = derivationProblems(meanRateHz, gaps, positionNoiseM, lateral.noiseMps2, options);

  const filters: RunFilters = {
    positionSmooth: savitzkyGolayFilter(lateral.halfWidth, POSITION_ORDER, 1),
    positionCurve: savitzkyGolayFilter(lateral.halfWidth, POSITION_ORDER, 2),
    speedSlope: speedNoiseMps !== null ? savitzkyGolayFilter(longitudinal.halfWidth, SPEED_ORDER, 1) : null,
  };
  const speedOut = session.speedMps ? session.speedMps : new Float64Array(n);
  const axOut = new Float64Array(n);
  const ayOut = new Float64Array(n);
  for (const [r, grid] of grids.entries()) {
    const count = grid.x.length;
    const { speed, along, across } = accelerationsOfRun(grid, filters, stepS);
    const run = runs[r]!;
    for (let i = run.from; i <= run.to; i++) {
      const position = (t[i]! - grid.startS) / stepS;
      const k = Math.min(Math.max(0, Math.floor(position)), count - 1);
      const k1 = Math.min(k + 1, count - 1);
      const w = Math.min(1, Math.max(0, position - k));
      if (!session.speedMps) speedOut[i] = lerp(speed[k]!, speed[k1]!, w);
      axOut[i] = lerp(along[k]!, along[k1]!, w);
      ayOut[i] = lerp(across[k]!, across[k1]!, w);
    }
  }
  const derived: string[] = [];
  if (!session.speedMps) derived.push('speedMps');
  if (!session.axMps2) derived.push('axMps2');
  if (!session.ayMps2) derived.push('ayMps2');
  return {
    session: {
      ...session,
      speedMps: speedOut,
      axMps2: session.axMps2 ?? axOut,
      ayMps2: session.ayMps2 ?? ayOut,
    },
    derived,
    quality: {
      meanRateHz,
      longestGapS: gaps.longestGapS,
      longestGapAtS: gaps.longestGapAtS,
      positionNoiseM,
      speedNoiseMps,
      lateralHalfWindowS: lateral.halfWidth * stepS,
      longitudinalHalfWindowS: longitudinal.halfWidth * stepS,
      lateralCutoffHz: savitzkyGolayCutoffShare(lateral.halfWidth, POSITION_ORDER) * (0.5 / stepS),
      lateralNoiseMps2: lateral.noiseMps2,
      longitudinalNoiseMps2: longitudinal.noiseMps2,
      problems,
    },
  };
}

/** One line for the notes: the method, its window and what it leaves. */
export function derivationNote(quality: DerivationQuality, derived: string[]): Note {
  const method =
    `${derived.join(', ')} derived from the GPS positions${derived.includes('speedMps') ? '' : ' and speed'} ` +
    `(Savitzky-Golay, ${(2 * quality.lateralHalfWindowS).toFixed(1)} s window, cut-off about ${quality.lateralCutoffHz.toFixed(2)} Hz, `;
  return note`${method}for ${distanceOf(quality.positionNoiseM, 2)} of position noise at ${quality.meanRateHz.toFixed(0)} Hz; about ${quality.lateralNoiseMps2.toFixed(2)} m/s^2 of noise left)`;
}

interface UniformRun {
  startS: number;
  x: Float64Array;
  y: Float64Array;
  v: Float64Array | null;
}

/** Samples from..to interpolated linearly onto times startS + k stepS. */
function uniformRun(session: TelemetrySession, from: number, to: number, stepS: number): UniformRun {
  const t = session.timeS;
  const startS = t[from]!;
  const count = Math.max(1, Math.floor((t[to]! - startS) / stepS + 1e-9) + 1);
  const x = new Float64Array(count);
  const y = new Float64Array(count);
  const v = session.speedMps ? new Float64Array(count) : null;
  let i = from;
  for (let k = 0; k < count; k++) {
    const at = startS + k * stepS;
    while (i < to - 1 && t[i + 1]! <= at) i++;
    const j = Math.min(i + 1, to);
    const span = t[j]! - t[i]!;
    const w = span > 0 ? Math.min(1, Math.max(0, (at - t[i]!) / span)) : 0;
    x[k] = lerp(session.xM![i]!, session.xM![j]!, w);
    y[k] = lerp(session.yM![i]!, session.yM![j]!, w);
    if (v) v[k] = lerp(session.speedMps![i]!, session.speedMps![j]!, w);
  }
  return { startS, x, y, v };
}
