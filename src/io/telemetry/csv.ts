// Telemetry CSV: dialect sniffed from the head of the file (separator, decimal comma, a '#'-prefixed header),
// read by the byte scanner's fast path (numeric-scan.ts) or, for quotes and other unusual dialects, tokenised
// by csv-parse (streamed from a file), and every record handed to the shared row pipeline; the session reader
// is the pipeline's consumer that keeps every chunk.

import { createReadStream } from 'node:fs';
import { open, stat } from 'node:fs/promises';
import type { Options } from 'csv-parse';
import { csvParseStream, csvParseSync } from '../lazy-libraries.js';
import { InputError } from '../../errors.js';
import type { TelemetrySession } from '../../telemetry/types.js';
import { HeldTooLong, RowPipeline } from './pipeline.js';
import { SessionAssembler } from './session.js';
import { NumericLineScanner, type ScanTarget } from './numeric-scan.js';
import { delimiterOf, loggerLayout, type LoggerLayout } from './logger-preamble.js';

export interface CsvDialect {
  delimiter: string;
  decimalComma: boolean;
  /** 1-based line of the header. */
  headerLine: number;
  /** A logger's units row under the header and its preamble above it (logger-preamble.ts); null for a plain file. */
  logger: LoggerLayout | null;
}

/** Reads the separator, the decimal mark and the header's line from the first lines of the file. */
export function sniffDialect(head: string, source: string): CsvDialect {
  const lines = head.replace(/^\uFEFF/, '').split(/\r?\n/);
  const logger = loggerLayout(lines);
  let headerIndex = logger ? logger.headerIndex : -1;
  for (let i = 0; i < lines.length && headerIndex < 0; i++) {
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
  // A separator inside a quoted header cell ("speed; km/h") is text, not the file's separator.
  const delimiter = delimiterOf(lines[headerIndex]!);
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
  return { delimiter, decimalComma, headerLine: headerIndex + 1, logger };
}

function looksNumeric(line: string): boolean {
  const first = line
    .split(/[,;\t]/)[0]!
    .trim()
    .replace(/^"|"$/g, '')
    .replace(',', '.');
  return first !== '' && Number.isFinite(Number(first));
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
    // Bounds the memory of a file with no line breaks (a disk image, gigabytes of NUL bytes).
    max_record_size: MAX_RECORD_CHARS,
  };
}

/** The longest record read, characters: far above any log's line, far below a file that has no lines. */
export const MAX_RECORD_CHARS = 16 * 1024 * 1024;

/** Wraps csv-parse's own errors (unclosed quotes and the like) as one-line input errors; passes ours through. */
function asInputError(error: unknown, source: string): Error {
  if (error instanceof InputError || error instanceof HeldTooLong) return error;
  if ((error as { code?: unknown }).code === 'CSV_MAX_RECORD_SIZE') {
    const line = (error as { lines?: unknown }).lines;
    return new InputError(
      `${source}: line ${typeof line === 'number' ? line : '?'}: a row of over ${MAX_RECORD_CHARS / 1024 / 1024} MiB; not a telemetry CSV`,
    );
  }
  const cause = (error as { cause?: unknown }).cause;
  if (cause instanceof InputError) return cause;
  const message = error instanceof Error ? error.message.split('\n')[0] : String(error);
  return new InputError(`${source}: cannot read as CSV: ${message}`);
}

/** csv-parse's records after the first `skip` (those the fast path has already handed over). */
function skipping(skip: number, target: ScanTarget): (cells: string[]) => void {
  let seen = 0;
  return (cells) => {
    if (seen++ >= skip) target.record(cells);
  };
}

/** Which reader tokenises a CSV: the byte scanner with csv-parse behind it, or csv-parse alone. */
export type CsvReader = 'fast' | 'csv-parse';

/** Hands every record of the text to the pipeline (the fast path, else csv-parse), keeping none. */
export function feedCsvText(
  text: string,
  source: string,
  dialect: CsvDialect,
  target: ScanTarget,
  reader: CsvReader = 'fast',
): void {
  try {
    const scanner = new NumericLineScanner(dialect, target);
    const bytes = Buffer.from(text, 'utf8');
    if (reader === 'fast' && scanner.scan(bytes, 0, bytes.length, true) >= 0) return;
    const feed = skipping(scanner.records, target);
    csvParseSync().parse(text, {
      ...parserOptions(dialect),
      on_record: (cells: string[]) => {
        feed(cells);
        return null;
      },
    });
  } catch (error) {
    throw asInputError(error, source);
  }
}

/** Reads the file through the byte scanner; the count of records handed over when csv-parse must take over, else null. */
async function scanCsvFile(file: string, dialect: CsvDialect, target: ScanTarget): Promise<number | null> {
  const scanner = new NumericLineScanner(dialect, target);
  const handle = await open(file, 'r');
  try {
    let buffer = Buffer.allocUnsafe(1 << 20);
    let filled = 0;
    for (;;) {
      if (filled === buffer.length) {
        // One line longer than the buffer: make room for it.
        const bigger = Buffer.allocUnsafe(buffer.length * 2);
        buffer.copy(bigger, 0, 0, filled);
        buffer = bigger;
      }
      const { bytesRead } = await handle.read(buffer, filled, buffer.length - filled, null);
      filled += bytesRead;
      const final = bytesRead === 0;
      const rest = scanner.scan(buffer, 0, filled, final);
      if (rest < 0) return scanner.records;
      if (final) return null;
      buffer.copy(buffer, 0, rest, filled);
      filled -= rest;
    }
  } finally {
    await handle.close();
  }
}

/** Streams the file's records to the pipeline (the fast path, else csv-parse); an error it throws ends the read. */
export async function feedCsvFile(file: string, dialect: CsvDialect, target: ScanTarget): Promise<void> {
  try {
    const fed = await scanCsvFile(file, dialect, target);
    if (fed !== null) await parseCsvFile(file, dialect, skipping(fed, target));
  } catch (error) {
    throw asInputError(error, file);
  }
}

/** Streams the file's records through csv-parse to `record`; an error thrown by `record` ends the read. */
async function parseCsvFile(file: string, dialect: CsvDialect, record: (cells: string[]) => void): Promise<void> {
  const parser = csvParseStream().parse(parserOptions(dialect));
  const input = createReadStream(file, { highWaterMark: 1 << 20 });
  await new Promise<void>((resolve, reject) => {
    input.on('error', reject);
    parser.on('error', reject);
    parser.on('data', (cells: string[]) => {
      try {
        record(cells);
      } catch (error) {
        input.destroy();
        parser.destroy();
        reject(error);
      }
    });
    parser.on('end', () => resolve());
    input.pipe(parser);
  });
}

function sessionPipeline(
  source: string,
  dialect: CsvDialect,
  mapping: Record<string, string>,
  assembler: SessionAssembler,
): RowPipeline {
  return new RowPipeline({
    source,
    headerLine: dialect.headerLine,
    logger: dialect.logger,
    decimalComma: dialect.decimalComma,
    mapping,
    decided: null,
    scan: null,
    mode: 'read',
    // The session holds every row anyway; rows held for a gap are no extra.
    maxHeldChunks: Infinity,
    skipRows: 0,
    sink: (chunk, layout) => assembler.add(chunk, layout),
  });
}

/**
 * Rows a file of `totalLength` probably holds, from the line length in its head, with 2 % to spare. Later rows
 * are usually a little longer (time stamps gain digits), so this errs on the high side.
 */
function expectedRows(head: string, totalLength: number): number {
  let lines = 0;
  for (let i = head.indexOf('\n'); i >= 0; i = head.indexOf('\n', i + 1)) lines++;
  if (lines === 0 || head.length === 0) return 0;
  return (totalLength / (head.length / lines)) * 1.02;
}

/** The session in a CSV text; `reader` 'csv-parse' skips the fast path (the tests hold the two equal). */
export function parseCsvText(
  text: string,
  source: string,
  mapping: Record<string, string>,
  reader: CsvReader = 'fast',
): TelemetrySession {
  const head = text.slice(0, 65536);
  const dialect = sniffDialect(head, source);
  const assembler = new SessionAssembler(source, expectedRows(head, text.length));
  const pipeline = sessionPipeline(source, dialect, mapping, assembler);
  feedCsvText(text, source, dialect, pipeline, reader);
  return assembler.finish(pipeline.finish());
}

/** Streams the file through the row pipeline into a session; `head` is the file's first bytes, already read for sniffing. */
export async function readCsvFile(
  file: string,
  head: string,
  mapping: Record<string, string>,
): Promise<TelemetrySession> {
  const dialect = sniffDialect(head, file);
  // The head is text and the size bytes: the same for ASCII logs, which nearly all are.
  const assembler = new SessionAssembler(file, expectedRows(head, (await stat(file)).size));
  const pipeline = sessionPipeline(file, dialect, mapping, assembler);
  await feedCsvFile(file, dialect, pipeline);
  return assembler.finish(pipeline.finish());
}
