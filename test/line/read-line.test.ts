// Reading a line CSV back onto a track: the same grid, another grid (resampled), and the one-line errors.

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
    // Linear interpolation of a sine sampled at 0.5 m: error below (0.5^2 / 8) * 3 * (2/100)^2 (interpolation bound).
    for (let i = 0; i < count; i += 7) expect(Math.abs(back[i]! - offsets[i]!)).toBeLessThan(1e-3);
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
