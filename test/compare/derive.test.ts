// Derived channels against kinematics: constant acceleration (v^2 = v0^2 + 2 a s), uniform circular motion
// (a = v^2 / R, curvature 1 / R), uniform straight motion.

import { describe, expect, it } from 'vitest';
import {
  axFromSpeed,
  ayFromCurvature,
  correlation,
  curvatureTooNoisy,
  movingAverage,
  pathCurvature,
  speedFromPositions,
} from '../../src/compare/derive.js';

describe('derived channels', () => {
  it('moving average: hand-computed values, open and cyclic', () => {
    const values = Float64Array.of(0, 3, 6, 3, 0);
    expect(Array.from(movingAverage(values, 1, false))).toEqual([0, 3, 4, 3, 0]);
    expect(Array.from(movingAverage(values, 1, true))).toEqual([1, 3, 4, 3, 1]);
  });

  it('ax from speed recovers a constant acceleration (v^2 = v0^2 + 2 a s)', () => {
    const a = -7.5;
    const speed = new Float64Array(400);
    for (let i = 0; i < speed.length; i++) speed[i] = Math.sqrt(60 * 60 + 2 * a * i * 0.5);
    const ax = axFromSpeed(speed, 0.5, false);
    // Central differences of sqrt are second-order accurate; away from the ends the error is tiny.
    for (let i = 20; i < 380; i++) expect(ax[i]!).toBeCloseTo(a, 2);
  });

  it('path curvature of a circle is 1 / R, and ay = v^2 / R (uniform circular motion)', () => {
    const r = 60;
    const n = Math.round((2 * Math.PI * r) / 1);
    const x = new Float64Array(n);
    const y = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      x[i] = r * Math.cos((2 * Math.PI * i) / n);
      y[i] = r * Math.sin((2 * Math.PI * i) / n);
    }
    const kappa = pathCurvature(x, y, (2 * Math.PI * r) / n, true);
    for (let i = 0; i < n; i++) expect(Math.abs(kappa[i]! * r - 1)).toBeLessThan(0.01);
    const ay = ayFromCurvature(new Float64Array(n).fill(20), kappa);
    expect(ay[17]!).toBeCloseTo((20 * 20) / r, 1);
    // Clockwise: negative curvature (positive = left).
    const clockwise = pathCurvature(
      x,
      y.map((value) => -value),
      (2 * Math.PI * r) / n,
      true,
    );
    expect(clockwise[5]!).toBeLessThan(0);
  });

  it('speed from positions in uniform straight motion', () => {
    const t = new Float64Array(50).map((_, i) => i * 0.05);
    const speed = speedFromPositions(
      t,
      t.map((value) => 3 * value * 10),
      t.map((value) => 4 * value * 10),
    );
    for (const value of speed) expect(value).toBeCloseTo(50, 9);
  });

  it('calls a path noisy when its curvature departs from the track more than the track curves', () => {
    const track = new Float64Array(100).fill(0.01);
    expect(
      curvatureTooNoisy(
        track.map((value) => value * 1.1),
        track,
      ),
    ).toBe(false);
    expect(
      curvatureTooNoisy(
        track.map((_, i) => (i % 2 ? 0.05 : -0.05)),
        track,
      ),
    ).toBe(true);
    expect(correlation(Float64Array.of(1, 2, 3), Float64Array.of(-2, -4, -6))).toBeCloseTo(-1, 12);
  });
});
