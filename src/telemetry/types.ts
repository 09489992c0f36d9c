// The record a telemetry reader produces and the comparison consumes: a whole logged session in SI units.
// It sits in its own folder below both src/io (which writes it) and src/compare (which reads it), so that
// neither imports the other.

import type { Note } from '../note.js';

/** A whole logged session before it is cut into laps: raw samples in time order, SI units. */
export interface TelemetrySession {
  source: string;
  count: number;
  timeS: Float64Array;
  /** NaN-free arrays where present, null where the log lacks the channel. */
  distanceM: Float64Array | null;
  speedMps: Float64Array | null;
  throttle: Float64Array | null;
  brake: Float64Array | null;
  /** Brake line pressure, Pa, where the log gives pressure; `brake` is then this over the session's high quantile. */
  brakePressurePa?: Float64Array | null;
  axMps2: Float64Array | null;
  ayMps2: Float64Array | null;
  steeringDeg: Float64Array | null;
  gear: Float64Array | null;
  rpm: Float64Array | null;
  /** Positions in the local plane, m (from x/y columns, or latitude/longitude projected). */
  xM: Float64Array | null;
  yM: Float64Array | null;
  /**
   * GPS altitude, m above mean sea level (GPX <ele>, NMEA GGA antenna altitude); absent or null where the log has
   * none. Read so that it is not dropped; GPS heights scatter several metres, so nothing uses them unsmoothed.
   */
  altitudeM?: Float64Array | null;
  /** Latitude/longitude origin of the local plane when positions came from GPS, degrees. */
  geoOrigin: { latDeg: number; lonDeg: number } | null;
  /** Messages for the user (skipped sentences, guessed units), one line each; distances as quantities. */
  notes: Note[];
}
