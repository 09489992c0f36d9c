// The uncertain reference's braking-zone table in both unit systems: the braking point in feet and the slowest
// speed in mph under imperial, each the metric cell's number converted through the exact definitions
// 1 ft = 0.3048 m and 1 mph = 0.44704 m/s (NIST SP 811, appendix B); the header names the unit.

import { describe, expect, it } from 'vitest';
import { uncertainReferenceText } from '../../src/report/uncertainty-summary.js';
import type { UncertainReference } from '../../src/uncertainty/uncertain-reference.js';
import { displayUnits } from '../../src/report/units.js';

const M_PER_FT = 0.3048; // NIST SP 811, appendix B (exact)
const MPS_PER_MPH = 0.44704; // NIST SP 811, appendix B (exact)

/** Two braking zones over a few draws (invented numbers of a club lap). */
const u = {
  draws: 8,
  seed: 1,
  design: 'test design',
  fields: [],
  clamped: 0,
  lapTimeS: { median: 75.8, low: 75.5, high: 76.1 },
  zones: [
    {
      brakingPointM: { median: 1101.4, low: 1098.2, high: 1104.9 },
      minSpeedMps: { median: 16.4, low: 16.1, high: 16.8 },
      foundShare: 1,
    },
    {
      brakingPointM: { median: 2380.7, low: 2377.0, high: 2383.3 },
      minSpeedMps: { median: 33.9, low: 33.5, high: 34.2 },
      foundShare: 0.875,
    },
  ],
} as unknown as UncertainReference;

/** The numbers of each table row after the zone's number: brake median, low, high, slowest median, low, high. */
const cells = (text: string) =>
  text
    .split('\n')
    .filter((line) => /^\d+\s/.test(line))
    .map((line) => [...line.slice(1).matchAll(/\d+(?:\.\d+)?/g)].slice(0, 6).map((m) => Number(m[0])));

describe('the braking zones over the draws', () => {
  it('are in feet and mph under imperial, the metric numbers converted', () => {
    const metric = uncertainReferenceText(u, displayUnits('metric'));
    const imperial = uncertainReferenceText(u, displayUnits('imperial'));
    expect(metric).toMatch(/brake at m\s+slowest km\/h/);
    expect(imperial).toMatch(/brake at ft\s+slowest mph/);
    const m = cells(metric);
    const i = cells(imperial);
    expect(i).toHaveLength(2);
    m.forEach((row, r) =>
      row.forEach((value, k) => {
        // Braking points in whole units (half a metre, then half a foot); speeds to 0.1 (0.05 km/h, then 0.05 mph).
        const [expected, tolerance] =
          k < 3
            ? [value / M_PER_FT, 0.5 / M_PER_FT + 0.5]
            : [value / 3.6 / MPS_PER_MPH, 0.05 / 3.6 / MPS_PER_MPH + 0.05];
        expect(Math.abs(i[r]![k]! - expected)).toBeLessThanOrEqual(tolerance + 1e-9);
      }),
    );
  });
});
