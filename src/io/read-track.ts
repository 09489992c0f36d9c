// Reads a track file into the TrackGrid: a centreline CSV or a segment JSON, chosen by extension (by content
// when the extension says neither). All validation of track input happens here, at the edge.

import { readFileSync } from 'node:fs';
import path from 'node:path';
import { InputError } from '../errors.js';
import type { TrackGrid } from '../track/types.js';
import { parseTrackCsv } from './track-csv.js';
import { parseTrackJson } from './track-json.js';

export interface TrackReadOptions {
  /** Grid step, m (the actual step fits the length exactly). */
  stepM: number;
  /** Our column name -> the file's column name. */
  columns: Record<string, string>;
  /** Full width where the file gives none, split evenly; null = none. */
  widthM: number | null;
  layout: 'auto' | 'closed' | 'open';
  /** Shortest wavelength kept by the centreline smoothing, m; null = the default (30 m); 0 = no smoothing. */
  smoothingM: number | null;
}

export function readTrackFile(file: string, options: TrackReadOptions): TrackGrid {
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    const reason = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'is a directory' : code === 'EACCES' ? 'permission denied' : (code ?? 'unreadable');
    throw new InputError(`${file}: cannot read the track file (${reason})`);
  }
  return parseTrackText(text, file, options);
}

export function parseTrackText(text: string, source: string, options: TrackReadOptions): TrackGrid {
  const extension = path.extname(source).toLowerCase();
  const isJson = extension === '.json' || (extension !== '.csv' && text.trimStart().startsWith('{'));
  return isJson ? parseTrackJson(text, source, options) : parseTrackCsv(text, source, options);
}
