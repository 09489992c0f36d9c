// Tells what a file is from its name and first bytes: a car or a segment track (JSON), a centreline (CSV with
// x_m, y_m and no time), or a driver log (GPX, NMEA 0183, or CSV with a time column).

import { extname } from 'node:path';
import { looksLikeGpx, looksLikeNmea } from '../io/telemetry/sniff.js';
import { recogniseHeader } from '../io/telemetry/columns.js';
import { loggerLayout } from '../io/telemetry/logger-preamble.js';

export type FileKind =
  'car' | 'track-json' | 'track-csv' | 'telemetry-csv' | 'telemetry-nmea' | 'telemetry-gpx' | 'unknown';

export const KIND_LABELS: Record<FileKind, string> = {
  car: 'car JSON',
  'track-json': 'segment track JSON',
  'track-csv': 'centreline CSV',
  'telemetry-csv': 'telemetry CSV',
  'telemetry-nmea': 'NMEA 0183 log',
  'telemetry-gpx': 'GPX log',
  unknown: 'unknown',
};

const CAR_KEYS = ['massKg', 'tyre', 'aero', 'powertrain'];
const TRACK_KEYS = ['segments', 'closed'];

/** The kind of a file's content; `head` is its first bytes as text (64 KiB is plenty). */
export function detectKind(head: string, source: string): FileKind {
  const text = head.replace(/^\uFEFF/, '');
  const extension = extname(source).toLowerCase();
  if (extension === '.gpx' || looksLikeGpx(text)) return 'telemetry-gpx';
  if (extension === '.nmea' || looksLikeNmea(text)) return 'telemetry-nmea';
  const start = text.trimStart();
  if (extension === '.json' || start.startsWith('{')) {
    // Key names near the top tell a car from a track even when the JSON itself is broken.
    const carScore = CAR_KEYS.filter((key) => text.includes(`"${key}"`)).length;
    const trackScore = TRACK_KEYS.filter((key) => text.includes(`"${key}"`)).length;
    if (carScore === 0 && trackScore === 0) return 'unknown';
    return carScore >= trackScore ? 'car' : 'track-json';
  }
  const lines = start.split(/\r?\n/);
  // A logger's preamble of key/value lines comes before its header (logger-preamble.ts).
  const logger = loggerLayout(lines);
  const firstLine = lines[logger ? logger.headerIndex : 0] ?? '';
  if (firstLine === '') return 'unknown';
  const names = firstLine
    .replace(/^#\s*/, '')
    .split(/[,;\t]/)
    .map((name) => name.trim().replace(/^"|"$/g, ''));
  if (names.some((name) => recogniseHeader(name)?.quantity === 'time')) return 'telemetry-csv';
  if (names.includes('x_m') && names.includes('y_m')) return 'track-csv';
  return 'unknown';
}
