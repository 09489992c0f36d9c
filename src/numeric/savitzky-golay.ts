// Savitzky-Golay smoothing and differentiation (Savitzky and Golay, Analytical Chemistry 36 (1964) 1627-1639):
// a least-squares polynomial of degree `order` through 2 halfWidth + 1 equally spaced samples, evaluated (or
// differentiated) at a point of the window. Every output is a fixed weighted sum of the window's samples, so the
// weights are computed once and the filter costs linear time. Its frequency response and the cut-off estimate
// below follow Schafer, "What is a Savitzky-Golay filter?", IEEE Signal Processing Magazine 28(4) (2011) 111-117.

import { mlMatrix } from './matrix-library.js';

/**
 * Weights w_k, k = -halfWidth..halfWidth, such that sum w_k y_k is the `derivative`-th derivative (per sample
 * step) at offset `at` (in steps from the window's centre) of the least-squares polynomial through the y_k.
 */
export function savitzkyGolayWeights(halfWidth: number, order: number, derivative = 0, at = 0): Float64Array {
  const size = 2 * halfWidth + 1;
  if (!(order >= derivative && order < size)) {
    throw new Error(`Savitzky-Golay filter: order ${order} needs a window of more than ${order} samples`);
  }
  // Normal equations of the fit, A^T A c = A^T y with A[k][j] = k^j (k centred); the weights are the row of
  // (A^T A)^-1 A^T that gives the derivative of the polynomial at `at`.
  const { Matrix, inverse } = mlMatrix();
  const design = new Matrix(size, order + 1);
  for (let k = 0; k < size; k++) for (let j = 0; j <= order; j++) design.set(k, j, Math.pow(k - halfWidth, j));
  const projector = inverse(design.transpose().mmul(design)).mmul(design.transpose());
  // d^derivative/dt^derivative of t^j at t = at: j! / (j - derivative)! at^(j - derivative).
  const weights = new Float64Array(size);
  for (let j = derivative; j <= order; j++) {
    let factor = 1;
    for (let q = 0; q < derivative; q++) factor *= j - q;
    const basis = factor * Math.pow(at, j - derivative);
    if (basis === 0) continue;
    for (let k = 0; k < size; k++) weights[k]! += basis * projector.get(j, k);
  }
  return weights;
}

/** A filter ready to run: centre weights for the interior and one-sided weights for each sample near an end. */
export interface SavitzkyGolayFilter {
  halfWidth: number;
  order: number;
  derivative: number;
  /** Weights at the window's centre. */
  centre: Float64Array;
  /** edge[e] evaluates at offset -(halfWidth - e) from the first full window's centre, e = 0..halfWidth - 1. */
  edge: Float64Array[];
  /** Standard deviation of the output per unit of white input noise at the centre: sqrt(sum w_k^2). */
  noiseGain: number;
}

export function savitzkyGolayFilter(halfWidth: number, order: number, derivative = 0): SavitzkyGolayFilter {
  const centre = savitzkyGolayWeights(halfWidth, order, derivative);
  const edge: Float64Array[] = [];
  for (let e = 0; e < halfWidth; e++) edge.push(savitzkyGolayWeights(halfWidth, order, derivative, e - halfWidth));
  let sum = 0;
  for (const w of centre) sum += w * w;
  return { halfWidth, order, derivative, centre, edge, noiseGain: Math.sqrt(sum) };
}

/**
 * Runs the filter over values sampled every stepS (the derivative is scaled to per-unit-of-stepS); near the ends
 * the first and last full windows are evaluated off-centre, so the ends are not pulled. Writes into `out`.
 */
export function applySavitzkyGolay(
  filter: SavitzkyGolayFilter,
  values: Float64Array,
  stepS: number,
  out: Float64Array = new Float64Array(values.length),
): Float64Array {
  const n = values.length;
  const m = filter.halfWidth;
  const scale = Math.pow(stepS, -filter.derivative);
  if (n < 2 * m + 1) {
    // Too short for one window: the best the samples allow is their own least-squares line's value or slope.
    out.fill(filter.derivative === 0 ? mean(values) : filter.derivative === 1 ? slope(values) / stepS : 0);
    return out;
  }
  const w = filter.centre;
  for (let i = m; i < n - m; i++) {
    let sum = 0;
    for (let k = 0; k <= 2 * m; k++) sum += w[k]! * values[i - m + k]!;
    out[i] = sum * scale;
  }
  for (let e = 0; e < m; e++) {
    const head = filter.edge[e]!;
    let first = 0;
    let last = 0;
    // The tail mirrors the head: the weight for offset +(m - e) is the head's weight for -(m - e), reversed in
    // the window and signed by the derivative's parity.
    const sign = filter.derivative % 2 === 0 ? 1 : -1;
    for (let k = 0; k <= 2 * m; k++) {
      first += head[k]! * values[k]!;
      last += sign * head[2 * m - k]! * values[n - 1 - 2 * m + k]!;
    }
    out[e] = first * scale;
    out[n - 1 - e] = last * scale;
  }
  return out;
}

/**
 * Approximate -3 dB cut-off of the smoothing filter as a share of the Nyquist frequency, by Schafer's (2011)
 * empirical formula (N + 1) / (3.2 halfWidth - 4.6) for an even order N, stated for halfWidth >= 25 and N < halfWidth
 * (below that an estimate only). An odd order smooths exactly as the even order below it (the odd power's weights
 * vanish at a symmetric centre), so N is the order rounded down to even.
 */
export function savitzkyGolayCutoffShare(halfWidth: number, order: number): number {
  const even = order - (order % 2);
  return (even + 1) / (3.2 * halfWidth - 4.6);
}

/** Magnitude of the filter's frequency response at a share of the Nyquist frequency (0-1): |sum w_k e^{-i pi f k}|. */
export function savitzkyGolayResponse(weights: Float64Array, nyquistShare: number): number {
  const m = (weights.length - 1) / 2;
  let re = 0;
  let im = 0;
  for (let k = 0; k < weights.length; k++) {
    const phase = Math.PI * nyquistShare * (k - m);
    re += weights[k]! * Math.cos(phase);
    im -= weights[k]! * Math.sin(phase);
  }
  return Math.hypot(re, im);
}

function mean(values: Float64Array): number {
  let sum = 0;
  for (const v of values) sum += v;
  return values.length > 0 ? sum / values.length : 0;
}

function slope(values: Float64Array): number {
  const n = values.length;
  if (n < 2) return 0;
  const centre = (n - 1) / 2;
  let sxy = 0;
  let sxx = 0;
  for (let i = 0; i < n; i++) {
    sxy += (i - centre) * values[i]!;
    sxx += (i - centre) * (i - centre);
  }
  return sxy / sxx;
}
