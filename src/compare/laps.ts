// Cuts a logged session into laps at the start/finish line. With positions: the samples are placed in the
// track's plane (GPS re-projected about the track's geo origin, or fitted onto the centreline by ICP), projected
// onto the centreline in order, and laps are counted where the unwrapped distance along the track passes the line.
// Without positions: at the resets of the lap-distance channel, or the whole file as one lap.

import { InputError } from '../errors.js';
import type { TrackGrid } from '../track/types.js';
import type { TelemetrySession } from './types.js';
import { applyRigid, fitRigidToCentreline, projectGlobal, projectPath, emptyProjection } from '../track/project.js';
import { reprojectPlane } from '../io/telemetry/geo.js';

export interface LapCut {
  /** Lap 1 runs from the first line crossing to the second; lap 0 is the part before the first crossing (the
   * out lap). When that part is itself a full lap (the log starts just after the line), it is lap 1. */
  lapNumber: number;
  /** Sample range holding the lap: the last sample at or before its start, the first at or after its end. */
  startIndex: number;
  endIndex: number;
  lapTimeS: number;
  complete: boolean;
  /** Why an incomplete lap is left out, or how a complete one was finished (extrapolated ends). */
  reason?: string;
  /** Session times of the lap's start and end at the line, s (interpolated, or extrapolated at a log's end). */
  startTimeS?: number;
  endTimeS?: number;
  /** Distance of the line along the centreline, m (0 = the track's start). */
  startFinishM?: number;
  /** Progress value at the lap's start: unwrapped distance along the track (positions), or scaled distance channel. */
  progressStartM?: number;
  /** Factor from the session's distance channel to track metres (laps cut without positions). */
  distanceScale?: number;
}

export interface CutOptions {
  startFinish?: { xM: number; yM: number };
}

/** The session's samples in the track's plane and their place along it, computed once per session and track. */
export interface PlacedSession {
  xM: Float64Array;
  yM: Float64Array;
  /** Unwrapped distance along the track, m (keeps growing lap after lap on a closed track). */
  progressM: Float64Array;
  offsetM: Float64Array;
  gapM: Float64Array;
  medianGapM: number;
  notes: string[];
}

/** Telemetry whose median distance to the centreline exceeds this does not belong to the track. */
export const MATCH_LIMIT_M = 25;
/** A lap must pass at least this share of the stations on the track. */
export const MIN_COVERAGE = 0.95;
/** Longest stretch off the track a complete lap may have, m. */
export const MAX_OFF_TRACK_M = 25;
/** Margin beyond the track's edge (or distance from the centreline where widths are unknown) still on track, m. */
const EDGE_MARGIN_M = 5;
const NO_WIDTH_LIMIT_M = 15;

const placedCache = new WeakMap<TelemetrySession, WeakMap<TrackGrid, PlacedSession>>();

export function placeSession(session: TelemetrySession, track: TrackGrid): PlacedSession | null {
  if (!session.xM || !session.yM) return null;
  const cached = placedCache.get(session)?.get(track);
  if (cached) return cached;
  const notes: string[] = [];
  let xM = session.xM;
  let yM = session.yM;
  if (session.geoOrigin && track.geoOrigin) {
    if (session.geoOrigin.latDeg !== track.geoOrigin.latDeg || session.geoOrigin.lonDeg !== track.geoOrigin.lonDeg) {
      ({ xM, yM } = reprojectPlane(xM, yM, session.geoOrigin, track.geoOrigin));
    }
  } else if (session.geoOrigin) {
    const fit = fitRigidToCentreline(track, xM, yM);
    ({ xM, yM } = applyRigid(fit, xM, yM));
    notes.push(`the track has no geo origin: GPS path laid onto the centreline by a rigid fit (turned ${((fit.rotationRad * 180) / Math.PI).toFixed(1)} deg, median gap ${fit.medianGapM.toFixed(1)} m)`);
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
  const medianGapM = medianOf(path.gapM);
  if (!(medianGapM <= MATCH_LIMIT_M)) {
    throw new InputError(`${session.source}: the telemetry does not match track ${track.name}: its median distance to the centreline is ${medianGapM.toFixed(0)} m (more than ${MATCH_LIMIT_M} m)`);
  }
  const placed = { xM, yM, progressM, offsetM: path.offsetM, gapM: path.gapM, medianGapM, notes };
  let byTrack = placedCache.get(session);
  if (!byTrack) placedCache.set(session, (byTrack = new WeakMap()));
  byTrack.set(track, placed);
  return placed;
}

export function cutLaps(session: TelemetrySession, track: TrackGrid, options: CutOptions = {}): { laps: LapCut[]; notes: string[] } {
  const placed = placeSession(session, track);
  const result = placed ? cutByPosition(session, track, placed, options) : cutByDistance(session, track);
  if (placed) result.notes.unshift(...placed.notes);
  for (const lap of result.laps) {
    if (!lap.complete) result.notes.push(`lap ${lap.lapNumber} left out: ${lap.reason}`);
    else if (lap.reason) result.notes.push(`lap ${lap.lapNumber}: ${lap.reason}`);
  }
  return result;
}

/** Where the line lies along the centreline: station 0, or the projection of the given point. */
function startFinishAlong(track: TrackGrid, options: CutOptions, source: string): number {
  if (!options.startFinish) return 0;
  const projection = emptyProjection();
  projectGlobal(track, options.startFinish.xM, options.startFinish.yM, projection);
  if (projection.gapM > MATCH_LIMIT_M) {
    throw new InputError(`${source}: --start-finish ${options.startFinish.xM},${options.startFinish.yM} is ${projection.gapM.toFixed(0)} m from the centreline of ${track.name}`);
  }
  return projection.alongM;
}

function sampleSpeed(session: TelemetrySession, placed: PlacedSession | null, i: number): number {
  if (session.speedMps) return session.speedMps[i]!;
  const j = i > 0 ? i - 1 : i + 1;
  const dt = Math.abs(session.timeS[i]! - session.timeS[j]!);
  if (!(dt > 0)) return NaN;
  if (placed) return Math.hypot(placed.xM[i]! - placed.xM[j]!, placed.yM[i]! - placed.yM[j]!) / dt;
  if (session.distanceM) return Math.abs(session.distanceM[i]! - session.distanceM[j]!) / dt;
  return NaN;
}

/** The longest missing stretch at a log's start or end that is still finished by extrapolation, m. */
function extrapolationAllowanceM(track: TrackGrid): number {
  return Math.max(2 * track.stepM, Math.min(25, 0.005 * track.lengthM));
}

function cutByPosition(session: TelemetrySession, track: TrackGrid, placed: PlacedSession, options: CutOptions): { laps: LapCut[]; notes: string[] } {
  const notes: string[] = [];
  const L = track.lengthM;
  const n = session.count;
  const t = session.timeS;
  const p = placed.progressM;
  const lineM = track.closed ? startFinishAlong(track, options, session.source) : 0;
  if (p[n - 1]! < p[0]! - 0.5 * L) notes.push('the log runs against the direction of the track');

  // Line crossings: times where the progress first reaches lineM + k L (only forwards; k counts up).
  const crossingTimes: number[] = [];
  const crossingProgress: number[] = [];
  const crossingAfter: number[] = [];
  if (track.closed) {
    let passed = Math.ceil((p[0]! - lineM) / L) - 1;
    for (let i = 0; i < n; i++) {
      const k = Math.floor((p[i]! - lineM) / L);
      while (k > passed) {
        passed++;
        const target = lineM + passed * L;
        let crossingT = t[i]!;
        if (i > 0 && p[i]! > p[i - 1]!) crossingT = t[i - 1]! + ((target - p[i - 1]!) / (p[i]! - p[i - 1]!)) * (t[i]! - t[i - 1]!);
        crossingTimes.push(crossingT);
        crossingProgress.push(target);
        crossingAfter.push(i);
      }
    }
  }

  const stations = track.xM.length;
  const visited = new Uint8Array(stations);
  const allowance = extrapolationAllowanceM(track);
  const laps: LapCut[] = [];

  const onTrack = (i: number): boolean => {
    const gap = placed.gapM[i]!;
    const widths = placed.offsetM[i]! >= 0 ? track.widthLeftM : track.widthRightM;
    if (!widths) return gap <= NO_WIDTH_LIMIT_M;
    let station = Math.round((p[i]! % L + L) % L / track.stepM);
    if (station >= stations) station = track.closed ? 0 : stations - 1;
    return gap <= widths[station]! + EDGE_MARGIN_M;
  };

  /** Builds the lap over progress [startP, endP] using samples first..last (inclusive). */
  const makeLap = (lapNumber: number, first: number, last: number, startP: number, endP: number, startT: number | null, endT: number | null): LapCut => {
    visited.fill(0);
    let offRun = 0;
    let offRunStart = 0;
    let worstOff = 0;
    let worstOffAt = 0;
    const maxStep = Math.max(100, 0.1 * L);
    for (let i = Math.max(first, 1); i <= last; i++) {
      const a = Math.max(p[i - 1]!, startP);
      const b = Math.min(p[i]!, endP);
      const step = p[i]! - p[i - 1]!;
      const bothOn = onTrack(i) && onTrack(i - 1);
      if (!bothOn && step > 0) {
        if (offRun === 0) offRunStart = a - startP;
        offRun += step;
        if (offRun > worstOff) {
          worstOff = offRun;
          worstOffAt = offRunStart;
        }
      } else if (bothOn) offRun = 0;
      if (!bothOn || !(step > 0) || step > maxStep || b <= a) continue;
      const from = Math.ceil((a - startP) / track.stepM);
      const to = Math.floor((b - startP) / track.stepM);
      for (let s = from; s <= to && s < stations; s++) visited[s] = 1;
    }
    let covered = 0;
    for (let s = 0; s < stations; s++) covered += visited[s]!;
    const coverage = covered / stations;
    const missingStart = p[first]! > startP ? p[first]! - startP : 0;
    const missingEnd = p[last]! < endP ? endP - p[last]! : 0;
    const reasons: string[] = [];
    let complete = true;
    if (missingStart > allowance) {
      complete = false;
      reasons.push(lapNumber === 0 ? `out lap: the log starts ${missingStart.toFixed(0)} m after the line` : `the log starts ${missingStart.toFixed(0)} m into the lap`);
    }
    if (missingEnd > allowance) {
      complete = false;
      reasons.push(`the log ends ${missingEnd.toFixed(0)} m before the line`);
    }
    if (coverage < MIN_COVERAGE) {
      complete = false;
      reasons.push(`covers ${(coverage * 100).toFixed(0)} % of the track (under ${MIN_COVERAGE * 100} %: pit lane, off track or a gap in the log)`);
    }
    if (worstOff > MAX_OFF_TRACK_M) {
      complete = false;
      reasons.push(`leaves the track for ${worstOff.toFixed(0)} m at ${worstOffAt.toFixed(0)} m`);
    }
    // Finish a log's ragged end by extrapolating at the speed of its first or last sample.
    let reason: string | undefined = reasons.length > 0 ? reasons.join('; ') : undefined;
    let start = startT;
    let end = endT;
    if (start === null) {
      const v = sampleSpeed(session, placed, first);
      start = t[first]! - (missingStart > 0 && v > 0 ? missingStart / v : 0);
      if (complete && missingStart > 0) reason = `the log starts ${missingStart.toFixed(1)} m after the line; start time extrapolated`;
    }
    if (end === null) {
      const v = sampleSpeed(session, placed, last);
      end = t[last]! + (missingEnd > 0 && v > 0 ? missingEnd / v : 0);
      if (complete && missingEnd > 0) reason = `${reason ? reason + '; ' : ''}the log ends ${missingEnd.toFixed(1)} m before the line; lap time extrapolated`;
    }
    return lapRecord(lapNumber, first, last, start, end, complete, reason, { startFinishM: lineM, progressStartM: startP });
  };

  if (!track.closed) {
    // An open stage is one run from its start to its end.
    let first = 0;
    while (first + 1 < n && p[first + 1]! <= 0) first++;
    laps.push(makeLap(1, first, n - 1, 0, L, null, null));
    return { laps, notes };
  }
  const m = crossingTimes.length;
  // Lap 0: from the log's start to the first crossing (or the whole log when it never crosses).
  const leadEnd = m > 0 ? crossingAfter[0]! : n - 1;
  if (m === 0) {
    const startP = lineM + Math.floor((p[0]! - lineM) / L) * L;
    laps.push(makeLap(0, 0, n - 1, startP, startP + L, null, null));
  } else if (leadEnd > 0) {
    laps.push(makeLap(0, 0, leadEnd, crossingProgress[0]! - L, crossingProgress[0]!, null, crossingTimes[0]!));
  }
  for (let c = 0; c < m; c++) {
    const first = Math.max(0, crossingAfter[c]! - 1);
    const hasNext = c + 1 < m;
    const last = hasNext ? crossingAfter[c + 1]! : n - 1;
    if (!hasNext && p[n - 1]! - crossingProgress[c]! < allowance) break;
    laps.push(makeLap(c + 1, first, last, crossingProgress[c]!, crossingProgress[c]! + L, crossingTimes[c]!, hasNext ? crossingTimes[c + 1]! : null));
  }
  // A log that starts just after the line makes its part before the first crossing a full lap: number it 1.
  if (laps[0]?.lapNumber === 0 && laps[0].complete) for (const lap of laps) lap.lapNumber++;
  return { laps, notes };
}

function cutByDistance(session: TelemetrySession, track: TrackGrid): { laps: LapCut[]; notes: string[] } {
  const notes: string[] = [];
  const L = track.lengthM;
  const n = session.count;
  const t = session.timeS;
  const d = sessionDistance(session);
  notes.push(session.distanceM ? 'no positions: laps placed by the distance channel, scaled to the track length' : 'no positions and no distance channel: distance integrated from the speed');

  // Resets of a lap-distance channel: a drop of more than half a track length.
  const resets: number[] = [];
  for (let i = 1; i < n; i++) if (d[i]! < d[i - 1]! - 0.5 * L) resets.push(i);
  const speedAt = (i: number) => {
    const v = sampleSpeed(session, null, i);
    return v > 0 ? v : NaN;
  };
  // Crossing time and the distance reached at it, for the reset before sample i.
  const crossings = resets.map((i) => {
    const v = speedAt(i);
    let crossingT = Number.isFinite(v) ? t[i]! - d![i]! / v : t[i]!;
    crossingT = Math.min(t[i]!, Math.max(t[i - 1]!, crossingT));
    const vBefore = speedAt(i - 1);
    const reached = d![i - 1]! + (Number.isFinite(vBefore) ? vBefore * (crossingT - t[i - 1]!) : 0);
    return { index: i, timeS: crossingT, reachedM: reached };
  });
  const laps: LapCut[] = [];
  const spans: number[] = [];
  for (let c = 0; c + 1 < crossings.length; c++) spans.push(crossings[c + 1]!.reachedM);
  const interiorScale = spans.length > 0 ? L / medianOf(Float64Array.from(spans)) : 1;
  if (spans.length > 0 && spans.every((span) => Math.abs(span / L - 1) > 0.2)) {
    throw new InputError(`${session.source}: the telemetry does not match track ${track.name}: its laps measure about ${medianOf(Float64Array.from(spans)).toFixed(0)} m by the distance channel, the track ${L.toFixed(0)} m`);
  }
  const allowance = extrapolationAllowanceM(track);
  const medianSpan = spans.length > 0 ? medianOf(Float64Array.from(spans)) : NaN;
  for (let c = 0; c + 1 < crossings.length; c++) {
    const span = spans[c]!;
    const complete = span >= MIN_COVERAGE * medianSpan && Math.abs(span / L - 1) <= 0.1;
    const reason = complete ? undefined : `measures ${span.toFixed(0)} m by the distance channel, laps measure ${medianSpan.toFixed(0)} m`;
    laps.push(lapRecord(c + 1, crossings[c]!.index - 1, crossings[c + 1]!.index, crossings[c]!.timeS, crossings[c + 1]!.timeS, complete, reason, { startFinishM: 0, progressStartM: 0, distanceScale: L / span }));
  }
  // The ends of the log (or the whole log when the channel never resets): complete only if they miss little.
  const edge = (lapNumber: number, first: number, last: number, startT: number | null, endT: number | null, offsetM: number) => {
    const scale = interiorScale;
    const startM = startT === null ? (d![first]! - offsetM) * scale : 0;
    const endM = endT === null ? (d![last]! - offsetM) * scale : L;
    const missingStart = Math.max(0, startM);
    const missingEnd = Math.max(0, L - endM);
    let reason: string | undefined;
    let complete = true;
    if (endM - startM > 1.5 * L) {
      complete = false;
      reason = `the distance channel runs ${((endM - startM) / L).toFixed(1)} track lengths without resetting; without positions the line cannot be found`;
    } else if (missingStart > allowance || missingEnd > allowance) {
      complete = false;
      reason = missingStart > allowance ? `out lap: starts ${missingStart.toFixed(0)} m into the lap` : `the log ends ${missingEnd.toFixed(0)} m before the line`;
    } else if (missingStart > 0 || missingEnd > 0) {
      reason = 'lap time extrapolated over the last metres before the line';
    }
    const vStart = speedAt(first);
    const vEnd = speedAt(last);
    const start = startT ?? t[first]! - (missingStart > 0 && vStart > 0 ? missingStart / vStart : 0);
    const end = endT ?? t[last]! + (missingEnd > 0 && vEnd > 0 ? missingEnd / vEnd : 0);
    laps.push(lapRecord(lapNumber, first, last, start, end, complete, reason, { startFinishM: 0, progressStartM: offsetM * scale, distanceScale: scale }));
  };
  if (crossings.length === 0) {
    // No reset: the whole file is one lap from its first sample.
    edge(1, 0, n - 1, null, null, d[0]!);
  } else {
    const first = crossings[0]!;
    if (first.index > 1) edge(0, 0, first.index, null, first.timeS, 0);
    const lastCrossing = crossings[crossings.length - 1]!;
    if (lastCrossing.index < n - 1) edge(crossings.length, lastCrossing.index - 1, n - 1, lastCrossing.timeS, null, 0);
  }
  laps.sort((a, b) => a.lapNumber - b.lapNumber);
  return { laps, notes };
}

function lapRecord(
  lapNumber: number, startIndex: number, endIndex: number, startTimeS: number, endTimeS: number, complete: boolean, reason: string | undefined,
  basis: { startFinishM: number; progressStartM: number; distanceScale?: number },
): LapCut {
  return { lapNumber, startIndex, endIndex, lapTimeS: endTimeS - startTimeS, complete, ...(reason ? { reason } : {}), startTimeS, endTimeS, ...basis };
}

const distanceCache = new WeakMap<TelemetrySession, Float64Array>();

/** The distance channel, or speed integrated over time (trapezoid rule) where the log has none. */
export function sessionDistance(session: TelemetrySession): Float64Array {
  if (session.distanceM) return session.distanceM;
  const cached = distanceCache.get(session);
  if (cached) return cached;
  if (!session.speedMps) throw new InputError(`${session.source}: no positions, distance or speed to place the samples along the track`);
  const t = session.timeS;
  const v = session.speedMps;
  const d = new Float64Array(session.count);
  for (let i = 1; i < d.length; i++) d[i] = d[i - 1]! + 0.5 * (v[i]! + v[i - 1]!) * (t[i]! - t[i - 1]!);
  distanceCache.set(session, d);
  return d;
}

export function medianOf(values: Float64Array): number {
  if (values.length === 0) return NaN;
  const step = Math.max(1, Math.floor(values.length / 50000));
  const sample: number[] = [];
  for (let i = 0; i < values.length; i += step) sample.push(values[i]!);
  sample.sort((a, b) => a - b);
  return sample[sample.length >> 1]!;
}
