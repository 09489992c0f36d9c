// A cut lap resampled onto the track's distance grid: each sample's place along the lap (projected positions,
// or the scaled distance channel) maps time and every channel onto the centreline stations by linear
// interpolation; missing channels are derived (./derive.ts). When the timing line is not at station 0 the lap is
// read from station 0 round to station 0 (the stretch before the line comes from the lap's end), so timeS[0] = 0.

import { InputError } from '../errors.js';
import type { TrackGrid } from '../track/types.js';
import { formatLapTime } from '../units.js';
import type { DriverLap } from './types.js';
import type { TelemetrySession } from '../telemetry/types.js';
import { cutLaps, type LapCut } from './laps.js';
import { placeSession } from './place-session.js';
import { sessionDistance } from './session-distance.js';
import {
  axFromSpeed,
  ayFromCurvature,
  correlation,
  curvatureTooNoisy,
  pathCurvature,
  speedFromPositions,
} from './derive.js';
import { wrapIndex } from '../numeric/lap-index.js';
import { lerp } from '../numeric/interpolate.js';
import { metricNoteText, type Note } from '../note.js';

export interface SelectOptions {
  lap?: number;
  startFinish?: { xM: number; yM: number };
}

export function alignLap(session: TelemetrySession, lap: LapCut, track: TrackGrid): DriverLap {
  return alignLapWithNotes(session, lap, track).lap;
}

/** Linear interpolation of values at time tq, with samples i and i + 1 bracketing it. */
function atTime(values: Float64Array, timeS: Float64Array, i: number, tq: number): number {
  const j = Math.min(i + 1, timeS.length - 1);
  const span = timeS[j]! - timeS[i]!;
  const w = span > 0 ? Math.min(1, Math.max(0, (tq - timeS[i]!) / span)) : 0;
  return lerp(values[i]!, values[j]!, w);
}

/** The lap's samples placed along it, with anchors at its two ends: (0, 0) and (L, lap time). */
interface LapSamples {
  alongM: Float64Array;
  elapsedS: Float64Array;
  /** Resamples a session channel onto the lap's samples (the two anchors interpolated in time). */
  channelAt: (values: Float64Array) => Float64Array;
}

function lapSamples(
  session: TelemetrySession,
  lap: Required<Pick<LapCut, 'startTimeS' | 'endTimeS' | 'progressStartM'>> & LapCut,
  lengthM: number,
  progressM: (i: number) => number,
): LapSamples {
  const t = session.timeS;
  const startT = lap.startTimeS;
  const endT = lap.endTimeS;
  let first = lap.startIndex;
  while (first <= lap.endIndex && t[first]! <= startT) first++;
  let last = lap.endIndex;
  while (last >= first && t[last]! >= endT) last--;
  const inner = Math.max(0, last - first + 1);
  const m = inner + 2;
  const alongM = new Float64Array(m);
  const elapsedS = new Float64Array(m);
  alongM[m - 1] = lengthM;
  elapsedS[m - 1] = endT - startT;
  let running = 0;
  for (let k = 0; k < inner; k++) {
    const i = first + k;
    let r = progressM(i) - lap.progressStartM;
    // Monotone along the lap: small backward steps (GPS jitter, a stop) hold the furthest point reached.
    if (r < running) r = running;
    if (r > lengthM) r = lengthM;
    running = r;
    alongM[k + 1] = r;
    elapsedS[k + 1] = t[i]! - startT;
  }
  const startBracket = Math.max(0, first - 1);
  const endBracket = Math.max(0, last);
  const channelAt = (values: Float64Array): Float64Array => {
    const out = new Float64Array(m);
    out[0] = atTime(values, t, startBracket, startT);
    for (let k = 0; k < inner; k++) out[k + 1] = values[first + k]!;
    out[m - 1] = atTime(values, t, endBracket, endT);
    return out;
  };
  return { alongM, elapsedS, channelAt };
}

/** Linear and held resampling from the lap's samples onto the stations, in the order the lap passes them. */
interface StationResampler {
  linear: (values: Float64Array) => Float64Array;
  held: (values: Float64Array) => Float64Array;
}

function stationResampler(track: TrackGrid, lineM: number, alongM: Float64Array): StationResampler {
  const L = track.lengthM;
  const n = track.distanceM.length;
  const m = alongM.length;
  // Stations from the line round to the line.
  const firstStation = track.closed ? Math.ceil(lineM / track.stepM - 1e-9) % n : 0;
  const weightIndex = new Int32Array(n);
  const weight = new Float64Array(n);
  let k = 0;
  for (let c = 0; c < n; c++) {
    const j = (firstStation + c) % n;
    let r = track.distanceM[j]! - lineM;
    if (r < 0) r += L;
    if (c === 0 && r > L - 1e-9) r = 0;
    while (k < m - 2 && alongM[k + 1]! <= r) k++;
    const span = alongM[k + 1]! - alongM[k]!;
    weightIndex[j] = k;
    weight[j] = span > 0 ? Math.min(1, Math.max(0, (r - alongM[k]!) / span)) : 0;
  }
  return {
    linear: (values) => {
      const out = new Float64Array(n);
      for (let j = 0; j < n; j++) {
        const a = weightIndex[j]!;
        out[j] = values[a]! + weight[j]! * (values[a + 1]! - values[a]!);
      }
      return out;
    },
    held: (values) => {
      const out = new Float64Array(n);
      for (let j = 0; j < n; j++) out[j] = weight[j]! < 0.5 ? values[weightIndex[j]!]! : values[weightIndex[j]! + 1]!;
      return out;
    },
  };
}

/** Time from station 0 (rotated when the line is elsewhere, so timeS[0] = 0 and the lap time is kept). */
function timeFromStationZero(passTimeS: Float64Array, lapTimeS: number): Float64Array {
  const timeS = new Float64Array(passTimeS.length);
  const zeroTime = passTimeS[0]!;
  for (let j = 0; j < passTimeS.length; j++) {
    const sinceZero = passTimeS[j]! - zeroTime;
    timeS[j] = sinceZero >= -1e-12 ? Math.max(0, sinceZero) : sinceZero + lapTimeS;
  }
  return timeS;
}

/** Speed at each station from the pass times of its neighbours along the centreline (a distance-only log). */
function speedFromPassTimes(track: TrackGrid, passTimeS: Float64Array, lapTimeS: number): Float64Array {
  const n = passTimeS.length;
  const speedMps = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    const previous = j > 0 ? j - 1 : track.closed ? n - 1 : 0;
    const next = j < n - 1 ? j + 1 : track.closed ? 0 : n - 1;
    let dt = passTimeS[next]! - passTimeS[previous]!;
    if (dt < 0) dt += lapTimeS;
    const ds = wrapIndex(next - previous, n) || 1;
    speedMps[j] = dt > 0 ? (ds * track.stepM) / dt : 0;
  }
  return speedMps;
}

/**
 * A logged acceleration checked against the one derived from speed or curvature: taken as derived when the log
 * has none, its sign turned (with the note) when it runs against the derived one.
 */
function signCheckedAcceleration(
  logged: Float64Array | null,
  derived: Float64Array,
  turnedNote: string,
): { values: Float64Array; derived: boolean; note: string | null } {
  if (!logged) return { values: derived, derived: true, note: null };
  if (correlation(logged, derived) >= -0.5) return { values: logged, derived: false, note: null };
  for (let j = 0; j < logged.length; j++) logged[j] = -logged[j]!;
  return { values: logged, derived: false, note: turnedNote };
}

export function alignLapWithNotes(
  session: TelemetrySession,
  lap: LapCut,
  track: TrackGrid,
): { lap: DriverLap; notes: string[] } {
  const notes: string[] = [];
  if (lap.startTimeS === undefined || lap.endTimeS === undefined || lap.progressStartM === undefined) {
    throw new Error('alignLap needs a LapCut made by cutLaps');
  }
  const cut = { ...lap, startTimeS: lap.startTimeS, endTimeS: lap.endTimeS, progressStartM: lap.progressStartM };
  const t = session.timeS;
  const lapTimeS = cut.endTimeS - cut.startTimeS;
  const placed = placeSession(session, track);
  const distance = placed ? null : sessionDistance(session);
  const scale = lap.distanceScale ?? 1;
  const samples = lapSamples(session, cut, track.lengthM, (i) =>
    placed ? placed.progressM[i]! : distance![i]! * scale,
  );
  const resampler = stationResampler(track, track.closed ? (lap.startFinishM ?? 0) : 0, samples.alongM);
  const channel = (values: Float64Array | null, held = false) =>
    values ? (held ? resampler.held : resampler.linear)(samples.channelAt(values)) : null;

  const passTime = resampler.linear(samples.elapsedS);
  const timeS = timeFromStationZero(passTime, lapTimeS);

  const derivedChannels: string[] = [];
  const xM = placed ? channel(placed.xM) : null;
  const yM = placed ? channel(placed.yM) : null;

  let speedMps = channel(session.speedMps);
  if (!speedMps) {
    derivedChannels.push('speedMps');
    if (placed) {
      const a = Math.max(0, lap.startIndex - 2);
      const b = Math.min(session.count, lap.endIndex + 3);
      const local = speedFromPositions(t.subarray(a, b), placed.xM.subarray(a, b), placed.yM.subarray(a, b));
      const full = new Float64Array(session.count);
      full.set(local, a);
      speedMps = channel(full)!;
      notes.push('speed derived from the positions');
    } else {
      speedMps = speedFromPassTimes(track, passTime, lapTimeS);
      notes.push('speed derived from the distance channel');
    }
  }

  const ax = signCheckedAcceleration(
    channel(session.axMps2),
    axFromSpeed(speedMps, track.stepM, track.closed),
    'the logged longitudinal acceleration runs opposite to the speed trace: sign turned (positive = speeding up)',
  );
  if (ax.derived) derivedChannels.push('axMps2');
  if (ax.note) notes.push(ax.note);

  let curvature = track.curvaturePerM;
  if (xM && yM) {
    const own = pathCurvature(xM, yM, track.stepM, track.closed);
    if (curvatureTooNoisy(own, track.curvaturePerM))
      notes.push("the driver's path is too noisy for its curvature: lateral acceleration uses the track's");
    else curvature = own;
  }
  const ay = signCheckedAcceleration(
    channel(session.ayMps2),
    ayFromCurvature(speedMps, curvature),
    'the logged lateral acceleration is positive to the right: sign turned (positive = left)',
  );
  if (ay.derived) derivedChannels.push('ayMps2');
  if (ay.note) notes.push(ay.note);

  return {
    lap: {
      source: session.source,
      lapNumber: lap.lapNumber,
      lapTimeS,
      timeS,
      speedMps,
      throttle: channel(session.throttle),
      brake: channel(session.brake),
      ...(session.brakePressurePa ? { brakePressurePa: channel(session.brakePressurePa) } : {}),
      axMps2: ax.values,
      ayMps2: ay.values,
      steeringDeg: channel(session.steeringDeg),
      gear: channel(session.gear, true),
      rpm: channel(session.rpm),
      xM,
      yM,
      derivedChannels,
    },
    notes,
  };
}

/** Cuts the session and aligns one lap: the given lap number, else the fastest complete lap. */
export function selectLap(
  session: TelemetrySession,
  track: TrackGrid,
  options: SelectOptions = {},
): { lap: DriverLap; laps: LapCut[]; notes: Note[] } {
  const cut = cutLaps(session, track, options.startFinish ? { startFinish: options.startFinish } : {});
  const notes = [...session.notes, ...cut.notes];
  const complete = cut.laps.filter((lap) => lap.complete);
  let chosen: LapCut | undefined;
  if (options.lap !== undefined) {
    chosen = cut.laps.find((lap) => lap.lapNumber === options.lap);
    if (!chosen) {
      throw new InputError(
        `${session.source}: --lap ${options.lap}: no such lap (laps found: ${cut.laps.map((lap) => lap.lapNumber).join(', ') || 'none'})`,
      );
    }
    if (!chosen.complete)
      throw new InputError(
        `${session.source}: --lap ${options.lap} is not a complete lap: ${metricNoteText(chosen.reason ?? 'incomplete')}`,
      );
  } else {
    if (complete.length === 0) {
      const why = cut.laps
        .map((lap) => `lap ${lap.lapNumber}: ${metricNoteText(lap.reason ?? 'incomplete')}`)
        .join('; ');
      throw new InputError(
        `${session.source}: no complete lap in the session on track ${track.name} (${why || 'no laps'})`,
      );
    }
    chosen = complete.reduce((best, lap) => (lap.lapTimeS < best.lapTimeS ? lap : best));
    notes.push(
      `lap ${chosen.lapNumber} chosen: the fastest of ${complete.length} complete lap${complete.length > 1 ? 's' : ''} (${formatLapTime(chosen.lapTimeS)})`,
    );
  }
  const aligned = alignLapWithNotes(session, chosen, track);
  return { lap: aligned.lap, laps: cut.laps, notes: [...notes, ...aligned.notes] };
}
