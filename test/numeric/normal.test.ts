// The standard normal and Student's t functions against printed tables.

import { describe, expect, it } from 'vitest';
import { logNormalCdf, normalCdf, normalQuantile, studentQuantile } from '../../src/numeric/normal.js';

describe('normal quantile (AS 241)', () => {
  it('matches the percentage points of the normal table', () => {
    // Abramowitz and Stegun, Handbook of Mathematical Functions (1964), table 26.5.
    expect(normalQuantile(0.975)).toBeCloseTo(1.959963985, 9);
    expect(normalQuantile(0.995)).toBeCloseTo(2.575829304, 9);
    expect(normalQuantile(0.9995)).toBeCloseTo(3.290526731, 9);
    expect(normalQuantile(0.05)).toBeCloseTo(-1.644853627, 9);
    expect(normalQuantile(0.5)).toBe(0);
  });

  it('agrees with the independent erfc of Numerical Recipes deep in both tails', () => {
    // Two separately published approximations checked against each other where no table reaches.
    for (const p of [1e-5, 1e-12, 1e-20, 1e-100]) {
      expect(logNormalCdf(normalQuantile(p))).toBeCloseTo(Math.log(p), 5);
      expect(logNormalCdf(-normalQuantile(p))).toBeCloseTo(Math.log1p(-p), 9);
    }
  });

  it('refuses probabilities outside (0, 1)', () => {
    expect(() => normalQuantile(0)).toThrow(RangeError);
    expect(() => normalQuantile(1)).toThrow(RangeError);
  });
});

describe('normal distribution function', () => {
  it('matches the table of the normal integral', () => {
    // Abramowitz and Stegun (1964), table 26.1 (P(x) to 15 places).
    expect(normalCdf(-1)).toBeCloseTo(0.158655254, 7);
    expect(normalCdf(1.96)).toBeCloseTo(0.975002105, 7);
    expect(normalCdf(-3)).toBeCloseTo(0.001349898, 8);
    // Far in the tail, Phi(-10) = 7.6199e-24 (from memory).
    expect(logNormalCdf(-10)).toBeCloseTo(Math.log(7.619853024e-24), 5);
  });
});

describe("Student's t quantile", () => {
  it('matches the t table at 97.5 %', () => {
    // Abramowitz and Stegun (1964), table 26.10: t(0.975) for 4, 8 and 30 degrees of freedom.
    expect(studentQuantile(0.975, 4)).toBeCloseTo(2.776, 2);
    expect(studentQuantile(0.975, 8)).toBeCloseTo(2.306, 3);
    expect(studentQuantile(0.975, 30)).toBeCloseTo(2.042, 3);
  });
});
