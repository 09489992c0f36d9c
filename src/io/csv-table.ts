// Reads a CSV text into a header and rows of trimmed cells with their line numbers in the file (csv-parse does
// the tokenising). A first line starting with '#' that names the columns counts as the header; later lines
// starting with '#' are comments. A plain file (printable ASCII, no quotes, no comments, one kind of line end,
// every row as wide as the header) is split without the tokeniser, which gives the same cells (checked against
// csv-parse in test/io/csv-plain.test.ts) without loading csv-parse or running its byte-by-byte state machine
// cold: most of what reading a small centreline cost at start-up.

import { csvParseSync } from './lazy-libraries.js';
import { InputError } from '../errors.js';

export interface CsvTable {
  header: string[];
  rows: string[][];
  /** Line number in the file (1-based) of each row. */
  lines: number[];
}

/** The longest line read, characters: a centreline or line row is tens of characters. */
export const MAX_ROW_CHARS = 64 * 1024;

/**
 * Refuses a line longer than MAX_ROW_CHARS before the tokeniser sees it: a file of numbers with no line breaks
 * would otherwise cost seconds of tokenising a million cells for a header that cannot be right.
 */
function refuseLongLines(text: string, source: string): void {
  let start = 0;
  for (let line = 1; start < text.length; line++) {
    const end = text.indexOf('\n', start);
    const stop = end < 0 ? text.length : end;
    if (stop - start > MAX_ROW_CHARS)
      throw new InputError(
        `${source}: line ${line}: a row of over ${MAX_ROW_CHARS / 1024} KiB; not a CSV of rows of numbers`,
      );
    start = stop + 1;
  }
}

/** Printable ASCII and line ends, without '"' and '#': nothing csv-parse would read other than as plain cells. */
const PLAIN_TEXT = /^[\x20\x21\x24-\x7e\r\n]*$/;

type TableRecords = { record: string[]; info: { lines: number } }[];

/** A plain CSV's records as csv-parse gives them (trimmed cells, blank lines skipped), or null if not plain. */
export function plainCsvRecords(body: string, delimiter: string): TableRecords | null {
  if (delimiter === '\t' || !PLAIN_TEXT.test(body)) return null;
  const crlf = body.includes('\r');
  const lines = body.split(crlf ? '\r\n' : '\n');
  const records: TableRecords = [];
  let width = -1;
  for (let k = 0; k < lines.length; k++) {
    const line = lines[k]!;
    // Mixed line ends are csv-parse's to read (it keeps the first kind it meets).
    if (crlf && (line.includes('\r') || line.includes('\n'))) return null;
    if (line.trim() === '') continue;
    const record = line.split(delimiter).map((cell) => cell.trim());
    if (width < 0) width = record.length;
    else if (record.length !== width) return null;
    records.push({ record, info: { lines: k + 1 } });
  }
  return records;
}

/** Any CSV through csv-parse, with its message on a malformed file. */
export function tokenisedCsvRecords(body: string, delimiter: string, source: string): TableRecords {
  try {
    return csvParseSync().parse(body, {
      delimiter,
      trim: true,
      skip_empty_lines: true,
      comment: '#',
      comment_no_infix: true,
      info: true,
    }) as unknown as TableRecords;
  } catch (error) {
    const message = error instanceof Error ? error.message.split('\n')[0] : String(error);
    throw new InputError(`${source}: malformed CSV: ${message}`);
  }
}

const NUMBER_PATTERN = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
const NON_FINITE_PATTERN = /^[+-]?(nan|inf|infinity)$/i;

export function parseCsvTable(text: string, source: string): CsvTable {
  refuseLongLines(text, source);
  let body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const headerStart = body.search(/\S/);
  if (headerStart < 0) throw new InputError(`${source}: the file is empty`);
  if (body[headerStart] === '#') body = body.slice(0, headerStart) + ' ' + body.slice(headerStart + 1);
  const headerEnd = body.indexOf('\n', headerStart);
  const headerLine = body.slice(headerStart, headerEnd < 0 ? undefined : headerEnd);
  const delimiter = headerLine.includes(',')
    ? ','
    : headerLine.includes(';')
      ? ';'
      : headerLine.includes('\t')
        ? '\t'
        : ',';
  const records = plainCsvRecords(body, delimiter) ?? tokenisedCsvRecords(body, delimiter, source);
  const first = records[0];
  if (!first) throw new InputError(`${source}: the file has no header row`);
  const header = first.record;
  return { header, rows: records.slice(1).map((r) => r.record), lines: records.slice(1).map((r) => r.info.lines) };
}

/** A cell as a finite number, or an InputError naming the file, the row (line in the file) and the column. */
export function numberCell(cell: string, source: string, line: number, column: string): number {
  const where = `${source}: row ${line}, column ${column}`;
  // A cell of megabytes (a file with no line breaks) is quoted by its start only.
  if (cell.length > 40) throw new InputError(`${where}: '${cell.slice(0, 40)}...' is not a number`);
  if (NUMBER_PATTERN.test(cell)) {
    const value = Number(cell);
    if (Number.isFinite(value)) return value;
    throw new InputError(`${where}: '${cell}' is out of range`);
  }
  if (NON_FINITE_PATTERN.test(cell)) throw new InputError(`${where}: '${cell}' is not a finite number`);
  if (cell === '') throw new InputError(`${where}: the cell is empty`);
  throw new InputError(`${where}: '${cell}' is not a number`);
}
