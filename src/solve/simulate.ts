// The library's main entry: the quasi-steady-state reference lap of a car on a track (or on a racing line).

import type { Ambient, Car } from '../car/types.js';
import type { Envelope } from '../car/envelope.js';
import type { Path, TrackGrid } from '../track/types.js';
import type { LapResult } from './types.js';
import { ambientFrom } from '../car/ambient.js';
import { buildEnvelope } from '../car/build-envelope.js';
import { solveSpeedProfile } from './speed-profile.js';
import { lapChannels } from './channels.js';
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

export function simulate(track: TrackGrid, car: Car, options: SimulateOptions = {}): LapResult {
  validateTrackGrid(track, 'simulate: track');
  validateCar(car, 'simulate: car');
  const ambient = options.ambient ?? ambientFrom();
  const envelope = options.envelope ?? buildEnvelope(car, ambient);
  const path = options.path ?? centrelinePath(track);
  if (options.path) validatePath(options.path, track.distanceM.length, 'simulate: options.path');
  const profile = solveSpeedProfile(path, envelope, {
    startSpeedMps: options.startSpeedMps ?? 0,
    shiftTimeS: car.powertrain.gearing?.shiftTimeS ?? 0,
    road: roadTermsOf(track),
  });
  const { trace, lapTimeS, lengthM } = lapChannels(
    path,
    envelope,
    profile.speedMps,
    profile.cornerLimitMps,
    track.distanceM,
    profile.shift,
  );
  let maxSpeedMps = -Infinity;
  let minSpeedMps = Infinity;
  for (let i = 0; i < trace.count; i++) {
    const speed = trace.speedMps[i]!;
    if (speed > maxSpeedMps) maxSpeedMps = speed;
    if (speed < minSpeedMps) minSpeedMps = speed;
  }
  return {
    trace,
    lapTimeS,
    lengthM,
    maxSpeedMps,
    minSpeedMps,
    brakingZones: zonesByCorner(findBrakingZones(trace), track),
    corners: cornerLayoutOf(track),
    track,
    path,
    envelopeKind: envelope.kind,
  };
}
