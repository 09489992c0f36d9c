// The envelope's cells, read in one walk down the sorted samples, against the plain estimator: for every cell of
// random logs, gather its samples with their kernel and sector weights, sort them and take the weighted type 7
// quantile of src/numeric/weighted-quantile.ts (itself checked against Hyndman and Fan's type 7); with equal
// weights, Hyndman and Fan's definition 7 written out here.

import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { cellFigures, LATERAL, movingSamples, type MovingSamples } from '../../src/compare/envelope-cells.js';
import { effectiveSampleSize, weightedQuantileSorted } from '../../src/numeric/weighted-quantile.js';
import { seededRandom } from '../../src/numeric/seeded-random.js';

const BAND_WIDTH_MPS = 2.5;
const TAPER_DEG = 10;
const KINDS = 5;

/** A log of n samples at 5-60 m/s whose accelerations point every way, some of them on the sector boundaries. */
function randomLog(seed: number, n: number) {
  const random = seededRandom(seed);
  const speedMps = new Float64Array(n);
  const axMps2 = new Float64Array(n);
  const ayMps2 = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    speedMps[i] = 3 + 57 * random.uniform();
    const angle = i % 17 === 0 ? (Math.PI / 4) * Math.round(8 * random.uniform()) : 2 * Math.PI * random.uniform();
    const size = 14 * Math.sqrt(random.uniform());
    axMps2[i] = size * Math.cos(angle);
    ayMps2[i] = size * Math.sin(angle);
  }
  return { speedMps, axMps2, ayMps2 };
}

/** Weight of sample i in a kind's sector: the tapered sectors' definition, from the angle of (|ax|, |ay|) sides. */
function sectorWeight(ax: number, ay: number, kind: number): number {
  const taper = (TAPER_DEG * Math.PI) / 180;
  const angle = Math.atan2(ay, ax);
  const axis = [Math.PI, 0, Math.PI / 2, -Math.PI / 2];
  const one = (d: number) => {
    let off = Math.abs(angle - axis[d]!);
    if (off > Math.PI) off = 2 * Math.PI - off;
    return Math.min(1, Math.max(0, (Math.PI / 4 + taper - off) / (2 * taper)));
  };
  return kind === LATERAL ? one(2) + one(3) : one(kind);
}

/** The cell's quantile and effective size by gathering, sorting and the plain weighted estimator. */
function plainCell(
  moving: MovingSamples,
  raw: ReturnType<typeof randomLog>,
  keep: number[],
  halfWidthBands: number,
  band: number,
  kind: number,
  q: number,
) {
  const pairs: [number, number][] = [];
  keep.forEach((i, k) => {
    const position = moving.speedMps[k]! / BAND_WIDTH_MPS - 0.5;
    const speedWeight = Number.isFinite(halfWidthBands)
      ? Math.max(0, 1 - Math.abs(position - band) / halfWidthBands)
      : 1;
    const weight = speedWeight * sectorWeight(raw.axMps2[i]!, raw.ayMps2[i]!, kind);
    if (weight > 0) pairs.push([kind < 2 ? Math.abs(raw.axMps2[i]!) : Math.abs(raw.ayMps2[i]!), weight]);
  });
  pairs.sort((a, b) => a[0] - b[0]);
  const weights = pairs.map((p) => p[1]);
  return {
    value:
      pairs.length > 0
        ? weightedQuantileSorted(
            pairs.map((p) => p[0]),
            weights,
            q,
          )
        : NaN,
    effective: effectiveSampleSize(weights),
  };
}

describe('envelope cells in one walk', () => {
  it('equal the plain weighted type 7 quantile of every cell, under every kernel', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 1e6 }),
        fc.integer({ min: 40, max: 1500 }),
        fc.constantFrom(0.5, 0.9, 0.98),
        (seed, n, q) => {
          const raw = randomLog(seed, n);
          const moving = movingSamples(raw, 5, TAPER_DEG);
          const keep = [...raw.speedMps.keys()].filter((i) => raw.speedMps[i]! >= 5);
          const bandCount = Math.ceil(60 / BAND_WIDTH_MPS);
          const halfWidths = [1, 3, Infinity];
          const figures = cellFigures(moving, { bandCount, widthMps: BAND_WIDTH_MPS, halfWidthBands: halfWidths }, q);
          halfWidths.forEach((halfWidth, kernel) => {
            figures[kernel]!.forEach((band, b) => {
              for (let kind = 0; kind < KINDS; kind++) {
                const plain = plainCell(moving, raw, keep, halfWidth, b, kind, q);
                const cell = band[kind]!;
                if (!Number.isFinite(plain.value)) {
                  expect(cell.value).toBeNaN();
                  continue;
                }
                // The walk sorts on keys rounded to 2^-20 m/s^2 (ties closer than that keep index order).
                expect(Math.abs(cell.value - plain.value)).toBeLessThan(1e-5);
                expect(cell.effective).toBeCloseTo(plain.effective, 9);
              }
            });
          });
        },
      ),
      { numRuns: 12, seed: 20261204 },
    );
  });

  it('give Hyndman and Fan type 7 with equal weights (one band of every speed, no taper)', () => {
    // Hyndman and Fan, "Sample quantiles in statistical packages", 1996, definition 7: h = (n - 1) q + 1,
    // Q = x[floor h] + (h - floor h)(x[floor h + 1] - x[floor h]) on the sorted sample, 1-based.
    const raw = randomLog(7, 801);
    const moving = movingSamples(raw, 5, 0);
    const cells = cellFigures(
      moving,
      { bandCount: 1, widthMps: BAND_WIDTH_MPS, halfWidthBands: [Infinity] },
      0.98,
    )[0]![0]!;
    const brake = [...moving.axMps2.keys()]
      .filter((k) => moving.sectorWeight[4 * k]! > 0)
      .map((k) => moving.axMps2[k]!)
      .sort((a, b) => a - b);
    const h = (brake.length - 1) * 0.98 + 1;
    const low = Math.floor(h);
    const expected = brake[low - 1]! + (h - low) * ((brake[low] ?? brake[low - 1]!) - brake[low - 1]!);
    expect(brake.length).toBeGreaterThan(100);
    expect(Math.abs(cells[0]!.value - expected)).toBeLessThan(1e-5);
    expect(cells[0]!.effective).toBeCloseTo(brake.length, 9);
  });
});
