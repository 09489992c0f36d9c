// Centreline CSV reading: header rules, column mapping, open/closed detection, widths, and the one-line errors.

import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseTrackText, readTrackFile } from '../../src/io/read-track.js';
import type { TrackReadOptions } from '../../src/io/track-read-options.js';
import { InputError } from '../../src/errors.js';

const defaults: TrackReadOptions = { stepM: 1, columns: {}, widthM: null, layout: 'auto', smoothingM: null };

/** Points on a circle of radius R (every `spacing` m), as CSV rows "x,y[,wl,wr]". */
function circleRows(radiusM: number, spacingM: number, widths: boolean, closeIt = false): string[] {
  const n = Math.round((2 * Math.PI * radiusM) / spacingM);
  const rows: string[] = [];
  for (let i = 0; i <= (closeIt ? n : n - 1); i++) {
    const a = (2 * Math.PI * (i % n)) / n;
    const xy = `${(radiusM * Math.cos(a)).toFixed(4)},${(radiusM * Math.sin(a)).toFixed(4)}`;
    rows.push(widths ? `${xy},5,7` : xy);
  }
  return rows;
}

function expectInputError(run: () => unknown, pattern: RegExp): void {
  let caught: unknown;
  try {
    run();
  } catch (error) {
    caught = error;
  }
  expect(caught).toBeInstanceOf(InputError);
  const message = (caught as Error).message;
  expect(message).not.toContain('\n');
  expect(message).toMatch(pattern);
}

describe('track CSV', () => {
  it('reads the native header with widths, closes a loop whose ends meet, and resamples at the step', () => {
    const text = ['x_m,y_m,width_left_m,width_right_m', ...circleRows(100, 5, true)].join('\n');
    const track = parseTrackText(text, 'ring.csv', defaults);
    expect(track.closed).toBe(true);
    expect(track.name).toBe('ring');
    // Circumference 2 pi R (circle geometry).
    expect(track.lengthM).toBeCloseTo(200 * Math.PI, 1);
    expect(track.stepM * track.xM.length).toBeCloseTo(track.lengthM, 9);
    expect(track.widthLeftM?.[10]).toBeCloseTo(5, 12);
    expect(track.widthRightM?.[10]).toBeCloseTo(7, 12);
  });

  it("takes a first line starting with '#' as the header and maps other column names", () => {
    const rows = circleRows(100, 5, false).map((row) => `${row},3.5,4.5`);
    const text = ['# x_m,y_m,w_tr_right_m,w_tr_left_m', ...rows].join('\n');
    const track = parseTrackText(text, 'mapped.csv', {
      ...defaults,
      columns: { width_left_m: 'w_tr_left_m', width_right_m: 'w_tr_right_m' },
    });
    expect(track.widthLeftM?.[0]).toBeCloseTo(4.5, 12);
    expect(track.widthRightM?.[0]).toBeCloseTo(3.5, 12);
  });

  it('drops a closing duplicate point, and gives --width-m evenly to both sides when the file has no widths', () => {
    const text = ['x_m,y_m', ...circleRows(100, 5, false, true)].join('\n');
    const track = parseTrackText(text, 'dup.csv', { ...defaults, widthM: 10 });
    expect(track.closed).toBe(true);
    expect(track.lengthM).toBeCloseTo(200 * Math.PI, 1);
    expect(track.widthLeftM?.[0]).toBe(5);
    expect(track.widthRightM?.[0]).toBe(5);
    expect(parseTrackText(text, 'dup.csv', defaults).widthLeftM).toBeNull();
  });

  it('leaves a track open when its ends are far apart, and obeys a forced layout', () => {
    // Three quarters of a circle: the ends are R sqrt 2 apart.
    const rows = circleRows(100, 5, false).slice(0, 95);
    const text = ['x_m,y_m', ...rows].join('\n');
    const open = parseTrackText(text, 'arc.csv', defaults);
    expect(open.closed).toBe(false);
    expect(open.stepM * (open.xM.length - 1)).toBeCloseTo(open.lengthM, 9);
    // Arc length R * angle for 94 intervals of 2 pi / 126.
    expect(open.lengthM).toBeCloseTo((100 * 2 * Math.PI * 94) / 126, 0);
    const full = ['x_m,y_m', ...circleRows(100, 5, false)].join('\n');
    expect(parseTrackText(full, 'ring.csv', { ...defaults, layout: 'open' }).closed).toBe(false);
    expect(parseTrackText(text, 'arc.csv', { ...defaults, layout: 'closed' }).closed).toBe(true);
  });

  it('reads a file from disk by extension, and sniffs the format otherwise', () => {
    const dir = mkdtempSync(path.join(tmpdir(), 'reflap-track-'));
    const text = ['x_m,y_m', ...circleRows(50, 2, false)].join('\n');
    writeFileSync(path.join(dir, 'loop.csv'), text);
    writeFileSync(path.join(dir, 'loop.txt'), text);
    expect(readTrackFile(path.join(dir, 'loop.csv'), defaults).closed).toBe(true);
    expect(readTrackFile(path.join(dir, 'loop.txt'), defaults).lengthM).toBeCloseTo(100 * Math.PI, 1);
  });

  describe('refuses bad input with one line naming the file and the place', () => {
    const good = circleRows(100, 5, false);
    it('missing file', () => {
      expectInputError(
        () => readTrackFile('/nonexistent/track.csv', defaults),
        /^\/nonexistent\/track\.csv: cannot read the track file \(no such file\)$/,
      );
    });
    it('malformed CSV', () => {
      const text = ['x_m,y_m', good[0], `${good[1]},9`, ...good.slice(2)].join('\n');
      expectInputError(() => parseTrackText(text, 'bad.csv', defaults), /^bad\.csv: malformed CSV: .*line 3/);
      expectInputError(
        () => parseTrackText('x_m,y_m\n1,"2\n3,4\n', 'quote.csv', defaults),
        /^quote\.csv: malformed CSV/,
      );
    });
    it('non-numeric cell, with the row number as in the file and the column name', () => {
      const plain = ['x_m,y_m', ...good.slice(0, 6), '12.5,north', ...good.slice(7)].join('\n');
      expectInputError(
        () => parseTrackText(plain, 'cell.csv', defaults),
        /^cell\.csv: row 8, column y_m: 'north' is not a number$/,
      );
      // A comment line and a blank line still count in the row number.
      const commented = ['# x_m,y_m', '# surveyed by hand', '', ...good.slice(0, 6), 'x,1', ...good.slice(7)].join(
        '\n',
      );
      expectInputError(
        () => parseTrackText(commented, 'cell.csv', defaults),
        /^cell\.csv: row 10, column x_m: 'x' is not a number$/,
      );
    });
    it('NaN and Infinity', () => {
      const nan = ['x_m,y_m', ...good.slice(0, 3), 'NaN,1', ...good.slice(4)].join('\n');
      expectInputError(
        () => parseTrackText(nan, 'nan.csv', defaults),
        /^nan\.csv: row 5, column x_m: 'NaN' is not a finite number$/,
      );
      const inf = ['x_m,y_m', ...good.slice(0, 3), '1,-Infinity', ...good.slice(4)].join('\n');
      expectInputError(
        () => parseTrackText(inf, 'inf.csv', defaults),
        /^inf\.csv: row 5, column y_m: '-Infinity' is not a finite number$/,
      );
    });
    it('fewer than four points', () => {
      expectInputError(
        () => parseTrackText('x_m,y_m\n0,0\n10,0\n10,10\n', 'few.csv', defaults),
        /^few\.csv: only 3 points; a centreline needs at least 4$/,
      );
    });
    it('repeated consecutive points, naming the row', () => {
      const text = ['x_m,y_m', ...good.slice(0, 10), good[9], ...good.slice(10)].join('\n');
      expectInputError(
        () => parseTrackText(text, 'rep.csv', defaults),
        /^rep\.csv: row 12: the point repeats the one before it \(row 11\)$/,
      );
    });
    it('a centreline that runs out and back along itself, naming the row where it turns back', () => {
      // 100 m out along x and back: the points are 2 m apart and the line reverses at x = 100 m (row 52).
      const out = Array.from({ length: 51 }, (_, k) => `${2 * k},0`);
      const back = Array.from({ length: 49 }, (_, k) => `${98 - 2 * k},0.5`);
      expectInputError(
        () => parseTrackText(['x_m,y_m', ...out, ...back].join('\n'), 'fold.csv', { ...defaults, layout: 'open' }),
        /^fold\.csv: row 52: the centreline turns back on itself at \(100, 0\)/,
      );
    });
    it('takes a hairpin of 15 m radius sampled every 10 m (a turn of about 38 degrees per point)', () => {
      // Chord angle per point on a circle: 2 asin(s / 2R) = 2 asin(10 / 30) = 38.9 degrees.
      const hairpin = Array.from({ length: 10 }, (_, k) => {
        const angle = k * 2 * Math.asin(10 / 30);
        return `${(15 * Math.sin(angle)).toFixed(4)},${(15 - 15 * Math.cos(angle)).toFixed(4)}`;
      });
      const lead = Array.from({ length: 10 }, (_, k) => `${-100 + 10 * k},0`);
      const track = parseTrackText(['x_m,y_m', ...lead, ...hairpin].join('\n'), 'pin.csv', {
        ...defaults,
        layout: 'open',
      });
      expect(track.lengthM).toBeGreaterThan(150);
    });
    it('negative widths', () => {
      const rows = good.map((row, i) => (i === 20 ? `${row},-1,5` : `${row},5,5`));
      const text = ['x_m,y_m,width_left_m,width_right_m', ...rows].join('\n');
      expectInputError(
        () => parseTrackText(text, 'neg.csv', defaults),
        /^neg\.csv: row 22, column width_left_m: negative width -1 m$/,
      );
    });
    it('a required column missing, listing the columns found', () => {
      const text = ['east,north', ...good].join('\n');
      expectInputError(
        () => parseTrackText(text, 'cols.csv', defaults),
        /^cols\.csv: required column x_m not found; columns found: east, north$/,
      );
      expectInputError(
        () => parseTrackText(['x_m,y_m', ...good].join('\n'), 'cols.csv', { ...defaults, columns: { x_m: 'easting' } }),
        /^cols\.csv: required column x_m \(read from 'easting'\) not found; columns found: x_m, y_m$/,
      );
    });
    it('a mapping that names no track column, and only one width column', () => {
      expectInputError(
        () => parseTrackText(['x_m,y_m', ...good].join('\n'), 'm.csv', { ...defaults, columns: { speed: 'v' } }),
        /^m\.csv: --columns names 'speed'/,
      );
      const text = ['x_m,y_m,width_left_m', ...good.map((row) => `${row},4`)].join('\n');
      expectInputError(
        () => parseTrackText(text, 'w.csv', defaults),
        /^w\.csv: column width_left_m found but width_right_m missing/,
      );
    });
  });
});
