// Property-based tests of the track readers (parseTrackText: centreline CSV and segment JSON): any text gives a
// TrackGrid or a one-line InputError naming the file, never another exception or a hang, and every grid that
// comes back is sound (finite, strictly increasing distance, at least 4 samples, widths not negative).

import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { parseTrackText } from '../../src/io/read-track.js';
import type { TrackReadOptions } from '../../src/io/track-read-options.js';
import type { TrackGrid } from '../../src/track/types.js';
import { anyJson, anyText, closedCircuit, csvText, resultOrInputError, runs, segment } from './generators.js';

const options: fc.Arbitrary<TrackReadOptions> = fc.record({
  stepM: fc.double({ min: 0.5, max: 20, noNaN: true }),
  columns: fc.constant({}),
  widthM: fc.option(fc.double({ min: 1, max: 30, noNaN: true }), { nil: null }),
  layout: fc.constantFrom('auto', 'closed', 'open'),
  smoothingM: fc.constantFrom(null, 0, 10, 60),
});

function expectSoundGrid(track: TrackGrid): void {
  const n = track.distanceM.length;
  expect(n).toBeGreaterThanOrEqual(4);
  expect(Number.isFinite(track.lengthM) && track.lengthM > 0).toBe(true);
  expect(Number.isFinite(track.stepM) && track.stepM > 0).toBe(true);
  for (const channel of [track.xM, track.yM, track.headingRad, track.curvaturePerM]) {
    expect(channel.length).toBe(n);
    for (let i = 0; i < n; i++) if (!Number.isFinite(channel[i]!)) throw new Error(`non-finite value at sample ${i}`);
  }
  for (let i = 1; i < n; i++)
    if (!(track.distanceM[i]! > track.distanceM[i - 1]!)) throw new Error(`distance not increasing at sample ${i}`);
  for (const width of [track.widthLeftM, track.widthRightM]) {
    if (width)
      for (let i = 0; i < n; i++) if (!(width[i]! >= 0)) throw new Error(`bad width at sample ${i}: ${width[i]}`);
  }
}

/** Grids read per source, so each property shows it reaches the reader's success path too. */
const gridsRead = new Map<string, number>();

function check(text: string, source: string, readOptions: TrackReadOptions): void {
  const track = resultOrInputError(() => parseTrackText(text, source, readOptions), source);
  if (track) {
    expectSoundGrid(track);
    gridsRead.set(source, (gridsRead.get(source) ?? 0) + 1);
  }
}

/** A centreline on an ellipse with noise, open or closed, at any scale from a kart track to a long circuit. */
const centreline = fc
  .record({
    count: fc.integer({ min: 2, max: 90 }),
    radiusM: fc.double({ min: 2, max: 1500, noNaN: true }),
    aspect: fc.double({ min: 0.3, max: 1, noNaN: true }),
    sweep: fc.constantFrom(1, 0.5, 0.98),
    noise: fc.double({ min: 0, max: 0.05, noNaN: true }),
    widths: fc.boolean(),
    seed: fc.nat(),
  })
  .map(({ count, radiusM, aspect, sweep, noise, widths, seed }) => {
    let state = seed || 1;
    const random = () => (state = (state * 16807) % 2147483647) / 2147483647 - 0.5;
    const lines = [widths ? 'x_m,y_m,width_left_m,width_right_m' : 'x_m,y_m'];
    for (let i = 0; i < count; i++) {
      const angle = (2 * Math.PI * sweep * i) / count;
      const x = radiusM * (Math.cos(angle) + noise * random());
      const y = aspect * radiusM * (Math.sin(angle) + noise * random());
      lines.push(
        widths
          ? `${x.toFixed(3)},${y.toFixed(3)},${(4 + random()).toFixed(2)},${(4 + random()).toFixed(2)}`
          : `${x.toFixed(3)},${y.toFixed(3)}`,
      );
    }
    return lines.join('\n') + '\n';
  });

/** Coordinates at absurd scales: a file in the wrong unit, or a number that overflows. */
const extremeCentreline = fc
  .record({ scale: fc.constantFrom(1e-6, 1e-3, 1e7, 1e12, 1e200, 1e307), count: fc.integer({ min: 4, max: 12 }) })
  .map(({ scale, count }) => {
    const lines = ['x_m,y_m'];
    for (let i = 0; i < count; i++)
      lines.push(`${scale * Math.cos((2 * Math.PI * i) / count)},${scale * Math.sin((2 * Math.PI * i) / count)}`);
    return lines.join('\n') + '\n';
  });

const trackHeaders = fc.array(fc.constantFrom('x_m', 'y_m', 'width_left_m', 'width_right_m', 'z_m', 'x', ''), {
  minLength: 0,
  maxLength: 5,
});

describe('track reader fuzz', () => {
  it('centreline CSV: any text, CSV-like text, plausible and absurd centrelines', () => {
    fc.assert(
      fc.property(
        fc.oneof(anyText, csvText(trackHeaders), centreline, centreline, extremeCentreline),
        options,
        (text, readOptions) => check(text, 'fuzz-track.csv', readOptions),
      ),
      runs(700, 20260615),
    );
    expect(gridsRead.get('fuzz-track.csv')).toBeGreaterThan(100);
  });

  it('segment JSON: any JSON, random segment lists, circuits that close', () => {
    const spec = fc.oneof(
      anyJson.map((value) => JSON.stringify(value)),
      fc
        .record({
          name: fc.constant('fuzzed'),
          closed: fc.boolean(),
          widthM: fc.option(fc.double({ min: -1, max: 20, noNaN: true }), { nil: undefined }),
          segments: fc.array(segment, { minLength: 0, maxLength: 8 }),
        })
        .map((value) => JSON.stringify(value)),
      closedCircuit.map((segments) => JSON.stringify({ name: 'fuzzed circuit', closed: true, widthM: 10, segments })),
      anyText,
    );
    fc.assert(
      fc.property(spec, options, (text, readOptions) => check(text, 'fuzz-track.json', readOptions)),
      runs(500, 20260616),
    );
    expect(gridsRead.get('fuzz-track.json')).toBeGreaterThan(50);
    console.log(`track fuzz: grids read ${JSON.stringify(Object.fromEntries(gridsRead))}`);
  });
});
