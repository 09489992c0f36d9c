// Box-constrained convex quadratic programme with a symmetric band of half-bandwidth 2 (pentadiagonal, plain
// or cyclic): minimise x^T Q x + 2 q^T x subject to lower <= x <= upper.
// Method: Mehrotra's primal-dual interior-point method (Mehrotra, "On the implementation of a primal-dual interior
// point method", SIAM J. Optim. 2 (1992) 575-601), in the form for bound-constrained QPs of Nocedal and Wright,
// Numerical Optimization, 2nd ed., section 16.6 (algorithm 16.4): x stays strictly inside the box, the bounds'
// multipliers z (lower) and w (upper) stay positive, and each step solves
//   (Q + Z/S + W/T) dx = -(Q x + q) + sigma mu (1/s - 1/t) - (corrector terms),   s = x - lower, t = upper - x,
// whose matrix keeps Q's band, so a step costs one pentadiagonal factorisation at linear cost (penta-cholesky.ts).
// Its step count hardly depends on the size of the problem or on which bounds end up active, which is what a
// line of thousands of points along the edges of a track needs (an active-set method here changed hundreds of
// bounds per step and cycled). Variables whose box has no width are fixed and leave the system.

import { factorBanded, factorCyclicBanded, type BandEntry } from '../numeric/banded.js';
import { factorPenta, pentaFactorFor, solvePenta, SMALLEST_CYCLIC_PENTA, type PentaFactor } from './penta-cholesky.js';
import { emptyBand, multiplyBand, type PentaBand } from './penta-band.js';

export interface BoxQpResult {
  x: Float64Array;
  iterations: number;
  converged: boolean;
}

/** Work arrays of one problem size, reused from one solve to the next. */
export interface BoxQpWorkspace {
  /** Q plus the barrier's diagonal, with the rows and columns of fixed variables made the identity's. */
  system: PentaBand;
  factor: PentaFactor;
  /** Multipliers of the lower and upper bounds. */
  z: Float64Array;
  w: Float64Array;
  gradient: Float64Array;
  /** 1 / (x - lower) and 1 / (upper - x). */
  inverseS: Float64Array;
  inverseT: Float64Array;
  rhs: Float64Array;
  dx: Float64Array;
  dz: Float64Array;
  dw: Float64Array;
  /** 1 where the box has no width and the variable is fixed. */
  fixed: Uint8Array;
  /** The polish's guess (-1 held at the lower bound, 1 at the upper bound, 0 free), right-hand side and gradient. */
  held: Int8Array;
  polishRhs: Float64Array;
  polishGradient: Float64Array;
}

/** A class, not an object literal, as the band (penta-band.ts says why). */
class Workspace implements BoxQpWorkspace {
  readonly system: PentaBand;
  readonly factor: PentaFactor;
  readonly z: Float64Array;
  readonly w: Float64Array;
  readonly gradient: Float64Array;
  readonly inverseS: Float64Array;
  readonly inverseT: Float64Array;
  readonly rhs: Float64Array;
  readonly dx: Float64Array;
  readonly dz: Float64Array;
  readonly dw: Float64Array;
  readonly fixed: Uint8Array;
  readonly held: Int8Array;
  readonly polishRhs: Float64Array;
  readonly polishGradient: Float64Array;

  constructor(count: number, cyclic: boolean) {
    this.system = emptyBand(count, cyclic);
    this.factor = pentaFactorFor(count, cyclic);
    this.z = new Float64Array(count);
    this.w = new Float64Array(count);
    this.gradient = new Float64Array(count);
    this.inverseS = new Float64Array(count);
    this.inverseT = new Float64Array(count);
    this.rhs = new Float64Array(count);
    this.dx = new Float64Array(count);
    this.dz = new Float64Array(count);
    this.dw = new Float64Array(count);
    this.fixed = new Uint8Array(count);
    this.held = new Int8Array(count);
    this.polishRhs = new Float64Array(count);
    this.polishGradient = new Float64Array(count);
  }
}

export function boxQpWorkspace(count: number, cyclic: boolean): BoxQpWorkspace {
  return new Workspace(count, cyclic);
}

export interface BoxQpOptions {
  /** Interior-point steps at most (default 80). */
  maxIterations?: number;
  /** Stop when the duality gap and the dual residual bound the objective's error by this (default 1e-12 of its
   * scale at the start). */
  tolerance?: number;
  workspace?: BoxQpWorkspace;
  /** Where the answer goes (default a new array). */
  out?: Float64Array;
}

/** A polish is tried once the duality gap is within this factor of the tolerance, and again at each hundredth. */
const POLISH_FROM = 1e3;
/** Where the polished point may stray outside the box (share of the width) and a multiplier have the wrong sign
 * (share of the gradient's largest terms): rounding, both. */
const POLISH_SLACK = 1e-9;
/** A box narrower than this fixes its variable, m. */
const FIXED_WIDTH = 1e-9;
/** Share of the way to a bound a step may go (Nocedal and Wright, section 16.6: 0.995 is usual). */
const STEP_TO_BOUNDARY = 0.995;
/** A dual residual this share of the gradient's largest terms is rounding (1e4 times the unit roundoff). */
const RESIDUAL_FLOOR = 1e-12;
/** How far inside the box the start is pushed, as a share of each box's width. */
const START_INSET = 0.01;

/** Each value into its box [lower, upper], into `out` (which may be `values`); returns `out`. */
export function clampInto<Out extends Float64Array>(
  values: Float64Array,
  lower: Float64Array,
  upper: Float64Array,
  out: Out,
): Out {
  for (let i = 0; i < values.length; i++) out[i] = Math.min(upper[i]!, Math.max(lower[i]!, values[i]!));
  return out;
}

/** Q's off-diagonals into the system, less those of fixed variables (their rows and columns leave it). */
function systemBand(band: PentaBand, work: BoxQpWorkspace): void {
  const n = band.count;
  const { system, fixed } = work;
  system.off1.set(band.off1);
  system.off2.set(band.off2);
  for (let i = 0; i < n; i++) {
    if (!fixed[i]) continue;
    system.off1[i] = 0;
    system.off2[i] = 0;
    if (band.cyclic || i >= 1) system.off1[i === 0 ? n - 1 : i - 1] = 0;
    if (band.cyclic || i >= 2) system.off2[i < 2 ? i + n - 2 : i - 2] = 0;
  }
}

/** The system's solve; tiny systems (corner entries meeting the band) go through the general banded solvers. */
function solveSystem(work: BoxQpWorkspace, rhs: Float64Array, out: Float64Array): boolean {
  const { system } = work;
  const n = system.count;
  if (n >= SMALLEST_CYCLIC_PENTA) {
    solvePenta(work.factor, rhs, out);
    return true;
  }
  const entry: BandEntry = (i, k) => (k === 0 ? system.diag[i]! : k === 1 ? system.off1[i]! : system.off2[i]!);
  try {
    (system.cyclic ? factorCyclicBanded : factorBanded)(n, 2, entry).solve(rhs, out);
  } catch {
    return false;
  }
  return true;
}

/** The longest steps (at most 1) along dx that keep x inside the box, and along dz and dw that keep the
 * multipliers positive, each `share` of the way to the nearest bound, into out[0] (primal) and out[1] (dual). */
function longestSteps(work: BoxQpWorkspace, share: number, out: Float64Array): void {
  const { dx, dz, dw, z, w, inverseS, inverseT, fixed } = work;
  let primal = 1 / share;
  let dual = 1 / share;
  for (let i = 0; i < dx.length; i++) {
    if (fixed[i]) continue;
    const towardsLower = dx[i]! * inverseS[i]!;
    const towardsUpper = dx[i]! * inverseT[i]!;
    if (towardsLower < -1 / primal) primal = -1 / towardsLower;
    if (towardsUpper > 1 / primal) primal = 1 / towardsUpper;
    if (dz[i]! < -z[i]! / dual) dual = -z[i]! / dz[i]!;
    if (dw[i]! < -w[i]! / dual) dual = -w[i]! / dw[i]!;
  }
  out[0] = primal * share;
  out[1] = dual * share;
}

/**
 * Solution polishing (Stellato, Banjac, Goulart, Bemporad and Boyd, "OSQP: an operator splitting solver for
 * quadratic programs", Math. Prog. Comp. 12 (2020) 637-672, section 5.2): near the end the barrier tells which
 * bounds hold (there z / s or w / t outweighs Q's own diagonal); holding those and solving for the rest gives the
 * exact answer if the guess is right, which the KKT conditions confirm (every free point inside the box, every
 * held one pushed against its bound). True, with x replaced, when it is.
 */
function polish(
  band: PentaBand,
  q: Float64Array,
  lower: Float64Array,
  upper: Float64Array,
  work: BoxQpWorkspace,
  x: Float64Array,
  signSlack: number,
): boolean {
  const { system, polishRhs: rhs, dx: candidate } = work;
  guessHeld(band, work);
  heldSystem(band, q, lower, upper, work, x);
  let solved = band.count < SMALLEST_CYCLIC_PENTA || factorPenta(system, work.factor);
  if (solved) solved = solveSystem(work, rhs, candidate);
  if (solved) solved = heldGuessHolds(band, q, lower, upper, work, signSlack);
  if (!solved) {
    // The interior-point steps go on with their own system.
    systemBand(band, work);
    barrierDiagonal(band, work);
    return false;
  }
  clampInto(candidate, lower, upper, x);
  return true;
}

/** The polish's guess of which bounds hold, into work.held (2 for a fixed variable). */
function guessHeld(band: PentaBand, work: BoxQpWorkspace): void {
  const { z, w, inverseS, inverseT, fixed, held } = work;
  for (let i = 0; i < band.count; i++) {
    const pullLower = fixed[i] ? 0 : z[i]! * inverseS[i]!;
    const pullUpper = fixed[i] ? 0 : w[i]! * inverseT[i]!;
    const own = band.diag[i]!;
    held[i] = fixed[i] ? 2 : pullLower > own && pullLower > pullUpper ? -1 : pullUpper > own ? 1 : 0;
  }
}

/** The system of the free variables with the held ones at their bounds, and its right-hand side. */
function heldSystem(
  band: PentaBand,
  q: Float64Array,
  lower: Float64Array,
  upper: Float64Array,
  work: BoxQpWorkspace,
  x: Float64Array,
): void {
  const n = band.count;
  const { system, held, polishRhs: rhs } = work;
  const boundOf = (i: number) => (held[i] === -1 ? lower[i]! : held[i] === 1 ? upper[i]! : x[i]!);
  for (let i = 0; i < n; i++) {
    system.diag[i] = held[i] ? 1 : band.diag[i]!;
    rhs[i] = held[i] ? boundOf(i) : -q[i]!;
    system.off1[i] = 0;
    system.off2[i] = 0;
  }
  // Each band pair (i, j): kept between two free variables, moved to the right-hand side next to a held one.
  for (let reach = 1; reach <= 2; reach++) {
    const offsets = reach === 1 ? band.off1 : band.off2;
    const kept = reach === 1 ? system.off1 : system.off2;
    const pairs = band.cyclic ? n : n - reach;
    for (let i = 0; i < pairs; i++) {
      const j = i + reach < n ? i + reach : i + reach - n;
      if (!held[i] && !held[j]) kept[i] = offsets[i]!;
      else if (!held[i]) rhs[i]! -= offsets[i]! * boundOf(j);
      else if (!held[j]) rhs[j]! -= offsets[i]! * boundOf(i);
    }
  }
}

/** Whether the polished point (work.dx) meets the KKT conditions: every free point inside the box, every held one
 * pushed against its bound. */
function heldGuessHolds(
  band: PentaBand,
  q: Float64Array,
  lower: Float64Array,
  upper: Float64Array,
  work: BoxQpWorkspace,
  signSlack: number,
): boolean {
  const { held, dx: candidate, polishGradient: gradient } = work;
  multiplyBand(band, candidate, gradient);
  let holds = true;
  for (let i = 0; i < band.count && holds; i++) {
    const g = gradient[i]! + q[i]!;
    const slack = POLISH_SLACK * (upper[i]! - lower[i]!);
    if (held[i] === 0) holds = candidate[i]! >= lower[i]! - slack && candidate[i]! <= upper[i]! + slack;
    else if (held[i] === -1) holds = g >= -signSlack;
    else if (held[i] === 1) holds = g <= signSlack;
  }
  return holds;
}

/** The interior-point system's diagonal Q + Z/S + W/T (1 for a fixed variable). */
function barrierDiagonal(band: PentaBand, work: BoxQpWorkspace): void {
  const { system, z, w, inverseS, inverseT, fixed } = work;
  for (let i = 0; i < band.count; i++)
    system.diag[i] = fixed[i] ? 1 : band.diag[i]! + z[i]! * inverseS[i]! + w[i]! * inverseT[i]!;
}

/** Pushes the start just inside the box (x) and fixes the variables whose box has no width; returns how many
 * are free. */
function startInside(
  lower: Float64Array,
  upper: Float64Array,
  start: Float64Array,
  fixed: Uint8Array,
  x: Float64Array,
): number {
  let free = 0;
  for (let i = 0; i < x.length; i++) {
    const width = upper[i]! - lower[i]!;
    fixed[i] = width <= FIXED_WIDTH ? 1 : 0;
    if (fixed[i]) {
      x[i] = 0.5 * (lower[i]! + upper[i]!);
      continue;
    }
    free++;
    const inset = START_INSET * width;
    x[i] = Math.min(upper[i]! - inset, Math.max(lower[i]! + inset, start[i]!));
  }
  return free;
}

/** The gradient's scale over the box (mean of |g| times the width over the free variables) and the size of its
 * largest terms (which sets its rounding error). */
interface ProblemScale {
  scale: number;
  largestTerm: number;
}

/** The gradient Q x + q at the start into work.gradient; returns the sum of |g| times the width over the free
 * variables. */
function startGradient(
  band: PentaBand,
  q: Float64Array,
  lower: Float64Array,
  upper: Float64Array,
  x: Float64Array,
  work: BoxQpWorkspace,
): number {
  const { gradient: g, fixed } = work;
  multiplyBand(band, x, g);
  let sum = 0;
  for (let i = 0; i < band.count; i++) {
    g[i]! += q[i]!;
    if (!fixed[i]) sum += Math.abs(g[i]!) * (upper[i]! - lower[i]!);
  }
  return sum;
}

/**
 * Multipliers from the gradient at the start, each at least a small share of the gradient's scale over the
 * width, so that every product s z and t w starts positive and of one size.
 */
function startMultipliers(
  band: PentaBand,
  q: Float64Array,
  lower: Float64Array,
  upper: Float64Array,
  x: Float64Array,
  free: number,
  work: BoxQpWorkspace,
): ProblemScale {
  const n = band.count;
  const { z, w, gradient: g, dz, dw, fixed } = work;
  let scale = startGradient(band, q, lower, upper, x, work);
  scale = free > 0 ? scale / free : 0;
  if (!(scale > 0)) scale = 1;
  let largestTerm = 0;
  for (let i = 0; i < n; i++) {
    const row = Math.abs(band.diag[i]!) + 2 * Math.abs(band.off1[i]!) + 2 * Math.abs(band.off2[i]!);
    const reach = Math.max(Math.abs(lower[i]!), Math.abs(upper[i]!));
    largestTerm = Math.max(largestTerm, Math.abs(q[i]!) + row * reach);
    const floor = fixed[i] ? 0 : (0.1 * scale) / (upper[i]! - lower[i]!);
    z[i] = fixed[i] ? 0 : Math.max(g[i]!, 0) + floor;
    w[i] = fixed[i] ? 0 : Math.max(-g[i]!, 0) + floor;
    // Fixed variables do not move: zeros in the right-hand sides and the multipliers' steps keep them.
    dz[i] = 0;
    dw[i] = 0;
  }
  return { scale, largestTerm };
}

/** Where an iterate stands: the duality gap, the dual residual's bound on the objective (sum |r| times the box's
 * width) and the largest dual residual. */
interface Standing {
  gap: number;
  residual: number;
  largestResidual: number;
}

/** The gradient, the standing of x, and the system's diagonal Q + Z/S + W/T with its right-hand side -g. */
function measure(
  band: PentaBand,
  q: Float64Array,
  lower: Float64Array,
  upper: Float64Array,
  x: Float64Array,
  work: BoxQpWorkspace,
  out: Standing,
): void {
  const n = band.count;
  const { system, z, w, gradient: g, inverseS, inverseT, rhs, fixed } = work;
  multiplyBand(band, x, g);
  let gap = 0;
  let residual = 0;
  let largestResidual = 0;
  for (let i = 0; i < n; i++) {
    const gi = g[i]! + q[i]!;
    g[i] = gi;
    if (fixed[i]) {
      system.diag[i] = 1;
      rhs[i] = 0;
      continue;
    }
    const s = x[i]! - lower[i]!;
    const t = upper[i]! - x[i]!;
    const iS = 1 / s;
    const iT = 1 / t;
    inverseS[i] = iS;
    inverseT[i] = iT;
    const r = Math.abs(gi - z[i]! + w[i]!);
    gap += s * z[i]! + t * w[i]!;
    residual += r * (s + t);
    if (r > largestResidual) largestResidual = r;
    system.diag[i] = band.diag[i]! + z[i]! * iS + w[i]! * iT;
    rhs[i] = -gi;
  }
  out.gap = gap;
  out.residual = residual;
  out.largestResidual = largestResidual;
}

// The steps of Mehrotra's predictor-corrector below each run one loop over the points in a function of its own
// that ends on a plain return: V8 compiles a long loop while it runs (on-stack replacement), before the code after
// it has ever run, and one function holding every loop was compiled again for each of them in a new process and
// sent back to the interpreter from code without type feedback, which the first racing line of a run paid for.

/** The predictor's multiplier steps from dx: dz = -z (1 + dx / s), dw = -w (1 - dx / t). */
function affineMultiplierSteps(work: BoxQpWorkspace): void {
  const { z, w, inverseS, inverseT, dx, dz, dw, fixed } = work;
  for (let i = 0; i < dx.length; i++) {
    if (fixed[i]) continue;
    dz[i] = -z[i]! * (1 + dx[i]! * inverseS[i]!);
    dw[i] = -w[i]! * (1 - dx[i]! * inverseT[i]!);
  }
}

/** The duality gap after the predictor's step, `primal` along dx and `dual` along dz and dw. */
function affineGap(
  lower: Float64Array,
  upper: Float64Array,
  x: Float64Array,
  work: BoxQpWorkspace,
  primal: number,
  dual: number,
): number {
  const { z, w, dx, dz, dw, fixed } = work;
  let gapAffine = 0;
  for (let i = 0; i < x.length; i++) {
    if (fixed[i]) continue;
    const d = primal * dx[i]!;
    gapAffine += (x[i]! - lower[i]! + d) * (z[i]! + dual * dz[i]!) + (upper[i]! - x[i]! - d) * (w[i]! + dual * dw[i]!);
  }
  return gapAffine;
}

/** The corrector's right-hand side: centring on `target` and the affine step's second-order term. */
function correctorRhs(work: BoxQpWorkspace, target: number): void {
  const { z, w, gradient: g, inverseS, inverseT, rhs, dx, dz, dw, fixed } = work;
  for (let i = 0; i < dx.length; i++) {
    if (fixed[i]) continue;
    const d = dx[i]!;
    const iS = inverseS[i]!;
    const iT = inverseT[i]!;
    // Right-hand side first (it needs the affine steps), then the affine parts of the multipliers' steps.
    rhs[i] = -g[i]! + target * (iS - iT) - d * dz[i]! * iS - d * dw[i]! * iT;
    dz[i] = (target - d * dz[i]!) * iS - z[i]!;
    dw[i] = (target + d * dw[i]!) * iT - w[i]!;
  }
}

/** The corrector's multiplier steps, completed with the parts that follow its dx. */
function correctorMultiplierSteps(work: BoxQpWorkspace): void {
  const { z, w, inverseS, inverseT, dx, dz, dw, fixed } = work;
  for (let i = 0; i < dx.length; i++) {
    if (fixed[i]) continue;
    dz[i]! -= z[i]! * dx[i]! * inverseS[i]!;
    dw[i]! += w[i]! * dx[i]! * inverseT[i]!;
  }
}

/** x, z and w moved `primal` along dx and `dual` along dz and dw. */
function takeStep(x: Float64Array, work: BoxQpWorkspace, primal: number, dual: number): void {
  const { z, w, dx, dz, dw, fixed } = work;
  for (let i = 0; i < x.length; i++) {
    if (fixed[i]) continue;
    x[i]! += primal * dx[i]!;
    z[i]! += dual * dz[i]!;
    w[i]! += dual * dw[i]!;
  }
}

/**
 * One step of Mehrotra's predictor-corrector from x (its system measured and factored): false when a solve
 * fails. `steps` holds the primal and dual step lengths.
 */
function predictorCorrector(
  lower: Float64Array,
  upper: Float64Array,
  x: Float64Array,
  mu: number,
  gap: number,
  work: BoxQpWorkspace,
  steps: Float64Array,
): boolean {
  const { rhs, dx } = work;
  // Predictor (affine scaling): the Newton step towards a zero gap, dx from -g, the multipliers' from dx, and
  // the longest steps that keep x inside the box and the multipliers positive.
  if (!solveSystem(work, rhs, dx)) return false;
  affineMultiplierSteps(work);
  longestSteps(work, 1, steps);
  // The gap that step would reach gives the centring weight sigma = (mu_aff / mu)^3; the corrector adds the
  // centring and the affine step's second-order term to the right-hand side.
  const gapAffine = affineGap(lower, upper, x, work, steps[0]!, steps[1]!);
  const target = Math.min(1, (gapAffine / gap) ** 3) * mu;
  correctorRhs(work, target);
  if (!solveSystem(work, rhs, dx)) return false;
  correctorMultiplierSteps(work);
  longestSteps(work, STEP_TO_BOUNDARY, steps);
  takeStep(x, work, steps[0]!, steps[1]!);
  return true;
}

/**
 * Solves the box QP from a starting point (pushed just inside the box). Returns a point inside the box, to the
 * tolerance when converged.
 */
export function solveBoxQp(
  band: PentaBand,
  q: Float64Array,
  lower: Float64Array,
  upper: Float64Array,
  start: Float64Array,
  options: BoxQpOptions = {},
): BoxQpResult {
  const n = band.count;
  const maxIterations = options.maxIterations ?? 80;
  const work = options.workspace ?? boxQpWorkspace(n, band.cyclic);
  const x = options.out ?? new Float64Array(n);
  const free = startInside(lower, upper, start, work.fixed, x);
  systemBand(band, work);
  const { scale, largestTerm } = startMultipliers(band, q, lower, upper, x, free, work);
  const residualFloor = RESIDUAL_FLOOR * largestTerm;
  const tolerance = options.tolerance ?? 1e-12 * scale * free;
  let polishAt = POLISH_FROM * tolerance;
  const steps = new Float64Array(2);
  const standing: Standing = { gap: 0, residual: 0, largestResidual: 0 };
  let converged = free === 0;
  let iterations = 0;
  while (!converged && iterations < maxIterations) {
    measure(band, q, lower, upper, x, work, standing);
    const { gap, residual, largestResidual } = standing;
    // x^T Q x + 2 q^T x is twice the form the multipliers belong to.
    if (2 * gap <= polishAt) {
      if (polish(band, q, lower, upper, work, x, POLISH_SLACK * largestTerm)) {
        converged = true;
        break;
      }
      polishAt /= 100;
    }
    if (2 * gap <= tolerance && (2 * residual <= tolerance || largestResidual <= residualFloor)) {
      converged = true;
      break;
    }
    iterations++;
    if (n >= SMALLEST_CYCLIC_PENTA && !factorPenta(work.system, work.factor)) break;
    if (!predictorCorrector(lower, upper, x, gap / (2 * free), gap, work, steps)) break;
  }
  clampInto(x, lower, upper, x);
  return { x, iterations, converged };
}
