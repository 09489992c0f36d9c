// The telemetry CSV fast path (src/io/telemetry/numeric-scan.ts) against outside references: every number it
// scans equals ECMAScript's Number() of the same text (ECMA-262, StringToNumber: the double nearest the
// decimal), and every log, in any dialect the readers accept, gives the same session or the same one-line
// error as csv-parse (the general-purpose CSV library the reader used alone before the fast path).

import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { parseCsvText } from '../../src/io/telemetry/csv.js';
import { NumericLineScanner, type ScanTarget } from '../../src/io/telemetry/numeric-scan.js';
import { InputError } from '../../src/errors.js';
import { cell, csvText, runs } from '../fuzz/generators.js';

/** What the scanner hands over for a one-column file: numbers, or cells where it took the general path. */
function scanOneColumn(text: string): (number | string)[] {
  const seen: (number | string)[] = [];
  let header = false;
  const target: ScanTarget = {
    get hasHeader() {
      return header;
    },
    boundColumns: () => [0],
    record(cells) {
      if (!header) header = true;
      else seen.push(cells.join('|'));
    },
    recordNumbers(values, count) {
      seen.push(count > 0 ? values[0]! : NaN);
    },
  };
  const scanner = new NumericLineScanner({ delimiter: ',', decimalComma: false, headerLine: 1, logger: null }, target);
  const bytes = Buffer.from(text, 'utf8');
  expect(scanner.scan(bytes, 0, bytes.length, true)).toBe(bytes.length);
  return seen;
}

/** A finite double written the ways loggers write numbers. */
const writtenNumber = fc
  .record({
    value: fc.double({ noNaN: true, noDefaultInfinity: true }),
    digits: fc.integer({ min: 0, max: 20 }),
    style: fc.constantFrom('string', 'fixed', 'exponential', 'precision', 'scaled'),
  })
  .map(({ value, digits, style }) => {
    if (style === 'fixed') return Math.abs(value) < 1e21 ? value.toFixed(digits) : String(value);
    if (style === 'exponential') return value.toExponential(digits);
    if (style === 'precision') return value.toPrecision(Math.max(1, digits));
    if (style === 'scaled') return (value / 1e300).toFixed(Math.min(digits, 9));
    return String(value);
  });

describe('numeric fast path', () => {
  it('reads every number as Number() does, bit for bit (ECMA-262 StringToNumber)', () => {
    fc.assert(
      fc.property(fc.array(writtenNumber, { minLength: 1, maxLength: 20 }), (texts) => {
        const scanned = scanOneColumn(['v', ...texts].join('\n') + '\n');
        expect(scanned.length).toBe(texts.length);
        // Out of range (2e+308): the general path words the error, as for any text that is not a number.
        texts.forEach((text, k) => expect(scanned[k]).toBe(Number.isFinite(Number(text)) ? Number(text) : text));
      }),
      runs(300, 1801),
    );
  });

  it('reads hand-picked forms as Number() does: signs, bare points, exponents, leading zeros, -0, 17 digits', () => {
    const texts = ['+.5', '5.', '-0', '-0.0e5', '007', '1E+3', '2.5e-3', '12345678901234567', '0.1', '1e22', '1e23'];
    const scanned = scanOneColumn(['v', ...texts].join('\n') + '\n');
    // toBe compares with Object.is: -0 and 0 differ.
    texts.forEach((text, k) => expect(scanned[k]).toBe(Number(text)));
  });

  it('hands text, white space, markers and hexadecimal to the general path as cells', () => {
    expect(scanOneColumn('v\n 7 \nnan\n0x1F\n1e400\n1.2.3\n')).toEqual([' 7 ', 'nan', '0x1F', '1e400', '1.2.3']);
  });
});

type Outcome = { session: unknown } | { error: string };

function outcome(text: string, reader: 'fast' | 'csv-parse'): Outcome {
  try {
    return { session: parseCsvText(text, 'log.csv', {}, reader) };
  } catch (error) {
    if (error instanceof InputError) return { error: error.message };
    throw error;
  }
}

const headers = fc.array(
  fc.constantFrom('time_s', 'Time', 'speed_kph', 'throttle', 'brake', 'x_m', 'y_m', 'lat', 'lon', 'gear', 'notes', ''),
  { minLength: 1, maxLength: 6 },
);

/** A log with rising time and numbers in every form, in a dialect: separator, decimal comma, line ending, BOM. */
const plausibleLog = fc
  .record({
    rows: fc.array(
      fc.array(fc.oneof({ weight: 5, arbitrary: writtenNumber }, { weight: 1, arbitrary: cell }), {
        minLength: 3,
        maxLength: 3,
      }),
      { minLength: 2, maxLength: 30 },
    ),
    separator: fc.constantFrom(',', ';', '\t'),
    decimalComma: fc.boolean(),
    end: fc.constantFrom('\n', '\r\n'),
    bom: fc.boolean(),
  })
  .map(({ rows, separator, decimalComma, end, bom }) => {
    const comma = decimalComma && separator !== ',';
    const lines = ['time_s', 'speed_kph', 'x_m'].join(separator);
    const body = rows.map((row, k) =>
      [String(k * 0.05), ...row.slice(1)].map((text) => (comma ? text.replace('.', ',') : text)).join(separator),
    );
    return (bom ? '\uFEFF' : '') + [lines, ...body].join(end) + end;
  });

describe('fast path against csv-parse', () => {
  it('gives the same session or the same message on CSV-like text of any dialect', () => {
    fc.assert(
      fc.property(csvText(headers), (text) => {
        expect(outcome(text, 'fast')).toEqual(outcome(text, 'csv-parse'));
      }),
      runs(400, 1802),
    );
  });

  it('gives the same session on plausible logs with numbers in every form', () => {
    fc.assert(
      fc.property(plausibleLog, (text) => {
        expect(outcome(text, 'fast')).toEqual(outcome(text, 'csv-parse'));
      }),
      runs(300, 1803),
    );
  });

  it('hands a quoted file, and a CRLF file with a bare line feed, to csv-parse and agrees with it', () => {
    for (const text of [
      'time_s,speed_kph\n0,"10"\n1,"2,5"\n2,30\n',
      'time_s,speed_kph\r\n0,10\r\n1,20\n2,30\r\n3,40\r\n',
      'time_s;speed_kph\n0;"1\n0"\n1;20\n',
    ])
      expect(outcome(text, 'fast')).toEqual(outcome(text, 'csv-parse'));
  });
});
