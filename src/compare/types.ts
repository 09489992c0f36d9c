// Records that flow from the telemetry readers to the comparison: a driver's lap resampled onto the
// track's centreline grid, so that it and the reference lap share one distance axis.

/** One lap of the driver, on the track's distance grid (same length as TrackGrid.distanceM). */
export interface DriverLap {
  /** File it came from and the lap's number within the session (1 = first complete lap). */
  source: string;
  lapNumber: number;
  lapTimeS: number;
  /** Elapsed time since the start/finish line at each centreline station, s (0 at station 0). */
  timeS: Float64Array;
  speedMps: Float64Array;
  /** 0-1; null where the log has no such channel. */
  throttle: Float64Array | null;
  brake: Float64Array | null;
  /** Longitudinal and lateral acceleration, m/s^2 (measured, or derived where the log has none). */
  axMps2: Float64Array;
  ayMps2: Float64Array;
  steeringDeg: Float64Array | null;
  gear: Float64Array | null;
  rpm: Float64Array | null;
  /** Driver's position in the track's plane, m; null where the log has no positions. */
  xM: Float64Array | null;
  yM: Float64Array | null;
  /** Which channels were measured and which derived, for the report. */
  derivedChannels: string[];
}

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
  axMps2: Float64Array | null;
  ayMps2: Float64Array | null;
  steeringDeg: Float64Array | null;
  gear: Float64Array | null;
  rpm: Float64Array | null;
  /** Positions in the local plane, m (from x/y columns, or latitude/longitude projected). */
  xM: Float64Array | null;
  yM: Float64Array | null;
  /** Latitude/longitude origin of the local plane when positions came from GPS, degrees. */
  geoOrigin: { latDeg: number; lonDeg: number } | null;
  /** Messages for the user (skipped sentences, guessed units), one line each. */
  notes: string[];
}
