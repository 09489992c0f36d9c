// Checks that a sentence written in imperial units says what the same sentence in metric says: every speed and
// distance converted through the exact definitions 1 mph = 0.44704 m/s and 1 ft = 0.3048 m (NIST SP 811,
// appendix B) and 1 km/h = 1/3.6 m/s (SI), within the rounding of both numbers; seconds, per cent and g unchanged.

import { expect } from 'vitest';

const MPS_PER_MPH = 0.44704; // NIST SP 811, appendix B (exact)
const M_PER_FT = 0.3048; // NIST SP 811, appendix B (exact)
const MPS_PER_KPH = 1 / 3.6; // 1 km/h = 1000 m / 3600 s (SI definition)

export interface Quantity {
  value: number;
  unit: string;
}

/** Every number of a sentence with the unit after it, in order (an acceleration, m/s^2 or m/s², is none of them). */
export function quantities(text: string): Quantity[] {
  return [...text.matchAll(/(-?\d+(?:\.\d+)?) (km\/h|mph|m|ft|s|%|g)(?![\w/²^])/g)].map((m) => ({
    value: Number(m[1]),
    unit: m[2]!,
  }));
}

/** Half a unit of the last digit written: the rounding of a sentence's number. */
const halfStep = (value: number) => {
  const digits = String(value).split('.')[1]?.length ?? 0;
  return 0.5 * 10 ** -digits;
};

/** The imperial sentence's numbers against the metric sentence's, pair by pair. */
export function expectConverted(metricText: string, imperialText: string): void {
  const m = quantities(metricText);
  const i = quantities(imperialText);
  expect(
    i.map((q) => q.unit),
    imperialText,
  ).toEqual(m.map((q) => (q.unit === 'km/h' ? 'mph' : q.unit === 'm' ? 'ft' : q.unit)));
  m.forEach((q, k) => {
    const other = i[k]!;
    if (q.unit === 'km/h') {
      // The metric number is rounded (half a step in km/h), then converted; the imperial one rounded again.
      const expected = (q.value * MPS_PER_KPH) / MPS_PER_MPH;
      const tolerance = (halfStep(q.value) * MPS_PER_KPH) / MPS_PER_MPH + halfStep(other.value) + 1e-9;
      expect(Math.abs(other.value - expected), imperialText).toBeLessThanOrEqual(tolerance);
    } else if (q.unit === 'm') {
      const expected = q.value / M_PER_FT;
      const tolerance = halfStep(q.value) / M_PER_FT + halfStep(other.value) + 1e-9;
      expect(Math.abs(other.value - expected), imperialText).toBeLessThanOrEqual(tolerance);
    } else expect(other.value, imperialText).toBe(q.value);
  });
}
