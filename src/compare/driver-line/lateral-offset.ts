// A lap's lateral offset from the centreline at each station (positive to the left, as curvature), from its
// positions in the track's plane: the component of (position - centreline point) along the centreline's left
// normal (-sin h, cos h). And the scatter of that offset about its own running mean, the resolution the log's
// positions allow: for white noise of standard deviation s, the residual about a w-point running mean has
// variance s^2 (1 - 1/w) (variance of a difference of a sample and the mean that contains it).

import type { TrackGrid } from '../../track/types.js';
import { movingAverage } from '../../numeric/moving-average.js';

export function lateralOffsetM(track: TrackGrid, xM: Float64Array, yM: Float64Array): Float64Array {
  const n = track.distanceM.length;
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const h = track.headingRad[i]!;
    out[i] = -(xM[i]! - track.xM[i]!) * Math.sin(h) + (yM[i]! - track.yM[i]!) * Math.cos(h);
  }
  return out;
}

/** Half-width of the running mean the line is read from, m: short against a corner, long against noise. */
const SCATTER_HALF_WINDOW_M = 4;

/** The offset as a running mean (what the corner figures read) and the scatter about it. */
export function smoothedOffset(
  offsetM: Float64Array,
  stepM: number,
  closed: boolean,
): { smoothM: Float64Array; scatterM: number } {
  const half = Math.max(1, Math.round(SCATTER_HALF_WINDOW_M / stepM));
  const smoothM = movingAverage(offsetM, half, closed);
  return { smoothM, scatterM: offsetScatterM(offsetM, smoothM, 2 * half + 1) };
}

/** Standard deviation of the offset's scatter about its running mean, m (the log's own position noise across the track). */
function offsetScatterM(offsetM: Float64Array, smooth: Float64Array, window: number): number {
  let sum = 0;
  for (let i = 0; i < offsetM.length; i++) sum += (offsetM[i]! - smooth[i]!) ** 2;
  const residualVariance = sum / Math.max(1, offsetM.length);
  return Math.sqrt(residualVariance / (1 - 1 / window));
}
