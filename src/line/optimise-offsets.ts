// Finds the offsets inside the corridor that minimise F(n) = sum_i a_i k_i(n)^2 + w sum_i b_i l_i(n), curvature
// squared traded against weighted path length. The minimum-curvature line is a_i = 1, w = 0 (Braghin, Cheli,
// Melzi and Sabbioni, "Race driver model", Computers & Structures 86 (2008); Heilmeier et al., Vehicle System
// Dynamics 58 (2020)). As there, the curvature is linearised about the current line and the quadratic
// programme is solved and re-linearised until it settles: here a damped Gauss-Newton step (Levenberg-Marquardt)
// with a backtracking line search on the exact F. The length term enters as sum b_i l_i^2 / (2 l_i0), which has
// the same value and gradient as sum b_i l_i at the current line and is an exact quadratic in n. Each k_i
// depends on n_(i-1), n_i, n_(i+1) and each l_i on n_i, n_(i+1), so the programme's matrix is a (cyclic)
// pentadiagonal band: no n-by-n matrix appears anywhere.

import type { TrackGrid } from '../track/types.js';
import type { Corridor } from './corridor.js';
import {
  centrelineCurvatureSlope,
  lineCurvature,
  offsetCurvature,
  lineSegmentLengths,
  neighbourOffsets,
  offsetCurvaturePartials,
  segmentCurvature,
} from './geometry.js';
import { emptyBand, solveBoxQp, type PentaBand } from './box-qp.js';

export interface OffsetWeights {
  /** Weight of k_i^2 at each sample. */
  curvature: Float64Array;
  /** Weight of each segment's length (one per segment), used times lengthWeight. */
  length: Float64Array | null;
  lengthWeight: number;
}

export interface OptimiseOptions {
  maxIterations: number;
  /** Stop when F falls by less than this share of itself in an iteration. */
  relativeTolerance: number;
}

/** Inner iterations per linearisation: the outer loop re-linearises anyway, so the QP need not be exact. */
const QP_ITERATIONS = 10;

export const DEFAULT_OPTIMISE_OPTIONS: OptimiseOptions = { maxIterations: 40, relativeTolerance: 1e-6 };

export interface OptimiseResult {
  offsetM: Float64Array;
  objective: number;
  iterations: number;
}

function clampInto(corridor: Corridor, offsetM: Float64Array): Float64Array {
  const out = new Float64Array(offsetM.length);
  for (let i = 0; i < out.length; i++)
    out[i] = Math.min(corridor.upperM[i]!, Math.max(corridor.lowerM[i]!, offsetM[i]!));
  return out;
}

/** F(n), the exact objective. */
export function offsetObjective(
  track: TrackGrid,
  weights: OffsetWeights,
  offsetM: Float64Array,
  slope: Float64Array,
): number {
  const kappa = lineCurvature(track, offsetM, slope);
  let sum = 0;
  for (let i = 0; i < kappa.length; i++) sum += weights.curvature[i]! * kappa[i]! * kappa[i]!;
  if (weights.length && weights.lengthWeight > 0) {
    const lengths = lineSegmentLengths(track, offsetM);
    let lengthSum = 0;
    for (let i = 0; i < lengths.length; i++) lengthSum += weights.length[i]! * lengths[i]!;
    sum += weights.lengthWeight * lengthSum;
  }
  return sum;
}

/** Adds weight * (e + c . x)^2 for a residual over columns i - 1, i, i + 1 to the band and to q. */
function addResidual3(
  band: PentaBand,
  q: Float64Array,
  i: number,
  cp: number,
  cm: number,
  cn: number,
  e: number,
  weight: number,
): void {
  const n = band.count;
  const ip = band.cyclic ? (i - 1 + n) % n : i - 1;
  const inx = band.cyclic ? (i + 1) % n : i + 1;
  const { diag, off1, off2 } = band;
  diag[i]! += weight * cm * cm;
  q[i]! += weight * e * cm;
  if (ip >= 0) {
    diag[ip]! += weight * cp * cp;
    off1[ip]! += weight * cp * cm;
    q[ip]! += weight * e * cp;
    if (inx < n) off2[ip]! += weight * cp * cn;
  }
  if (inx < n) {
    diag[inx]! += weight * cn * cn;
    off1[i]! += weight * cm * cn;
    q[inx]! += weight * e * cn;
  }
}

/** The Gauss-Newton quadratic model about `offsetM` (without damping): band Q and vector q of x^T Q x + 2 q^T x. */
function buildModel(
  track: TrackGrid,
  weights: OffsetWeights,
  offsetM: Float64Array,
  slope: Float64Array,
): { band: PentaBand; q: Float64Array } {
  const count = offsetM.length;
  const closed = track.closed;
  const band = emptyBand(count, closed);
  const q = new Float64Array(count);
  const h = track.stepM;
  const kc = track.curvaturePerM;
  const partials = new Float64Array(3);
  for (let i = 0; i < count; i++) {
    const [prev, next] = neighbourOffsets(offsetM, i, closed);
    const n = offsetM[i]!;
    const dn = (next - prev) / (2 * h);
    const ddn = (next - 2 * n + prev) / (h * h);
    offsetCurvaturePartials(n, dn, ddn, kc[i]!, slope[i]!, partials);
    const [kN, kD, kDD] = partials as unknown as [number, number, number];
    let cp = -kD / (2 * h) + kDD / (h * h);
    let cm = kN - (2 * kDD) / (h * h);
    let cn = kD / (2 * h) + kDD / (h * h);
    // Open ends: the line continues straight past the end (ghost = 2 n_end - n_neighbour).
    if (!closed && i === 0) {
      cm += 2 * cp;
      cn -= cp;
      cp = 0;
    }
    if (!closed && i === count - 1) {
      cm += 2 * cn;
      cp -= cn;
      cn = 0;
    }
    const kappa0 = offsetCurvature(n, dn, ddn, kc[i]!, slope[i]!);
    const ip = closed ? (i - 1 + count) % count : i - 1;
    const inx = closed ? (i + 1) % count : i + 1;
    const e = kappa0 - cm * n - (ip >= 0 ? cp * offsetM[ip]! : 0) - (inx < count ? cn * offsetM[inx]! : 0);
    addResidual3(band, q, i, cp, cm, cn, e, weights.curvature[i]!);
  }
  if (weights.length && weights.lengthWeight > 0) {
    const segments = closed ? count : count - 1;
    const lengths = lineSegmentLengths(track, offsetM);
    for (let i = 0; i < segments; i++) {
      const weight = (weights.lengthWeight * weights.length[i]!) / (2 * lengths[i]!);
      const half = 0.5 * h * segmentCurvature(kc, i);
      // l_i^2 = (h - half (n_i + n_j))^2 + (n_j - n_i)^2, two linear residuals over columns i, i + 1.
      addResidual2(band, q, i, -half, -half, h, weight);
      addResidual2(band, q, i, -1, 1, 0, weight);
    }
  }
  return { band, q };
}

function addResidual2(
  band: PentaBand,
  q: Float64Array,
  i: number,
  cm: number,
  cn: number,
  e: number,
  weight: number,
): void {
  const n = band.count;
  const inx = band.cyclic ? (i + 1) % n : i + 1;
  band.diag[i]! += weight * cm * cm;
  q[i]! += weight * e * cm;
  if (inx < n) {
    band.off1[i]! += weight * cm * cn;
    band.diag[inx]! += weight * cn * cn;
    q[inx]! += weight * e * cn;
  }
}

/** Minimises F inside the corridor, starting from `start` (clipped into the corridor). */
export function optimiseOffsets(
  track: TrackGrid,
  corridor: Corridor,
  weights: OffsetWeights,
  start: Float64Array,
  options: OptimiseOptions = DEFAULT_OPTIMISE_OPTIONS,
): OptimiseResult {
  const count = start.length;
  const slope = centrelineCurvatureSlope(track);
  let current = clampInto(corridor, start);
  let value = offsetObjective(track, weights, current, slope);
  let damping = -1;
  let iterations = 0;
  const trial = new Float64Array(count);
  for (; iterations < options.maxIterations; iterations++) {
    const { band, q } = buildModel(track, weights, current, slope);
    let scale = 0;
    for (let i = 0; i < count; i++) scale += band.diag[i]!;
    scale = scale / count || 1;
    if (damping < 0) damping = 1e-6 * scale;
    let accepted = false;
    let decrease = 0;
    for (let attempt = 0; attempt < 6 && !accepted; attempt++) {
      // Damping mu |x - n0|^2 adds mu to the diagonal and -mu n0 to q.
      for (let i = 0; i < count; i++) {
        band.diag[i]! += damping;
        q[i]! -= damping * current[i]!;
      }
      const { x } = solveBoxQp(band, q, corridor.lowerM, corridor.upperM, current, QP_ITERATIONS);
      for (let i = 0; i < count; i++) {
        band.diag[i]! -= damping;
        q[i]! += damping * current[i]!;
      }
      // Backtracking along the step; the corridor is convex, so every point of the step stays inside.
      for (let t = 1; t > 0.01 && !accepted; t *= 0.5) {
        for (let i = 0; i < count; i++) trial[i] = current[i]! + t * (x[i]! - current[i]!);
        const trialValue = offsetObjective(track, weights, trial, slope);
        if (trialValue < value) {
          decrease = value - trialValue;
          current = Float64Array.from(trial);
          value = trialValue;
          accepted = true;
          if (t === 1) damping = Math.max(damping / 10, 1e-14 * scale);
        }
      }
      if (!accepted) damping *= 10;
    }
    if (!accepted || decrease <= options.relativeTolerance * Math.abs(value)) {
      iterations++;
      break;
    }
  }
  return { offsetM: current, objective: value, iterations };
}
