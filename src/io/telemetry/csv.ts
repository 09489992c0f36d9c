// Telemetry CSV: dialect sniffed from the head of the file (separator, decimal comma, a '#'-prefixed header),
// tokenised by csv-parse, and streamed so that only the recognised numeric channels are kept, each in a
// growable Float64Array.

import { createReadStream } from 'node:fs';
import { parse as parseStream, type Options } from 'csv-parse';
import { parse as parseSync } from 'csv-parse/sync';
import { InputError } from '../../errors.js';
import type { TelemetrySession } from '../../compare/types.js';
import { bindColumns, type ColumnBinding, type Quantity } from './columns.js';
import { GrowableFloat64 } from './growable.js';
import { buildSession, type RawChannel } from './session.js';

export interface CsvDialect {
  delimiter: string;
  decimalComma: boolean;
  /** 1-based line of the header. */
  headerLine: number;
}

const MISSING = new Set(['', 'nan', 'na', 'n/a', 'null', '-', '--']);

/** Reads the separator, the decimal mark and the header's line from the first lines of the file. */
export function sniffDialect(head: string, source: string): CsvDialect {
  const lines = head.replace(/^\uFEFF/, '').split(/\r?\n/);
  let headerIndex = -1;
  for (let i = 0; i < lines.length; i++) {
    const line = lines[i]!.trim();
    if (line === '') continue;
    if (line.startsWith('#')) {
      // A '#' line right before the first data line is the header (the track CSVs write it so); other '#' lines are comments.
      const next = lines.slice(i + 1).find((candidate) => candidate.trim() !== '');
      if (next !== undefined && !next.trim().startsWith('#') && looksNumeric(next)) {
        headerIndex = i;
        break;
      }
      continue;
    }
    headerIndex = i;
    break;
  }
  if (headerIndex < 0) throw new InputError(`${source}: empty file (no header)`);
  const header = lines[headerIndex]!;
  const delimiter = header.includes('\t') ? '\t' : header.includes(';') ? ';' : ',';
  let decimalComma = false;
  if (delimiter !== ',') {
    const pattern = /^\s*"?[-+]?\d+,\d+"?\s*$/;
    for (const line of lines.slice(headerIndex + 1, headerIndex + 40)) {
      if (line.split(delimiter).some((field) => pattern.test(field))) {
        decimalComma = true;
        break;
      }
    }
  }
  return { delimiter, decimalComma, headerLine: headerIndex + 1 };
}

function looksNumeric(line: string): boolean {
  const first = line.split(/[,;\t]/)[0]!.trim().replace(/^"|"$/g, '').replace(',', '.');
  return first !== '' && Number.isFinite(Number(first));
}

/** Collects rows into channel buffers; the first record is the header. */
class CsvCollector {
  private bindings: ColumnBinding[] = [];
  private buffers: GrowableFloat64[] = [];
  private headers: string[] = [];
  private ignored: string[] = [];
  private rows = 0;
  private firstDataLine = 0;
  private readonly lineOfRow: number[] = [];

  constructor(
    private readonly source: string,
    private readonly dialect: CsvDialect,
    private readonly mapping: Record<string, string>,
  ) {}

  private records = 0;

  /** One parsed record; its line is counted here (blank lines arrive as one empty field). */
  record(cells: string[]): void {
    const line = this.dialect.headerLine + this.records++;
    if (cells.length === 1 && cells[0]!.trim() === '') return;
    if (this.headers.length === 0) {
      const headers = cells.map((cell, index) => (index === 0 ? cell.replace(/^\uFEFF/, '').replace(/^\s*#\s*/, '') : cell).trim());
      this.headers = headers;
      const { bindings, ignored } = bindColumns(headers, this.mapping, this.source);
      this.bindings = bindings;
      this.ignored = ignored;
      this.buffers = bindings.map(() => new GrowableFloat64());
      return;
    }
    if (this.rows === 0) this.firstDataLine = line;
    // Lines are recorded only when they stop following rows one to one (blank lines, quoted line breaks).
    if (this.lineOfRow.length > 0 || line !== this.firstDataLine + this.rows) {
      if (this.lineOfRow.length === 0) for (let r = 0; r < this.rows; r++) this.lineOfRow.push(this.firstDataLine + r);
      this.lineOfRow.push(line);
    }
    const decimalComma = this.dialect.decimalComma;
    for (let b = 0; b < this.bindings.length; b++) {
      const binding = this.bindings[b]!;
      const cell = cells[binding.index];
      let value: number;
      if (cell === undefined || cell.length === 0) value = NaN;
      else {
        // Number() trims white space itself; only a failed parse looks further (missing-value markers, text).
        value = Number(decimalComma ? cell.replace(',', '.') : cell);
        if (value === 0 && cell.trim() === '') value = NaN;
        else if (!Number.isFinite(value)) {
          if (!MISSING.has(cell.trim().toLowerCase())) {
            const shown = cell.length > 40 ? `${cell.slice(0, 40)}...` : cell;
            throw new InputError(`${this.source}: line ${line}, column ${binding.header}: '${shown}' is not a number`);
          }
          value = NaN;
        }
      }
      this.buffers[b]!.push(value);
    }
    this.rows++;
  }

  finish(notes: string[]): TelemetrySession {
    if (this.headers.length === 0) throw new InputError(`${this.source}: empty file (no header)`);
    if (this.rows === 0) {
      const listed = this.headers.join(', ');
      const shown = listed.length > 200 ? `${listed.slice(0, 200)}... (${this.headers.length} columns)` : listed;
      throw new InputError(`${this.source}: header only, no data rows (header: ${shown})`);
    }
    const channels = new Map<Quantity, RawChannel>();
    this.bindings.forEach((binding, b) => {
      channels.set(binding.quantity, { values: this.buffers[b]!.toArray(), header: binding.header, scale: binding.scale });
    });
    if (this.ignored.length > 0) notes.push(`columns not used: ${this.ignored.join(', ')}`);
    if (this.dialect.decimalComma) notes.push('decimal commas read');
    const lineOfRow = this.lineOfRow;
    const firstDataLine = this.firstDataLine;
    return buildSession({
      source: this.source,
      channels,
      placeOfSample: (index) => `line ${lineOfRow.length > 0 ? lineOfRow[index] : firstDataLine + index}`,
      found: this.headers,
      notes,
    });
  }
}

function parserOptions(dialect: CsvDialect): Options {
  return {
    delimiter: dialect.delimiter,
    bom: true,
    from_line: dialect.headerLine,
    relax_column_count: true,
    relax_quotes: true,
    // Blank lines come through as records so that line numbers stay exact (quoted line breaks aside).
    skip_empty_lines: false,
  };
}

/** Wraps csv-parse's own errors (unclosed quotes and the like) as one-line input errors; passes ours through. */
function asInputError(error: unknown, source: string): Error {
  if (error instanceof InputError) return error;
  const cause = (error as { cause?: unknown }).cause;
  if (cause instanceof InputError) return cause;
  const message = error instanceof Error ? error.message.split('\n')[0] : String(error);
  return new InputError(`${source}: cannot read as CSV: ${message}`);
}

export function parseCsvText(text: string, source: string, mapping: Record<string, string>): TelemetrySession {
  const dialect = sniffDialect(text.slice(0, 65536), source);
  const collector = new CsvCollector(source, dialect, mapping);
  try {
    for (const record of parseSync(text, parserOptions(dialect)) as string[][]) collector.record(record);
  } catch (error) {
    throw asInputError(error, source);
  }
  return collector.finish([]);
}

/** Streams the file through csv-parse; `head` is the file's first bytes, already read for sniffing. */
export async function readCsvFile(file: string, head: string, mapping: Record<string, string>): Promise<TelemetrySession> {
  const dialect = sniffDialect(head, file);
  const collector = new CsvCollector(file, dialect, mapping);
  const parser = parseStream(parserOptions(dialect));
  try {
    const input = createReadStream(file, { highWaterMark: 1 << 20 });
    await new Promise<void>((resolve, reject) => {
      input.on('error', reject);
      parser.on('error', reject);
      parser.on('data', (record: string[]) => {
        try {
          collector.record(record);
        } catch (error) {
          input.destroy();
          parser.destroy();
          reject(error);
        }
      });
      parser.on('end', () => resolve());
      input.pipe(parser);
    });
  } catch (error) {
    throw asInputError(error, file);
  }
  return collector.finish([]);
}
