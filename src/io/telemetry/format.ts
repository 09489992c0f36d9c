// Which reader a driver log needs (GPX by extension or '<gpx', NMEA 0183 by '$' sentences, else CSV), told from
// the file's name and its first 64 KiB.

import { open } from 'node:fs/promises';
import { extname } from 'node:path';
import { InputError } from '../../errors.js';
import { guardInputFile, isUtf16Le } from '../input-file.js';
import { looksLikeGpx, looksLikeNmea } from './sniff.js';

export type TelemetryFormat = 'csv' | 'nmea' | 'gpx';

export function sniffTelemetryFormat(head: string, source: string): TelemetryFormat {
  const extension = extname(source).toLowerCase();
  if (extension === '.gpx' || looksLikeGpx(head)) return 'gpx';
  if (extension === '.nmea' || looksLikeNmea(head)) return 'nmea';
  return 'csv';
}

/**
 * The head's bytes as text. A NUL byte means binary data (a disk image, a file of zeros), refused here rather than
 * after the CSV reader has gathered megabytes looking for the end of a line; UTF-16 text (its byte order mark
 * first) has NULs and is read by the CSV reader, so it passes.
 */
function textHead(bytes: Buffer, file: string): string {
  if (!isUtf16Le(bytes)) {
    const nul = bytes.indexOf(0);
    if (nul >= 0) throw new InputError(`${file}: byte ${nul + 1} is a NUL byte: binary data, not a text log`);
  }
  return bytes.toString('utf8');
}

/** The first 64 KiB of a log as text; an unreadable or empty file is an input error. */
export async function readTelemetryHead(file: string): Promise<string> {
  guardInputFile(file, 'telemetry file', 'telemetryCsv');
  let head: string;
  try {
    const handle = await open(file, 'r');
    try {
      const buffer = Buffer.alloc(65536);
      const { bytesRead } = await handle.read(buffer, 0, buffer.length, 0);
      head = textHead(buffer.subarray(0, bytesRead), file);
    } finally {
      await handle.close();
    }
  } catch (error) {
    if (error instanceof InputError) throw error;
    const code = (error as NodeJS.ErrnoException).code;
    throw new InputError(`${file}: cannot read the telemetry file (${code ?? String(error)})`);
  }
  if (head.replace(/^\uFEFF/, '').trim() === '') throw new InputError(`${file}: empty file`);
  return head;
}
