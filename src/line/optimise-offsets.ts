// Finds the offsets inside the corridor that minimise F(n) = sum_i a_i k_i(n)^2 + w sum_i b_i l_i(n), curvature
// squared traded against weighted path length. The minimum-curvature line is a_i = 1, w = 0 (Braghin, Cheli,
// Melzi and Sabbioni, "Race driver model", Computers & Structures 86 (2008); Heilmeier et al., Vehicle System
// Dynamics 58 (2020)). As there, the curvature is linearised about the current line and the quadratic
// programme is solved and re-linearised until it settles: here a damped Gauss-Newton step (Levenberg-Marquardt)
// with a backtracking line search on the exact F. The length term enters as sum b_i l_i^2 / (2 l_i0), which has
// the same value and gradient as sum b_i l_i at the current line and is an exact quadratic in n. Each k_i
// depends on n_(i-1), n_i, n_(i+1) and each l_i on n_i, n_(i+1), so the programme's matrix is a (cyclic)
// pentadiagonal band: no n-by-n matrix appears anywhere.

import type { Corridor } from './corridor.js';
import {
  centrelineCurvatureSlope,
  lineCurvature,
  lineSegmentLengths,
  nextOffset,
  offsetCurvature,
  offsetCurvaturePartials,
  previousOffset,
  segmentCurvature,
  type OffsetGrid,
} from './geometry.js';
import { boxQpWorkspace, clampInto, solveBoxQp, type BoxQpWorkspace } from './box-qp.js';
import { emptyBand, type PentaBand } from './penta-band.js';

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

/** Interior-point steps per linearisation at most (box-qp.ts); it usually needs 15 to 30. */
const QP_ITERATIONS = 80;
/** Each quadratic programme is solved to this share of the decrease that ends the outer iterations. */
const QP_TOLERANCE = 1e-3;

export const DEFAULT_OPTIMISE_OPTIONS: OptimiseOptions = { maxIterations: 40, relativeTolerance: 1e-6 };

export interface OptimiseResult {
  offsetM: Float64Array;
  objective: number;
  /** Gauss-Newton iterations, and the interior-point steps of their quadratic programmes in all. */
  iterations: number;
  qpSteps: number;
}

/** Work arrays of one grid size, allocated once per optimisation. */
interface Scratch {
  band: PentaBand;
  q: Float64Array;
  partials: Float64Array;
  kappa: Float64Array;
  lengths: Float64Array;
  qp: BoxQpWorkspace;
  step: Float64Array;
}

/** A class, not an object literal, as the band (penta-band.ts says why). */
class ScratchArrays implements Scratch {
  readonly band: PentaBand;
  readonly q: Float64Array;
  readonly partials: Float64Array;
  readonly kappa: Float64Array;
  readonly lengths: Float64Array;
  readonly qp: BoxQpWorkspace;
  readonly step: Float64Array;

  constructor(count: number, closed: boolean) {
    this.band = emptyBand(count, closed);
    this.q = new Float64Array(count);
    this.partials = new Float64Array(3);
    this.kappa = new Float64Array(count);
    this.lengths = new Float64Array(closed ? count : Math.max(count - 1, 0));
    this.qp = boxQpWorkspace(count, closed);
    this.step = new Float64Array(count);
  }
}

function scratchFor(count: number, closed: boolean): Scratch {
  return new ScratchArrays(count, closed);
}

/** F(n), the exact objective. */
export function offsetObjective(
  track: OffsetGrid,
  weights: OffsetWeights,
  offsetM: Float64Array,
  slope: Float64Array,
  scratch: Pick<Scratch, 'kappa' | 'lengths'> = scratchFor(offsetM.length, track.closed),
): number {
  let sum = weightedSquares(weights.curvature, lineCurvature(track, offsetM, slope, scratch.kappa));
  if (weights.length && weights.lengthWeight > 0)
    sum += weights.lengthWeight * weightedSum(weights.length, lineSegmentLengths(track, offsetM, scratch.lengths));
  return sum;
}

/** sum w_i v_i^2. */
function weightedSquares(weight: Float64Array, values: Float64Array): number {
  let sum = 0;
  for (let i = 0; i < values.length; i++) sum += weight[i]! * values[i]! * values[i]!;
  return sum;
}

/** sum w_i v_i. */
function weightedSum(weight: Float64Array, values: Float64Array): number {
  let sum = 0;
  for (let i = 0; i < values.length; i++) sum += weight[i]! * values[i]!;
  return sum;
}

/** Adds weight * (e + c . x)^2 for a residual over columns i - 1, i, i + 1 to the band and to q (cp = 0: over i and
 * i + 1 alone). */
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
  const ip = band.cyclic ? (i === 0 ? n - 1 : i - 1) : i - 1;
  const inx = band.cyclic ? (i + 1 === n ? 0 : i + 1) : i + 1;
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

/** The Gauss-Newton quadratic model about `offsetM` (without damping) into scratch.band and scratch.q: the band
 * Q and vector q of x^T Q x + 2 q^T x. */
function buildModel(
  track: OffsetGrid,
  weights: OffsetWeights,
  offsetM: Float64Array,
  slope: Float64Array,
  scratch: Scratch,
): void {
  const { band, q } = scratch;
  band.diag.fill(0);
  band.off1.fill(0);
  band.off2.fill(0);
  q.fill(0);
  addCurvatureTerms(track, weights.curvature, offsetM, slope, scratch);
  if (weights.length && weights.lengthWeight > 0)
    addLengthTerms(track, weights.length, weights.lengthWeight, offsetM, scratch);
}

/** The curvature term's residuals, linearised about `offsetM`, into the model. */
function addCurvatureTerms(
  track: OffsetGrid,
  curvatureWeight: Float64Array,
  offsetM: Float64Array,
  slope: Float64Array,
  scratch: Scratch,
): void {
  const count = offsetM.length;
  const closed = track.closed;
  const { band, q, partials } = scratch;
  const h = track.stepM;
  const kc = track.curvaturePerM;
  for (let i = 0; i < count; i++) {
    const prev = previousOffset(offsetM, i, closed);
    const next = nextOffset(offsetM, i, closed);
    const n = offsetM[i]!;
    const dn = (next - prev) / (2 * h);
    const ddn = (next - 2 * n + prev) / (h * h);
    offsetCurvaturePartials(n, dn, ddn, kc[i]!, slope[i]!, partials);
    const kN = partials[0]!;
    const kD = partials[1]!;
    const kDD = partials[2]!;
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
    const ip = closed ? (i === 0 ? count - 1 : i - 1) : i - 1;
    const inx = closed ? (i + 1 === count ? 0 : i + 1) : i + 1;
    const e = kappa0 - cm * n - (ip >= 0 ? cp * offsetM[ip]! : 0) - (inx < count ? cn * offsetM[inx]! : 0);
    addResidual3(band, q, i, cp, cm, cn, e, curvatureWeight[i]!);
  }
}

/** The length term's residuals into the model (the minimum-time line's; the minimum-curvature line has none). */
function addLengthTerms(
  track: OffsetGrid,
  length: Float64Array,
  lengthWeight: number,
  offsetM: Float64Array,
  scratch: Scratch,
): void {
  const { band, q } = scratch;
  const h = track.stepM;
  const kc = track.curvaturePerM;
  const segments = track.closed ? offsetM.length : offsetM.length - 1;
  const lengths = lineSegmentLengths(track, offsetM, scratch.lengths);
  for (let i = 0; i < segments; i++) {
    const weight = (lengthWeight * length[i]!) / (2 * lengths[i]!);
    const half = 0.5 * h * segmentCurvature(kc, i);
    // l_i^2 = (h - half (n_i + n_j))^2 + (n_j - n_i)^2, two linear residuals over columns i, i + 1.
    addResidual3(band, q, i, 0, -half, -half, h, weight);
    addResidual3(band, q, i, 0, -1, 1, 0, weight);
  }
}

// The loops over the points live in small functions of their own that end on a plain return (here and in
// box-qp.ts): V8 compiles a long loop while it runs (on-stack replacement), and a driver holding them all was compiled
// whole for each of its loops in a new process and sent back to the interpreter from code after them that had no
// type feedback yet, which the first racing line of a run paid for in compile time.

function sumOf(values: Float64Array): number {
  let sum = 0;
  for (let i = 0; i < values.length; i++) sum += values[i]!;
  return sum;
}

/** Damping mu |x - n0|^2 adds mu to the diagonal and -mu n0 to q (a negative mu takes it off again, exactly). */
function addDamping(band: PentaBand, q: Float64Array, centre: Float64Array, damping: number): void {
  for (let i = 0; i < centre.length; i++) {
    band.diag[i]! += damping;
    q[i]! -= damping * centre[i]!;
  }
}

/** The point `t` of the way from `from` to `to`, into `out`. */
function pointAlong(from: Float64Array, to: Float64Array, t: number, out: Float64Array): void {
  for (let i = 0; i < from.length; i++) out[i] = from[i]! + t * (to[i]! - from[i]!);
}

/** Minimises F inside the corridor, starting from `start` (clipped into the corridor). */
export function optimiseOffsets(
  track: OffsetGrid,
  corridor: Corridor,
  weights: OffsetWeights,
  start: Float64Array,
  options: OptimiseOptions = DEFAULT_OPTIMISE_OPTIONS,
): OptimiseResult {
  const count = start.length;
  const slope = centrelineCurvatureSlope(track);
  const scratch = scratchFor(count, track.closed);
  const { band, q, step } = scratch;
  const lower = corridor.lowerM;
  const upper = corridor.upperM;
  let current = clampInto(start, lower, upper, new Float64Array(count));
  let trial = new Float64Array(count);
  let value = offsetObjective(track, weights, current, slope, scratch);
  let damping = -1;
  let iterations = 0;
  let qpSteps = 0;
  for (; iterations < options.maxIterations; iterations++) {
    buildModel(track, weights, current, slope, scratch);
    const scale = sumOf(band.diag) / count || 1;
    if (damping < 0) damping = 1e-6 * scale;
    let accepted = false;
    let decrease = 0;
    for (let attempt = 0; attempt < 6 && !accepted; attempt++) {
      addDamping(band, q, current, damping);
      qpSteps += solveBoxQp(band, q, lower, upper, current, {
        maxIterations: QP_ITERATIONS,
        tolerance: QP_TOLERANCE * options.relativeTolerance * Math.abs(value),
        workspace: scratch.qp,
        out: step,
      }).iterations;
      addDamping(band, q, current, -damping);
      // Backtracking along the step; the corridor is convex, so every point of the step stays inside.
      for (let t = 1; t > 0.01 && !accepted; t *= 0.5) {
        pointAlong(current, step, t, trial);
        const trialValue = offsetObjective(track, weights, trial, slope, scratch);
        if (trialValue < value) {
          decrease = value - trialValue;
          [current, trial] = [trial, current];
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
  return { offsetM: current, objective: value, iterations, qpSteps };
}
