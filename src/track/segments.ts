// A track built from straights, circular arcs and transitions (clothoids: curvature linear in distance), the
// way road and circuit alignments are designed (e.g. AASHTO, A Policy on Geometric Design of Highways and
// Streets, ch. 3). Curvature is exact and used as it is; the heading is its exact integral, and the positions
// are the integral of (cos, sin) of the heading by 3-point Gauss-Legendre quadrature on pieces that turn at
// most 0.05 rad (error far below a millimetre per kilometre).

import { InputError } from '../errors.js';
import { degToRad, radToDeg } from '../units.js';
import type { NamedCorner, TrackGrid } from './types.js';
import { wrapAngleRad } from './geometry.js';
import { uniformGrid } from './resample.js';
import { movingAverage } from '../numeric/moving-average.js';

/** A segment's grade (%, positive uphill, constant along it) and bank (degrees, positive = surface falls to the
 * left), both optional; a track with neither is flat. */
export interface SegmentRoad {
  gradePct?: number | undefined;
  bankDeg?: number | undefined;
}

export type TrackSegment = SegmentRoad &
  (
    | { kind: 'straight'; lengthM: number }
    /** Positive angle = left turn, negative = right. */
    | { kind: 'arc'; radiusM: number; angleDeg: number }
    /** Curvature 1/m, positive = left, linear in distance from startCurvature to endCurvature. */
    | { kind: 'transition'; lengthM: number; startCurvature: number; endCurvature: number }
  );

/** Length of the vertical curve that rounds a change of grade between segments, m. */
export const VERTICAL_CURVE_M = 50;

/** Steepest grade and bank a segment may have (%, degrees): beyond them a value is a typo, not a road. */
export const MAX_SEGMENT_GRADE_PCT = 40;
export const MAX_SEGMENT_BANK_DEG = 45;

export interface SegmentTrackSpec {
  name: string;
  closed: boolean;
  /** Full width, split evenly left and right, unless widthLeftM / widthRightM say otherwise; null = unknown. */
  widthM: number | null;
  widthLeftM?: number;
  widthRightM?: number;
  segments: TrackSegment[];
  corners?: NamedCorner[];
  geoOrigin?: { latDeg: number; lonDeg: number } | null;
  /** Heading at the start, degrees anticlockwise from east (x); default 0. */
  startHeadingDeg?: number;
}

/** A closed segment list must end within these of its start. */
export const CLOSURE_TOLERANCE_M = 1;
export const CLOSURE_TOLERANCE_DEG = 1;

/** Every segment kind as curvature linear in distance over its length. */
interface Piece {
  startM: number;
  lengthM: number;
  startCurvature: number;
  endCurvature: number;
  startHeadingRad: number;
  startX: number;
  startY: number;
}

const GAUSS_NODES = [0.5 - Math.sqrt(15) / 10, 0.5, 0.5 + Math.sqrt(15) / 10];
const GAUSS_WEIGHTS = [5 / 18, 8 / 18, 5 / 18];
const MAX_TURN_PER_PIECE_RAD = 0.05;

/** Tightest curvature a segment may have, 1/m: a radius of 1 m, tighter than any car can turn. */
export const MAX_SEGMENT_CURVATURE_PER_M = 1;
/** Longest segment track, m: a long rally stage is under 50 km. */
export const MAX_SEGMENT_TRACK_LENGTH_M = 200_000;
/** With the two limits above a piece needs at most 4 million parts; the cap holds the integration to that. */
const MAX_PARTS = Math.ceil((MAX_SEGMENT_CURVATURE_PER_M * MAX_SEGMENT_TRACK_LENGTH_M) / MAX_TURN_PER_PIECE_RAD);

function headingAt(piece: Piece, u: number): number {
  return (
    piece.startHeadingRad +
    piece.startCurvature * u +
    ((piece.endCurvature - piece.startCurvature) * u * u) / (2 * piece.lengthM)
  );
}

function curvatureAt(piece: Piece, u: number): number {
  return piece.startCurvature + ((piece.endCurvature - piece.startCurvature) * u) / piece.lengthM;
}

/** Displacement along the piece from local distance ua to ub, written to out[0], out[1]. */
function displacement(piece: Piece, ua: number, ub: number, out: Float64Array): void {
  const span = ub - ua;
  const maxCurvature = Math.max(Math.abs(curvatureAt(piece, ua)), Math.abs(curvatureAt(piece, ub)));
  const parts = Math.min(MAX_PARTS, Math.max(1, Math.ceil((maxCurvature * span) / MAX_TURN_PER_PIECE_RAD)));
  const h = span / parts;
  let dx = 0;
  let dy = 0;
  for (let p = 0; p < parts; p++) {
    const u0 = ua + p * h;
    for (let g = 0; g < 3; g++) {
      const theta = headingAt(piece, u0 + GAUSS_NODES[g]! * h);
      dx += GAUSS_WEIGHTS[g]! * Math.cos(theta);
      dy += GAUSS_WEIGHTS[g]! * Math.sin(theta);
    }
  }
  out[0] = dx * h;
  out[1] = dy * h;
}

function toPieces(
  segments: TrackSegment[],
  startHeadingRad: number,
  source: string,
): { pieces: Piece[]; lengthM: number; endX: number; endY: number; endHeadingRad: number } {
  if (segments.length === 0) throw new InputError(`${source}: segments: the list is empty`);
  const pieces: Piece[] = [];
  let s = 0;
  let heading = startHeadingRad;
  let x = 0;
  let y = 0;
  const d = new Float64Array(2);
  segments.forEach((segment, index) => {
    let lengthM: number;
    let k0: number;
    let k1: number;
    const where = `${source}: segments[${index}]`;
    if (segment.kind === 'straight') {
      if (!(segment.lengthM > 0 && Number.isFinite(segment.lengthM)))
        throw new InputError(`${where}.lengthM: must be a positive length, m`);
      lengthM = segment.lengthM;
      k0 = k1 = 0;
    } else if (segment.kind === 'arc') {
      if (!(segment.radiusM > 0 && Number.isFinite(segment.radiusM)))
        throw new InputError(`${where}.radiusM: must be a positive radius, m`);
      if (segment.radiusM < 1 / MAX_SEGMENT_CURVATURE_PER_M)
        throw new InputError(
          `${where}.radiusM: ${segment.radiusM} m is tighter than any car turns (at least ${1 / MAX_SEGMENT_CURVATURE_PER_M} m)`,
        );
      if (!(segment.angleDeg !== 0 && Number.isFinite(segment.angleDeg)))
        throw new InputError(`${where}.angleDeg: must be a non-zero angle, degrees`);
      lengthM = segment.radiusM * Math.abs(degToRad(segment.angleDeg));
      k0 = k1 = Math.sign(segment.angleDeg) / segment.radiusM;
    } else {
      if (!(segment.lengthM > 0 && Number.isFinite(segment.lengthM)))
        throw new InputError(`${where}.lengthM: must be a positive length, m`);
      if (!Number.isFinite(segment.startCurvature) || !Number.isFinite(segment.endCurvature))
        throw new InputError(`${where}: curvatures must be finite numbers, 1/m`);
      for (const field of ['startCurvature', 'endCurvature'] as const) {
        if (Math.abs(segment[field]) > MAX_SEGMENT_CURVATURE_PER_M)
          throw new InputError(
            `${where}.${field}: ${segment[field]} 1/m is outside -${MAX_SEGMENT_CURVATURE_PER_M} to ${MAX_SEGMENT_CURVATURE_PER_M} 1/m (a radius under 1 m)`,
          );
      }
      lengthM = segment.lengthM;
      k0 = segment.startCurvature;
      k1 = segment.endCurvature;
    }
    if (segment.gradePct !== undefined && !(Math.abs(segment.gradePct) <= MAX_SEGMENT_GRADE_PCT))
      throw new InputError(`${where}.gradePct: ${segment.gradePct} % is steeper than ${MAX_SEGMENT_GRADE_PCT} %`);
    if (segment.bankDeg !== undefined && !(Math.abs(segment.bankDeg) <= MAX_SEGMENT_BANK_DEG))
      throw new InputError(`${where}.bankDeg: ${segment.bankDeg} degrees is over ${MAX_SEGMENT_BANK_DEG} degrees`);
    if (!(s + lengthM <= MAX_SEGMENT_TRACK_LENGTH_M))
      throw new InputError(
        `${where}: the track reaches ${(s + lengthM).toPrecision(3)} m, over the ${MAX_SEGMENT_TRACK_LENGTH_M / 1000} km a segment track may have`,
      );
    const piece: Piece = {
      startM: s,
      lengthM,
      startCurvature: k0,
      endCurvature: k1,
      startHeadingRad: heading,
      startX: x,
      startY: y,
    };
    pieces.push(piece);
    displacement(piece, 0, lengthM, d);
    x += d[0]!;
    y += d[1]!;
    heading = headingAt(piece, lengthM);
    s += lengthM;
  });
  return { pieces, lengthM: s, endX: x, endY: y, endHeadingRad: heading };
}

export function trackFromSegments(spec: SegmentTrackSpec, stepM: number, source: string): TrackGrid {
  const startHeadingRad = degToRad(spec.startHeadingDeg ?? 0);
  const { pieces, lengthM, endX, endY, endHeadingRad } = toPieces(spec.segments, startHeadingRad, source);
  const closed = spec.closed;
  let gapX = 0;
  let gapY = 0;
  if (closed) {
    const gapM = Math.hypot(endX, endY);
    const headingOffDeg = radToDeg(wrapAngleRad(endHeadingRad - startHeadingRad));
    if (gapM > CLOSURE_TOLERANCE_M || Math.abs(headingOffDeg) > CLOSURE_TOLERANCE_DEG) {
      throw new InputError(
        `${source}: segments: the closed track does not close: it ends ${gapM.toFixed(2)} m from its start ` +
          `(x ${endX.toFixed(2)} m, y ${endY.toFixed(2)} m) with the heading off by ${headingOffDeg.toFixed(2)} degrees ` +
          `(allowed ${CLOSURE_TOLERANCE_M} m and ${CLOSURE_TOLERANCE_DEG} degree)`,
      );
    }
    gapX = endX;
    gapY = endY;
  }

  const corners = spec.corners ?? [];
  corners.forEach((corner, index) => {
    if (!(corner.atM >= 0 && corner.atM <= lengthM)) {
      throw new InputError(
        `${source}: corners[${index}].atM: ${corner.atM} m is outside the track (0 to ${lengthM.toFixed(1)} m)`,
      );
    }
  });

  const grid = uniformGrid(lengthM, stepM, closed, source);
  const count = grid.count;
  const distanceM = new Float64Array(count);
  const xM = new Float64Array(count);
  const yM = new Float64Array(count);
  const headingRad = new Float64Array(count);
  const curvaturePerM = new Float64Array(count);
  const d = new Float64Array(2);
  let k = 0;
  let u = 0;
  let px = pieces[0]!.startX;
  let py = pieces[0]!.startY;
  for (let i = 0; i < count; i++) {
    const s = i === count - 1 && !closed ? lengthM : i * grid.stepM;
    while (k < pieces.length - 1 && s >= pieces[k + 1]!.startM) {
      k++;
      u = 0;
      px = pieces[k]!.startX;
      py = pieces[k]!.startY;
    }
    const piece = pieces[k]!;
    const target = Math.min(s - piece.startM, piece.lengthM);
    if (target > u) {
      displacement(piece, u, target, d);
      px += d[0]!;
      py += d[1]!;
      u = target;
    }
    // Spread the closure gap (under 1 m) along the lap so the loop joins.
    const share = closed ? s / lengthM : 0;
    distanceM[i] = s;
    xM[i] = px - gapX * share;
    yM[i] = py - gapY * share;
    headingRad[i] = headingAt(piece, target);
    // The exact curvature at the sample; at a jump (an arc entered without a transition) the sample takes
    // the value of the segment that starts there.
    curvaturePerM[i] = curvatureAt(piece, target);
  }

  const road = segmentRoad(spec, pieces, distanceM, source);
  const widthLeft = spec.widthLeftM ?? (spec.widthM !== null ? spec.widthM / 2 : null);
  const widthRight = spec.widthRightM ?? (spec.widthM !== null ? spec.widthM / 2 : null);
  return {
    name: spec.name,
    closed,
    stepM: grid.stepM,
    lengthM: closed ? count * grid.stepM : (count - 1) * grid.stepM,
    distanceM,
    xM,
    yM,
    headingRad,
    curvaturePerM,
    widthLeftM: widthLeft !== null ? new Float64Array(count).fill(widthLeft) : null,
    widthRightM: widthRight !== null ? new Float64Array(count).fill(widthRight) : null,
    geoOrigin: spec.geoOrigin ?? null,
    corners: corners.map((corner) => ({ ...corner })),
    source,
    ...road,
  };
}

/** A smoothed grade this close to its sample's own grade is that grade: the moving average's running sum leaves
 * residue of about 1e-17 where its window sees one grade only, and a flat stretch must stay exactly flat (the
 * solver takes its level-road path on exact zeros). 1e-12 is a micrometre of height per kilometre. */
const GRADE_RESIDUE = 1e-12;

/** Heights (the integral of each segment's grade) and banks on the grid; nothing when no segment gives either. */
function segmentRoad(
  spec: SegmentTrackSpec,
  pieces: Piece[],
  distanceM: Float64Array,
  source: string,
): { zM?: Float64Array; bankRad?: Float64Array } {
  const segments = spec.segments;
  if (!segments.some((s) => s.gradePct !== undefined || s.bankDeg !== undefined)) return {};
  const count = distanceM.length;
  const startZ = new Float64Array(pieces.length + 1);
  for (let k = 0; k < pieces.length; k++)
    startZ[k + 1] = startZ[k]! + ((segments[k]!.gradePct ?? 0) / 100) * pieces[k]!.lengthM;
  const endZ = startZ[pieces.length]!;
  if (spec.closed && Math.abs(endZ) > CLOSURE_TOLERANCE_M)
    throw new InputError(
      `${source}: segments: the grades do not close the lap: it ends ${endZ.toFixed(2)} m ${endZ > 0 ? 'above' : 'below'} its start (allowed ${CLOSURE_TOLERANCE_M} m)`,
    );
  const gradeShare = new Float64Array(count);
  const bankRad = new Float64Array(count);
  let k = 0;
  for (let i = 0; i < count; i++) {
    const s = distanceM[i]!;
    while (k < pieces.length - 1 && s >= pieces[k + 1]!.startM) k++;
    gradeShare[i] = (segments[k]!.gradePct ?? 0) / 100;
    bankRad[i] = degToRad(segments[k]!.bankDeg ?? 0);
  }
  // A change of grade between segments is rounded into a parabolic vertical curve (grade linear in distance) of
  // VERTICAL_CURVE_M, as road alignments are designed; a bare kink would be a crest of zero radius.
  const step = count > 1 ? distanceM[1]! - distanceM[0]! : 1;
  const smooth = movingAverage(gradeShare, Math.round(VERTICAL_CURVE_M / step / 2), spec.closed);
  // The running sum leaves rounding residue where the window sees one grade only; that grade is the exact average.
  for (let i = 0; i < count; i++) if (Math.abs(smooth[i]! - gradeShare[i]!) < GRADE_RESIDUE) smooth[i] = gradeShare[i]!;
  const zM = new Float64Array(count);
  for (let i = 1; i < count; i++) zM[i] = zM[i - 1]! + 0.5 * (smooth[i - 1]! + smooth[i]!) * step;
  if (spec.closed) closeHeights(zM, smooth, step);
  return { zM, bankRad };
}

/**
 * Spread what is left of a closed lap's gap in height (under the tolerance: the grid samples each segment's grade
 * a fraction of a step off its ends) over the steps where the height changes, in proportion to their length, so
 * the loop joins and a level stretch keeps its height exactly.
 */
function closeHeights(zM: Float64Array, smooth: Float64Array, step: number): void {
  const count = zM.length;
  const climbs = (i: number, j: number) => smooth[i] !== 0 || smooth[j] !== 0;
  const gap = zM[count - 1]! + 0.5 * (smooth[count - 1]! + smooth[0]!) * step;
  let climbing = climbs(count - 1, 0) ? 1 : 0;
  for (let i = 1; i < count; i++) if (climbs(i - 1, i)) climbing++;
  if (climbing === 0) return;
  const share = gap / climbing;
  let taken = 0;
  for (let i = 1; i < count; i++) {
    if (climbs(i - 1, i)) taken += share;
    zM[i] = zM[i]! - taken;
  }
}
