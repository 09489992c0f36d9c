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

/** The running sums of the smoothing and the differences after it leave rounding residue in the slope and the
 * vertical curvature (1/m) of a straight line of heights: about 1e-15 on a 5 km lap at 1 m, up to about 1e-11 at a
 * 0.1 m step; a real road changes them by 1e-6 or more between samples (a vertical curve of radius 100 km at 0.1 m).
 * A change under this is taken as none, so a constant grade stays exactly constant and a level road exactly level,
 * as the file says, and the solver reuses one sample's limits on the next. */
const ROUNDING_RESIDUE = 1e-9;

/** The value, or the one held before it where they differ by rounding residue only (zero counts as held). */
const held = (value: number, before: number) => (Math.abs(value - before) < ROUNDING_RESIDUE ? before : value);

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
  let slopeBefore = 0;
  let curvatureBefore = 0;
  for (let i = 0; i < n; i++) {
    const prev = lapIndex(i - 1, n, closed);
    const next = lapIndex(i + 1, n, closed);
    const span = closed ? 2 : next - prev;
    const slope = held(held((smooth[next]! - smooth[prev]!) / (span * h), 0), slopeBefore);
    slopeBefore = slope;
    gradeRad[i] = Math.atan(slope);
    // Curvature of the profile z(s): z'' / (1 + z'^2)^(3/2); an open track's ends take their neighbour's.
    if (span === 2) {
      const curvature = (smooth[next]! - 2 * smooth[i]! + smooth[prev]!) / (h * h) / Math.pow(1 + slope * slope, 1.5);
      verticalCurvaturePerM[i] = curvatureBefore = held(held(curvature, 0), curvatureBefore);
    }
  }
  if (!closed && n > 2) {
    verticalCurvaturePerM[0] = verticalCurvaturePerM[1]!;
    verticalCurvaturePerM[n - 1] = verticalCurvaturePerM[n - 2]!;
  }
  const profile = { zM, gradeRad, bankRad, verticalCurvaturePerM };
  profiles.set(track, profile);
  return profile;
}
