// Speed and brake of every lap of a session over each corner's stretch, thinned to a few metres between samples,
// for small multiples that set the laps side by side corner by corner. Only these short windows are kept per lap,
// never a lap's whole channels, so memory stays flat in the number of laps.

import type { TrackGrid } from '../../track/types.js';
import type { LapResult } from '../../solve/types.js';

/** The stretch of the lap a corner's small multiple covers, m along the track (inside the lap). */
export interface CornerWindow {
  id: number;
  fromM: number;
  toM: number;
}

export interface CornerLapTrace {
  lap: number;
  speedMps: Float64Array;
  /** Brake share 0-1 (measured, or estimated from the deceleration where `brakeEstimated`). */
  brake: Float64Array;
  brakeEstimated: boolean;
}

export interface CornerTraces {
  id: number;
  /** The window's stations, m, one per kept sample. */
  stationM: Float64Array;
  reference: { speedMps: Float64Array; brake: Float64Array };
  laps: CornerLapTrace[];
}

/** Keeps one sample about every this many metres of a window. */
export const CORNER_TRACE_STEP_M = 2;

/** Station indices of a window on the grid, about CORNER_TRACE_STEP_M apart, ends included. */
function windowIndices(window: CornerWindow, track: TrackGrid): Int32Array {
  const n = track.distanceM.length;
  const stride = Math.max(1, Math.round(CORNER_TRACE_STEP_M / track.stepM));
  const first = Math.max(0, Math.min(n - 1, Math.ceil(window.fromM / track.stepM)));
  const last = Math.max(first, Math.min(n - 1, Math.floor(window.toM / track.stepM)));
  const indices: number[] = [];
  for (let i = first; i < last; i += stride) indices.push(i);
  indices.push(last);
  return Int32Array.from(indices);
}

function pick(values: ArrayLike<number>, indices: Int32Array): Float64Array {
  const out = new Float64Array(indices.length);
  for (let k = 0; k < indices.length; k++) out[k] = values[indices[k]!]!;
  return out;
}

/** A collector: the reference's windows at once, then each lap's as the session is walked lap by lap. */
export function cornerTracesCollector(track: TrackGrid, windows: readonly CornerWindow[], reference: LapResult) {
  const indices = windows.map((window) => windowIndices(window, track));
  const traces: CornerTraces[] = windows.map((window, c) => ({
    id: window.id,
    stationM: pick(track.distanceM, indices[c]!),
    reference: {
      speedMps: pick(reference.trace.speedMps, indices[c]!),
      brake: pick(reference.trace.brake, indices[c]!),
    },
    laps: [],
  }));
  return {
    add(lap: number, channels: { speedMps: ArrayLike<number>; brake: ArrayLike<number>; brakeEstimated: boolean }) {
      traces.forEach((trace, c) =>
        trace.laps.push({
          lap,
          speedMps: pick(channels.speedMps, indices[c]!),
          brake: pick(channels.brake, indices[c]!),
          brakeEstimated: channels.brakeEstimated,
        }),
      );
    },
    traces,
  };
}
