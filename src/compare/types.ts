// Records of the comparison: a driver's lap resampled onto the track's centreline grid, so that it and the
// reference lap share one distance axis, and the corner-by-corner result. The raw session record the readers
// produce lives below both, in src/telemetry/types.ts.

import type { Note } from '../note.js';

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
  /** Brake line pressure, Pa, where the log gives pressure (then `brake` is its share of the session's high quantile). */
  brakePressurePa?: Float64Array | null;
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

/** A stretch of the lap where the driver's grip use departs from the reference's. */
export interface GripStretch {
  startM: number;
  endM: number;
  kind: 'unused' | 'exceeded';
  /** Mean grip use of the driver over the stretch (1 = on the envelope). */
  meanGripUse: number;
  /** Length of the stretch, m (also across the start line, where endM < startM). */
  lengthM?: number;
}

/** One of the track's corners (track/corner-layout.ts) with the driver's numbers against the reference's. */
export interface CornerComparison {
  /** The corner's number in the track's one numbering (running order from the start line unless a corners file says otherwise). */
  id: number;
  name: string | null;
  entryM: number;
  apexM: number;
  exitM: number;
  /** Driver's braking point minus the reference's, m (negative = the driver brakes earlier); null when neither brakes. */
  brakingPointDeltaM: number | null;
  /** The same difference as time at the reference's speed there, s. */
  brakingPointDeltaS: number | null;
  referenceBrakingPointM: number | null;
  driverBrakingPointM: number | null;
  /** The corner's turn-in (entry), m, and each braking point as metres before it (negative: after it). */
  turnInM?: number;
  referenceBeforeTurnInM?: number | null;
  driverBeforeTurnInM?: number | null;
  /** A marker the corners file names before this corner, and the driver's braking point as metres before it. */
  markerName?: string | null;
  driverBeforeMarkerM?: number | null;
  entrySpeedDriverKph: number;
  entrySpeedReferenceKph: number;
  minSpeedDriverKph: number;
  minSpeedReferenceKph: number;
  /** Driver minus reference, km/h. */
  minSpeedDeltaKph: number;
  /** Where the driver's slowest point falls relative to the apex, m (positive = after the apex). */
  minSpeedOffsetFromApexM: number;
  exitSpeedDriverKph: number;
  exitSpeedReferenceKph: number;
  /** Time lost (positive) or gained (negative) against the reference in each phase and in all, s. */
  entryTimeLostS: number;
  middleTimeLostS: number;
  exitTimeLostS: number;
  timeLostS: number;
  /** Time with neither throttle nor brake above 5 %, s (null without pedal channels). */
  coastingS: number | null;
  meanGripUse: number;
  peakGripUse: number;
  stretches: GripStretch[];
  /** Stretch of the lap this corner owns (its approach, the corner and the run out of it), m; the corners'
   * stretches cover the lap exactly once, so their timeLostS add up to the lap-time difference. */
  ownStartM?: number;
  ownEndM?: number;
  /** Where the reference's slowest point falls relative to the apex, m (positive = after the apex). */
  referenceMinSpeedOffsetFromApexM?: number;
  /** Where the driver starts slowing without braking (lifts), m; null when the driver brakes or keeps the speed. */
  driverLiftPointM?: number | null;
  /** Driver's lift point minus the reference's point of slowing, m, where neither brakes; null otherwise. */
  liftPointDeltaM?: number | null;
  /** Coasting of the reference over the same stretch, s (null without pedal channels on the driver's side). */
  referenceCoastingS?: number | null;
  /** Mean and peak grip use of the reference through the corner, for scale. */
  referenceMeanGripUse?: number;
  referencePeakGripUse?: number;
}

/** The three phases' time lost, s: where a corner no clause describes loses its time. */
interface PhaseTimes {
  entryTimeLostS: number;
  middleTimeLostS: number;
  exitTimeLostS: number;
}

/** One clause of a finding: what it claims and its numbers, SI with the unit in each name. */
export type Claim =
  | {
      kind: 'brakes-late-and-hard';
      /** Driver's braking point minus the reference's, m; the reference's speed there, m/s. */
      brakingPointDeltaM: number;
      brakingSpeedMps: number;
      /** Why too hard: grip use over the envelope (overDriven), else the car is slowed too far. */
      overDriven: boolean;
      peakGripUse: number;
    }
  | { kind: 'lifts-before-braking-point'; brakingPointDeltaM: number; brakingSpeedMps: number }
  | { kind: 'brakes-early'; brakingPointDeltaM: number; brakingSpeedMps: number; brakingPointDeltaS: number | null }
  | { kind: 'brakes-late'; brakingPointDeltaM: number; brakingSpeedMps: number }
  | { kind: 'lifts-where-flat'; liftSpeedMps: number }
  | { kind: 'lifts-early'; liftPointDeltaM: number }
  | { kind: 'coasts'; coastingS: number }
  | { kind: 'slowest-point-low'; minSpeedDeltaMps: number; referenceMinSpeedMps: number }
  | { kind: 'slowest-point-misplaced'; minSpeedOffsetFromApexM: number; referenceMinSpeedOffsetFromApexM: number }
  | { kind: 'exit-slow'; exitSpeedDeltaMps: number }
  | { kind: 'grip-unused'; unusedLengthM: number }
  | { kind: 'over-the-limit'; peakGripUse: number }
  | ({ kind: 'loses-in-entry' | 'loses-in-middle' | 'loses-in-exit' } & PhaseTimes);

/** What a clause of a finding claims, whatever its numbers: the unit in which a finding can hold or not. */
export type ClaimKind = Claim['kind'];

/** A finding of the comparison: a corner, the time at stake and what it claims (the sentence is the report's). */
export interface Finding {
  /** Corner id, or null for a finding about the whole lap. */
  corner: number | null;
  cornerName: string | null;
  /** Estimated time at stake, s. */
  timeS: number;
  /** The main clause first (or where the corner's time goes), then up to two further observations. */
  claims: Claim[];
}

export interface ComparisonResult {
  trackName: string;
  carName: string;
  driverLapTimeS: number;
  referenceLapTimeS: number;
  /** Lap time against the reference on the driver's demonstrated envelope, when one was fitted or given. */
  demonstratedLapTimeS: number | null;
  /** Driver minus reference time at each station, s (on the track grid). */
  deltaS: Float64Array;
  /** Driver's grip use at each station, over the envelope the reference uses. */
  driverGripUse: Float64Array;
  corners: CornerComparison[];
  findings: Finding[];
  /** Notes for people (a note with speeds or distances is written in the reader's units by src/report/note-text.ts). */
  notes: Note[];
  /** Which envelope the reference above uses: the car model's or the driver's demonstrated one. */
  referenceEnvelopeKind?: string;
  /** Reference lap time on the car model's envelope (the second gap, when the reference above is the demonstrated one). */
  carModelLapTimeS?: number | null;
  /** Why the demonstrated lap above is doubtful (see the notes), when a check on it failed. */
  demonstratedCaveat?: string;
  /** Grid step of deltaS and driverGripUse, m (station i is at i * stepM). */
  stepM?: number;
}
