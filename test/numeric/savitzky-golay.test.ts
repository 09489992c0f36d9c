// The Savitzky-Golay filter against its paper and its frequency response: the convolution weights tabulated by
// Savitzky and Golay (Analytical Chemistry 36 (1964) 1627, tables I, III and V), exact reproduction of a polynomial
// of the filter's order (the defining property of a least-squares polynomial fit, stated in the paper), and the
// -3 dB cut-off against Schafer's empirical formula (IEEE Signal Processing Magazine 28(4) (2011) 111-117).

import { describe, expect, it } from 'vitest';
import {
  applySavitzkyGolay,
  savitzkyGolayCutoffShare,
  savitzkyGolayFilter,
  savitzkyGolayResponse,
  savitzkyGolayWeights,
} from '../../src/numeric/savitzky-golay.js';

const scaled = (weights: Float64Array, norm: number) => Array.from(weights, (w) => Math.round(w * norm * 1e9) / 1e9);

describe('Savitzky-Golay weights', () => {
  it('match the 1964 tables for quadratic smoothing and first and second derivatives', () => {
    // Savitzky and Golay (1964), table I (smoothing, quadratic/cubic): 5 points (-3, 12, 17, 12, -3) / 35,
    // 7 points (-2, 3, 6, 7, 6, 3, -2) / 21.
    expect(scaled(savitzkyGolayWeights(2, 2, 0), 35)).toEqual([-3, 12, 17, 12, -3]);
    expect(scaled(savitzkyGolayWeights(3, 2, 0), 21)).toEqual([-2, 3, 6, 7, 6, 3, -2]);
    // Table III (first derivative, quadratic): 5 points (-2, -1, 0, 1, 2) / 10.
    expect(scaled(savitzkyGolayWeights(2, 2, 1), 10)).toEqual([-2, -1, 0, 1, 2]);
    // Table V (second derivative, quadratic/cubic): 5 points (2, -1, -2, -1, 2) / 7.
    expect(scaled(savitzkyGolayWeights(2, 3, 2), 7)).toEqual([2, -1, -2, -1, 2]);
  });

  it('reproduces a polynomial of the filter order exactly, with its derivatives, at the ends too', () => {
    // A least-squares fit of degree p reproduces any polynomial of degree <= p (Savitzky and Golay 1964).
    const stepS = 0.1;
    const n = 60;
    const p = (t: number) => 2 - 3 * t + 0.5 * t * t - 0.25 * t * t * t;
    const dp = (t: number) => -3 + t - 0.75 * t * t;
    const ddp = (t: number) => 1 - 1.5 * t;
    const values = Float64Array.from({ length: n }, (_, i) => p(i * stepS));
    const smooth = applySavitzkyGolay(savitzkyGolayFilter(6, 3, 0), values, stepS);
    const slope = applySavitzkyGolay(savitzkyGolayFilter(6, 3, 1), values, stepS);
    const curve = applySavitzkyGolay(savitzkyGolayFilter(6, 3, 2), values, stepS);
    for (let i = 0; i < n; i++) {
      const t = i * stepS;
      expect(smooth[i]!).toBeCloseTo(p(t), 9);
      expect(slope[i]!).toBeCloseTo(dp(t), 8);
      expect(curve[i]!).toBeCloseTo(ddp(t), 7);
    }
  });

  it('passes DC unchanged and has its -3 dB point where Schafer (2011) puts it', () => {
    for (const [halfWidth, order] of [
      [25, 2],
      [25, 4],
      [40, 3],
      [30, 6],
    ] as const) {
      const weights = savitzkyGolayWeights(halfWidth, order, 0);
      expect(savitzkyGolayResponse(weights, 0)).toBeCloseTo(1, 12);
      // Find the first -3 dB crossing by bisection on the response (monotone in the pass band).
      let lo = 0;
      let hi = 0.5;
      for (let k = 0; k < 50; k++) {
        const mid = 0.5 * (lo + hi);
        if (savitzkyGolayResponse(weights, mid) > Math.SQRT1_2) lo = mid;
        else hi = mid;
      }
      // The formula is an empirical fit (Schafer: for M >= 25 and N < M); within 10 % here. An odd order
      // smooths as the even order below it.
      expect(Math.abs(lo / savitzkyGolayCutoffShare(halfWidth, order) - 1)).toBeLessThan(0.1);
      if (order % 2 === 1) {
        const even = savitzkyGolayWeights(halfWidth, order - 1, 0);
        for (let k = 0; k < weights.length; k++) expect(weights[k]!).toBeCloseTo(even[k]!, 12);
      }
    }
  });

  it('its noise gain is the root sum of squares of the weights, the standard deviation of a linear estimate', () => {
    const filter = savitzkyGolayFilter(2, 2, 0);
    // (9 + 144 + 289 + 144 + 9) / 35^2 = 595 / 1225 = 17 / 35: the variance of the centre value of the fit.
    expect(filter.noiseGain).toBeCloseTo(Math.sqrt(17 / 35), 12);
  });
});
