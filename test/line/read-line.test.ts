// Reading a line CSV back onto a track: the same grid, another grid (through the spline), positions alone (a
// published line from outside the project), and the one-line errors.

import { describe, expect, it } from 'vitest';
import { parseLineCsv } from '../../src/io/read-line.js';
import { lineCsv } from '../../src/line/line-csv.js';
import { lineFromOffsets } from '../../src/line/racing-line.js';
import { InputError } from '../../src/errors.js';
import { ring } from './hand-tracks.js';

const track = ring(100, 10, 2);
const count = track.distanceM.length;
// A line swinging +-3 m twice a lap: offset = 3 sin(2 theta).
const offsets = new Float64Array(count);
for (let i = 0; i < count; i++) offsets[i] = 3 * Math.sin((2 * track.distanceM[i]!) / 100);
const csv = lineCsv(lineFromOffsets(track, offsets));
const offsetsOnly = csv
  .split('\n')
  .map((row) => row.split(',').slice(0, 2).join(','))
  .join('\n');

describe('line CSV round trip', () => {
  it('reads back the offsets it wrote on the same grid', () => {
    const back = parseLineCsv(csv, 'line.csv', track);
    for (let i = 0; i < count; i += 7) expect(back[i]).toBeCloseTo(offsets[i]!, 4);
  });

  it('resamples a line written on a finer grid onto this one', () => {
    const fine = ring(100, 10, 0.5);
    const fineOffsets = new Float64Array(fine.distanceM.length);
    for (let i = 0; i < fineOffsets.length; i++) fineOffsets[i] = 3 * Math.sin((2 * fine.distanceM[i]!) / 100);
    const back = parseLineCsv(lineCsv(lineFromOffsets(fine, fineOffsets)), 'fine.csv', track);
    // Even linear interpolation of a sine sampled at 0.5 m stays below (0.5^2 / 8) * 3 * (2/100)^2 = 4e-5 m
    // (interpolation error bound); the cubic spline does better still.
    for (let i = 0; i < count; i += 7) expect(Math.abs(back[i]! - offsets[i]!)).toBeLessThan(1e-4);
  });

  it('reads a line of x_m, y_m alone onto the track along each normal', () => {
    const positionsOnly = csv
      .split('\n')
      .map((row) => row.split(',').slice(2, 4).join(','))
      .filter((row, k) => k === 0 || k % 3 === 1)
      .join('\n');
    const back = parseLineCsv(positionsOnly, 'xy.csv', track);
    // Every third point of the 2 m line (6 m apart on a 100 m ring, 3.4 degrees of turn between points): a cubic
    // through them is within (h^4 / 384) max|f''''| of the sine, about 1e-4 m (de Boor, ch. IV); the positions
    // are rounded to 1 mm in the file.
    for (let i = 0; i < count; i += 5) expect(Math.abs(back[i]! - offsets[i]!)).toBeLessThan(3e-3);
  });
});

describe('points too far apart to resolve the corners', () => {
  it('is an error naming the spacing, the turn and the spacing to give', () => {
    const sparse = ring(30, 10, 1);
    // A 30 m ring from points 20 m apart: 38 degrees of turn from one point to the next, over the 29 allowed.
    const rows = ['s_m,offset_m'];
    for (let s = 0; s < sparse.lengthM - 1; s += 20) rows.push(`${s},0`);
    expect(() => parseLineCsv(rows.join('\n'), 'sparse.csv', sparse)).toThrow(
      /sparse\.csv: row \d+: the line's points are 20\.0 m apart where it turns 38 degrees between them, too far apart to resolve a corner of radius about (29\.9|30\.0) m; give points at most 15\.0 m apart there/,
    );
  });
});

describe('bad line files', () => {
  const cases: [string, string, RegExp][] = [
    ['missing column', 's_m,x_m\n0,1\n2,3\n', /required column offset_m not found/],
    ['not a number', csv.replace(/\n4\.\d+,/, '\n4.1,abc,').replace('abc,', 'abc'), /row 4, column offset_m: 'abc/],
    ['stations not increasing', csv.replace(/\n4\.\d+,/, '\n1.000,'), /row 4, column s_m: 1 does not increase/],
    ['another track (shorter lap)', csv.split('\n').slice(0, 100).join('\n'), /belongs to another track or layout/],
    // Rows are lines of the file: the header is line 1, so the third sample (s = 4.0 m) is row 4.
    [
      'outside the edges',
      offsetsOnly.replace(/\n(4\.\d+),[-0-9.]+/, '\n$1,7.5'),
      /row 4: offset 7\.50 m at 4\.0 m is outside the track/,
    ],
  ];
  it.each(cases)('%s', (_name, text, pattern) => {
    expect(() => parseLineCsv(text, 'line.csv', track)).toThrow(InputError);
    expect(() => parseLineCsv(text, 'line.csv', track)).toThrow(pattern);
  });

  it('refuses positions that do not match the offsets on this track', () => {
    const shifted = csv.replace(
      /\n(4\.\d+),([-0-9.]+),([-0-9.]+),/,
      (_m, s, n, x) => `\n${s},${n},${(Number(x) + 10).toFixed(3)},`,
    );
    expect(() => parseLineCsv(shifted, 'line.csv', track)).toThrow(
      /row 4: x_m, y_m lie 10\.\d m from where offset_m puts the line/,
    );
  });
});
