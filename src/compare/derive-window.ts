// How noisy a uniformly sampled log is and how wide a Savitzky-Golay window its derivatives need: the noise as the
// leverage-corrected residual of a short cubic fit, the window as the smallest whose predicted output noise (the
// variance of the least-squares estimate, Savitzky and Golay 1964) meets a target.

import { savitzkyGolayFilter, applySavitzkyGolay } from '../numeric/savitzky-golay.js';

/**
 * White-noise standard deviation of the gridded channels: residuals from a cubic fit over +-0.5 s, divided by
 * sqrt(1 - w_0) (w_0 = the fit's weight on the sample itself, so E[r^2] = sigma^2 (1 - w_0) for a least-squares
 * smoother); channels are pooled, one value per log.
 */
export function pooledNoise(series: readonly Float64Array[], stepS: number): number {
  const half = Math.max(3, Math.round(0.5 / stepS));
  const fit = savitzkyGolayFilter(half, 3, 0);
  const w0 = fit.centre[half]!;
  let sum = 0;
  let count = 0;
  for (const values of series) {
    if (values.length < 2 * half + 1) continue;
    const smooth = applySavitzkyGolay(fit, values, stepS);
    for (let k = half; k < values.length - half; k++) {
      const r = values[k]! - smooth[k]!;
      sum += r * r;
      count++;
    }
  }
  return count > 0 ? Math.sqrt(sum / count / (1 - w0)) : 0;
}

/**
 * Smallest half-width (samples) whose derivative of order `derivative` leaves at most targetMps2 of noise from an
 * input noise sigma, by the closed forms of the least-squares estimates on a symmetric window: the slope's variance
 * sigma^2 / sum k^2, the second derivative's 4 sigma^2 / sum (k^2 - mean k^2)^2 (quadratic and cubic fits alike).
 */
export function chooseHalfWidth(
  sigma: number,
  stepS: number,
  derivative: 1 | 2,
  minHalf: number,
  maxHalf: number,
  targetMps2: number,
): { halfWidth: number; noiseMps2: number } {
  let noise = Infinity;
  let m = minHalf;
  for (; m <= maxHalf; m++) {
    noise = sigma * derivativeNoiseGain(m, derivative) * Math.pow(stepS, -derivative);
    if (noise <= targetMps2) break;
  }
  return { halfWidth: Math.min(m, maxHalf), noiseMps2: noise };
}

export function derivativeNoiseGain(halfWidth: number, derivative: 1 | 2): number {
  let sumK2 = 0;
  for (let k = -halfWidth; k <= halfWidth; k++) sumK2 += k * k;
  if (derivative === 1) return 1 / Math.sqrt(sumK2);
  const meanK2 = sumK2 / (2 * halfWidth + 1);
  let spread = 0;
  for (let k = -halfWidth; k <= halfWidth; k++) spread += (k * k - meanK2) * (k * k - meanK2);
  return 2 / Math.sqrt(spread);
}
