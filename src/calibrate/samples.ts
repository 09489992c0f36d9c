// The samples a calibration fits: speed and the two accelerations of every moment of a session, with the pedal
// and gear channels where the log has them. A log with accelerometer channels is used in time order as logged;
// one without them is cut into laps and each complete lap aligned on the track's grid, where the accelerations are
// derived exactly as the comparison derives them (src/compare/align.ts).

import { InputError } from '../errors.js';
import type { TrackGrid } from '../track/types.js';
import type { DriverLap } from '../compare/types.js';
import type { TelemetrySession } from '../telemetry/types.js';
import { cutLaps, type LapCut } from '../compare/laps.js';
import { lateralPath, type LateralPathSummary } from './lateral-path.js';
import { alignLapWithNotes } from '../compare/align.js';
import { correlation, speedFromPositions } from '../compare/derive.js';
import { metricNoteText, type Note } from '../note.js';

export interface CalibrationSamples {
  source: string;
  count: number;
  /** Time of each sample, s; increasing within a run. */
  timeS: Float64Array;
  speedMps: Float64Array;
  /** Longitudinal (positive = speeding up) and lateral acceleration, m/s^2. */
  axMps2: Float64Array;
  ayMps2: Float64Array;
  /** 0-1, null where the log has no such channel. */
  throttle: Float64Array | null;
  brake: Float64Array | null;
  gear: Float64Array | null;
  /** First sample of each run of consecutive samples (a lap, or a stretch of the log without a gap), then count. */
  runStarts: Int32Array;
  /** Channels derived rather than measured. */
  derivedChannels: string[];
  /** Where a derived lateral acceleration came from (null where the log measured it). */
  lateralPath: LateralPathSummary | null;
  notes: Note[];
}

/** The note on a grip fitted from derived accelerations. */
export const DERIVED_GRIP_NOTE =
  'grip fitted from derived accelerations, taken as on the limit up to noise: a driver who stayed below the limit fits less grip than the car has';

/** A gap in the log longer than this ends a run: nothing is fitted across it, s. */
export const RUN_GAP_S = 1;

/** Samples from a session: its own channels when it logged both accelerations, else its complete laps on the track's grid. */
export function calibrationSamples(session: TelemetrySession, track: TrackGrid | null): CalibrationSamples {
  if (session.axMps2 && session.ayMps2 && (session.speedMps || (session.xM && session.yM)))
    return sessionSamples(session);
  if (!track) {
    const missing = [session.axMps2 ? null : 'longitudinal', session.ayMps2 ? null : 'lateral']
      .filter(Boolean)
      .join(' and ');
    throw new InputError(
      `${session.source}: the log has no ${missing} acceleration channel; give --track so the accelerations can be derived from the laps on the track`,
    );
  }
  return lapSamples(session, track);
}

function sessionSamples(session: TelemetrySession): CalibrationSamples {
  const n = session.count;
  const notes: Note[] = [];
  const derivedChannels: string[] = [];
  let speedMps = session.speedMps;
  if (!speedMps) {
    speedMps = speedFromPositions(session.timeS, session.xM!, session.yM!);
    derivedChannels.push('speedMps');
  }
  const axMps2 = Float64Array.from(session.axMps2!);
  if (correlation(axMps2, timeDerivative(session.timeS, speedMps)) < -0.5) {
    for (let i = 0; i < n; i++) axMps2[i] = -axMps2[i]!;
    notes.push(
      'the logged longitudinal acceleration runs opposite to the speed trace: sign turned (positive = speeding up)',
    );
  }
  const starts = [0];
  for (let i = 1; i < n; i++) if (session.timeS[i]! - session.timeS[i - 1]! > RUN_GAP_S) starts.push(i);
  starts.push(n);
  return {
    source: session.source,
    count: n,
    timeS: session.timeS,
    speedMps,
    axMps2,
    ayMps2: session.ayMps2!,
    throttle: session.throttle,
    brake: session.brake,
    gear: session.gear,
    runStarts: Int32Array.from(starts),
    derivedChannels,
    lateralPath: null,
    notes,
  };
}

/** dv/dt by central differences over neighbouring samples, for the sign check only. */
function timeDerivative(timeS: Float64Array, values: Float64Array): Float64Array {
  const n = values.length;
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const a = Math.max(0, i - 1);
    const b = Math.min(n - 1, i + 1);
    const dt = timeS[b]! - timeS[a]!;
    out[i] = dt > 0 ? (values[b]! - values[a]!) / dt : 0;
  }
  return out;
}

function lapSamples(session: TelemetrySession, track: TrackGrid): CalibrationSamples {
  const cut = cutLaps(session, track);
  const notes = [...session.notes, ...cut.notes];
  const laps: DriverLap[] = [];
  const cuts: LapCut[] = [];
  let offsetS = 0;
  for (const lapCut of cut.laps) {
    if (!lapCut.complete) continue;
    cuts.push(lapCut);
    const aligned = alignLapWithNotes(session, lapCut, track);
    // Each lap's alignment says the same things: keep one of each.
    for (const note of aligned.notes)
      if (!notes.some((held) => metricNoteText(held) === metricNoteText(note))) notes.push(note);
    laps.push(aligned.lap);
  }
  if (laps.length === 0)
    throw new InputError(`${session.source}: no complete lap on track ${track.name} to calibrate from`);
  const lateral = laps[0]!.derivedChannels.includes('ayMps2') ? lateralPath(session, track, cuts, laps) : null;
  const stations = track.distanceM.length;
  const count = laps.length * stations;
  const timeS = new Float64Array(count);
  const speedMps = new Float64Array(count);
  const axMps2 = new Float64Array(count);
  const ayMps2 = new Float64Array(count);
  const has = (pick: (lap: DriverLap) => Float64Array | null) => laps.every((lap) => pick(lap) !== null);
  const throttle = has((lap) => lap.throttle) ? new Float64Array(count) : null;
  const brake = has((lap) => lap.brake) ? new Float64Array(count) : null;
  const gear = has((lap) => lap.gear) ? new Float64Array(count) : null;
  const runStarts = new Int32Array(laps.length + 1);
  laps.forEach((lap, k) => {
    const at = k * stations;
    runStarts[k] = at;
    // Each lap keeps its own clock, moved on so that the laps do not overlap in time.
    for (let j = 0; j < stations; j++) timeS[at + j] = offsetS + lap.timeS[j]!;
    offsetS += lap.lapTimeS + RUN_GAP_S * 10;
    speedMps.set(lap.speedMps, at);
    axMps2.set(lap.axMps2, at);
    if (lateral) {
      const curvature = lateral.curvaturePerM;
      for (let j = 0; j < stations; j++) ayMps2[at + j] = lap.speedMps[j]! * lap.speedMps[j]! * curvature[j]!;
    } else {
      ayMps2.set(lap.ayMps2, at);
    }
    if (throttle) throttle.set(lap.throttle!, at);
    if (brake) brake.set(lap.brake!, at);
    if (gear) gear.set(lap.gear!, at);
  });
  runStarts[laps.length] = count;
  notes.push(`${laps.length} complete lap${laps.length > 1 ? 's' : ''} aligned on the track's grid`);
  if (lateral) {
    notes.push(lateral.note);
    // The grip fit holds such samples on the boundary up to symmetric noise (./grip-fit.ts): it cannot see a driver
    // who stayed below the limit.
    notes.push(DERIVED_GRIP_NOTE);
  }
  return {
    source: session.source,
    count,
    timeS,
    speedMps,
    axMps2,
    ayMps2,
    throttle,
    brake,
    gear,
    runStarts,
    derivedChannels: [...laps[0]!.derivedChannels],
    lateralPath: lateral?.summary ?? null,
    notes,
  };
}

/**
 * Blocks of samples for the cluster sandwich (./covariance.ts): consecutive chosen samples (indices in time order)
 * no more than `gapS` apart, in one run of the log, and spanning at most `spanS` (Bester, Conley and Hansen,
 * J. Econometrics 165 (2011) 137-151: clusters as blocks of dependent data).
 */
export function timeBlocks(
  samples: CalibrationSamples,
  index: ArrayLike<number>,
  gapS: number,
  spanS: number,
): { cluster: Int32Array; clusters: number } {
  const cluster = new Int32Array(index.length);
  let clusters = 0;
  let run = 0;
  let blockStartS = -Infinity;
  for (let k = 0; k < index.length; k++) {
    const i = index[k]!;
    let newRun = false;
    while (run + 1 < samples.runStarts.length && i >= samples.runStarts[run + 1]!) {
      run++;
      newRun = true;
    }
    const t = samples.timeS[i]!;
    if (k === 0 || newRun || t - samples.timeS[index[k - 1]!]! > gapS || t - blockStartS > spanS) {
      clusters++;
      blockStartS = t;
    }
    cluster[k] = clusters - 1;
  }
  return { cluster, clusters };
}
