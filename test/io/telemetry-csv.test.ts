// Telemetry CSV: one small lap written in several dialects must read to identical channels; units in headers
// (or in the data range) are converted to SI; bad input is a one-line InputError naming the place.

import { mkdtempSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { parseTelemetryText, readTelemetryFile } from '../../src/io/telemetry/read-telemetry.js';
import type { TelemetrySession } from '../../src/telemetry/types.js';
import { InputError } from '../../src/errors.js';
import { selectLap } from '../../src/compare/align.js';
import { simulate } from '../../src/solve/simulate.js';
import { readCarFile } from '../../src/io/read-car.js';
import { traceCsv } from '../../src/report/trace-csv.js';
import { displayUnits } from '../../src/report/units.js';
import { triangleTrack } from '../fixtures/telemetry/tracks.js';
import { noteText } from '../../src/report/note-text.js';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
const none = { columns: {} };

// The lap: time s, distance m, speed m/s, throttle 0-1, brake 0-1, ax m/s^2, ay m/s^2.
const rows = [
  [0.0, 0.0, 20.0, 1.0, 0.0, 2.5, 0.5],
  [0.1, 2.0, 20.25, 1.0, 0.0, 2.45, -1.25],
  [0.2, 4.1, 20.5, 0.75, 0.0, 0.0, 3.5],
  [0.3, 6.2, 20.5, 0.0, 0.5, -8.0, 4.75],
  [0.4, 8.2, 19.75, 0.0, 1.0, -12.5, 0.0],
];

function table(
  delimiter: string,
  header: string[],
  format: (value: number) => string,
  quote = false,
  lineEnd = '\n',
): string {
  const q = (text: string) => (quote ? `"${text}"` : text);
  return (
    [header.map(q).join(delimiter), ...rows.map((row) => row.map((value) => q(format(value))).join(delimiter))].join(
      lineEnd,
    ) + lineEnd
  );
}

const siHeader = ['time_s', 'distance_m', 'speed_mps', 'throttle', 'brake', 'ax_mps2', 'ay_mps2'];
const plain = (value: number) => String(value);
const comma = (value: number) => String(value).replace('.', ',');

function channels(session: TelemetrySession) {
  return {
    t: Array.from(session.timeS),
    d: Array.from(session.distanceM!),
    v: Array.from(session.speedMps!),
    throttle: Array.from(session.throttle!),
    brake: Array.from(session.brake!),
    ax: Array.from(session.axMps2!),
    ay: Array.from(session.ayMps2!),
  };
}

function expectClose(actual: ReturnType<typeof channels>, expected: ReturnType<typeof channels>): void {
  for (const key of Object.keys(expected) as Array<keyof typeof expected>) {
    actual[key].forEach((value, i) => expect(value).toBeCloseTo(expected[key][i]!, 9));
  }
}

describe('CSV dialects', () => {
  const reference = channels(parseTelemetryText(table(',', siHeader, plain), 'comma.csv', none));

  it('reads the plain comma file as written', () => {
    expect(reference.v).toEqual(rows.map((row) => row[2]));
    expect(reference.brake).toEqual(rows.map((row) => row[4]));
  });

  it.each([
    ['semicolon with decimal commas', table(';', siHeader, comma)],
    ['tab', table('\t', siHeader, plain)],
    ['BOM and CRLF', '\uFEFF' + table(',', siHeader, plain, false, '\r\n')],
    ['quoted fields', table(',', siHeader, plain, true)],
    ['quoted decimal commas with semicolons, CRLF', table(';', siHeader, comma, true, '\r\n')],
    ['a comment line and a # header', '# exported by a logger\n' + table(',', siHeader, plain).replace(/^/, '# ')],
  ])('%s gives the same channels', (_, text) => {
    expectClose(channels(parseTelemetryText(text, 'dialect.csv', none)), reference);
  });

  it('converts km/h, percent and g (1 g = 9.80665 m/s^2, CGPM 1901; 1 km/h = 1/3.6 m/s)', () => {
    const header = [
      'Time [s]',
      'Distance (m)',
      'Speed [km/h]',
      'Throttle %',
      'brake_pct',
      'ax_g',
      'Lateral Acceleration [g]',
    ];
    const text = [
      header.join(','),
      ...rows.map((row) =>
        [row[0], row[1], row[2]! * 3.6, row[3]! * 100, row[4]! * 100, row[5]! / 9.80665, row[6]! / 9.80665].join(','),
      ),
    ].join('\n');
    expectClose(channels(parseTelemetryText(text, 'units.csv', none)), reference);
  });

  it('decides throttle % vs 0-1 and g vs m/s^2 from the data when the header has no unit, and says so', () => {
    const header = ['t', 'dist', 'speed_mps', 'tps', 'brake', 'ax', 'ay'];
    const text = [
      header.join(','),
      ...rows.map((row) => [row[0], row[1], row[2], row[3]! * 100, row[4], row[5], row[6]].join(',')),
    ].join('\n');
    const session = parseTelemetryText(text, 'guess.csv', none);
    expectClose(channels(session), reference);
    expect(session.notes).toContain('column tps: no unit in the header; read as percent from its range');
    expect(session.notes).toContain('column brake: no unit in the header; read as 0-1 from its range');
  });

  it('reads speed without a unit by the distance travelled (km/h here)', () => {
    const text = ['time,distance,speed', ...rows.map((row) => [row[0], row[1], row[2]! * 3.6].join(','))].join('\n');
    const session = parseTelemetryText(text, 'speed.csv', none);
    expect(session.speedMps![0]).toBeCloseTo(20, 9);
    expect(session.notes.some((note) => /read as km\/h/.test(noteText(note)))).toBe(true);
  });

  it('follows a --telemetry-columns mapping for headers of its own', () => {
    const header = ['Zeit', 'Weg', 'Tempo', 'Gas', 'Bremse', 'Laengs', 'Quer'];
    const text = table(',', header, plain);
    const mapping = {
      time_s: 'Zeit',
      distance_m: 'Weg',
      speed_mps: 'Tempo',
      throttle: 'Gas',
      brake: 'Bremse',
      ax_mps2: 'Laengs',
      ay_mps2: 'Quer',
    };
    expectClose(channels(parseTelemetryText(text, 'mapped.csv', { columns: mapping })), reference);
  });

  it('streams a file from disk to the same channels', async () => {
    const dir = mkdtempSync(path.join(os.tmpdir(), 'reflap-telemetry-'));
    const file = path.join(dir, 'lap.csv');
    writeFileSync(file, '\uFEFF' + table(';', siHeader, comma, false, '\r\n'));
    expectClose(channels(await readTelemetryFile(file, none)), reference);
  });
});

describe('CSV bad input', () => {
  const cases: Array<[string, string, Record<string, string>, RegExp]> = [
    ['empty file', '', {}, /empty\.csv: empty file/],
    ['header only', 'time_s,speed_kph\n', {}, /header only, no data rows \(header: time_s, speed_kph\)/],
    ['no time column', 'speed_kph,throttle\n100,1\n101,1\n', {}, /no time column \(found: speed_kph, throttle\)/],
    [
      'text in a numeric column',
      'time_s,speed_kph\n0,100\n0.1,fast\n',
      {},
      /line 3, column speed_kph: 'fast' is not a number/,
    ],
    [
      'text after a blank line (line numbers stay exact)',
      'time_s,speed_kph\n0,100\n\n0.1,fast\n',
      {},
      /line 4, column speed_kph: 'fast' is not a number/,
    ],
    [
      'time running backwards',
      'time_s,speed_kph\n0,100\n0.2,100\n0.1,100\n',
      {},
      /line 4, column time_s: time runs backwards/,
    ],
    [
      'a mapping to a missing header',
      'time_s,v\n0,1\n1,2\n',
      { speed_kph: 'Speed' },
      /no column 'Speed' in the header \(found: time_s, v\)/,
    ],
    ['an unknown canonical name', 'time_s,v\n0,1\n1,2\n', { velocity: 'v' }, /unknown channel name 'velocity'/],
    [
      'nothing to place the samples',
      'time_s,rpm\n0,5000\n1,5100\n',
      {},
      /no position, distance or speed column \(found: time_s, rpm\)/,
    ],
  ];
  it.each(cases)('%s', (_, text, columns, message) => {
    const name = _ === 'empty file' ? 'empty.csv' : 'bad.csv';
    expect(() => parseTelemetryText(text, name, { columns })).toThrow(InputError);
    expect(() => parseTelemetryText(text, name, { columns })).toThrow(message);
  });

  it('fills empty cells and says how many', () => {
    const session = parseTelemetryText('time_s,speed_mps\n0,10\n1,\n2,30\n', 'gaps.csv', none);
    expect(Array.from(session.speedMps!)).toEqual([10, 20, 30]);
    expect(session.notes).toContain('column speed_mps: 1 empty cells filled by interpolation');
  });
});

describe('simulate trace as telemetry (round trip)', () => {
  it('reads the trace CSV back and aligns it to the same lap time', () => {
    const track = triangleTrack(1);
    const car = readCarFile(path.join(root, 'cars', 'brackle-club.json'));
    const result = simulate(track, car);
    const session = parseTelemetryText(traceCsv(result), 'trace.csv', none);
    expect(session.speedMps).not.toBeNull();
    expect(session.gear === null || session.gear.length === session.count).toBe(true);
    const { lap, notes } = selectLap(session, track);
    expect(Math.abs(lap.lapTimeS - result.lapTimeS)).toBeLessThan(0.02);
    let worst = 0;
    for (let j = 0; j < track.distanceM.length; j++)
      worst = Math.max(worst, Math.abs(lap.timeS[j]! - result.trace.timeS[j]!));
    expect(worst).toBeLessThan(0.005);
    expect(lap.derivedChannels).toEqual([]);
    expect(notes.some((note) => /lap 1 chosen/.test(noteText(note)))).toBe(true);
  });

  it('reads an imperial trace (feet and mph columns) back as the metric one', () => {
    // distance_ft, x_ft, y_ft and speed_mph convert by 1 ft = 0.3048 m and 1 mph = 0.44704 m/s exactly (NIST SP 811
    // appendix B): both traces read back to the same session within the files' rounding.
    const track = triangleTrack(1);
    const car = readCarFile(path.join(root, 'cars', 'brackle-club.json'));
    const result = simulate(track, car);
    const metric = parseTelemetryText(traceCsv(result), 'trace.csv', none);
    const imperial = parseTelemetryText(traceCsv(result, [], displayUnits('imperial')), 'trace-ft.csv', none);
    expect(imperial.count).toBe(metric.count);
    expect(metric.distanceM).not.toBeNull();
    expect(metric.speedMps).not.toBeNull();
    for (const field of ['distanceM', 'xM', 'yM', 'speedMps'] as const) {
      // Positions are written where the trace has them; then in both files.
      expect(imperial[field] === null, field).toBe(metric[field] === null);
      if (metric[field] === null) continue;
      let worst = 0;
      for (let i = 0; i < metric.count; i++)
        worst = Math.max(worst, Math.abs(imperial[field]![i]! - metric[field]![i]!));
      // Three decimals of a foot or a mile per hour: under 1 mm and 1 mm/s.
      expect(worst, field).toBeLessThan(0.002);
    }
  });
});
