// The chunked streaming telemetry reader (streamTelemetryCsv) against the session reader (readTelemetryFile),
// which share one row pipeline: the same channels to the last bit, the same notes and the same errors naming
// the same lines, on the corpus of fixtures and on generated logs longer than many chunks; chunks never exceed
// CHUNK_ROWS; values are checked against the generated input (unit definitions, linear interpolation).

import { mkdtempSync, readdirSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import {
  CHUNK_ROWS,
  readTelemetryFile,
  streamTelemetryCsv,
  type TelemetryChannel,
  type TelemetryChunk,
} from '../../src/io/telemetry/read-telemetry.js';
import type { TelemetrySession } from '../../src/telemetry/types.js';
import { InputError } from '../../src/errors.js';
import { sniffTelemetryFormat } from '../../src/io/telemetry/read-telemetry.js';
import fc from 'fast-check';
import { csvText, runs } from '../fuzz/generators.js';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
const brokenDir = path.join(root, 'test', 'fixtures', 'broken');
const none = { columns: {} };
const folder = mkdtempSync(path.join(os.tmpdir(), 'reflap-stream-'));
const FIELDS: TelemetryChannel[] = [
  'timeS',
  'distanceM',
  'speedMps',
  'throttle',
  'brake',
  'axMps2',
  'ayMps2',
  'steeringDeg',
  'gear',
  'rpm',
  'xM',
  'yM',
];

interface Streamed {
  chunks: Array<{ firstRow: number; rows: number; buffer: ArrayBufferLike }>;
  channels: Partial<Record<TelemetryChannel, number[]>>;
  summary: Awaited<ReturnType<typeof streamTelemetryCsv>>;
}

async function stream(file: string): Promise<Streamed> {
  const chunks: Streamed['chunks'] = [];
  const channels: Streamed['channels'] = {};
  const summary = await streamTelemetryCsv(file, none, (chunk: TelemetryChunk) => {
    chunks.push({ firstRow: chunk.firstRow, rows: chunk.rows, buffer: chunk.timeS.buffer });
    for (const field of FIELDS) {
      const values = chunk[field];
      if (!values) continue;
      expect(values.length).toBe(chunk.rows);
      (channels[field] ??= []).push(...values);
    }
  });
  return { chunks, channels, summary };
}

function write(name: string, text: string): string {
  const file = path.join(folder, name);
  writeFileSync(file, text);
  return file;
}

/** The streamed chunks are contiguous, bounded, and give the session's channels and notes exactly. */
async function expectSameAsSession(file: string): Promise<{ session: TelemetrySession; streamed: Streamed }> {
  const session = await readTelemetryFile(file, none);
  const streamed = await stream(file);
  let next = 0;
  for (const chunk of streamed.chunks) {
    expect(chunk.firstRow).toBe(next);
    expect(chunk.rows).toBeGreaterThan(0);
    expect(chunk.rows).toBeLessThanOrEqual(CHUNK_ROWS);
    next += chunk.rows;
  }
  expect(next).toBe(session.count);
  expect(streamed.summary.rows).toBe(session.count);
  expect(streamed.summary.notes).toEqual(session.notes);
  expect(streamed.summary.geoOrigin).toEqual(session.geoOrigin);
  expect(streamed.summary.startTimeS).toBe(session.timeS[0]);
  expect(streamed.summary.endTimeS).toBe(session.timeS[session.count - 1]);
  expect([...streamed.summary.channels].sort()).toEqual(FIELDS.filter((field) => session[field] !== null).sort());
  for (const field of FIELDS) {
    const values = session[field] ?? null;
    if (values === null) expect(streamed.channels[field]).toBeUndefined();
    else expect(streamed.channels[field]).toEqual(Array.from(values));
  }
  return { session, streamed };
}

async function messageOf(promise: Promise<unknown>): Promise<string> {
  try {
    await promise;
  } catch (error) {
    expect(error).toBeInstanceOf(InputError);
    return (error as Error).message;
  }
  throw new Error('expected an input error');
}

describe('streamed reader on the fixtures', () => {
  const readable = [
    'bom.csv',
    'crlf.csv',
    'decimal-commas.csv',
    'duplicate-timestamps.csv',
    'missing-cells.csv',
    'quoted-separators.csv',
    'truncated-last-line.csv',
  ];
  it.each(readable)('%s: the same channels and notes as the session reader', async (name) => {
    await expectSameAsSession(path.join(brokenDir, name));
  });

  it('every broken CSV fixture: the same one-line message from both readers', async () => {
    const csvFiles = readdirSync(brokenDir).filter((name) => name.endsWith('.csv') && !readable.includes(name));
    expect(csvFiles.length).toBeGreaterThan(3);
    for (const name of csvFiles) {
      const file = path.join(brokenDir, name);
      const fromSession = await messageOf(readTelemetryFile(file, none));
      expect(await messageOf(stream(file))).toBe(fromSession);
    }
  });

  it('a missing cell is filled on the line between its neighbours in time (linear interpolation, common practice)', async () => {
    const { streamed } = await expectSameAsSession(path.join(brokenDir, 'missing-cells.csv'));
    // missing-cells.csv: speed 100 at 0.0 s, empty at 0.1 s, 104 at 0.2 s, in km/h (1 km/h = 1/3.6 m/s, SI brochure).
    expect(streamed.channels.speedMps![1]).toBeCloseTo(102 / 3.6, 12);
  });
});

/** A 10 Hz log of `rows` rows with positions on a circle; `cell` may blank or change cells. */
function circleLog(
  rows: number,
  header: string[],
  cell: (row: number, column: string, value: string) => string,
): string {
  const lines = [header.join(',')];
  for (let i = 0; i < rows; i++) {
    const t = i * 0.1;
    const angle = t / 20;
    const speedMps = 31.4159 * (1 + 0.2 * Math.sin(i / 50));
    const values: Record<string, string> = {
      time_s: t.toFixed(1),
      speed: (speedMps * 3.6).toFixed(3),
      speed_kph: (speedMps * 3.6).toFixed(3),
      x_m: (628.318 * Math.cos(angle)).toFixed(3),
      y_m: (628.318 * Math.sin(angle)).toFixed(3),
      throttle: (50 + 50 * Math.sin(i / 30)).toFixed(1),
      ax: (0.5 * Math.sin(i / 40)).toFixed(3),
      ay_g: (1.2 * Math.cos(i / 40)).toFixed(3),
      lat: (47.1 + 0.005 * Math.sin(angle)).toFixed(7),
      lon: (8.2 + 0.007 * Math.cos(angle)).toFixed(7),
      rpm: (4000 + 2000 * Math.sin(i / 70)).toFixed(0),
      spare: '',
    };
    lines.push(header.map((column) => cell(i, column, values[column]!)).join(','));
  }
  return lines.join('\n') + '\n';
}

describe('streamed reader on generated logs of many chunks', () => {
  it('units in the header, gaps: chunks of at most CHUNK_ROWS in reused buffers, the same channels', async () => {
    const rows = 5 * CHUNK_ROWS + 123;
    const file = write(
      'units.csv',
      circleLog(rows, ['time_s', 'speed_kph', 'x_m', 'y_m', 'ay_g', 'rpm'], (i, column, value) =>
        column === 'rpm' && i % 97 === 5 ? '' : value,
      ),
    );
    const { streamed } = await expectSameAsSession(file);
    expect(streamed.chunks.length).toBe(6);
    // Chunks are views into a few reused buffers, not new arrays per row or per chunk.
    expect(new Set(streamed.chunks.map((chunk) => chunk.buffer)).size).toBeLessThanOrEqual(3);
    // 1 g = 9.80665 m/s^2 (CGPM 1901, standard gravity).
    expect(streamed.channels.ayMps2![0]).toBeCloseTo(1.2 * 9.80665, 12);
    expect(streamed.summary.notes).toContain(
      `column rpm: ${Math.ceil((rows - 5) / 97)} empty cells filled by interpolation`,
    );
  });

  it('units from the data (speed, throttle, acceleration): decided over the whole log, as the session reader does', async () => {
    const rows = 3 * CHUNK_ROWS + 7;
    const file = write(
      'no-units.csv',
      circleLog(rows, ['time_s', 'speed', 'x_m', 'y_m', 'throttle', 'ax'], (_, __, value) => value),
    );
    const { streamed } = await expectSameAsSession(file);
    expect(streamed.summary.notes).toEqual([
      'column speed: no unit in the header; read as km/h (it matches the distance travelled)',
      'column throttle: no unit in the header; read as percent from its range',
      'column ax: no unit in the header; read as g from its range',
    ]);
    // The log wrote speed in km/h (1 km/h = 1/3.6 m/s) and throttle in percent.
    expect(streamed.channels.speedMps![0]).toBeCloseTo(31.4159, 3);
    expect(streamed.channels.throttle![0]).toBeCloseTo(0.5, 12);
  });

  it('GPS latitude/longitude: the same plane and origin as the session reader', async () => {
    const file = write(
      'gps.csv',
      circleLog(2 * CHUNK_ROWS + 50, ['time_s', 'speed_kph', 'lat', 'lon'], (_, __, value) => value),
    );
    const { session } = await expectSameAsSession(file);
    // The origin is the mean fix: the circle's centre, 47.1 N 8.2 E, to within a small fraction of its radius.
    expect(session.geoOrigin!.latDeg).toBeCloseTo(47.1, 3);
    expect(session.geoOrigin!.lonDeg).toBeCloseTo(8.2, 3);
  });

  it('a channel empty over more than 16 chunks: the file is scanned for its long gaps, and few rows are held', async () => {
    const rows = 20 * CHUNK_ROWS;
    const gapFrom = 1000;
    const gapTo = 18 * CHUNK_ROWS;
    const file = write(
      'long-gap.csv',
      circleLog(rows, ['time_s', 'speed_kph', 'x_m', 'y_m', 'rpm', 'spare'], (i, column, value) =>
        column === 'rpm' && i >= gapFrom && i < gapTo ? '' : value,
      ),
    );
    const { streamed } = await expectSameAsSession(file);
    // 20 chunks go out through a handful of buffers: the gap did not hold the rows behind it.
    expect(new Set(streamed.chunks.map((chunk) => chunk.buffer)).size).toBeLessThanOrEqual(8);
    expect(streamed.summary.notes).toEqual([
      'columns not used: spare',
      `column rpm: ${gapTo - gapFrom} empty cells filled by interpolation`,
    ]);
    // Linear interpolation in time across the gap (common practice): halfway in time, halfway in value.
    const before = streamed.channels.rpm![gapFrom - 1]!;
    const after = streamed.channels.rpm![gapTo]!;
    const middle = (gapFrom - 1 + gapTo) / 2;
    expect(streamed.channels.rpm![Math.floor(middle)]!).toBeCloseTo(
      before + ((Math.floor(middle) - (gapFrom - 1)) / (gapTo - (gapFrom - 1))) * (after - before),
      6,
    );
  });

  it('a column empty throughout is left out by both readers', async () => {
    const file = write(
      'empty-column.csv',
      'time_s,speed_kph,rpm\n' +
        Array.from({ length: 20 * CHUNK_ROWS }, (_, i) => `${(i * 0.05).toFixed(2)},100,`).join('\n') +
        '\n',
    );
    const { streamed } = await expectSameAsSession(file);
    expect(streamed.summary.notes).toEqual(['column rpm is empty; left out']);
    expect(streamed.summary.channels).toEqual(['timeS', 'speedMps']);
  });
});

describe('streamed reader errors name the same line as the session reader', () => {
  const rows = 3 * CHUNK_ROWS;
  // Data row i is on line i + 2 (the header is line 1).
  const cases: Array<[string, (i: number, column: string, value: string) => string, string, string[]]> = [
    [
      'text in a numeric column in the third chunk',
      (i, column, value) => (i === 2 * CHUNK_ROWS + 10 && column === 'speed_kph' ? 'fast' : value),
      `line ${2 * CHUNK_ROWS + 12}, column speed_kph: 'fast' is not a number`,
      ['time_s', 'speed_kph'],
    ],
    [
      'time running backwards in the second chunk',
      (i, column, value) => (i === CHUNK_ROWS + 3 && column === 'time_s' ? '0.05' : value),
      `line ${CHUNK_ROWS + 5}, column time_s: time runs backwards (0.05 after ${((CHUNK_ROWS + 2) * 0.1).toFixed(1)})`,
      ['time_s', 'speed_kph'],
    ],
    [
      'an empty time',
      (i, column, value) => (i === 9000 && column === 'time_s' ? '' : value),
      'line 9002, column time_s: empty time',
      ['time_s', 'speed_kph'],
    ],
    [
      'a latitude out of range',
      (i, column, value) => (i === 20000 && column === 'lat' ? '91.5' : value),
      'line 20002, column lat: 91.5 is not a latitude/longitude in degrees',
      ['time_s', 'speed_kph', 'lat', 'lon'],
    ],
    [
      'text after a backwards step: the text is reported, as the session reader does',
      (i, column, value) =>
        i === 100 && column === 'time_s' ? '0' : i === 2 * CHUNK_ROWS && column === 'speed_kph' ? 'x' : value,
      `line ${2 * CHUNK_ROWS + 2}, column speed_kph: 'x' is not a number`,
      ['time_s', 'speed_kph'],
    ],
  ];
  it.each(cases)('%s', async (name, cell, expected, header) => {
    const file = write(`${name.replace(/\W+/g, '-')}.csv`, circleLog(rows, header, cell));
    const fromStream = await messageOf(stream(file));
    expect(fromStream).toBe(`${file}: ${expected}`);
    expect(await messageOf(readTelemetryFile(file, none))).toBe(fromStream);
  });

  it('a GPX or NMEA log is not read in chunks', async () => {
    const file = write('ride.gpx', '<gpx version="1.1"></gpx>');
    expect(await messageOf(stream(file))).toBe(`${file}: a GPX log; only CSV logs are read in chunks`);
  });
});

describe('streamed reader against the session reader on fuzzed CSV', () => {
  const headers = fc.array(
    fc.constantFrom(
      'time_s',
      'Time',
      'time [ms]',
      'speed_kph',
      'speed',
      'distance_m',
      'throttle',
      'brake',
      'lat',
      'lon',
      'x_m',
      'y_m',
      'ax',
      'ay_g',
      'rpm',
      'notes',
      '',
    ),
    { minLength: 1, maxLength: 7 },
  );
  // Plausible logs: time rising (now and then standing still or stepping back), numbers with empty cells, now
  // and then a word, in any of the columns, with or without units.
  const plausible = fc
    .record({
      columns: fc.subarray(
        [
          'speed',
          'speed_kph',
          'distance_m',
          'throttle',
          'brake_pct',
          'lat',
          'lon',
          'x_m',
          'y_m',
          'ax',
          'ay_g',
          'rpm',
          'gear',
        ],
        { minLength: 1, maxLength: 6 },
      ),
      count: fc.integer({ min: 0, max: 80 }),
      blanks: fc.integer({ min: 0, max: 6 }),
      back: fc.integer({ min: -1, max: 300 }),
      word: fc.integer({ min: -1, max: 1500 }),
      seed: fc.integer({ min: 1, max: 1000 }),
    })
    .map(({ columns, count, blanks, back, word, seed }) => {
      const lines = [['time_s', ...columns].join(',')];
      for (let i = 0; i < count; i++) {
        const cells = [String(i === back ? (i - 2) * 0.1 : i * 0.1)];
        columns.forEach((column, c) => {
          const k = i * columns.length + c;
          const value =
            column === 'lat'
              ? 47 + 0.001 * Math.sin(i / 9)
              : column === 'lon'
                ? 8 + 0.001 * Math.cos(i / 9)
                : 50 + 40 * Math.sin((i + seed) / 7 + c);
          cells.push(k === word ? 'n/a?' : blanks > 0 && (k * seed) % (11 - blanks) === 0 ? '' : value.toFixed(4));
        });
        lines.push(cells.join(','));
      }
      return lines.join('\n') + '\n';
    });

  it('any CSV-like text: both read the same session, or both give the same message', async () => {
    let read = 0;
    let case_ = 0;
    await fc.assert(
      fc.asyncProperty(fc.oneof(csvText(headers), plausible, plausible), async (text) => {
        if (sniffTelemetryFormat(text.slice(0, 65536), 'fuzz.csv') !== 'csv') return;
        const file = write(`fuzz-${case_++}.csv`, text);
        let sessionMessage: string | null = null;
        try {
          await readTelemetryFile(file, none);
        } catch (error) {
          expect(error).toBeInstanceOf(InputError);
          sessionMessage = (error as Error).message;
        }
        if (sessionMessage === null) {
          await expectSameAsSession(file);
          read++;
        } else expect(await messageOf(stream(file))).toBe(sessionMessage);
      }),
      runs(300, 20260701),
    );
    expect(read).toBeGreaterThan(10);
    console.log(`streamed against session: ${read} sessions read alike of ${case_} CSV cases`);
  });
});
