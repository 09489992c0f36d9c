// The log's noise and the derivative window it calls for (src/compare/derive-window.ts).

import { describe, expect, it } from 'vitest';
import { chooseHalfWidth, derivativeNoiseGain, pooledNoise } from '../../src/compare/derive-window.js';
import { savitzkyGolayFilter } from '../../src/numeric/savitzky-golay.js';
import { seededRandom } from '../../src/numeric/seeded-random.js';

describe('noise and window of a uniformly sampled log', () => {
  it('the closed-form noise gains equal the Savitzky-Golay weights’ root sum of squares', () => {
    // Variance of a linear least-squares estimate = sigma^2 sum w_k^2 (Savitzky and Golay 1964): the closed forms
    // the window rule uses must agree with the weights themselves.
    for (const m of [3, 8, 20]) {
      expect(derivativeNoiseGain(m, 1)).toBeCloseTo(savitzkyGolayFilter(m, 2, 1).noiseGain, 10);
      expect(derivativeNoiseGain(m, 2)).toBeCloseTo(savitzkyGolayFilter(m, 3, 2).noiseGain, 10);
    }
  });

  it('reads the standard deviation of white noise on a smooth signal', () => {
    // A cubic fit leaves a cubic untouched, so the residuals are the noise alone; corrected by the leverage, the
    // pooled estimate is the noise's standard deviation. 20,000 samples: the sample SD's relative standard error is
    // 1/sqrt(2 N) = 0.5 % (normal theory, e.g. Kendall and Stuart), so 3 % is six standard errors.
    const random = seededRandom(11);
    const stepS = 0.04;
    const sigma = 0.7;
    const series = [0, 1].map((shift) =>
      Float64Array.from({ length: 10_000 }, (_, k) => {
        const t = k * stepS;
        return 3 + 2 * t - 0.05 * t * t + shift + sigma * random.gaussian();
      }),
    );
    expect(Math.abs(pooledNoise(series, stepS) / sigma - 1)).toBeLessThan(0.03);
  });

  it('picks the smallest half-width whose predicted noise meets the target', () => {
    // The second derivative's noise is sigma * gain(m) / dt^2 (Savitzky and Golay 1964): the chosen m meets the
    // target and m - 1 does not.
    const sigma = 0.5;
    const stepS = 0.1;
    const target = 0.3;
    const { halfWidth, noiseMps2 } = chooseHalfWidth(sigma, stepS, 2, 2, 60, target);
    expect(noiseMps2).toBeLessThanOrEqual(target);
    expect((sigma * derivativeNoiseGain(halfWidth - 1, 2)) / stepS ** 2).toBeGreaterThan(target);
  });
});
