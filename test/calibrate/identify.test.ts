// The collinearity diagnostics of Belsley, Kuh and Welsch (Regression Diagnostics, 1980) on designs whose
// dependences are built in.

import { describe, expect, it } from 'vitest';
import { crossProduct, identifiability } from '../../src/calibrate/identify.js';

function design(rows: number[][]): Float64Array {
  return Float64Array.from(rows.flat());
}

describe('identifiability', () => {
  it('names the two columns of a near-dependence and leaves the independent one out', () => {
    const rows: number[][] = [];
    for (let i = 0; i < 40; i++) {
      const a = 1 + i / 10;
      rows.push([a, 2 * a + 1e-6 * Math.sin(i), Math.cos(i)]);
    }
    const result = identifiability(crossProduct(design(rows), 3, rows.length));
    expect(result.uninformed).toEqual([]);
    expect(result.entanglements).toHaveLength(1);
    expect(result.entanglements[0]!.parameters).toEqual([0, 1]);
    expect(result.entanglements[0]!.conditionIndex).toBeGreaterThan(1000);
  });

  it('finds nothing in an orthogonal design: all condition indices are 1', () => {
    // Columns of a 2-level factorial design are orthogonal and of equal length: every singular value is equal.
    const rows = [
      [1, 1, 1],
      [1, -1, -1],
      [-1, 1, -1],
      [-1, -1, 1],
    ];
    const result = identifiability(crossProduct(design(rows), 3, 4));
    expect(result.entanglements).toEqual([]);
    expect(result.conditionNumber).toBeCloseTo(1, 10);
  });

  it('marks a column of zeros as carrying no information', () => {
    const rows = [
      [1, 0, 2],
      [2, 0, -1],
      [3, 0, 0.5],
    ];
    const result = identifiability(crossProduct(design(rows), 3, 3));
    expect(result.uninformed).toEqual([1]);
  });

  it('stays below the threshold of 30 for a moderately correlated pair', () => {
    // Two columns at 60 degrees: the unit-scaled cross product has eigenvalues 1 +- cos 60, so the condition index
    // is sqrt(1.5 / 0.5) = 1.73.
    const rows = [
      [1, 0.5],
      [0, Math.sqrt(3) / 2],
    ];
    const result = identifiability(crossProduct(design(rows), 2, 2));
    expect(result.conditionNumber).toBeCloseTo(Math.sqrt(3), 10);
    expect(result.entanglements).toEqual([]);
  });
});
