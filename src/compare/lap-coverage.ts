// Whether a cut lap is whole: the share of the track's stations it passes on track, its longest stretch off the
// track, the metres missing at a log's ends, and the one-line reasons given for a lap left out or finished by extrapolation.

import { InputError } from '../errors.js';
import type { TrackGrid } from '../track/types.js';
import type { TelemetrySession } from '../telemetry/types.js';
import type { PlacedSession } from './place-session.js';
import { sampledMedian } from '../numeric/quantile.js';
import { distanceOf, note, type Note } from '../note.js';

/** A lap must pass at least this share of the stations on the track. */
export const MIN_COVERAGE = 0.95;
/** Longest stretch off the track a complete lap may have, m. */
export const MAX_OFF_TRACK_M = 25;
/** Margin beyond the track's edge (or distance from the centreline where widths are unknown) still on track, m. */
const EDGE_MARGIN_M = 5;
const NO_WIDTH_LIMIT_M = 15;

/** The longest missing stretch at a log's start or end that is still finished by extrapolation, m. */
export function extrapolationAllowanceM(track: TrackGrid): number {
  return Math.max(2 * track.stepM, Math.min(25, 0.005 * track.lengthM));
}

export interface PositionCoverage {
  /** Share of the track's stations passed on track. */
  coverage: number;
  /** Longest stretch off the track, m, and where it starts, m from the lap's start. */
  worstOffM: number;
  worstOffAtM: number;
}

/**
 * A measure of laps of placed samples: for samples first..last (inclusive) over progress [startP, endP], the share
 * of stations passed on track and the longest run off it. One station buffer serves every lap of the session.
 */
export function positionCoverage(
  track: TrackGrid,
  placed: PlacedSession,
): (first: number, last: number, startP: number, endP: number) => PositionCoverage {
  const L = track.lengthM;
  const p = placed.progressM;
  const stations = track.xM.length;
  const visited = new Uint8Array(stations);

  const onTrack = (i: number): boolean => {
    const gap = placed.gapM[i]!;
    const widths = placed.offsetM[i]! >= 0 ? track.widthLeftM : track.widthRightM;
    if (!widths) return gap <= NO_WIDTH_LIMIT_M;
    let station = Math.round((((p[i]! % L) + L) % L) / track.stepM);
    if (station >= stations) station = track.closed ? 0 : stations - 1;
    return gap <= widths[station]! + EDGE_MARGIN_M;
  };

  return (first, last, startP, endP) => {
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
    return { coverage: covered / stations, worstOffM: worstOff, worstOffAtM: worstOffAt };
  };
}

/** Why a lap of placed samples is left out (none when it is complete); `endsLog`: the log ends inside this lap. */
export function positionLapProblems(
  lapNumber: number,
  endsLog: boolean,
  missingStart: number,
  missingEnd: number,
  measured: PositionCoverage,
  allowance: number,
): Note[] {
  const reasons: Note[] = [];
  if (missingStart > allowance) {
    reasons.push(
      lapNumber === 0
        ? note`out lap: the log starts ${distanceOf(missingStart)} after the line`
        : note`the log starts ${distanceOf(missingStart)} into the lap`,
    );
  }
  if (missingEnd > allowance) {
    // The first lap of a log that starts after the line is the out lap; the last of several that ends before it,
    // the in lap (the car leaves the circuit for the pits).
    reasons.push(
      endsLog && lapNumber > 0
        ? note`in lap: the log ends ${distanceOf(missingEnd)} before the line`
        : note`the log ends ${distanceOf(missingEnd)} before the line`,
    );
  }
  if (measured.coverage < MIN_COVERAGE) {
    reasons.push(
      `covers ${(measured.coverage * 100).toFixed(0)} % of the track (under ${MIN_COVERAGE * 100} %: pit lane, off track or a gap in the log)`,
    );
  }
  if (measured.worstOffM > MAX_OFF_TRACK_M) {
    reasons.push(note`leaves the track for ${distanceOf(measured.worstOffM)} at ${distanceOf(measured.worstOffAtM)}`);
  }
  return reasons;
}

/** Refuses a log whose laps by the distance channel (spans between resets, m) all miss the track's length by over 20 %. */
export function checkDistanceLapsMatch(session: TelemetrySession, track: TrackGrid, spans: number[]): void {
  const L = track.lengthM;
  if (spans.length > 0 && spans.every((span) => Math.abs(span / L - 1) > 0.2)) {
    throw new InputError(
      `${session.source}: the telemetry does not match track ${track.name}: its laps measure about ${sampledMedian(Float64Array.from(spans)).toFixed(0)} m by the distance channel, the track ${L.toFixed(0)} m`,
    );
  }
}

/** Why a lap between two resets of the distance channel is left out, or undefined when it is complete. */
export function distanceLapProblem(span: number, medianSpan: number, L: number): Note | undefined {
  const complete = span >= MIN_COVERAGE * medianSpan && Math.abs(span / L - 1) <= 0.1;
  return complete
    ? undefined
    : note`measures ${distanceOf(span)} by the distance channel, laps measure ${distanceOf(medianSpan)}`;
}

/** Whether a lap at an end of a log placed by distance (over [startM, endM] of the track) is complete, and why not
 * or how finished; `inLap`: the last of several laps, which the log ends inside. */
export function distanceEdgeCheck(
  startM: number,
  endM: number,
  missingStart: number,
  missingEnd: number,
  L: number,
  allowance: number,
  inLap = false,
): { complete: boolean; reason: Note | undefined } {
  let reason: Note | undefined;
  let complete = true;
  if (endM - startM > 1.5 * L) {
    complete = false;
    reason = `the distance channel runs ${((endM - startM) / L).toFixed(1)} track lengths without resetting; without positions the line cannot be found`;
  } else if (missingStart > allowance || missingEnd > allowance) {
    complete = false;
    reason =
      missingStart > allowance
        ? note`out lap: starts ${distanceOf(missingStart)} into the lap`
        : note`${inLap ? 'in lap: ' : ''}the log ends ${distanceOf(missingEnd)} before the line`;
  } else if (missingStart > 0 || missingEnd > 0) {
    reason = 'lap time extrapolated over the last metres before the line';
  }
  return { complete, reason };
}
