// Segment JSON reading: the schema, its one-line errors, options that override the file, and the demo tracks.

import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { parseTrackText, readTrackFile } from '../../src/io/read-track.js';
import type { TrackReadOptions } from '../../src/io/track-read-options.js';
import { InputError } from '../../src/errors.js';

const projectRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
const defaults: TrackReadOptions = { stepM: 1, columns: {}, widthM: null, layout: 'auto', smoothingM: null };

const stadium = {
  name: 'Stadium',
  closed: true,
  widthM: 12,
  segments: [
    { kind: 'straight', lengthM: 400 },
    { kind: 'arc', radiusM: 50, angleDeg: 180 },
    { kind: 'straight', lengthM: 400 },
    { kind: 'arc', radiusM: 50, angleDeg: 180 },
  ],
};

/** The InputError's message (rethrowing anything else); a test then matches it and checks it is one line. */
function inputErrorOf(run: () => unknown): string {
  try {
    run();
  } catch (error) {
    if (error instanceof InputError) return error.message;
    throw error;
  }
  return 'no error was thrown';
}

function expectInputError(run: () => unknown, pattern: RegExp): void {
  const message = inputErrorOf(run);
  expect(message).toMatch(pattern);
  expect(message.includes('\n')).toBe(false);
}

describe('track JSON', () => {
  it('reads a segment description with widths, corners and a geo origin', () => {
    const text = JSON.stringify({
      ...stadium,
      widthLeftM: 5,
      widthRightM: 7,
      origin: { latDeg: 51.5, lonDeg: -1.2 },
      corners: [{ atM: 478.5, name: 'East' }],
    });
    const track = parseTrackText(text, 'stadium.json', defaults);
    // Length 2 L + 2 pi R (circle geometry).
    expect(track.lengthM).toBeCloseTo(800 + 100 * Math.PI, 9);
    expect(track.widthLeftM?.[0]).toBe(5);
    expect(track.widthRightM?.[0]).toBe(7);
    expect(track.geoOrigin).toEqual({ latDeg: 51.5, lonDeg: -1.2 });
    expect(track.corners).toEqual([{ atM: 478.5, name: 'East' }]);
    expect(track.name).toBe('Stadium');
  });

  it('splits widthM evenly, falls back to --width-m, and follows a forced layout', () => {
    expect(parseTrackText(JSON.stringify(stadium), 's.json', defaults).widthLeftM?.[0]).toBe(6);
    const { widthM: _omit, ...noWidth } = stadium;
    expect(parseTrackText(JSON.stringify(noWidth), 's.json', defaults).widthLeftM).toBeNull();
    expect(parseTrackText(JSON.stringify(noWidth), 's.json', { ...defaults, widthM: 8 }).widthRightM?.[0]).toBe(4);
    expect(parseTrackText(JSON.stringify(stadium), 's.json', { ...defaults, layout: 'open' }).closed).toBe(false);
  });

  it('refuses an unknown key, naming it and where it is', () => {
    expectInputError(
      () => parseTrackText(JSON.stringify({ ...stadium, surface: 'asphalt' }), 't.json', defaults),
      /^t\.json: unknown key 'surface'$/,
    );
    const segments: object[] = [...stadium.segments];
    segments[1] = { ...segments[1], bank: 3 };
    expectInputError(
      () => parseTrackText(JSON.stringify({ ...stadium, segments }), 't.json', defaults),
      /^t\.json: segments\[1\]: unknown key 'bank'$/,
    );
  });

  it('refuses wrong fields and kinds with the field path', () => {
    const segments = [...stadium.segments];
    segments[2] = { kind: 'straight', lengthM: -3 };
    expectInputError(
      () => parseTrackText(JSON.stringify({ ...stadium, segments }), 't.json', defaults),
      /^t\.json: segments\[2\]\.lengthM: /,
    );
    segments[2] = { kind: 'spiral', lengthM: 3 } as unknown as (typeof segments)[number];
    expectInputError(
      () => parseTrackText(JSON.stringify({ ...stadium, segments }), 't.json', defaults),
      /^t\.json: segments\[2\]/,
    );
    expectInputError(
      () => parseTrackText(JSON.stringify({ ...stadium, closed: 'yes' }), 't.json', defaults),
      /^t\.json: closed: /,
    );
  });

  it('reads a segment track that starts with a byte-order mark', () => {
    const track = parseTrackText(`\uFEFF${JSON.stringify(stadium)}`, 'bom.json', defaults);
    // Length 2 L + 2 pi R (circle geometry).
    expect(track.lengthM).toBeCloseTo(800 + 100 * Math.PI, 9);
    expect(track.closed).toBe(true);
  });

  it('refuses invalid JSON with the line and column', () => {
    expectInputError(
      () => parseTrackText('{\n  "name": "x",\n  "closed": true,,\n}', 'broken.json', defaults),
      /^broken\.json: line 3, column 18: not valid JSON/,
    );
  });

  it('refuses unclosed segments with the distance and the angle', () => {
    const segments = [...stadium.segments];
    segments[3] = { kind: 'arc', radiusM: 50, angleDeg: 170 };
    expectInputError(
      () => parseTrackText(JSON.stringify({ ...stadium, segments }), 'gap.json', defaults),
      /^gap\.json: segments: the closed track does not close: it ends \d+\.\d\d m from its start .*off by -10\.00 degrees/,
    );
  });

  describe('demo circuits in tracks/', () => {
    // Checks from the brief: a ~4 km circuit with a hairpin, a fast sweeper, a chicane and a long straight,
    // ~12 m wide; a club circuit of 1.6 to 2 km, ~9 m wide. Both must close within 1 m and 1 degree.
    it('velmora-downs.json closes and has the features it claims', () => {
      const track = readTrackFile(path.join(projectRoot, 'tracks', 'velmora-downs.json'), defaults);
      expect(track.closed).toBe(true);
      expect(track.lengthM).toBeGreaterThan(3800);
      expect(track.lengthM).toBeLessThan(4300);
      expect(track.widthLeftM?.[0]).toBe(6);
      expect(track.geoOrigin).not.toBeNull();
      let turning = 0;
      let tightest = Infinity;
      let straightRun = 0;
      let longestStraight = 0;
      for (const k of track.curvaturePerM) {
        turning += k * track.stepM;
        tightest = Math.min(tightest, 1 / Math.abs(k));
        straightRun = k === 0 ? straightRun + track.stepM : 0;
        longestStraight = Math.max(longestStraight, straightRun);
      }
      // Sampled curvature sums to the lap's heading change within 1 % (the jumps into arcs without transitions
      // cost up to half a step each); the heading itself turns by exactly 2 pi.
      expect(Math.abs(turning / (2 * Math.PI) - 1)).toBeLessThan(0.01);
      const n = track.headingRad.length;
      expect(track.headingRad[n - 1]! - track.headingRad[0]!).toBeCloseTo(
        2 * Math.PI - track.stepM * track.curvaturePerM[n - 1]!,
        3,
      );
      expect(tightest).toBeLessThan(20); // hairpin
      expect(longestStraight).toBeGreaterThan(900);
      expect(track.corners.length).toBeGreaterThanOrEqual(5);
      // Each named corner has a bend within 20 m of its mark (a chicane's mark sits between its two arcs).
      for (const corner of track.corners) {
        const i = Math.round(corner.atM / track.stepM);
        const near = track.curvaturePerM.subarray(i - 20, i + 20).reduce((m, k) => Math.max(m, Math.abs(k)), 0);
        expect(near).toBeGreaterThan(1 / 300);
      }
      // The loop joins: the last sample is about one step from the first.
      expect(Math.hypot(track.xM[n - 1]! - track.xM[0]!, track.yM[n - 1]! - track.yM[0]!)).toBeLessThan(
        track.stepM * 1.01,
      );
    });

    it('tarnwick-club.json closes, 1.6 to 2 km, 9 m wide', () => {
      const track = readTrackFile(path.join(projectRoot, 'tracks', 'tarnwick-club.json'), defaults);
      expect(track.lengthM).toBeGreaterThan(1600);
      expect(track.lengthM).toBeLessThan(2000);
      expect((track.widthLeftM?.[0] ?? 0) + (track.widthRightM?.[0] ?? 0)).toBe(9);
      let turning = 0;
      for (const k of track.curvaturePerM) turning += k * track.stepM;
      expect(Math.abs(Math.abs(turning) / (2 * Math.PI) - 1)).toBeLessThan(0.01);
    });
  });
});
