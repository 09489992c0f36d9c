// The seeded generator against the moments of the distributions it claims to draw from.

import { describe, expect, it } from 'vitest';
import { seededRandom } from '../../src/numeric/seeded-random.js';

const COUNT = 200_000;

function moments(draw: () => number): { mean: number; variance: number; min: number; max: number } {
  let sum = 0;
  let sumSq = 0;
  let min = Infinity;
  let max = -Infinity;
  for (let k = 0; k < COUNT; k++) {
    const x = draw();
    sum += x;
    sumSq += x * x;
    min = Math.min(min, x);
    max = Math.max(max, x);
  }
  const mean = sum / COUNT;
  return { mean, variance: sumSq / COUNT - mean * mean, min, max };
}

describe('seededRandom', () => {
  it('draws uniformly on [0, 1): mean 1/2 and variance 1/12', () => {
    // Standard uniform distribution: mean 1/2, variance 1/12 (any statistics handbook, e.g. NIST/SEMATECH
    // e-Handbook of Statistical Methods, 1.3.6.6.2). Tolerances are five standard errors of the sample moments.
    const { mean, variance, min, max } = moments(seededRandom(2024).uniform);
    expect(Math.abs(mean - 0.5)).toBeLessThan(5 * Math.sqrt(1 / 12 / COUNT));
    expect(Math.abs(variance - 1 / 12)).toBeLessThan(5 * Math.sqrt(1 / 180 / COUNT));
    expect(min).toBeGreaterThanOrEqual(0);
    expect(max).toBeLessThan(1);
  });

  it('draws standard normal values by Box-Muller: mean 0, variance 1', () => {
    // Box and Muller (1958): the transform of two uniforms gives N(0, 1); the sample variance of n normal draws
    // has standard error sqrt(2/n).
    const { mean, variance } = moments(seededRandom(7).gaussian);
    expect(Math.abs(mean)).toBeLessThan(5 / Math.sqrt(COUNT));
    expect(Math.abs(variance - 1)).toBeLessThan(5 * Math.sqrt(2 / COUNT));
  });

  it('repeats its sequence for a seed and differs between seeds', () => {
    // Common practice: a seeded generator is reproducible.
    const a = seededRandom(11);
    const b = seededRandom(11);
    const c = seededRandom(12);
    const first = Array.from({ length: 5 }, () => a.uniform());
    expect(Array.from({ length: 5 }, () => b.uniform())).toEqual(first);
    expect(Array.from({ length: 5 }, () => c.uniform())).not.toEqual(first);
  });
});
