// A boundary fitted to a cloud of samples that lie on it or inside it: the stochastic frontier of Aigner, Lovell and
// Schmidt (J. Econometrics 6 (1977) 21-37). Each sample is e = y - f(theta) = v - u, with v ~ N(0, sigma_v^2) the
// measurement noise and u >= 0 half-normal, |N(0, sigma_u^2)|, how far inside the boundary the sample stayed. In
// their parameters sigma^2 = sigma_v^2 + sigma_u^2 and lambda = sigma_u / sigma_v >= 0 the log-likelihood of a sample
// is ln 2 - ln sigma + ln phi(e / sigma) + ln Phi(-e lambda / sigma); lambda = 0 (every sample on the boundary up to
// noise) is a point of the parameter space, not a limit. Maximised by Newton's method with the Gauss-Newton form of
// the second derivatives in theta (those of f itself left out, as in nonlinear least squares), exact ones in
// (ln sigma, lambda), and a line search; the covariance is the inverse of that information, set beside the cluster
// sandwich (./covariance.ts).

import { Matrix, inverse, pseudoInverse } from 'ml-matrix';
import { logNormalCdf, logNormalPdf } from '../numeric/normal.js';
import { MIN_CLUSTERS, clusterScoreProduct, conservativeCovariance, sandwich } from './covariance.js';
import { ar1VarianceInflation, lag1Autocorrelation } from './serial-correlation.js';

export interface FrontierProblem {
  /** Number of samples. */
  count: number;
  /** Writes e_i = y_i - f_i(theta) for every sample; theta in natural units. */
  residuals(theta: Float64Array, out: Float64Array): void;
  /** Cluster of each sample (0..clusters-1): samples of one cluster share their errors. */
  cluster: Int32Array;
  clusters: number;
  /** A typical size of each parameter: finite-difference steps and the conditioning work in these units. */
  scales: Float64Array;
  /** How many of the samples count as independent for the skewness pre-test (default: the clusters). */
  independent?: number;
  /**
   * Whether neighbouring samples of a cluster are serially correlated beyond what the clusters capture (channels
   * derived by smoothing): the classical covariance is then inflated by the AR(1) factor of the residuals' lag-1
   * autocorrelation (./serial-correlation.ts) before it is set beside the cluster sandwich.
   */
  serialCorrelation?: boolean;
  /**
   * Whether samples may stay inside the boundary (the one-sided term, after the skewness pre-test); false holds
   * lambda at 0, symmetric noise about the boundary, for samples whose skew says more about how they were made than
   * about the driver (accelerations derived by smoothing: ./grip-fit.ts).
   */
  insideTerm?: boolean;
}

export interface FrontierFit {
  theta: Float64Array;
  /** Covariance of theta, natural units. */
  covariance: Matrix;
  sigmaV: number;
  sigmaU: number;
  logLikelihood: number;
  iterations: number;
  converged: boolean;
  /** de_i / d(theta_k / scale_k), row-major, at the answer (for the identifiability diagnostics). */
  jacobian: Float64Array;
  /** Factor on the classical variance for serially correlated residuals (1 when not asked for or none found). */
  varianceInflation: number;
}

const LN2 = Math.LN2;
const MAX_ITERATIONS = 60;

/** ln L of one sample; c = ln sigma. */
export function frontierLogLikelihood(e: number, c: number, lambda: number): number {
  const sigma = Math.exp(c);
  const u = e / sigma;
  return LN2 - c + logNormalPdf(u) + logNormalCdf(-lambda * u);
}

/** Per sample: l, then the first derivatives in (e, c, lambda), then the second (ee, ec, el, cc, cl, ll). */
const STRIDE = 10;

/** Analytic derivatives of each sample's ln L (with u = e / sigma, z = -lambda u, M = phi(z) / Phi(z), M' = -M (z + M)). */
function derivatives(e: Float64Array, c: number, lambda: number, out: Float64Array): number {
  const sigma = Math.exp(c);
  let total = 0;
  for (let i = 0; i < e.length; i++) {
    const u = e[i]! / sigma;
    const z = -lambda * u;
    const logCdf = logNormalCdf(z);
    const m = Math.exp(logNormalPdf(z) - logCdf);
    const dm = -m * (z + m);
    const l = LN2 - c + logNormalPdf(u) + logCdf;
    const lu = -u - lambda * m;
    const ll = -u * m;
    const luu = -1 + lambda * lambda * dm;
    const lul = -m + lambda * u * dm;
    const lll = u * u * dm;
    const o = i * STRIDE;
    out[o] = l;
    out[o + 1] = lu / sigma;
    out[o + 2] = -1 - u * lu;
    out[o + 3] = ll;
    out[o + 4] = luu / (sigma * sigma);
    out[o + 5] = -(u * luu + lu) / sigma;
    out[o + 6] = lul / sigma;
    out[o + 7] = u * lu + u * u * luu;
    out[o + 8] = -u * lul;
    out[o + 9] = lll;
    total += l;
  }
  return total;
}

/** de/d(theta_k / scale_k) by finite differences (central, or forward from `base` = e(theta)), row-major n x p. */
export function residualJacobian(
  problem: FrontierProblem,
  theta: Float64Array,
  out: Float64Array,
  base: Float64Array | null = null,
): void {
  const p = theta.length;
  const n = problem.count;
  const plus = new Float64Array(n);
  const minus = new Float64Array(n);
  const shifted = new Float64Array(theta);
  for (let k = 0; k < p; k++) {
    const h = (base ? 1e-6 : 1e-4) * problem.scales[k]!;
    shifted[k] = theta[k]! + h;
    problem.residuals(shifted, plus);
    if (base) minus.set(base);
    else {
      shifted[k] = theta[k]! - h;
      problem.residuals(shifted, minus);
    }
    shifted[k] = theta[k]!;
    const span = base ? h : 2 * h;
    for (let i = 0; i < n; i++) out[i * p + k] = ((plus[i]! - minus[i]!) / span) * problem.scales[k]!;
  }
}

function standardDeviation(values: Float64Array): number {
  let mean = 0;
  for (const value of values) mean += value;
  mean /= values.length;
  let sum = 0;
  for (const value of values) sum += (value - mean) ** 2;
  return Math.sqrt(sum / Math.max(1, values.length - 1));
}

/** Gradient and Gauss-Newton Hessian in (theta scaled, c[, lambda]). */
function assemble(
  d: Float64Array,
  jacobian: Float64Array,
  n: number,
  p: number,
  withLambda: boolean,
): { gradient: Float64Array; hessian: Matrix } {
  const m = p + (withLambda ? 2 : 1);
  const gradient = new Float64Array(m);
  const h = new Float64Array(m * m);
  for (let i = 0; i < n; i++) {
    const o = i * STRIDE;
    const le = d[o + 1]!;
    const lee = d[o + 4]!;
    const lec = d[o + 5]!;
    const lel = d[o + 6]!;
    const row = i * p;
    for (let j = 0; j < p; j++) {
      const jj = jacobian[row + j]!;
      gradient[j]! += le * jj;
      for (let k = j; k < p; k++) h[j * m + k]! += lee * jj * jacobian[row + k]!;
      h[j * m + p]! += lec * jj;
      if (withLambda) h[j * m + p + 1]! += lel * jj;
    }
    gradient[p]! += d[o + 2]!;
    h[p * m + p]! += d[o + 7]!;
    if (withLambda) {
      gradient[p + 1]! += d[o + 3]!;
      h[p * m + p + 1]! += d[o + 8]!;
      h[(p + 1) * m + p + 1]! += d[o + 9]!;
    }
  }
  const hessian = Matrix.zeros(m, m);
  for (let j = 0; j < m; j++) for (let k = j; k < m; k++) hessian.set(j, k, h[j * m + k]!).set(k, j, h[j * m + k]!);
  return { gradient, hessian };
}

/** The inverse, or the pseudo-inverse where a direction carries no information at all (a noise-free log). */
function invertOrPseudo(matrix: Matrix): Matrix {
  try {
    return inverse(matrix);
  } catch {
    return pseudoInverse(matrix);
  }
}

/** Newton step solving (information + mu I) step = gradient, with Levenberg's mu raised until the step ascends. */
function newtonStep(gradient: Float64Array, hessian: Matrix): number[] | null {
  const m = gradient.length;
  const information = hessian.clone().mul(-1);
  let scale = 0;
  for (let j = 0; j < m; j++) scale = Math.max(scale, Math.abs(information.get(j, j)));
  if (!(scale > 0)) scale = 1;
  for (let mu = 0; mu <= 1e8; mu = mu === 0 ? 1e-8 : mu * 10) {
    const damped = information.clone();
    for (let j = 0; j < m; j++) damped.set(j, j, damped.get(j, j) + mu * scale);
    try {
      const candidate = inverse(damped)
        .mmul(Matrix.columnVector(Array.from(gradient)))
        .getColumn(0);
      let ascent = 0;
      for (let j = 0; j < m; j++) ascent += candidate[j]! * gradient[j]!;
      if (ascent >= 0 && candidate.every(Number.isFinite)) return candidate;
    } catch {
      // Singular: more damping.
    }
  }
  return null;
}

/** Maximises ln L over (c, lambda) for fixed residuals: Newton's method in two variables, lambda kept >= 0. */
interface NoiseState {
  c: number;
  lambda: number;
  /** lambda sits on its bound 0 while the likelihood would rather have it negative. */
  lambdaFixed: boolean;
  /** lambda held at 0 by the skewness pre-test, whatever the gradient says. */
  lambdaLocked: boolean;
}

/** ln L summed, with its gradient and Hessian in (c, lambda): what the two-variable Newton step needs (`d` is scratch). */
function noiseSums(
  e: Float64Array,
  c: number,
  lambda: number,
  d: Float64Array,
): { l: number; gc: number; gl: number; hcc: number; hcl: number; hll: number } {
  const l = derivatives(e, c, lambda, d);
  let gc = 0;
  let gl = 0;
  let hcc = 0;
  let hcl = 0;
  let hll = 0;
  for (let o = 0; o < e.length * STRIDE; o += STRIDE) {
    gc += d[o + 2]!;
    gl += d[o + 3]!;
    hcc += d[o + 7]!;
    hcl += d[o + 8]!;
    hll += d[o + 9]!;
  }
  return { l, gc, gl, hcc, hcl, hll };
}

function maximiseNoise(e: Float64Array, state: NoiseState, d: Float64Array): number {
  if (state.lambdaLocked) {
    // lambda = 0 is the normal model: the likelihood's sigma is the root mean square residual, in closed form.
    let squares = 0;
    for (let i = 0; i < e.length; i++) squares += e[i]! * e[i]!;
    state.c = 0.5 * Math.log(Math.max(1e-300, squares / e.length));
    return derivatives(e, state.c, 0, d);
  }
  let sums = noiseSums(e, state.c, state.lambda, d);
  for (let iteration = 0; iteration < 20; iteration++) {
    const { gc, gl, hcc, hcl, hll } = sums;
    if (state.lambdaFixed && gl > 0) state.lambdaFixed = false;
    let dc: number;
    let dl: number;
    if (state.lambdaFixed) {
      dc = hcc < 0 ? -gc / hcc : gc;
      dl = 0;
    } else {
      const det = hcc * hll - hcl * hcl;
      // Newton where the Hessian is negative definite, else a gradient step.
      if (hcc < 0 && det > 0) {
        dc = -(hll * gc - hcl * gl) / det;
        dl = -(hcc * gl - hcl * gc) / det;
      } else {
        dc = gc / Math.max(1, Math.abs(hcc));
        dl = gl / Math.max(1, Math.abs(hll));
      }
    }
    if (Math.abs(dc * gc + dl * gl) < 1e-8) break;
    let accepted = false;
    for (let t = 1; t > 1e-6; t *= 0.5) {
      const c = state.c + t * dc;
      const raw = state.lambda + t * dl;
      const lambda = Math.max(0, raw);
      const trial = noiseSums(e, c, lambda, d);
      if (trial.l >= sums.l) {
        accepted = trial.l > sums.l;
        state.c = c;
        state.lambda = lambda;
        if (raw <= 0 && !state.lambdaFixed) state.lambdaFixed = true;
        sums = trial;
        break;
      }
    }
    if (!accepted) break;
  }
  return derivatives(e, state.c, state.lambda, d);
}

/**
 * Coelli's third-moment test (J. Productivity Analysis 6 (1995) 247-268): with no inefficiency the residuals of
 * the least-squares fit are symmetric; a significantly negative skew (one-sided 5 %) says samples stay inside the
 * boundary. Samples that share their errors count as one: the caller says how many independent ones there are.
 */
export function insideSkewSignificant(e: Float64Array, clusters: number): boolean {
  const n = e.length;
  let mean = 0;
  for (const value of e) mean += value;
  mean /= n;
  let m2 = 0;
  let m3 = 0;
  for (const value of e) {
    const d = value - mean;
    m2 += d * d;
    m3 += d * d * d;
  }
  m2 /= n;
  m3 /= n;
  if (!(m2 > 0)) return false;
  const z = m3 / Math.sqrt((6 * m2 * m2 * m2) / Math.max(1, clusters));
  return z < -1.6449;
}

/** The profile Hessian in theta: the Schur complement of the noise block (the theta block alone where the noise
 * block is singular). */
function profileHessian(hessian: Matrix, p: number): Matrix {
  const m = hessian.rows;
  const thetaBlock = hessian.subMatrix(0, p - 1, 0, p - 1);
  const cross = hessian.subMatrix(0, p - 1, p, m - 1);
  const noiseBlock = hessian.subMatrix(p, m - 1, p, m - 1);
  try {
    return thetaBlock.sub(cross.mmul(inverse(noiseBlock)).mmul(cross.transpose()));
  } catch {
    return thetaBlock;
  }
}

/**
 * The parameters' covariance at the answer (Jacobian by central differences): the inverse information, inflated
 * for serially correlated samples where asked, or the cluster-robust sandwich where it is the more cautious.
 */
function covarianceAt(
  problem: FrontierProblem,
  theta: Float64Array,
  jacobian: Float64Array,
  e: Float64Array,
  d: Float64Array,
  noise: NoiseState,
): { covariance: Matrix; varianceInflation: number; logLikelihood: number } {
  const p = theta.length;
  const n = problem.count;
  const { c, lambda, lambdaFixed } = noise;
  residualJacobian(problem, theta, jacobian);
  const logLikelihood = derivatives(e, c, lambda, d);
  const { hessian } = assemble(d, jacobian, n, p, !lambdaFixed);
  const m = hessian.rows;
  const informationInverse = invertOrPseudo(hessian.clone().mul(-1));
  let robust: Matrix | null = null;
  if (problem.clusters >= MIN_CLUSTERS) {
    const scores = new Float64Array(n * m);
    for (let i = 0; i < n; i++) {
      const o = i * STRIDE;
      for (let k = 0; k < p; k++) scores[i * m + k] = d[o + 1]! * jacobian[i * p + k]!;
      scores[i * m + p] = d[o + 2]!;
      if (!lambdaFixed) scores[i * m + p + 1] = d[o + 3]!;
    }
    robust = sandwich(informationInverse, clusterScoreProduct(scores, m, problem.cluster, problem.clusters));
  }
  // Classical variances assume independent samples; smoothed channels are not (the factor is 1 when not asked for).
  const varianceInflation = problem.serialCorrelation
    ? ar1VarianceInflation(lag1Autocorrelation(e, problem.cluster), n)
    : 1;
  const classical = varianceInflation > 1 ? informationInverse.clone().mul(varianceInflation) : informationInverse;
  const chosen = conservativeCovariance(classical, robust, problem.clusters);
  const covariance = Matrix.zeros(p, p);
  for (let j = 0; j < p; j++)
    for (let k = 0; k < p; k++) covariance.set(j, k, chosen.get(j, k) * problem.scales[j]! * problem.scales[k]!);
  return { covariance, varianceInflation, logLikelihood };
}

export function fitFrontier(problem: FrontierProblem, start: Float64Array): FrontierFit {
  const p = start.length;
  const n = problem.count;
  const theta = new Float64Array(start);
  const e = new Float64Array(n);
  problem.residuals(theta, e);
  // The noise terms are maximised out for each theta (a profile likelihood), so Newton's steps in theta do not
  // bend around the strong coupling of the boundary's place with sigma and lambda. The first pass holds lambda at
  // 0 (least squares); the inefficiency term enters only where the pre-test finds the samples skewed inside: on the
  // boundary of the parameter space the estimate would otherwise jump between lambda = 0 and lambda > 0 with the noise.
  const noise: NoiseState = {
    c: Math.log(Math.max(1e-6, standardDeviation(e))),
    lambda: 0,
    lambdaFixed: true,
    lambdaLocked: true,
  };
  const jacobian = new Float64Array(n * p);
  const d = new Float64Array(n * STRIDE);
  const trialD = new Float64Array(n * STRIDE);
  const trial = new Float64Array(n);
  const nextTheta = new Float64Array(p);
  let iterations = 0;
  let converged = false;
  let current = maximiseNoise(e, noise, d);

  for (; iterations < MAX_ITERATIONS; iterations++) {
    residualJacobian(problem, theta, jacobian, e);
    const { gradient, hessian } = assemble(d, jacobian, n, p, !noise.lambdaFixed);
    const step = newtonStep(gradient.subarray(0, p), profileHessian(hessian, p));
    let decrement = 0;
    if (step) for (let j = 0; j < p; j++) decrement += step[j]! * gradient[j]!;
    let improved = false;
    if (step && decrement >= 1e-7) {
      // Backtrack from the full step; where the full step is taken, try longer ones while they keep paying (far
      // from the answer the boundary creeps towards the cloud in short Newton steps).
      const origin = new Float64Array(theta);
      const tryStep = (t: number): boolean => {
        for (let k = 0; k < p; k++) nextTheta[k] = origin[k]! + t * step[k]! * problem.scales[k]!;
        problem.residuals(nextTheta, trial);
        const trialNoise = { ...noise };
        const value = maximiseNoise(trial, trialNoise, trialD);
        if (!(value > current || (value === current && t < 1))) return false;
        improved ||= value > current;
        theta.set(nextTheta);
        e.set(trial);
        d.set(trialD);
        Object.assign(noise, trialNoise);
        current = value;
        return true;
      };
      let t = 1;
      for (let halving = 0; halving < 40 && !tryStep(t); halving++) t *= 0.5;
      if (t === 1 && improved) for (let longer = 2; longer <= 32 && tryStep(longer); longer *= 2);
    }
    if (!improved) {
      if (noise.lambdaLocked) {
        // Least squares has converged: let the inefficiency in only if the residuals lean inside.
        noise.lambdaLocked = false;
        if (problem.insideTerm !== false && insideSkewSignificant(e, problem.independent ?? problem.clusters)) {
          noise.lambda = 1;
          noise.lambdaFixed = false;
          current = maximiseNoise(e, noise, d);
          continue;
        }
      }
      converged = step !== null;
      break;
    }
  }

  const { c, lambda } = noise;
  const { covariance, varianceInflation, logLikelihood } = covarianceAt(problem, theta, jacobian, e, d, noise);
  const sigma = Math.exp(c);
  const sigmaV = sigma / Math.sqrt(1 + lambda * lambda);
  return {
    theta,
    covariance,
    sigmaV,
    sigmaU: lambda * sigmaV,
    logLikelihood,
    iterations,
    converged,
    jacobian,
    varianceInflation,
  };
}
