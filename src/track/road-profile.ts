// The road in three dimensions on the track's grid: height, grade, bank and vertical curvature, from the heights
// and bank angles a track file gives. Grade and vertical curvature are central differences of the height after a
// light moving average (surveyed heights carry centimetre steps that a second difference would turn into spikes).

import type { TrackGrid } from './types.js';
import { movingAverage } from '../numeric/moving-average.js';
import { lapIndex } from '../numeric/lap-index.js';

export interface RoadProfile {
  /** Height above the track's datum, m (zeros where the file gives bank only). */
  zM: Float64Array;
  /** Grade angle, rad, positive uphill in the direction of travel. */
  gradeRad: Float64Array;
  /** Bank angle, rad, positive when the surface falls towards the left edge (helping a left-hand turn). */
  bankRad: Float64Array;
  /** Vertical curvature d2z/ds2, 1/m: negative over a crest, positive in a compression. */
  verticalCurvaturePerM: Float64Array;
}

/** Half-width of the moving average over the heights before differencing, m. */
export const HEIGHT_SMOOTHING_M = 5;

const profiles = new WeakMap<TrackGrid, RoadProfile | null>();

/** The track's road profile, or null for a flat track (no heights, no bank): the solver then runs as on flat ground. */
export function roadProfileOf(track: TrackGrid): RoadProfile | null {
  if (!track.zM && !track.bankRad) return null;
  const cached = profiles.get(track);
  if (cached !== undefined) return cached;
  const n = track.distanceM.length;
  const zM = track.zM ?? new Float64Array(n);
  const bankRad = track.bankRad ?? new Float64Array(n);
  const smooth = movingAverage(zM, Math.round(HEIGHT_SMOOTHING_M / track.stepM), track.closed);
  const gradeRad = new Float64Array(n);
  const verticalCurvaturePerM = new Float64Array(n);
  const h = track.stepM;
  const closed = track.closed;
  for (let i = 0; i < n; i++) {
    const prev = lapIndex(i - 1, n, closed);
    const next = lapIndex(i + 1, n, closed);
    const span = closed ? 2 : next - prev;
    const slope = (smooth[next]! - smooth[prev]!) / (span * h);
    gradeRad[i] = Math.atan(slope);
    // Curvature of the profile z(s): z'' / (1 + z'^2)^(3/2); an open track's ends take their neighbour's.
    if (span === 2)
      verticalCurvaturePerM[i] =
        (smooth[next]! - 2 * smooth[i]! + smooth[prev]!) / (h * h) / Math.pow(1 + slope * slope, 1.5);
  }
  if (!closed && n > 2) {
    verticalCurvaturePerM[0] = verticalCurvaturePerM[1]!;
    verticalCurvaturePerM[n - 1] = verticalCurvaturePerM[n - 2]!;
  }
  const profile = { zM, gradeRad, bankRad, verticalCurvaturePerM };
  profiles.set(track, profile);
  return profile;
}
