// The corpus of broken and odd files (test/fixtures/broken/): each gives its documented message
// (docs/robustness.md), or, where the file is an accepted dialect (BOM, CRLF, decimal commas, quoted
// separators), is read correctly. Expected values come from the fixture's own text, written by hand.

import { describe, expect, it, beforeAll, afterAll } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { readTelemetryFile } from '../../src/io/telemetry/read-telemetry.js';
import { readTrackFile } from '../../src/io/read-track.js';
import { readCarFile } from '../../src/io/read-car.js';
import { checkFiles } from '../../src/check/check-files.js';
import { InputError } from '../../src/errors.js';
import { projectRoot } from '../helpers/cli.js';

const broken = (name: string) => join(projectRoot, 'test', 'fixtures', 'broken', name);
const read = (name: string) => readTelemetryFile(broken(name), { columns: {} });
const TRACK_OPTIONS = { stepM: 1, columns: {}, widthM: null, layout: 'auto' as const, smoothingM: null };
const KPH = 1 / 3.6;

/** The reader's error, which must be an InputError of one line. */
async function failure(promise: Promise<unknown>): Promise<string> {
  try {
    await promise;
  } catch (error) {
    expect(error).toBeInstanceOf(InputError);
    const message = (error as Error).message;
    expect(message).not.toMatch(/[\r\n]/);
    return message;
  }
  throw new Error('expected the file to be refused');
}

const escape = (text: string) => text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
const place = (name: string) => `^${escape(broken(name))}: `;

describe('broken telemetry files', () => {
  it('empty file', async () => {
    expect(await failure(read('empty.csv'))).toMatch(new RegExp(`${place('empty.csv')}empty file$`));
  });

  it('header only', async () => {
    expect(await failure(read('header-only.csv'))).toMatch(
      new RegExp(`${place('header-only.csv')}header only, no data rows \\(header: time_s, speed_kph\\)$`),
    );
  });

  it('BOM before the header: read as if it were not there', async () => {
    const session = await read('bom.csv');
    expect(session.count).toBe(4);
    expect(Array.from(session.timeS)).toEqual([0, 0.1, 0.2, 0.3]);
    expect(session.speedMps![3]).toBeCloseTo(103 * KPH, 12);
  });

  it('CRLF line ends: read like LF', async () => {
    const session = await read('crlf.csv');
    expect(session.count).toBe(4);
    expect(session.speedMps![0]).toBeCloseTo(100 * KPH, 12);
    expect(session.timeS[3]).toBeCloseTo(0.3, 12);
  });

  it('decimal commas with semicolons: read, with a note', async () => {
    const session = await read('decimal-commas.csv');
    expect(session.count).toBe(4);
    expect(session.timeS[2]).toBeCloseTo(0.2, 12);
    expect(session.speedMps![1]).toBeCloseTo(101.5 * KPH, 12);
    expect(session.notes).toContain('decimal commas read');
  });

  it('quoted fields with separators inside: read, the text column left out', async () => {
    const session = await read('quoted-separators.csv');
    expect(session.count).toBe(4);
    expect(session.speedMps![3]).toBeCloseTo(103 * KPH, 12);
    expect(session.notes).toContain('columns not used: comment');
  });

  it('mixed separators: the row in the other separator is named', async () => {
    expect(await failure(read('mixed-separators.csv'))).toMatch(
      new RegExp(`${place('mixed-separators.csv')}line 3, column time_s: '0\\.1,101' is not a number$`),
    );
  });

  it('truncated last line: the missing cell is filled, with a note', async () => {
    const session = await read('truncated-last-line.csv');
    expect(session.count).toBe(4);
    expect(session.timeS[3]).toBeCloseTo(0.3, 12);
    // Held at the end: the last known speed, 102 km/h.
    expect(session.speedMps![3]).toBeCloseTo(102 * KPH, 12);
    expect(session.notes).toContain('column speed_kph: 1 empty cells filled by interpolation');
  });

  it('missing cells: filled by linear interpolation in time, with notes', async () => {
    const session = await read('missing-cells.csv');
    expect(session.count).toBe(4);
    // Row 0.1 s lies halfway between 100 and 104 km/h.
    expect(session.speedMps![1]).toBeCloseTo(102 * KPH, 12);
    // Throttle 50, (gap), (gap), 80 percent at 0, 0.1, 0.2, 0.3 s: 60 given, 70 interpolated.
    expect(session.throttle![2]).toBeCloseTo(0.7, 12);
    expect(session.notes).toContain('column throttle: 1 empty cells filled by interpolation');
  });

  it('text in a numeric column: the line, the column and the text are named', async () => {
    expect(await failure(read('text-in-numeric.csv'))).toMatch(
      new RegExp(`${place('text-in-numeric.csv')}line 3, column speed_kph: 'fast' is not a number$`),
    );
  });

  it('duplicated timestamps: accepted (time does not run backwards); check notes them', async () => {
    const session = await read('duplicate-timestamps.csv');
    expect(session.count).toBe(5);
    expect(Array.from(session.timeS)).toEqual([0, 0.1, 0.1, 0.2, 0.3]);
    const [report] = (await checkFiles([broken('duplicate-timestamps.csv')])).files;
    expect(report!.problems).toEqual([]);
    expect(report!.notes).toContain('1 row repeats the time stamp of the row before (first at line 4)');
  });

  it('binary garbage: refused in one line, control characters escaped', async () => {
    expect(await failure(read('binary-garbage.bin'))).toMatch(
      new RegExp(`${place('binary-garbage.bin')}byte \\d+ is a NUL byte: binary data, not a text log$`),
    );
    const [report] = (await checkFiles([broken('binary-garbage.bin')])).files;
    expect(report!.problems).toEqual([
      `${broken('binary-garbage.bin')}: not a file reflap reads: expected a car or segment track (JSON), a centreline CSV (x_m, y_m), or a log (CSV with a time column, NMEA 0183, GPX)`,
    ]);
  });

  it('NMEA with bad checksums only: refused, saying why', async () => {
    expect(await failure(read('bad-checksums.nmea'))).toMatch(
      new RegExp(
        `${place('bad-checksums.nmea')}no RMC or GGA sentence with a GPS fix \\(3 sentences skipped for bad checksums\\)$`,
      ),
    );
  });

  it('GPX that is not XML: refused with the XML line', async () => {
    expect(await failure(read('not-xml.gpx'))).toMatch(
      new RegExp(`${place('not-xml.gpx')}not a GPX file \\(not valid XML at line 4: .*lat.*\\)$`),
    );
  });

  describe('a single line of several megabytes (generated, not committed)', () => {
    let folder: string;
    beforeAll(() => {
      folder = mkdtempSync(join(tmpdir(), 'reflap-long-line-'));
    });
    afterAll(() => rmSync(folder, { recursive: true, force: true }));

    it('no line break in 3 MB: refused in one short line', async () => {
      const file = join(folder, 'one-line.csv');
      writeFileSync(file, '1.25,'.repeat(600_000));
      const message = await failure(readTelemetryFile(file, { columns: {} }));
      // 600,000 separators make 600,001 cells: far more than any logger's channels, refused before matching them.
      expect(message).toBe(`${file}: line 1: a header of 600001 columns; a log has at most 10000`);
      expect(message.length).toBeLessThan(600);
    });

    it('a 6 MB cell in an otherwise good log: refused naming the line and column', async () => {
      const file = join(folder, 'long-cell.csv');
      writeFileSync(file, `time_s,speed_kph\n0,100\n0.1,${'9'.repeat(6_000_000)}x\n0.2,102\n`);
      const message = await failure(readTelemetryFile(file, { columns: {} }));
      expect(message).toBe(`${file}: line 3, column speed_kph: '${'9'.repeat(40)}...' is not a number`);
    });
  });
});

describe('check on files too large for one string', () => {
  it('a large telemetry CSV is checked by streaming, with a note; other large files are refused', async () => {
    // A threshold of 100 bytes stands in for the real one (128 MB), so the test stays small.
    const good = (await checkFiles([broken('quoted-separators.csv')], { streamAboveBytes: 100 })).files[0]!;
    expect(good.problems).toEqual([]);
    expect(good.summary).toBe('telemetry CSV: 4 samples over 0.3 s');
    expect(good.notes).toContain('large file: read by streaming, so only the first problem is listed');
    const bad = (await checkFiles([broken('car-three-problems.json')], { streamAboveBytes: 100 })).files[0]!;
    expect(bad.problems).toEqual([
      `${broken('car-three-problems.json')}: car JSON of over 0 MB; only telemetry CSV files may be that large`,
    ]);
  });
});

describe('broken car and track files', () => {
  it('a car with a negative mass, an unknown key and a missing field: the reader names all three in one line', () => {
    const message = (() => {
      try {
        readCarFile(broken('car-three-problems.json'));
      } catch (error) {
        return (error as Error).message;
      }
      return '';
    })();
    expect(message).toMatch(/field massKg: .*>0/);
    expect(message).toContain('unknown field wingAngleDeg');
    expect(message).toContain('missing required field powertrain');
  });

  it('a car with three problems: check lists three lines', async () => {
    const [report] = (await checkFiles([broken('car-three-problems.json')])).files;
    const file = broken('car-three-problems.json');
    expect(report!.kind).toBe('car');
    expect(report!.problems).toHaveLength(3);
    expect(report!.problems).toContain(`${file}: unknown field wingAngleDeg`);
    expect(report!.problems).toContain(`${file}: missing required field powertrain`);
    expect(report!.problems.some((problem) => problem.startsWith(`${file}: field massKg: `))).toBe(true);
  });

  it('a centreline with two bad cells: the reader stops at the first, check names both rows', async () => {
    const file = broken('track-two-bad-cells.csv');
    expect(() => readTrackFile(file, TRACK_OPTIONS)).toThrow(`${file}: row 4, column y_m: 'abc' is not a number`);
    const [report] = (await checkFiles([file])).files;
    expect(report!.problems).toEqual([
      `${file}: row 4, column y_m: 'abc' is not a number`,
      `${file}: row 6, column x_m: the cell is empty`,
    ]);
  });

  it('an empty track file', () => {
    expect(() => readTrackFile(broken('empty.csv'), TRACK_OPTIONS)).toThrow(
      `${broken('empty.csv')}: the file is empty`,
    );
  });
});
