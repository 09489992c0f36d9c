// Cuts a logged session into laps at the start/finish line. With positions: laps are counted where the session's
// unwrapped distance along the track (place-session.ts) passes the line. Without positions: at the resets of the
// lap-distance channel, or the whole file as one lap. A log's ragged ends are finished by extrapolation.

import type { TrackGrid } from '../track/types.js';
import type { TelemetrySession } from '../telemetry/types.js';
import { placeSession, type PlacedSession } from './place-session.js';
import { sampleSpeed, sessionDistance } from './session-distance.js';
import {
  distanceResets,
  distanceSpeedAt,
  lineCrossings,
  startFinishAlong,
  type CutOptions,
  type LineCrossings,
} from './lap-crossings.js';
import {
  checkDistanceLapsMatch,
  distanceEdgeCheck,
  distanceLapProblem,
  extrapolationAllowanceM,
  positionCoverage,
  positionLapProblems,
} from './lap-coverage.js';
import { sampledMedian } from '../numeric/quantile.js';
import { distanceOf, joinNotes, note, type Note } from '../note.js';

/** A gap at a log's end shorter than this (the note's last digit, 0.1 m) is timed like any other but not noted: a
 * note saying the log ends 0.0 m before the line tells a driver nothing (a real one-lap GPS log did). */
const NOTED_GAP_M = 0.05;

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
  reason?: Note;
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

export function cutLaps(
  session: TelemetrySession,
  track: TrackGrid,
  options: CutOptions = {},
): { laps: LapCut[]; notes: Note[] } {
  const placed = placeSession(session, track);
  const result = placed ? cutByPosition(session, track, placed, options) : cutByDistance(session, track);
  if (placed) result.notes.unshift(...placed.notes);
  for (const lap of result.laps) refuseTimeGap(lap, session.timeS);
  for (const lap of result.laps) {
    if (!lap.complete) result.notes.push(note`lap ${lap.lapNumber} left out: ${lap.reason ?? 'incomplete'}`);
    else if (lap.reason) result.notes.push(note`lap ${lap.lapNumber}: ${lap.reason}`);
  }
  return result;
}

/** The longest step between two samples a complete lap may have, s: a logger that stopped for longer saw none of it. */
export const MAX_LAP_TIME_GAP_S = 5;

/** Marks a lap incomplete where its samples leave a time gap over MAX_LAP_TIME_GAP_S. */
function refuseTimeGap(lap: LapCut, timeS: Float64Array): void {
  if (!lap.complete) return;
  let widestS = 0;
  let atS = 0;
  for (let i = lap.startIndex + 1; i <= lap.endIndex; i++) {
    const stepS = timeS[i]! - timeS[i - 1]!;
    if (stepS > widestS) {
      widestS = stepS;
      atS = timeS[i - 1]!;
    }
  }
  if (widestS > MAX_LAP_TIME_GAP_S) {
    lap.complete = false;
    lap.reason = `a gap of ${widestS.toFixed(1)} s in the log at ${atS.toFixed(1)} s (over ${MAX_LAP_TIME_GAP_S} s)`;
  }
}

function cutByPosition(
  session: TelemetrySession,
  track: TrackGrid,
  placed: PlacedSession,
  options: CutOptions,
): { laps: LapCut[]; notes: Note[] } {
  const notes: Note[] = [];
  const L = track.lengthM;
  const n = session.count;
  const t = session.timeS;
  const p = placed.progressM;
  const lineM = track.closed ? startFinishAlong(track, options, session.source) : 0;
  if (p[n - 1]! < p[0]! - 0.5 * L) notes.push('the log runs against the direction of the track');

  const crossings: LineCrossings = track.closed
    ? lineCrossings(p, t, n, lineM, L)
    : { timeS: [], progressM: [], afterIndex: [] };
  const crossingTimes = crossings.timeS;
  const crossingProgress = crossings.progressM;
  const crossingAfter = crossings.afterIndex;

  const measure = positionCoverage(track, placed);
  const allowance = extrapolationAllowanceM(track);
  const laps: LapCut[] = [];

  /** Builds the lap over progress [startP, endP] using samples first..last (inclusive). */
  const makeLap = (
    lapNumber: number,
    first: number,
    last: number,
    startP: number,
    endP: number,
    startT: number | null,
    endT: number | null,
  ): LapCut => {
    const measured = measure(first, last, startP, endP);
    const missingStart = p[first]! > startP ? p[first]! - startP : 0;
    const missingEnd = p[last]! < endP ? endP - p[last]! : 0;
    const reasons = positionLapProblems(lapNumber, endT === null, missingStart, missingEnd, measured, allowance);
    const complete = reasons.length === 0;
    // Finish a log's ragged end by extrapolating at the speed of its first or last sample.
    let reason: Note | undefined = reasons.length > 0 ? joinNotes(reasons, '; ') : undefined;
    let start = startT;
    let end = endT;
    if (start === null) {
      const v = sampleSpeed(session, placed, first);
      start = t[first]! - (missingStart > 0 && v > 0 ? missingStart / v : 0);
      if (complete && missingStart >= NOTED_GAP_M)
        reason = note`the log starts ${distanceOf(missingStart, 1)} after the line; start time extrapolated`;
    }
    if (end === null) {
      const v = sampleSpeed(session, placed, last);
      end = t[last]! + (missingEnd > 0 && v > 0 ? missingEnd / v : 0);
      if (complete && missingEnd >= NOTED_GAP_M)
        reason = note`${reason ? note`${reason}; ` : ''}the log ends ${distanceOf(missingEnd, 1)} before the line; lap time extrapolated`;
    }
    return lapRecord(lapNumber, first, last, start, end, complete, reason, {
      startFinishM: lineM,
      progressStartM: startP,
    });
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
    laps.push(
      makeLap(
        c + 1,
        first,
        last,
        crossingProgress[c]!,
        crossingProgress[c]! + L,
        crossingTimes[c]!,
        hasNext ? crossingTimes[c + 1]! : null,
      ),
    );
  }
  // A log that starts just after the line makes its part before the first crossing a full lap: number it 1.
  if (laps[0]?.lapNumber === 0 && laps[0].complete) for (const lap of laps) lap.lapNumber++;
  return { laps, notes };
}

function cutByDistance(session: TelemetrySession, track: TrackGrid): { laps: LapCut[]; notes: Note[] } {
  const notes: Note[] = [];
  const L = track.lengthM;
  const n = session.count;
  const t = session.timeS;
  const d = sessionDistance(session);
  notes.push(
    session.distanceM
      ? 'no positions: laps placed by the distance channel, scaled to the track length'
      : 'no positions and no distance channel: distance integrated from the speed',
  );

  const crossings = distanceResets(session, d, L);
  const laps: LapCut[] = [];
  const spans: number[] = [];
  for (let c = 0; c + 1 < crossings.length; c++) spans.push(crossings[c + 1]!.reachedM);
  const interiorScale = spans.length > 0 ? L / sampledMedian(Float64Array.from(spans)) : 1;
  checkDistanceLapsMatch(session, track, spans);
  const allowance = extrapolationAllowanceM(track);
  const medianSpan = spans.length > 0 ? sampledMedian(Float64Array.from(spans)) : NaN;
  for (let c = 0; c + 1 < crossings.length; c++) {
    const span = spans[c]!;
    const reason = distanceLapProblem(span, medianSpan, L);
    const complete = reason === undefined;
    laps.push(
      lapRecord(
        c + 1,
        crossings[c]!.index - 1,
        crossings[c + 1]!.index,
        crossings[c]!.timeS,
        crossings[c + 1]!.timeS,
        complete,
        reason,
        { startFinishM: 0, progressStartM: 0, distanceScale: L / span },
      ),
    );
  }
  // The ends of the log (or the whole log when the channel never resets): complete only if they miss little.
  const edge = (
    lapNumber: number,
    first: number,
    last: number,
    startT: number | null,
    endT: number | null,
    offsetM: number,
  ) => {
    const scale = interiorScale;
    const startM = startT === null ? (d[first]! - offsetM) * scale : 0;
    const endM = endT === null ? (d[last]! - offsetM) * scale : L;
    const missingStart = Math.max(0, startM);
    const missingEnd = Math.max(0, L - endM);
    const inLap = endT === null && lapNumber > 0;
    const { complete, reason } = distanceEdgeCheck(startM, endM, missingStart, missingEnd, L, allowance, inLap);
    const vStart = distanceSpeedAt(session, first);
    const vEnd = distanceSpeedAt(session, last);
    const start = startT ?? t[first]! - (missingStart > 0 && vStart > 0 ? missingStart / vStart : 0);
    const end = endT ?? t[last]! + (missingEnd > 0 && vEnd > 0 ? missingEnd / vEnd : 0);
    laps.push(
      lapRecord(lapNumber, first, last, start, end, complete, reason, {
        startFinishM: 0,
        progressStartM: offsetM * scale,
        distanceScale: scale,
      }),
    );
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
  lapNumber: number,
  startIndex: number,
  endIndex: number,
  startTimeS: number,
  endTimeS: number,
  complete: boolean,
  reason: Note | undefined,
  basis: { startFinishM: number; progressStartM: number; distanceScale?: number },
): LapCut {
  return {
    lapNumber,
    startIndex,
    endIndex,
    lapTimeS: endTimeS - startTimeS,
    complete,
    ...(reason ? { reason } : {}),
    startTimeS,
    endTimeS,
    ...basis,
  };
}
