// The reference lap as the solver returns it: per-sample traces on the track's distance grid, and the braking zones.

import type { Path, TrackGrid } from '../track/types.js';
import type { CornerLayout } from '../track/corner-layout.js';

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

/** A braking zone with the corner it serves, in the track's one corner numbering. */
export interface CornerZone extends BrakingZone {
  /** Number of the corner served; 0 where the track has no corners. */
  corner: number;
  cornerName: string | null;
  /** Unique within the lap: 'c3', or 'c3b' for a second zone serving corner 3 (a lift before the brakes). */
  tag: string;
  /** The served corner's turn-in (its entry), m along the centreline. */
  turnInM: number | null;
  /** Where the brakes come on as metres before that turn-in, m (negative: braking starts after it). */
  beforeTurnInM: number | null;
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
  /** Share of the engine's drive at this speed and gear in use, 0-1, as the pedal shows it. */
  throttle: Float64Array;
  /** Share of the tyres' braking (left beside the cornering) in use, 0-1. */
  brake: Float64Array;
  /** Tyres' share of their friction limit in use (1 = at the limit); the engine's limit is not part of it. */
  gripUse: Float64Array;
  /** 1 where the engine's full drive is in use (held back by power, not grip), else 0. */
  powerLimited: Uint8Array;
  /** Corner-limit speed at each sample, m/s (the quasi-steady-state bound). */
  cornerLimitMps: Float64Array;
  /** Gear in use, 0 where the car has no gears. */
  gear: Int8Array;
  /** 1 during an upshift's gap in drive, else 0. */
  shift: Uint8Array;
  hasGears: boolean;
}

export interface LapResult {
  trace: LapTrace;
  lapTimeS: number;
  /** Length of the driven path, m. */
  lengthM: number;
  maxSpeedMps: number;
  minSpeedMps: number;
  brakingZones: CornerZone[];
  /** The track's corners and sectors, numbered as every command and report numbers them. */
  corners: CornerLayout;
  track: TrackGrid;
  path: Path;
  envelopeKind: string;
}
