// Positions against a track's centreline: nearest-point projection onto the polyline of grid stations
// (distance along, signed offset, gap), a tracking search for ordered samples that looks only around the
// previous match (linear time, and it cannot jump to a neighbouring stretch of track), and a rigid 2-D fit of a
// path onto the centreline by trimmed ICP (Besl & McKay 1992, IEEE TPAMI 14(2)) with the closed-form
// least-squares rotation of Kabsch (1976, Acta Cryst. A32) / Umeyama (1991, IEEE TPAMI 13(4)) in each step.

import type { TrackGrid } from './types.js';
import { lerp } from '../numeric/interpolate.js';
import { median } from '../numeric/quantile.js';

export interface PointProjection {
  /** Distance along the centreline of the nearest point, m, in [0, lengthM). */
  alongM: number;
  /** Signed lateral offset, m, positive to the left of the direction of travel. */
  offsetM: number;
  /** Unsigned distance to the centreline, m. */
  gapM: number;
  /** Index of the segment (station i to i + 1) holding the nearest point. */
  segment: number;
}

export function emptyProjection(): PointProjection {
  return { alongM: 0, offsetM: 0, gapM: Infinity, segment: 0 };
}

function segmentCount(track: TrackGrid): number {
  return track.closed ? track.xM.length : track.xM.length - 1;
}

/** Projects onto segment i; updates `out` when closer than what it holds. */
function trySegment(track: TrackGrid, i: number, x: number, y: number, out: PointProjection): void {
  const n = track.xM.length;
  const j = i + 1 < n ? i + 1 : 0;
  const ax = track.xM[i]!;
  const ay = track.yM[i]!;
  const dx = track.xM[j]! - ax;
  const dy = track.yM[j]! - ay;
  const px = x - ax;
  const py = y - ay;
  const lengthSquared = dx * dx + dy * dy;
  let t = lengthSquared > 0 ? (px * dx + py * dy) / lengthSquared : 0;
  if (t < 0) t = 0;
  else if (t > 1) t = 1;
  const ex = px - t * dx;
  const ey = py - t * dy;
  const gap = Math.sqrt(ex * ex + ey * ey);
  if (gap >= out.gapM) return;
  const start = track.distanceM[i]!;
  const end = j === 0 ? track.lengthM : track.distanceM[j]!;
  let along = lerp(start, end, t);
  if (along >= track.lengthM) along -= track.lengthM;
  const length = Math.sqrt(lengthSquared);
  out.gapM = gap;
  out.alongM = along;
  out.offsetM = length > 0 ? (dx * py - dy * px) / length : 0;
  out.segment = i;
}

/** Nearest point among segments centre - half ... centre + half (wrapping on a closed track). */
export function projectNear(
  track: TrackGrid,
  x: number,
  y: number,
  centre: number,
  half: number,
  out: PointProjection,
): void {
  const segments = segmentCount(track);
  out.gapM = Infinity;
  if (2 * half + 1 >= segments) {
    for (let i = 0; i < segments; i++) trySegment(track, i, x, y, out);
    return;
  }
  for (let k = -half; k <= half; k++) {
    let i = centre + k;
    if (track.closed) i = ((i % segments) + segments) % segments;
    else if (i < 0 || i >= segments) continue;
    trySegment(track, i, x, y, out);
  }
}

/** Nearest point on the whole centreline: a coarse pass over every k-th station, then a refine around the best. */
export function projectGlobal(track: TrackGrid, x: number, y: number, out: PointProjection): void {
  const n = track.xM.length;
  const stride = Math.max(1, Math.round(Math.sqrt(n) / 2));
  // Coarse candidates: the few best strided stations, so a near-tie across a hairpin is refined on both sides.
  let best = -1;
  let bestD = Infinity;
  let second = -1;
  let secondD = Infinity;
  for (let i = 0; i < n; i += stride) {
    const dx = track.xM[i]! - x;
    const dy = track.yM[i]! - y;
    const d = dx * dx + dy * dy;
    if (d < bestD) {
      second = best;
      secondD = bestD;
      best = i;
      bestD = d;
    } else if (d < secondD) {
      second = i;
      secondD = d;
    }
  }
  const found = emptyProjection();
  projectNear(track, x, y, best, stride + 1, found);
  if (second >= 0) {
    const other = emptyProjection();
    projectNear(track, x, y, second, stride + 1, other);
    if (other.gapM < found.gapM) Object.assign(found, other);
  }
  Object.assign(out, found);
}

export interface PathProjection {
  alongM: Float64Array;
  offsetM: Float64Array;
  gapM: Float64Array;
}

/**
 * Projects ordered samples from..to-1. Each sample is searched around the previous match, in a window that
 * grows with the distance moved; where the match is far from the track (pit lane, paddock, a GPS jump) a global
 * search is tried once the car has moved 5 m since the last one.
 */
export function projectPath(
  track: TrackGrid,
  xM: Float64Array,
  yM: Float64Array,
  from = 0,
  to = xM.length,
): PathProjection {
  const count = to - from;
  const alongM = new Float64Array(count);
  const offsetM = new Float64Array(count);
  const gapM = new Float64Array(count);
  const near = emptyProjection();
  const global = emptyProjection();
  const farM = 20;
  let lastGlobalX = NaN;
  let lastGlobalY = NaN;
  for (let k = 0; k < count; k++) {
    const i = from + k;
    const x = xM[i]!;
    const y = yM[i]!;
    if (k === 0) {
      projectGlobal(track, x, y, near);
      lastGlobalX = x;
      lastGlobalY = y;
    } else {
      const moved = Math.hypot(x - xM[i - 1]!, y - yM[i - 1]!);
      const half = 4 + Math.ceil((2 * moved) / track.stepM);
      projectNear(track, x, y, near.segment, half, near);
      if (near.gapM > farM && Math.hypot(x - lastGlobalX, y - lastGlobalY) > 5) {
        projectGlobal(track, x, y, global);
        lastGlobalX = x;
        lastGlobalY = y;
        if (global.gapM < near.gapM - 1) Object.assign(near, global);
      }
    }
    alongM[k] = near.alongM;
    offsetM[k] = near.offsetM;
    gapM[k] = near.gapM;
  }
  return { alongM, offsetM, gapM };
}

export interface RigidTransform {
  rotationRad: number;
  txM: number;
  tyM: number;
  /** Median distance of the fitted points to the centreline, m. */
  medianGapM: number;
}

export function applyRigid(
  transform: RigidTransform,
  xM: Float64Array,
  yM: Float64Array,
): { xM: Float64Array; yM: Float64Array } {
  const c = Math.cos(transform.rotationRad);
  const s = Math.sin(transform.rotationRad);
  const outX = new Float64Array(xM.length);
  const outY = new Float64Array(yM.length);
  for (let i = 0; i < xM.length; i++) {
    outX[i] = c * xM[i]! - s * yM[i]! + transform.txM;
    outY[i] = s * xM[i]! + c * yM[i]! + transform.tyM;
  }
  return { xM: outX, yM: outY };
}

function centroid(xs: ArrayLike<number>, ys: ArrayLike<number>): [number, number] {
  let sx = 0;
  let sy = 0;
  for (let i = 0; i < xs.length; i++) {
    sx += xs[i]!;
    sy += ys[i]!;
  }
  return [sx / xs.length, sy / ys.length];
}

/** Points matched to the centreline: each point's nearest centreline point (qx, qy) and its gap. */
interface Matches {
  px: readonly number[];
  py: readonly number[];
  qx: Float64Array;
  qy: Float64Array;
  gaps: Float64Array;
}

/** Moves every point by the transform and matches it to its nearest centreline point. */
function matchToCentreline(
  track: TrackGrid,
  transform: RigidTransform,
  matches: Matches,
  projection: PointProjection,
): void {
  const { px, py, qx, qy, gaps } = matches;
  const c = Math.cos(transform.rotationRad);
  const s = Math.sin(transform.rotationRad);
  const n = track.xM.length;
  for (let i = 0; i < px.length; i++) {
    const x = c * px[i]! - s * py[i]! + transform.txM;
    const y = s * px[i]! + c * py[i]! + transform.tyM;
    projectGlobal(track, x, y, projection);
    const a = projection.segment;
    const b = a + 1 < n ? a + 1 : 0;
    const t = n > 1 ? segmentFraction(track, a, b, x, y) : 0;
    qx[i] = lerp(track.xM[a]!, track.xM[b]!, t);
    qy[i] = lerp(track.yM[a]!, track.yM[b]!, t);
    gaps[i] = projection.gapM;
  }
}

/**
 * Kabsch in 2-D (Kabsch 1976): the rotation and translation that best map the points onto their matches, over
 * the pairs whose gap is at most keepM; null with fewer than three such pairs.
 */
function kabschStep(matches: Matches, keepM: number): { rotationRad: number; txM: number; tyM: number } | null {
  const { px, py, qx, qy, gaps } = matches;
  let count = 0;
  let mpx = 0;
  let mpy = 0;
  let mqx = 0;
  let mqy = 0;
  for (let i = 0; i < px.length; i++) {
    if (gaps[i]! > keepM) continue;
    mpx += px[i]!;
    mpy += py[i]!;
    mqx += qx[i]!;
    mqy += qy[i]!;
    count++;
  }
  if (count < 3) return null;
  mpx /= count;
  mpy /= count;
  mqx /= count;
  mqy /= count;
  let sp = 0;
  let sq = 0;
  for (let i = 0; i < px.length; i++) {
    if (gaps[i]! > keepM) continue;
    const ax = px[i]! - mpx;
    const ay = py[i]! - mpy;
    const bx = qx[i]! - mqx;
    const by = qy[i]! - mqy;
    sp += ax * bx + ay * by;
    sq += ax * by - ay * bx;
  }
  const rotationRad = Math.atan2(sq, sp);
  const c = Math.cos(rotationRad);
  const s = Math.sin(rotationRad);
  return { rotationRad, txM: mqx - (c * mpx - s * mpy), tyM: mqy - (s * mpx + c * mpy) };
}

/** ICP from a start: match, drop the pairs beyond 2.5 x the median gap, Kabsch, until the transform settles. */
function iterateRigid(
  track: TrackGrid,
  start: RigidTransform,
  iterations: number,
  matches: Matches,
  projection: PointProjection,
): RigidTransform {
  let current = start;
  let medianGap = Infinity;
  for (let iteration = 0; iteration < iterations; iteration++) {
    matchToCentreline(track, current, matches, projection);
    medianGap = median(matches.gaps);
    const next = kabschStep(matches, Math.max(2.5 * medianGap, 1));
    if (next === null) break;
    const change =
      Math.abs(next.rotationRad - current.rotationRad) +
      Math.hypot(next.txM - current.txM, next.tyM - current.tyM) / 1000;
    current = { ...next, medianGapM: medianGap };
    if (change < 1e-9) break;
  }
  return { rotationRad: current.rotationRad, txM: current.txM, tyM: current.tyM, medianGapM: medianGap };
}

/**
 * Rotation + translation (no scale, no mirror) that lays a path onto the centreline. ICP from twelve starting
 * headings about the centroids; in each iteration the pairs further than 2.5 x the median gap are dropped
 * (pit lane, off-track) before the Kabsch step. The start with the smallest median gap wins.
 */
export function fitRigidToCentreline(track: TrackGrid, xM: Float64Array, yM: Float64Array): RigidTransform {
  const stride = Math.max(1, Math.floor(xM.length / 600));
  const px: number[] = [];
  const py: number[] = [];
  for (let i = 0; i < xM.length; i += stride) {
    px.push(xM[i]!);
    py.push(yM[i]!);
  }
  const m = px.length;
  const [pcx, pcy] = centroid(px, py);
  const [tcx, tcy] = centroid(track.xM, track.yM);
  const projection = emptyProjection();
  const matches: Matches = { px, py, qx: new Float64Array(m), qy: new Float64Array(m), gaps: new Float64Array(m) };

  let best: RigidTransform | null = null;
  for (let k = 0; k < 12; k++) {
    const angle = (k * Math.PI) / 6;
    const c = Math.cos(angle);
    const s = Math.sin(angle);
    const start = {
      rotationRad: angle,
      txM: tcx - (c * pcx - s * pcy),
      tyM: tcy - (s * pcx + c * pcy),
      medianGapM: Infinity,
    };
    const candidate = iterateRigid(track, start, 12, matches, projection);
    if (!best || candidate.medianGapM < best.medianGapM) best = candidate;
  }
  const refined = iterateRigid(track, best!, 40, matches, projection);
  // Report the gap of the final transform over all sampled points.
  const placed = applyRigid(refined, Float64Array.from(px), Float64Array.from(py));
  const gaps = matches.gaps;
  for (let i = 0; i < m; i++) {
    projectGlobal(track, placed.xM[i]!, placed.yM[i]!, projection);
    gaps[i] = projection.gapM;
  }
  return { ...refined, medianGapM: median(gaps) };
}

function segmentFraction(track: TrackGrid, a: number, b: number, x: number, y: number): number {
  const dx = track.xM[b]! - track.xM[a]!;
  const dy = track.yM[b]! - track.yM[a]!;
  const lengthSquared = dx * dx + dy * dy;
  if (lengthSquared === 0) return 0;
  const t = ((x - track.xM[a]!) * dx + (y - track.yM[a]!) * dy) / lengthSquared;
  return t < 0 ? 0 : t > 1 ? 1 : t;
}
