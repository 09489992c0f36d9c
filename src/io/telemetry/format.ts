// Which reader a driver log needs (GPX by extension or '<gpx', NMEA 0183 by '$' sentences, else CSV), told from
// the file's name and its first 64 KiB.

import { open } from 'node:fs/promises';
import { extname } from 'node:path';
import { InputError } from '../../errors.js';
import { looksLikeGpx } from './gpx.js';
import { looksLikeNmea } from './nmea.js';

export type TelemetryFormat = 'csv' | 'nmea' | 'gpx';

export function sniffTelemetryFormat(head: string, source: string): TelemetryFormat {
  const extension = extname(source).toLowerCase();
  if (extension === '.gpx' || looksLikeGpx(head)) return 'gpx';
  if (extension === '.nmea' || looksLikeNmea(head)) return 'nmea';
  return 'csv';
}

/** The first 64 KiB of a log as text; an unreadable or empty file is an input error. */
export async function readTelemetryHead(file: string): Promise<string> {
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
  return head;
}
