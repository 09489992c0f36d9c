// Entry point for driver logs: sniffs the format (GPX by extension or '<gpx', NMEA 0183 by '$' sentences,
// else CSV) and hands the text or the stream to its reader. CSV files are streamed; GPS logs are small.

import { open, readFile } from 'node:fs/promises';
import { extname } from 'node:path';
import { InputError } from '../../errors.js';
import type { TelemetrySession } from '../../compare/types.js';
import { parseCsvText, readCsvFile } from './csv.js';
import { looksLikeGpx, parseGpxText } from './gpx.js';
import { looksLikeNmea, parseNmeaText } from './nmea.js';

export interface TelemetryReadOptions {
  /** Canonical channel name (time_s, speed_kph, ...) -> the file's header. */
  columns: Record<string, string>;
}

export type TelemetryFormat = 'csv' | 'nmea' | 'gpx';

export function sniffTelemetryFormat(head: string, source: string): TelemetryFormat {
  const extension = extname(source).toLowerCase();
  if (extension === '.gpx' || looksLikeGpx(head)) return 'gpx';
  if (extension === '.nmea' || looksLikeNmea(head)) return 'nmea';
  return 'csv';
}

export function parseTelemetryText(text: string, source: string, options: TelemetryReadOptions): TelemetrySession {
  if (text.replace(/^\uFEFF/, '').trim() === '') throw new InputError(`${source}: empty file`);
  const format = sniffTelemetryFormat(text.slice(0, 65536), source);
  if (format === 'gpx') return parseGpxText(text, source);
  if (format === 'nmea') return parseNmeaText(text, source);
  return parseCsvText(text, source, options.columns);
}

export async function readTelemetryFile(file: string, options: TelemetryReadOptions): Promise<TelemetrySession> {
  let head: string;
  try {
    const handle = await open(file, 'r');
    try {
      const buffer = Buffer.alloc(65536);
      const { bytesRead } = await handle.read(buffer, 0, buffer.length, 0);
      head = buffer.subarray(0, bytesRead).toString('utf8');
    } finally {
      await handle.close();
    }
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    throw new InputError(`${file}: cannot read the telemetry file (${code ?? String(error)})`);
  }
  if (head.replace(/^\uFEFF/, '').trim() === '') throw new InputError(`${file}: empty file`);
  const format = sniffTelemetryFormat(head, file);
  if (format === 'csv') return readCsvFile(file, head, options.columns);
  const text = await readFile(file, 'utf8');
  return format === 'gpx' ? parseGpxText(text, file) : parseNmeaText(text, file);
}
