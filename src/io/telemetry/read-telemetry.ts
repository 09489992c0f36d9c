// Entry point for driver logs: sniffs the format and hands the text or the stream to its reader. CSV files are
// streamed through the row pipeline (whole sessions here, chunks in stream.ts); GPS logs are small.

import { readFile } from 'node:fs/promises';
import { InputError } from '../../errors.js';
import { guardInputFile } from '../input-file.js';
import { checkSessionRanges } from './session-ranges.js';
import type { TelemetrySession } from '../../telemetry/types.js';
import { parseCsvText, readCsvFile } from './csv.js';
import { readTelemetryHead, sniffTelemetryFormat } from './format.js';
import { parseGpxText } from './gpx.js';
import { parseNmeaText } from './nmea.js';

export { sniffTelemetryFormat, type TelemetryFormat } from './format.js';
export { streamTelemetryCsv, type TelemetryStreamOptions } from './stream.js';
export { CHUNK_ROWS, type TelemetryChannel, type TelemetryChunk, type TelemetryStreamSummary } from './chunk.js';

export interface TelemetryReadOptions {
  /** Canonical channel name (time_s, speed_kph, ...) -> the file's header. */
  columns: Record<string, string>;
}

export function parseTelemetryText(text: string, source: string, options: TelemetryReadOptions): TelemetrySession {
  if (text.replace(/^\uFEFF/, '').trim() === '') throw new InputError(`${source}: empty file`);
  const format = sniffTelemetryFormat(text.slice(0, 65536), source);
  if (format === 'gpx') return checkSessionRanges(parseGpxText(text, source));
  if (format === 'nmea') return checkSessionRanges(parseNmeaText(text, source));
  return checkSessionRanges(parseCsvText(text, source, options.columns));
}

export async function readTelemetryFile(file: string, options: TelemetryReadOptions): Promise<TelemetrySession> {
  const head = await readTelemetryHead(file);
  const format = sniffTelemetryFormat(head, file);
  if (format === 'csv') return checkSessionRanges(await readCsvFile(file, head, options.columns));
  guardInputFile(file, 'GPS log', 'gpsLog');
  const text = await readFile(file, 'utf8');
  return checkSessionRanges(format === 'gpx' ? parseGpxText(text, file) : parseNmeaText(text, file));
}
