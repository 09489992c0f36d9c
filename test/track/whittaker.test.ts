// The Whittaker smoother (src/track/whittaker.ts) against what Eilers, "A perfect smoother", Anal. Chem. 75 (2003)
// 3631-3636, states of it: its gain on a sine, 1 / (1 + lambda (2 - 2 cos k h)^2), and a straight line kept exactly
// (the second differences of a line are zero), gaps of weight 0 filled in.

import { describe, expect, it } from 'vitest';
import { whittakerLambda, whittakerSmooth } from '../../src/track/whittaker.js';

describe('Whittaker smoother', () => {
  it('halves a sine at the cut-off wavelength on a closed grid, and follows the stated gain at others', () => {
    const n = 480;
    const stepM = 2;
    const cutoffM = 60;
    const lambda = whittakerLambda(stepM, cutoffM);
    for (const wavelengthM of [30, 60, 120, 240]) {
      const values = Float64Array.from({ length: n }, (_, i) => Math.sin((2 * Math.PI * i * stepM) / wavelengthM));
      const smooth = whittakerSmooth(values, stepM, cutoffM, true);
      // On a cyclic grid a sine of a whole number of periods is an eigenvector: its gain is Eilers' formula exactly.
      const kh = (2 * Math.PI * stepM) / wavelengthM;
      const gain = 1 / (1 + lambda * (2 - 2 * Math.cos(kh)) ** 2);
      if (wavelengthM === cutoffM) expect(gain).toBeCloseTo(0.5, 12);
      for (let i = 0; i < n; i++) expect(smooth[i]!).toBeCloseTo(gain * values[i]!, 9);
    }
  });

  it('keeps a straight line exactly on an open grid, and fills points of weight 0 on it', () => {
    const n = 200;
    const values = Float64Array.from({ length: n }, (_, i) => 3 + 0.25 * i);
    const weights = Float64Array.from({ length: n }, (_, i) => (i % 7 === 3 || (i > 80 && i < 120) ? 0 : 1));
    const noisy = Float64Array.from(values, (v, i) => (weights[i] === 0 ? 1e6 : v));
    const smooth = whittakerSmooth(noisy, 1, 50, false, weights);
    for (let i = 0; i < n; i++) expect(smooth[i]!).toBeCloseTo(values[i]!, 6);
  });
});
