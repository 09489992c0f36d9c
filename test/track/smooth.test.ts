// Centreline smoothing and curvature: circles with and without GPS-like noise, and the smoother's response
// against the Whittaker-Henderson transfer function 1 / (1 + lambda (2 - 2 cos w)^2) (Eilers 2003, "A perfect
// smoother", Analytical Chemistry 75, eq. for the frequency response of the second-order penalty).

import { describe, expect, it } from 'vitest';
import { centrelinePath, trackFromCentreline } from '../../src/track/resample.js';
import { smoothingLambda, whittakerSmoother } from '../../src/track/smooth.js';

function prng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Circle of radius R sampled every ~spacing m, with Gaussian noise of sigma m on x and y (Box-Muller). */
function noisyCircle(radiusM: number, spacingM: number, sigmaM: number, seed: number) {
  const random = prng(seed);
  const gauss = () => Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());
  const n = Math.round((2 * Math.PI * radiusM) / spacingM);
  const xM = new Float64Array(n);
  const yM = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const angle = (2 * Math.PI * i) / n;
    xM[i] = radiusM * Math.cos(angle) + sigmaM * gauss();
    yM[i] = radiusM * Math.sin(angle) + sigmaM * gauss();
  }
  return { xM, yM, widthLeftM: null, widthRightM: null };
}

function stats(values: Float64Array): { mean: number; sd: number } {
  let sum = 0;
  let sum2 = 0;
  for (const v of values) {
    sum += v;
    sum2 += v * v;
  }
  const mean = sum / values.length;
  return { mean, sd: Math.sqrt(Math.max(0, sum2 / values.length - mean * mean)) };
}

/**
 * Curvature scatter expected from white position noise: the normal displacement n(s) adds n'' to the curvature;
 * noise of variance sigma^2 per point at spacing D has spectral density sigma^2 D up to 1 / (2D), and the
 * smoother passes H(f) = 1 / (1 + (f smoothingM)^4). Variance = int 2 sigma^2 D (2 pi f)^4 H^2 df.
 */
function predictedCurvatureSd(sigmaM: number, spacingM: number, smoothingM: number): number {
  const steps = 20000;
  const nyquist = 1 / (2 * spacingM);
  let variance = 0;
  for (let i = 0; i < steps; i++) {
    const f = ((i + 0.5) * nyquist) / steps;
    const h = 1 / (1 + (f * smoothingM) ** 4);
    variance += 2 * sigmaM ** 2 * spacingM * (2 * Math.PI * f) ** 4 * h * h * (nyquist / steps);
  }
  return Math.sqrt(variance);
}

const options = { name: 'circle', closed: true, stepM: 1, source: 'circle' };

describe('trackFromCentreline', () => {
  it('a noise-free circle of radius 100 m sampled every 5 m gives curvature 1/R within 0.5 % and length 2 pi R', () => {
    // Circle geometry: curvature 1/R, circumference 2 pi R.
    for (const smoothingM of [0, 30]) {
      const track = trackFromCentreline(noisyCircle(100, 5, 0, 1), { ...options, smoothingM });
      let worst = 0;
      for (const k of track.curvaturePerM) worst = Math.max(worst, Math.abs(k * 100 - 1));
      expect(worst).toBeLessThan(0.005);
      expect(track.lengthM).toBeCloseTo(200 * Math.PI, 1);
      // Heading turns by 2 pi over the lap.
      const n = track.headingRad.length;
      expect(track.headingRad[n - 1]! - track.headingRad[0]! + track.stepM / 100).toBeCloseTo(2 * Math.PI, 3);
    }
  });

  it('a circle with 0.3 m Gaussian noise every 5 m: mean curvature within 3 % of 1/100, scatter as the filter predicts', () => {
    // Eight seeded circles, so the scatter estimate itself is steady.
    for (const smoothingM of [30, 80]) {
      let meanSum = 0;
      let sdSum = 0;
      const runs = 8;
      for (let seed = 1; seed <= runs; seed++) {
        const track = trackFromCentreline(noisyCircle(100, 5, 0.3, seed), { ...options, smoothingM });
        const { mean, sd } = stats(track.curvaturePerM);
        expect(Math.abs(mean * 100 - 1)).toBeLessThan(0.03);
        meanSum += mean;
        sdSum += sd;
      }
      expect(Math.abs((meanSum / runs) * 100 - 1)).toBeLessThan(0.01);
      const predicted = predictedCurvatureSd(0.3, 5, smoothingM);
      expect(sdSum / runs / predicted).toBeGreaterThan(0.75);
      expect(sdSum / runs / predicted).toBeLessThan(1.25);
      // At 80 m the scatter is small: under 6 % of the curvature.
      if (smoothingM === 80) expect((sdSum / runs) * 100).toBeLessThan(0.06);
    }
  });

  it('an open arc keeps its ends and its curvature', () => {
    // Quarter circle of radius 50 m, points every 4 m, open.
    const n = Math.round((Math.PI * 50) / 2 / 4) + 1;
    const xM = new Float64Array(n);
    const yM = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const a = ((Math.PI / 2) * i) / (n - 1);
      xM[i] = 50 * Math.sin(a);
      yM[i] = 50 - 50 * Math.cos(a);
    }
    const track = trackFromCentreline(
      { xM, yM, widthLeftM: null, widthRightM: null },
      { ...options, closed: false, smoothingM: 0 },
    );
    expect(track.lengthM).toBeCloseTo(25 * Math.PI, 1);
    expect(track.xM[track.xM.length - 1]).toBeCloseTo(50, 2);
    const middle = track.curvaturePerM.subarray(5, -5);
    for (const k of middle) expect(Math.abs(k * 50 - 1)).toBeLessThan(0.005);
  });

  it('carries widths along by linear interpolation', () => {
    const circle = noisyCircle(100, 5, 0, 1);
    const n = circle.xM.length;
    const widthLeftM = new Float64Array(n).fill(4);
    const widthRightM = new Float64Array(n).fill(6);
    const track = trackFromCentreline({ ...circle, widthLeftM, widthRightM }, { ...options, smoothingM: 30 });
    expect(track.widthLeftM?.every((w) => Math.abs(w - 4) < 1e-12)).toBe(true);
    expect(track.widthRightM?.every((w) => Math.abs(w - 6) < 1e-12)).toBe(true);
  });

  it('centrelinePath has the track curvature and one step per segment', () => {
    const track = trackFromCentreline(noisyCircle(100, 5, 0, 1), { ...options, smoothingM: 30 });
    const path = centrelinePath(track);
    expect(path.closed).toBe(true);
    expect(path.segmentLengthM.length).toBe(track.xM.length);
    expect(path.segmentLengthM.every((h) => h === track.stepM)).toBe(true);
    expect(Array.from(path.curvaturePerM)).toEqual(Array.from(track.curvaturePerM));
  });
});

describe('whittakerSmoother', () => {
  it('passes a sine of wavelength smoothingM at half amplitude, and of 2 smoothingM at 1 / (1 + 1/16)', () => {
    // Transfer function 1 / (1 + lambda (2 - 2 cos w)^2), w = 2 pi h / wavelength (Eilers 2003).
    const stepM = 1;
    const smoothingM = 40;
    const lambda = smoothingLambda(smoothingM, stepM);
    for (const wavelengthM of [40, 80]) {
      const n = 40 * wavelengthM;
      const y = new Float64Array(n);
      for (let i = 0; i < n; i++) y[i] = Math.sin((2 * Math.PI * i * stepM) / wavelengthM);
      const z = whittakerSmoother(n, lambda, true)(y);
      const w = (2 * Math.PI * stepM) / wavelengthM;
      const expected = 1 / (1 + lambda * (2 - 2 * Math.cos(w)) ** 2);
      let amplitude = 0;
      for (const v of z) amplitude = Math.max(amplitude, Math.abs(v));
      expect(amplitude).toBeCloseTo(expected, 4);
      if (wavelengthM === smoothingM) expect(expected).toBeCloseTo(0.5, 2);
    }
  });
});
