// The same track on a coarser grid, for a warm start: the line is first found on a grid a few times coarser, then
// carried onto the fine grid by a cubic spline (resample-line.ts) and finished there, so the fine grid needs only
// the few iterations that polish a nearly right line whatever its spacing (nested iteration, the "full multigrid"
// idea of Briggs, Henson and McCormick, A Multigrid Tutorial, 2nd ed., SIAM 2000, ch. 3). Every channel the
// line search reads is interpolated linearly from the fine grid, which resolves it.

import type { TrackGrid } from '../track/types.js';
import { resampleLinear, type ResampleChannel } from '../track/geometry.js';
import { isInputError } from '../errors.js';
import { corridorOf, type Corridor } from './corridor.js';
import { splineOffsets } from './resample-line.js';
import { clampInto } from './box-qp.js';

/** Spacing of the coarse grid, m: fine enough for the default 30 m centreline smoothing (7 points a wavelength). */
export const COARSE_STEP_M = 4;

/** The track on a grid of about COARSE_STEP_M, or null when the track's own grid is not at least twice as fine. */
export function coarseTrack(track: TrackGrid): TrackGrid | null {
  const n = track.distanceM.length;
  const intervals = Math.round(track.lengthM / COARSE_STEP_M);
  const count = track.closed ? intervals : intervals + 1;
  if (2 * count > n || count < 16) return null;
  const stepM = track.lengthM / intervals;
  const channel = (values: Float64Array, lapOffset?: number): ResampleChannel => ({
    values,
    out: new Float64Array(count),
    ...(lapOffset === undefined ? {} : { lapOffset }),
  });
  const turns = track.closed
    ? 2 * Math.PI * Math.round((track.headingRad[n - 1]! - track.headingRad[0]!) / (2 * Math.PI))
    : undefined;
  const x = channel(track.xM);
  const y = channel(track.yM);
  const heading = channel(track.headingRad, turns);
  const curvature = channel(track.curvaturePerM);
  const left = track.widthLeftM ? channel(track.widthLeftM) : null;
  const right = track.widthRightM ? channel(track.widthRightM) : null;
  const z = track.zM ? channel(track.zM) : null;
  const bank = track.bankRad ? channel(track.bankRad) : null;
  const channels = [x, y, heading, curvature, left, right, z, bank].filter((c): c is ResampleChannel => c !== null);
  resampleLinear(track.distanceM, track.lengthM, track.closed, stepM, count, channels);
  const distanceM = new Float64Array(count);
  for (let i = 0; i < count; i++) distanceM[i] = i * stepM;
  return {
    name: track.name,
    closed: track.closed,
    stepM,
    lengthM: track.lengthM,
    distanceM,
    xM: x.out,
    yM: y.out,
    headingRad: heading.out,
    curvaturePerM: curvature.out,
    widthLeftM: left ? left.out : null,
    widthRightM: right ? right.out : null,
    geoOrigin: track.geoOrigin,
    corners: track.corners,
    ...(z ? { zM: z.out } : {}),
    ...(bank ? { bankRad: bank.out } : {}),
    source: track.source,
  };
}

export interface CoarseLevel {
  track: TrackGrid;
  corridor: Corridor;
}

/** The coarse grid's track and corridor for a warm start, or null (grid already coarse, or no room there). */
export function coarseLevel(track: TrackGrid, marginM: number): CoarseLevel | null {
  const coarse = coarseTrack(track);
  if (!coarse) return null;
  try {
    return { track: coarse, corridor: corridorOf(coarse, marginM) };
  } catch (error) {
    // Interpolated widths that fold where the fine ones just fit: the search runs on the fine grid alone.
    if (isInputError(error)) return null;
    throw error;
  }
}

/** Offsets found on the coarse grid, carried onto the fine grid by the cubic spline and into its corridor. */
export function prolongOffsets(
  track: TrackGrid,
  corridor: Corridor,
  coarse: TrackGrid,
  offsetM: Float64Array,
): Float64Array {
  const fine = splineOffsets(track, coarse.distanceM, offsetM);
  return clampInto(fine, corridor.lowerM, corridor.upperM, fine);
}
