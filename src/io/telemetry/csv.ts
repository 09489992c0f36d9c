// Telemetry CSV: dialect sniffed from the head of the file (separator, decimal comma, a '#'-prefixed header),
// tokenised by csv-parse (streamed from a file), and every record handed to the shared row pipeline; the
// session reader is the pipeline's consumer that keeps every chunk.

import { createReadStream } from 'node:fs';
import { stat } from 'node:fs/promises';
import { parse as parseStream, type Options } from 'csv-parse';
import { parse as parseSync } from 'csv-parse/sync';
import { InputError } from '../../errors.js';
import type { TelemetrySession } from '../../compare/types.js';
import { HeldTooLong, RowPipeline } from './pipeline.js';
import { SessionAssembler } from './session.js';

export interface CsvDialect {
  delimiter: string;
  decimalComma: boolean;
  /** 1-based line of the header. */
  headerLine: number;
}

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
  };
}

/** Wraps csv-parse's own errors (unclosed quotes and the like) as one-line input errors; passes ours through. */
function asInputError(error: unknown, source: string): Error {
  if (error instanceof InputError || error instanceof HeldTooLong) return error;
  const cause = (error as { cause?: unknown }).cause;
  if (cause instanceof InputError) return cause;
  const message = error instanceof Error ? error.message.split('\n')[0] : String(error);
  return new InputError(`${source}: cannot read as CSV: ${message}`);
}

/** Hands every record of the text to `record` as csv-parse reads it, keeping none (the text is memory enough). */
export function feedCsvText(
  text: string,
  source: string,
  dialect: CsvDialect,
  record: (cells: string[]) => void,
): void {
  try {
    parseSync(text, {
      ...parserOptions(dialect),
      on_record: (cells: string[]) => {
        record(cells);
        return null;
      },
    });
  } catch (error) {
    throw asInputError(error, source);
  }
}

/** Streams the file's records through csv-parse to `record`; an error thrown by `record` ends the read. */
export async function feedCsvFile(file: string, dialect: CsvDialect, record: (cells: string[]) => void): Promise<void> {
  const parser = parseStream(parserOptions(dialect));
  try {
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
  } catch (error) {
    throw asInputError(error, file);
  }
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

export function parseCsvText(text: string, source: string, mapping: Record<string, string>): TelemetrySession {
  const head = text.slice(0, 65536);
  const dialect = sniffDialect(head, source);
  const assembler = new SessionAssembler(source, expectedRows(head, text.length));
  const pipeline = sessionPipeline(source, dialect, mapping, assembler);
  feedCsvText(text, source, dialect, (cells) => pipeline.record(cells));
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
  await feedCsvFile(file, dialect, (cells) => pipeline.record(cells));
  return assembler.finish(pipeline.finish());
}
