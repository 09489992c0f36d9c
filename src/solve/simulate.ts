// The library's main entry: the quasi-steady-state reference lap of a car on a track (or on a racing line).

import type { Ambient, Car } from '../car/types.js';
import type { Envelope } from '../car/envelope.js';
import type { Path, TrackGrid } from '../track/types.js';
import type { BrakingZone, LapResult } from './types.js';
import { ambientFrom } from '../car/ambient.js';
import { buildEnvelope } from '../car/build-envelope.js';
import { solveSpeedProfile } from './speed-profile.js';
import { lapChannels, lapTimeAndBrake } from './channels.js';
import { findBrakingZones } from './braking-zones.js';
import { centrelinePath } from '../track/resample.js';
import { cornerLayoutOf } from '../track/corner-layout.js';
import { zonesByCorner } from './corner-zones.js';
import { roadProfileOf } from '../track/road-profile.js';
import { roadTerms } from './road-terms.js';
import { validateCar } from '../car/validate.js';
import { validatePath, validateTrackGrid } from '../track/validate-grid.js';

export interface SimulateOptions {
  /** Air conditions; ISA sea level when omitted. */
  ambient?: Ambient;
  /** Use this envelope instead of the car model's (e.g. one fitted to a driver's data). */
  envelope?: Envelope;
  /** Drive this path (a racing line) instead of the centreline; sampled on the track's grid. */
  path?: Path;
  /** Speed at the start of an open track, m/s (default 0). */
  startSpeedMps?: number;
}

/** The road's terms for the solver, or null on a flat track (no heights, no bank). */
function roadTermsOf(track: TrackGrid) {
  const profile = roadProfileOf(track);
  return profile ? roadTerms(profile) : null;
}

/** The speed profile on the path the options ask for, with the envelope and path it was solved on; `caller` names
 * the entry point in the messages of a record that fails its checks. */
function solveOn(track: TrackGrid, car: Car, options: SimulateOptions, caller: string) {
  validateTrackGrid(track, `${caller}: track`);
  validateCar(car, `${caller}: car`);
  const ambient = options.ambient ?? ambientFrom();
  const envelope = options.envelope ?? buildEnvelope(car, ambient);
  const path = options.path ?? centrelinePath(track);
  if (options.path) validatePath(options.path, track.distanceM.length, `${caller}: options.path`);
  const profile = solveSpeedProfile(path, envelope, {
    startSpeedMps: options.startSpeedMps ?? 0,
    shiftTimeS: car.powertrain.gearing?.shiftTimeS ?? 0,
    road: roadTermsOf(track),
  });
  return { envelope, path, profile };
}

/** The lap time and the braking points of simulate() without its other channels (lap-time mode). */
export interface LapTimeResult {
  lapTimeS: number;
  /** Length of the driven path, m. */
  lengthM: number;
  /** Speed at each sample, m/s, as simulate()'s trace has it. */
  speedMps: Float64Array;
  /** Where the brakes come on and the slowest point after, as simulate() finds them (not yet matched to corners). */
  brakingZones: BrakingZone[];
  path: Path;
  track: TrackGrid;
}

/**
 * The same passes as simulate() and the same lap time and braking zones, without the channels a driver reads
 * (throttle, grip use, gear and the rest): what a setup sweep or the line search needs from each of its many laps.
 */
export function simulateLapTime(track: TrackGrid, car: Car, options: SimulateOptions = {}): LapTimeResult {
  const { envelope, path, profile } = solveOn(track, car, options, 'simulateLapTime');
  const { lapTimeS, lengthM, brake } = lapTimeAndBrake(path, envelope, profile);
  const brakingZones = brakingZonesOf(path, track, profile.speedMps, brake);
  return { lapTimeS, lengthM, speedMps: profile.speedMps, brakingZones, path, track };
}

/** The braking zones of a lap, from a record of the one shape every caller of findBrakingZones builds (the
 * comparison's too): a lap's full trace in its place made the finder's reads polymorphic, and the first lap-time
 * lap after a full one threw its compiled code away. */
function brakingZonesOf(path: Path, track: TrackGrid, speedMps: Float64Array, brake: Float64Array): BrakingZone[] {
  return findBrakingZones({ closed: path.closed, count: speedMps.length, speedMps, stationM: track.distanceM, brake });
}

/** The largest of `sign` x each value. A loop of its own that ends on a plain return: V8 compiles a long loop while
 * it runs (on-stack replacement), and a caller holding the loop was sent back to the interpreter on every call once
 * a track of another shape (a three-dimensional one) had run. */
function largestOf(values: Float64Array, sign = 1): number {
  let largest = -Infinity;
  for (let i = 0; i < values.length; i++) if (sign * values[i]! > largest) largest = sign * values[i]!;
  return largest;
}

export function simulate(track: TrackGrid, car: Car, options: SimulateOptions = {}): LapResult {
  const { envelope, path, profile } = solveOn(track, car, options, 'simulate');
  const { trace, lapTimeS, lengthM } = lapChannels(path, envelope, profile, track.distanceM);
  return {
    trace,
    lapTimeS,
    lengthM,
    maxSpeedMps: largestOf(trace.speedMps),
    minSpeedMps: -largestOf(trace.speedMps, -1),
    brakingZones: zonesByCorner(brakingZonesOf(path, track, trace.speedMps, trace.brake), track),
    corners: cornerLayoutOf(track),
    track,
    path,
    envelopeKind: envelope.kind,
  };
}
