// Logger CSV exports with a key/value preamble above the header and a units row under it: the preamble is kept
// as notes, the units row gives each column's unit, and plain files read exactly as before. Unit factors are
// the SI definitions (km/h = 1000 m / 3600 s; 1 mph = 0.44704 m/s exactly, NIST SP 811 appendix B;
// 1 g = 9.80665 m/s^2, CGPM 1901).

import { describe, expect, it } from 'vitest';
import { parseTelemetryText } from '../../src/io/telemetry/read-telemetry.js';
import { parseCsvText } from '../../src/io/telemetry/csv.js';
import { loggerLayout } from '../../src/io/telemetry/logger-preamble.js';
import { detectKind } from '../../src/check/detect-kind.js';
import { inputErrorMessage } from '../helpers/input-error.js';

const read = (text: string) => parseTelemetryText(text, 'log.csv', { columns: {} });

/** A 20 Hz export: preamble, header, units row, then rows of (t, speed, lateral g, longitudinal g, throttle %). */
function loggerExport(options: { speedUnit?: string; separator?: string; decimalComma?: boolean; rows?: number } = {}) {
  const sep = options.separator ?? ',';
  const number = (value: number, digits: number) => {
    const text = value.toFixed(digits);
    return options.decimalComma ? text.replace('.', ',') : text;
  };
  const lines = [
    ['Session', 'Practice 2'].join(sep),
    ['Vehicle', 'Car 7'].join(sep),
    ['Sample rate', '20 Hz'].join(sep),
    '',
    ['Time', 'Speed', 'Lat Acc', 'Long Acc', 'Throttle'].join(sep),
    ['s', options.speedUnit ?? 'km/h', 'g', 'g', '%'].join(sep),
  ];
  for (let i = 0; i < (options.rows ?? 50); i++)
    lines.push([number(i * 0.05, 2), number(100, 1), number(0.5, 2), number(-0.25, 2), number(40, 1)].join(sep));
  return lines.join('\n') + '\n';
}

describe('logger exports with a preamble and a units row', () => {
  it('skips the preamble, keeps its pairs as a note, and takes every unit from the units row', () => {
    const session = read(loggerExport());
    expect(session.count).toBe(50);
    expect(session.speedMps![0]).toBeCloseTo(100 / 3.6, 12);
    expect(session.ayMps2![0]).toBeCloseTo(0.5 * 9.80665, 12);
    expect(session.axMps2![0]).toBeCloseTo(-0.25 * 9.80665, 12);
    expect(session.throttle![0]).toBeCloseTo(0.4, 12);
    expect(session.notes).toContain(
      'logger preamble of 3 lines before the header: Session: Practice 2; Vehicle: Car 7; Sample rate: 20 Hz',
    );
    expect(session.notes).toContain('units taken from the row under the header: s, km/h, g, g, %');
  });

  it('reads mph and m/s from the units row', () => {
    expect(read(loggerExport({ speedUnit: 'mph' })).speedMps![0]).toBeCloseTo(100 * 0.44704, 12);
    expect(read(loggerExport({ speedUnit: 'm/s' })).speedMps![0]).toBe(100);
  });

  it('reads the dialect with semicolons and decimal commas', () => {
    const session = read(loggerExport({ separator: ';', decimalComma: true }));
    expect(session.count).toBe(50);
    expect(session.ayMps2![0]).toBeCloseTo(0.5 * 9.80665, 12);
  });

  it('gives the same session by the byte scanner and by csv-parse', () => {
    const text = loggerExport({ rows: 500 });
    const fast = parseCsvText(text, 'log.csv', {}, 'fast');
    const general = parseCsvText(text, 'log.csv', {}, 'csv-parse');
    expect(Array.from(fast.speedMps!)).toEqual(Array.from(general.speedMps!));
    expect(fast.notes).toEqual(general.notes);
  });

  it('names the file line of a bad cell, counting the preamble and the units row', () => {
    // Line 7 is the first data row: 3 preamble lines, a blank line, the header and the units row come first.
    const text = loggerExport().replace('\n0.00,100.0', '\n0.00,fast');
    expect(inputErrorMessage(() => read(text))).toMatch(/^log\.csv: line 7, column Speed \[km\/h\]: /);
  });

  it('is a log to check', () => {
    expect(detectKind(loggerExport(), 'log.csv')).toBe('telemetry-csv');
  });
});

describe('plain files are not logger exports', () => {
  it('finds no preamble and no units row where the header is the first line', () => {
    expect(loggerLayout(['time_s,speed_kph', '0,100', '0.1,101'])).toBeNull();
    expect(loggerLayout(['# time_s,speed_kph', '0,100', '0.1,101'])).toBeNull();
    expect(loggerLayout(['time_s,speed_kph'])).toBeNull();
    expect(loggerLayout(['# a comment', 'time_s,speed_kph', '0,100'])).toBeNull();
  });

  it('finds a units row with no preamble', () => {
    const layout = loggerLayout(['time,speed', 's,[km/h]', '0,100', '0.1,101']);
    expect(layout).toEqual({ headerIndex: 0, units: ['s', '[km/h]'], preamble: [] });
    expect(read('time,speed\ns,[km/h]\n0,36\n0.1,36\n').speedMps![0]).toBeCloseTo(10, 12);
  });
});
