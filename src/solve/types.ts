// The reference lap as the solver returns it: per-sample traces on the track's distance grid, and the braking zones.

import type { Path, TrackGrid } from '../track/types.js';

export interface BrakingZone {
  /** Index and distance along the lap (path distance) where braking begins. */
  startIndex: number;
  startM: number;
  entrySpeedMps: number;
  /** Index and distance of the slowest point that follows. */
  minSpeedIndex: number;
  minSpeedAtM: number;
  minSpeedMps: number;
  /** Distance over which the brakes are on, m. */
  brakingLengthM: number;
}

export interface LapTrace {
  closed: boolean;
  /** Number of samples; every array below has this length. */
  count: number;
  /** Distance along the driven path, m (equals the centreline distance when driving the centreline). */
  distanceM: Float64Array;
  /** Distance along the centreline, m: the common grid that comparisons use. */
  stationM: Float64Array;
  timeS: Float64Array;
  speedMps: Float64Array;
  axMps2: Float64Array;
  ayMps2: Float64Array;
  curvaturePerM: Float64Array;
  throttle: Float64Array;
  brake: Float64Array;
  gripUse: Float64Array;
  /** Corner-limit speed at each sample, m/s (the quasi-steady-state bound). */
  cornerLimitMps: Float64Array;
  /** Gear in use, 0 where the car has no gears. */
  gear: Int8Array;
  hasGears: boolean;
}

export interface LapResult {
  trace: LapTrace;
  lapTimeS: number;
  /** Length of the driven path, m. */
  lengthM: number;
  maxSpeedMps: number;
  minSpeedMps: number;
  brakingZones: BrakingZone[];
  track: TrackGrid;
  path: Path;
  envelopeKind: string;
}
