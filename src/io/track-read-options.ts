// How a track file is read: grid step, column mapping, width and layout where the file gives none, smoothing.
// Its own module because the format readers (track-csv.ts, track-json.ts) and their dispatcher (read-track.ts)
// all take it, and the dispatcher imports the format readers.

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

export const DEFAULT_TRACK_READ_OPTIONS: TrackReadOptions = {
  stepM: 1,
  columns: {},
  widthM: null,
  layout: 'auto',
  smoothingM: null,
};
