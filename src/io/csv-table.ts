// Reads a CSV text into a header and rows of trimmed cells with their line numbers in the file (csv-parse does
// the tokenising). A first line starting with '#' that names the columns counts as the header; later lines
// starting with '#' are comments.

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
  let records: { record: string[]; info: { lines: number } }[];
  try {
    records = csvParseSync().parse(body, {
      delimiter,
      trim: true,
      skip_empty_lines: true,
      comment: '#',
      comment_no_infix: true,
      info: true,
    }) as unknown as typeof records;
  } catch (error) {
    const message = error instanceof Error ? error.message.split('\n')[0] : String(error);
    throw new InputError(`${source}: malformed CSV: ${message}`);
  }
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
