// The plain-CSV split that reads centreline and line files without the tokeniser is held to csv-parse itself (the
// reference library every other CSV goes through, with the same options): on generated files with spaces around
// cells, empty cells, blank and space-only lines, LF or CRLF line ends, it gives the same cells on the same line
// numbers; where a file has anything else (quotes, comments, tabs, other characters, mixed line ends, a row of
// another width) it declines and csv-parse reads the file.

import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { parseCsvTable, plainCsvRecords, tokenisedCsvRecords } from '../../src/io/csv-table.js';
import { runs } from '../fuzz/generators.js';

const SOURCE = 'plain.csv';

const cell = fc.oneof(
  { weight: 30, arbitrary: fc.double({ min: -1e6, max: 1e6, noNaN: true }).map(String) },
  { weight: 30, arbitrary: fc.constantFrom('', ' ', '1.5e3', 'x_m', 'abc', ' 12 ', '1,5') },
  { weight: 1, arbitrary: fc.constantFrom('\t3', '"4"', '5#', '#6', 'é', '7\r') },
);

const csvFile = fc
  .record({
    width: fc.integer({ min: 1, max: 4 }),
    delimiter: fc.constantFrom(',', ';'),
    lineEnd: fc.constantFrom('\n', '\r\n', '\n', '\r\n', '\r'),
    rows: fc.array(fc.array(cell, { minLength: 1, maxLength: 5 }), { minLength: 1, maxLength: 12 }),
    blanks: fc.array(fc.constantFrom('', '  ', '', '  ', ' \t'), { maxLength: 3 }),
    mixEnds: fc.oneof({ weight: 5, arbitrary: fc.constant(false) }, { weight: 1, arbitrary: fc.constant(true) }),
    sameWidth: fc.oneof({ weight: 5, arbitrary: fc.constant(true) }, { weight: 1, arbitrary: fc.constant(false) }),
    trailingEnd: fc.boolean(),
  })
  .map(({ width, delimiter, lineEnd, rows, blanks, mixEnds, sameWidth, trailingEnd }) => {
    const lines = rows.map((row) => (sameWidth ? Array.from({ length: width }, (_, k) => row[k] ?? '') : row));
    const text = lines.map((row) => row.join(delimiter));
    blanks.forEach((blank, k) => text.splice((k * 3) % (text.length + 1), 0, blank));
    const ends = text.map((_, k) => (mixEnds && k % 2 === 1 ? '\n' : lineEnd));
    const body = text.map((line, k) => line + (k < text.length - 1 || trailingEnd ? ends[k] : '')).join('');
    return { body, delimiter };
  });

const essentials = (records: { record: string[]; info: { lines: number } }[]) =>
  records.map(({ record, info }) => ({ record, lines: info.lines }));

describe('plain CSV split against csv-parse', () => {
  it("gives csv-parse's cells and line numbers wherever it reads a file, and declines the rest", () => {
    let split = 0;
    let declined = 0;
    fc.assert(
      fc.property(csvFile, ({ body, delimiter }) => {
        const plain = plainCsvRecords(body, delimiter);
        let reference: ReturnType<typeof essentials> | string;
        try {
          reference = essentials(tokenisedCsvRecords(body, delimiter, SOURCE));
        } catch (error) {
          reference = (error as Error).message;
        }
        if (plain === null) {
          declined++;
          return;
        }
        split++;
        expect(essentials(plain)).toEqual(reference);
      }),
      runs(600, 2518),
    );
    // Both paths are exercised: the comparison is not of an empty set.
    expect(split).toBeGreaterThan(100);
    expect(declined).toBeGreaterThan(100);
  });

  it('reads a centreline with CRLF ends, spaces and a blank line as the header and numbered rows', () => {
    const table = parseCsvTable('x_m, y_m\r\n 0 ,1\r\n\r\n2, 3 \r\n', SOURCE);
    // Line numbers counted by hand from the text above: the blank third line is skipped but counted.
    expect(table).toEqual({
      header: ['x_m', 'y_m'],
      rows: [
        ['0', '1'],
        ['2', '3'],
      ],
      lines: [2, 4],
    });
  });
});
