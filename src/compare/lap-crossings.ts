// Where a session crosses the start/finish line: the line's place along the centreline, the times at which the
// unwrapped progress of placed samples reaches it lap after lap, and the resets of a lap-distance channel.

import { InputError } from '../errors.js';
import type { TrackGrid } from '../track/types.js';
import type { TelemetrySession } from '../telemetry/types.js';
import { projectGlobal, emptyProjection } from '../track/project.js';
import { MATCH_LIMIT_M } from './place-session.js';
import { sampleSpeed } from './session-distance.js';

export interface CutOptions {
  startFinish?: { xM: number; yM: number };
}

/** Line crossings of placed samples, in order: the (interpolated) time, the progress reached, the first sample after. */
export interface LineCrossings {
  timeS: number[];
  progressM: number[];
  afterIndex: number[];
}

/** A reset of the distance channel: the first sample after it, the crossing time and the distance reached by then. */
export interface DistanceReset {
  index: number;
  timeS: number;
  reachedM: number;
}

/** Where the line lies along the centreline: station 0, or the projection of the given point. */
export function startFinishAlong(track: TrackGrid, options: CutOptions, source: string): number {
  if (!options.startFinish) return 0;
  const projection = emptyProjection();
  projectGlobal(track, options.startFinish.xM, options.startFinish.yM, projection);
  if (projection.gapM > MATCH_LIMIT_M) {
    throw new InputError(
      `${source}: --start-finish ${options.startFinish.xM},${options.startFinish.yM} is ${projection.gapM.toFixed(0)} m from the centreline of ${track.name}`,
    );
  }
  return projection.alongM;
}

/** Times where the progress p first reaches lineM + k L on a closed track of length L (only forwards; k counts up). */
export function lineCrossings(p: Float64Array, t: Float64Array, n: number, lineM: number, L: number): LineCrossings {
  const crossingTimes: number[] = [];
  const crossingProgress: number[] = [];
  const crossingAfter: number[] = [];
  let passed = Math.ceil((p[0]! - lineM) / L) - 1;
  for (let i = 0; i < n; i++) {
    const k = Math.floor((p[i]! - lineM) / L);
    while (k > passed) {
      passed++;
      const target = lineM + passed * L;
      let crossingT = t[i]!;
      if (i > 0 && p[i]! > p[i - 1]!)
        crossingT = t[i - 1]! + ((target - p[i - 1]!) / (p[i]! - p[i - 1]!)) * (t[i]! - t[i - 1]!);
      crossingTimes.push(crossingT);
      crossingProgress.push(target);
      crossingAfter.push(i);
    }
  }
  return { timeS: crossingTimes, progressM: crossingProgress, afterIndex: crossingAfter };
}

/** Speed at sample i without positions, or NaN where it is not positive. */
export function distanceSpeedAt(session: TelemetrySession, i: number): number {
  const v = sampleSpeed(session, null, i);
  return v > 0 ? v : NaN;
}

/** Resets of a lap-distance channel d (a drop of more than half a track length L), each with its crossing. */
export function distanceResets(session: TelemetrySession, d: Float64Array, L: number): DistanceReset[] {
  const n = session.count;
  const t = session.timeS;
  const resets: number[] = [];
  for (let i = 1; i < n; i++) if (d[i]! < d[i - 1]! - 0.5 * L) resets.push(i);
  // Crossing time and the distance reached at it, for the reset before sample i.
  return resets.map((i) => {
    const v = distanceSpeedAt(session, i);
    let crossingT = Number.isFinite(v) ? t[i]! - d[i]! / v : t[i]!;
    crossingT = Math.min(t[i]!, Math.max(t[i - 1]!, crossingT));
    const vBefore = distanceSpeedAt(session, i - 1);
    const reached = d[i - 1]! + (Number.isFinite(vBefore) ? vBefore * (crossingT - t[i - 1]!) : 0);
    return { index: i, timeS: crossingT, reachedM: reached };
  });
}
