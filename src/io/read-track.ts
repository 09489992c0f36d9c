// Reads a track file into the TrackGrid: a centreline CSV or a segment JSON, chosen by extension (by content
// when the extension says neither). All validation of track input happens here, at the edge.

import { readTextFile } from './read-text.js';
import path from 'node:path';
import type { TrackGrid } from '../track/types.js';
import { parseTrackCsv } from './track-csv.js';
import { parseTrackJson } from './track-json.js';
import { DEFAULT_TRACK_READ_OPTIONS, type TrackReadOptions } from './track-read-options.js';

/** Options left out take their defaults (1 m step, no column mapping, widths from the file, layout from the file). */
export function readTrackFile(file: string, options: Partial<TrackReadOptions> = {}): TrackGrid {
  return parseTrackText(readTextFile(file, 'track file', 'track'), file, options);
}

export function parseTrackText(
  text: string,
  source: string,
  partialOptions: Partial<TrackReadOptions> = {},
): TrackGrid {
  const options: TrackReadOptions = { ...DEFAULT_TRACK_READ_OPTIONS, ...partialOptions };
  const extension = path.extname(source).toLowerCase();
  const isJson = extension === '.json' || (extension !== '.csv' && text.trimStart().startsWith('{'));
  return isJson ? parseTrackJson(text, source, options) : parseTrackCsv(text, source, options);
}
