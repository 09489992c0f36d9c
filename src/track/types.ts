// The track as the rest of the program sees it: samples on one uniform distance grid along the centreline, SI units.

import type { CornerLayout } from './corner-layout.js';

export interface NamedCorner {
  /** Distance along the centreline of the apex or of the corner's middle, m. */
  atM: number;
  name: string;
}

export interface TrackGrid {
  name: string;
  /** Closed circuit (the last sample joins the first) or open stage (hill climb, single sector). */
  closed: boolean;
  /** Grid spacing along the centreline, m. */
  stepM: number;
  /** Centreline length, m: n * stepM when closed, (n - 1) * stepM when open. */
  lengthM: number;
  distanceM: Float64Array;
  xM: Float64Array;
  yM: Float64Array;
  /** Heading of the centreline, rad, unwrapped (continuous along the lap). */
  headingRad: Float64Array;
  /** Signed curvature of the centreline, 1/m, positive = left turn. */
  curvaturePerM: Float64Array;
  /** Usable width to the left and right of the centreline, m; null where the source gives none. */
  widthLeftM: Float64Array | null;
  widthRightM: Float64Array | null;
  /** Where the local plane's origin (x = 0, y = 0) lies on the Earth, for GPS logs; x points east, y north. */
  geoOrigin: { latDeg: number; lonDeg: number } | null;
  /** Corner names given by the track file, if any. */
  corners: NamedCorner[];
  /** Height of the centreline above the track's datum, m; absent on a flat track. */
  zM?: Float64Array | null;
  /** Bank angle, rad, positive when the surface falls towards the left edge; absent on a flat track. */
  bankRad?: Float64Array | null;
  /** Corners and sectors given by a corners file; absent = found from the curvature (corner-layout.ts). */
  cornerLayout?: CornerLayout;
  /** Where the grid came from, for messages. */
  source: string;
}

/**
 * What the solver drives along: the centreline or a racing line, sampled on the centreline's grid.
 * segmentLengthM[i] is the path length from sample i to sample i + 1 (to sample 0 after the last on a closed path).
 */
export interface Path {
  closed: boolean;
  curvaturePerM: Float64Array;
  segmentLengthM: Float64Array;
}
