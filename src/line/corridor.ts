// The corridor a line may use: at each sample, the offsets between the right and left edges less a margin.
// Checks the track first: it must give widths, the margin must fit, and the edges must not fold over
// themselves (an offset curve at distance w from a centreline of curvature kc folds where w |kc| >= 1 on the
// side of the turn's centre: its radius 1/|kc| - w would be zero or negative). The test applies to the edges
// less the margin, the outermost curves a line may follow.

import { InputError } from '../errors.js';
import type { Car } from '../car/types.js';
import type { TrackGrid } from '../track/types.js';

export interface Corridor {
  /** Smallest allowed offset (right edge plus margin, negative), m. */
  lowerM: Float64Array;
  /** Largest allowed offset (left edge less margin), m. */
  upperM: Float64Array;
  marginM: number;
}

/** Default margin from each edge: half the car's width plus 0.3 m where the car gives its width, else 0.8 m. */
export const DEFAULT_MARGIN_M = 0.8;
export const EDGE_CLEARANCE_M = 0.3;

export function defaultMarginM(car: Car | null): number {
  if (car && car.widthM !== null && car.widthM > 0) return car.widthM / 2 + EDGE_CLEARANCE_M;
  return DEFAULT_MARGIN_M;
}

const at = (track: TrackGrid, i: number) => `${track.distanceM[i]!.toFixed(1)} m`;

/** Validates the track's widths against the margin and returns the corridor; InputError on bad input. */
export function corridorOf(track: TrackGrid, marginM: number): Corridor {
  if (!(marginM >= 0) || !Number.isFinite(marginM))
    throw new InputError(`margin ${marginM} m: must be a number of metres, zero or more`);
  const left = track.widthLeftM;
  const right = track.widthRightM;
  if (!left || !right) {
    throw new InputError(
      `${track.source}: the track gives no widths, so there is no room for a line; give them with --width-m <m> or with width columns (width_left_m, width_right_m; see --columns)`,
    );
  }
  const count = track.distanceM.length;
  const lowerM = new Float64Array(count);
  const upperM = new Float64Array(count);
  for (let i = 0; i < count; i++) {
    const wl = left[i]!;
    const wr = right[i]!;
    const kc = track.curvaturePerM[i]!;
    if (!(wl >= 0 && wr >= 0))
      throw new InputError(
        `${track.source}: at ${at(track, i)} the width is missing or negative (left ${wl} m, right ${wr} m)`,
      );
    if (wl + wr < 2 * marginM) {
      throw new InputError(
        `${track.source}: at ${at(track, i)} the track is ${(wl + wr).toFixed(2)} m wide, less than twice the margin of ${marginM} m; lower --margin-m`,
      );
    }
    // The line keeps the margin from the edges, so what must not fold is the edge less the margin.
    const usableLeft = wl - marginM;
    const usableRight = wr - marginM;
    if (kc * usableLeft >= 1 || -kc * usableRight >= 1) {
      const side = kc > 0 ? 'left' : 'right';
      const width = kc > 0 ? wl : wr;
      throw new InputError(
        `${track.source}: at ${at(track, i)} the ${side} edge folds over itself: ${width.toFixed(2)} m of width (less the margin of ${marginM} m) on the inside of a turn of radius ${(1 / Math.abs(kc)).toFixed(2)} m; narrow the width there or smooth the centreline (--smoothing-m)`,
      );
    }
    lowerM[i] = -(wr - marginM);
    upperM[i] = wl - marginM;
  }
  return { lowerM, upperM, marginM };
}
