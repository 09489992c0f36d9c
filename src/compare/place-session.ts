// Places a logged session's samples in the track's plane (GPS re-projected about the track's geo origin, or fitted
// onto the centreline by ICP) and projects them onto the centreline in order, unwrapped lap after lap.

import { InputError } from '../errors.js';
import type { TrackGrid } from '../track/types.js';
import type { TelemetrySession } from '../telemetry/types.js';
import { applyRigid, fitRigidToCentreline, projectPath } from '../track/project.js';
import { reprojectPlane } from '../track/geodesy.js';
import { sampledMedian } from '../numeric/quantile.js';
import { radToDeg } from '../units.js';
import { distanceOf, note, type Note } from '../note.js';

/** The session's samples in the track's plane and their place along it, computed once per session and track. */
export interface PlacedSession {
  xM: Float64Array;
  yM: Float64Array;
  /** Unwrapped distance along the track, m (keeps growing lap after lap on a closed track). */
  progressM: Float64Array;
  offsetM: Float64Array;
  gapM: Float64Array;
  medianGapM: number;
  notes: Note[];
}

/** Telemetry whose median distance to the centreline exceeds this does not belong to the track. */
export const MATCH_LIMIT_M = 25;

const placedCache = new WeakMap<TelemetrySession, WeakMap<TrackGrid, PlacedSession>>();

export function placeSession(session: TelemetrySession, track: TrackGrid): PlacedSession | null {
  if (!session.xM || !session.yM) return null;
  const cached = placedCache.get(session)?.get(track);
  if (cached) return cached;
  const notes: Note[] = [];
  let xM = session.xM;
  let yM = session.yM;
  if (session.geoOrigin && track.geoOrigin) {
    if (session.geoOrigin.latDeg !== track.geoOrigin.latDeg || session.geoOrigin.lonDeg !== track.geoOrigin.lonDeg) {
      ({ xM, yM } = reprojectPlane(xM, yM, session.geoOrigin, track.geoOrigin));
    }
  } else if (session.geoOrigin) {
    const fit = fitRigidToCentreline(track, xM, yM);
    ({ xM, yM } = applyRigid(fit, xM, yM));
    notes.push(
      note`the track has no geo origin: GPS path laid onto the centreline by a rigid fit (turned ${radToDeg(fit.rotationRad).toFixed(1)} deg, median gap ${distanceOf(fit.medianGapM, 1)})`,
    );
  }
  const path = projectPath(track, xM, yM);
  const progressM = path.alongM;
  if (track.closed) {
    // Unwrap: a step of more than half a lap backwards is a pass over the line forwards, and the reverse.
    const L = track.lengthM;
    let turns = 0;
    let previous = progressM[0]!;
    for (let i = 1; i < progressM.length; i++) {
      const along = progressM[i]!;
      const step = along - previous;
      if (step < -L / 2) turns++;
      else if (step > L / 2) turns--;
      previous = along;
      progressM[i] = along + turns * L;
    }
  }
  const medianGapM = sampledMedian(path.gapM);
  if (!(medianGapM <= MATCH_LIMIT_M)) {
    throw new InputError(
      `${session.source}: the telemetry does not match track ${track.name}: its median distance to the centreline is ${medianGapM.toFixed(0)} m (more than ${MATCH_LIMIT_M} m)`,
    );
  }
  const placed = { xM, yM, progressM, offsetM: path.offsetM, gapM: path.gapM, medianGapM, notes };
  let byTrack = placedCache.get(session);
  if (!byTrack) placedCache.set(session, (byTrack = new WeakMap()));
  byTrack.set(track, placed);
  return placed;
}
