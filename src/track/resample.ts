// Turns centreline points (a survey, a GPS trace, a map export) into the uniform TrackGrid: a chord-length
// cubic spline through the points, sampled at the grid step; Whittaker smoothing of x and y (see smooth.ts);
// heading and curvature of the smoothed curve by central differences; and a final pass onto exactly uniform
// arc length. Widths are carried along by linear interpolation.

import { InputError } from '../errors.js';
import type { NamedCorner, Path, TrackGrid } from './types.js';
import { chordSpline, sampleSpline } from './spline.js';
import { smoothingLambda, whittakerSmoother } from './smooth.js';
import { arcLengths, headingAndCurvature, resampleLinear, wrapAngleRad, type ResampleChannel } from './geometry.js';

export interface CentrelinePoints {
  xM: Float64Array;
  yM: Float64Array;
  widthLeftM: Float64Array | null;
  widthRightM: Float64Array | null;
  /** Height above the track's datum, m, and bank angle, rad (positive: surface falls to the left), if given. */
  zM?: Float64Array | null;
  bankRad?: Float64Array | null;
}

export interface CentrelineOptions {
  name: string;
  closed: boolean;
  stepM: number;
  /** Shortest wavelength kept by the smoothing, m; 0 = none. */
  smoothingM: number;
  source: string;
  corners?: NamedCorner[];
  geoOrigin?: { latDeg: number; lonDeg: number } | null;
}

/** The grid on a length: closed n = round(L / step), open n = round(L / step) + 1; the actual step fits L exactly. */
/** More grid points than this means coordinates in the wrong unit (1,000 km at 1 m), not a track. */
export const MAX_GRID_POINTS = 1_000_000;

export function uniformGrid(
  lengthM: number,
  stepM: number,
  closed: boolean,
  source: string,
): { count: number; stepM: number } {
  if (!(lengthM / stepM <= MAX_GRID_POINTS)) {
    throw new InputError(
      `${source}: the track is ${lengthM.toPrecision(3)} m long, over ${MAX_GRID_POINTS} grid points at a step of ${stepM} m; are the coordinates in metres?`,
    );
  }
  const intervals = Math.max(1, Math.round(lengthM / stepM));
  const count = closed ? intervals : intervals + 1;
  if (count < 4) {
    throw new InputError(
      `${source}: the track is only ${lengthM.toFixed(2)} m long, under 4 grid points at a step of ${stepM} m`,
    );
  }
  return { count, stepM: lengthM / intervals };
}

/**
 * The sharpest turn a centreline may make at one of its points, degrees: a hairpin sampled every few tens of
 * metres turns well under this at each point, a line that runs out and back along itself turns 180 degrees.
 */
export const MAX_TURN_AT_POINT_DEG = 150;

/** The first point where the centreline turns back on itself (over MAX_TURN_AT_POINT_DEG), or -1. */
export function firstFold(xM: ArrayLike<number>, yM: ArrayLike<number>, closed: boolean): number {
  const n = xM.length;
  const limit = Math.cos((MAX_TURN_AT_POINT_DEG * Math.PI) / 180);
  for (let i = closed ? 0 : 1; i < (closed ? n : n - 1); i++) {
    const before = (i - 1 + n) % n;
    const after = (i + 1) % n;
    const ax = xM[i]! - xM[before]!;
    const ay = yM[i]! - yM[before]!;
    const bx = xM[after]! - xM[i]!;
    const by = yM[after]! - yM[i]!;
    const lengths = Math.hypot(ax, ay) * Math.hypot(bx, by);
    if (lengths > 0 && (ax * bx + ay * by) / lengths < limit) return i;
  }
  return -1;
}

export function trackFromCentreline(points: CentrelinePoints, options: CentrelineOptions): TrackGrid {
  const { closed, source } = options;
  const n = points.xM.length;
  if (n < 4) throw new InputError(`${source}: only ${n} points; a centreline needs at least 4`);
  const fold = firstFold(points.xM, points.yM, closed);
  if (fold >= 0)
    throw new InputError(
      `${source}: point ${fold}: the centreline turns back on itself (over ${MAX_TURN_AT_POINT_DEG} degrees at one point); a track does not run out and back along itself`,
    );
  const spline = chordSpline(points.xM, points.yM, closed);

  // Intermediate grid at (about) the target step in the spline's chord parameter.
  const { count: m } = uniformGrid(spline.totalT, options.stepM, closed, source);
  const x = new Float64Array(m);
  const y = new Float64Array(m);
  const widthLeft = points.widthLeftM ? new Float64Array(m) : null;
  const widthRight = points.widthRightM ? new Float64Array(m) : null;
  const widthChannels = [];
  if (widthLeft && points.widthLeftM) widthChannels.push({ values: points.widthLeftM, out: widthLeft });
  if (widthRight && points.widthRightM) widthChannels.push({ values: points.widthRightM, out: widthRight });
  const z = points.zM ? new Float64Array(m) : null;
  const bank = points.bankRad ? new Float64Array(m) : null;
  if (z && points.zM) widthChannels.push({ values: points.zM, out: z });
  if (bank && points.bankRad) widthChannels.push({ values: points.bankRad, out: bank });
  sampleSpline(spline, m, x, y, widthChannels);

  if (options.smoothingM > 0) {
    const parameterStep = closed ? spline.totalT / m : spline.totalT / (m - 1);
    const solve = whittakerSmoother(m, smoothingLambda(options.smoothingM, parameterStep), closed);
    solve(x, x);
    solve(y, y);
  }

  const heading = new Float64Array(m);
  const curvature = new Float64Array(m);
  headingAndCurvature(x, y, closed, heading, curvature);
  const { distanceM: sourceDistance, totalM } = arcLengths(x, y, curvature, closed);

  const grid = uniformGrid(totalM, options.stepM, closed, source);
  const count = grid.count;
  const track: TrackGrid = {
    name: options.name,
    closed,
    stepM: grid.stepM,
    lengthM: closed ? count * grid.stepM : (count - 1) * grid.stepM,
    distanceM: new Float64Array(count),
    xM: new Float64Array(count),
    yM: new Float64Array(count),
    headingRad: new Float64Array(count),
    curvaturePerM: new Float64Array(count),
    widthLeftM: widthLeft ? new Float64Array(count) : null,
    widthRightM: widthRight ? new Float64Array(count) : null,
    geoOrigin: options.geoOrigin ?? null,
    corners: options.corners ?? [],
    source,
    ...(z ? { zM: new Float64Array(count) } : {}),
    ...(bank ? { bankRad: new Float64Array(count) } : {}),
  };
  for (let i = 0; i < count; i++) track.distanceM[i] = i * grid.stepM;
  const lapTurning = closed ? heading[m - 1]! + wrapAngleRad(heading[0]! - heading[m - 1]!) - heading[0]! : 0;
  const channels: ResampleChannel[] = [
    { values: x, out: track.xM },
    { values: y, out: track.yM },
    { values: heading, out: track.headingRad, lapOffset: lapTurning },
    { values: curvature, out: track.curvaturePerM },
  ];
  if (widthLeft && track.widthLeftM) channels.push({ values: widthLeft, out: track.widthLeftM });
  if (widthRight && track.widthRightM) channels.push({ values: widthRight, out: track.widthRightM });
  if (z && track.zM) channels.push({ values: z, out: track.zM });
  if (bank && track.bankRad) channels.push({ values: bank, out: track.bankRad });
  resampleLinear(sourceDistance, totalM, closed, grid.stepM, count, channels);
  return track;
}

/** The centreline as a Path for the solver: its curvature, and segments of one grid step. */
const centrelines = new WeakMap<TrackGrid, Path>();

export function centrelinePath(track: TrackGrid): Path {
  // One path per grid, like the grid's other derived records: a sweep solving the same track many times reuses it
  // and what the solver derives from it. Its arrays are read, never written, as every array of a result.
  let path = centrelines.get(track);
  if (!path) {
    const n = track.curvaturePerM.length;
    const segments = new Float64Array(track.closed ? n : n - 1);
    segments.fill(track.stepM);
    path = { closed: track.closed, curvaturePerM: track.curvaturePerM.slice(), segmentLengthM: segments };
    centrelines.set(track, path);
  }
  return path;
}
