// Corners of a track found from the centreline's curvature: runs of one turning sense whose smoothed
// curvature rises clearly above a straight's, with entry and exit where it crosses a share of its peak and the
// apex at the middle of the tightest part (the geometric apex). Numbered in running order from the start line.

import type { NamedCorner, TrackGrid } from './types.js';
import { movingAverage } from '../numeric/moving-average.js';
import { degToRad } from '../units.js';
import { wrapIndex } from '../numeric/lap-index.js';

export interface CornerDetectionOptions {
  /** Window of the moving average applied to the curvature before detection, m. */
  smoothingM: number;
  /** A corner's peak curvature must exceed this, 1/m (1/400 = radius 400 m). */
  minPeakCurvaturePerM: number;
  /** Below this the track counts as straight, 1/m. */
  straightCurvaturePerM: number;
  /** A corner must turn the car by at least this much, rad. */
  minTurnRad: number;
  /** Entry and exit where the curvature crosses this share of the corner's peak. */
  edgeShareOfPeak: number;
  /** Runs of the same sense closer than this join one corner (double apex), m. */
  joinGapM: number;
  /** A track-file name applies to the corner whose span holds it, or whose apex lies within this, m. */
  nameToleranceM: number;
}

export const DEFAULT_CORNER_OPTIONS: CornerDetectionOptions = {
  smoothingM: 15,
  minPeakCurvaturePerM: 1 / 400,
  straightCurvaturePerM: 1 / 1000,
  minTurnRad: degToRad(15),
  edgeShareOfPeak: 0.3,
  joinGapM: 15,
  nameToleranceM: 60,
};

/**
 * A corner on the grid. Indices are unwrapped: on a closed track entryIndex may be negative and exitIndex may
 * reach past the last sample when the corner straddles the start line; apexIndex is always on the grid.
 */
export interface CornerSpan {
  id: number;
  name: string | null;
  /** +1 left, -1 right. */
  side: number;
  entryIndex: number;
  apexIndex: number;
  exitIndex: number;
  /** Stations on the lap, m, each folded into [0, lap length). */
  entryM: number;
  apexM: number;
  exitM: number;
  peakCurvaturePerM: number;
  /** Tightest radius of the corner, m (1 / peak curvature). */
  radiusM: number;
  /** A place the user names before the corner (a braking board), which braking points are also measured from. */
  marker: CornerMarker | null;
}

export interface CornerMarker {
  name: string;
  /** Station of the marker on the lap, m. */
  atM: number;
}

interface Run {
  start: number;
  end: number;
  side: number;
}

export function detectCorners(
  track: TrackGrid,
  options: CornerDetectionOptions = DEFAULT_CORNER_OPTIONS,
): CornerSpan[] {
  const n = track.distanceM.length;
  const step = track.stepM;
  if (n < 3) return [];
  const kappa = movingAverage(track.curvaturePerM, Math.round(options.smoothingM / step / 2), track.closed);
  const quiet = (k: number) => Math.abs(kappa[wrapIndex(k, n)]!) < options.straightCurvaturePerM;
  // On a closed track start the scan on a straight so no corner is cut in two by the start line.
  let origin = 0;
  if (track.closed) {
    while (origin < n && !quiet(origin)) origin++;
    if (origin === n) return [wholeLapCorner(track, kappa)];
  }
  const span = n;
  const runs: Run[] = [];
  let k = 0;
  while (k < span) {
    if (quiet(origin + k)) {
      k++;
      continue;
    }
    const side = Math.sign(kappa[wrapIndex(origin + k, n)]!);
    const start = k;
    while (k < span && !quiet(origin + k) && Math.sign(kappa[wrapIndex(origin + k, n)]!) === side) k++;
    runs.push({ start: origin + start, end: origin + k - 1, side });
  }
  // Join same-sense runs split by a short, nearly straight gap (a double-apex corner).
  const joinSamples = Math.round(options.joinGapM / step);
  const joined: Run[] = [];
  for (const run of runs) {
    const last = joined[joined.length - 1];
    if (last && last.side === run.side && run.start - last.end - 1 <= joinSamples) last.end = run.end;
    else joined.push({ ...run });
  }
  const corners: CornerSpan[] = [];
  for (const run of joined) {
    let peak = 0;
    let turn = 0;
    for (let j = run.start; j <= run.end; j++) {
      const value = Math.abs(kappa[wrapIndex(j, n)]!);
      if (value > peak) peak = value;
      turn += track.curvaturePerM[wrapIndex(j, n)]! * step;
    }
    if (peak < options.minPeakCurvaturePerM || Math.abs(turn) < options.minTurnRad) continue;
    const edge = Math.max(options.straightCurvaturePerM, options.edgeShareOfPeak * peak);
    let entry = run.start;
    while (entry < run.end && Math.abs(kappa[wrapIndex(entry, n)]!) < edge) entry++;
    let exit = run.end;
    while (exit > entry && Math.abs(kappa[wrapIndex(exit, n)]!) < edge) exit--;
    // Apex: the middle of the stretch within 10 % of the peak (a constant-radius arc has no single maximum).
    let first = -1;
    let lastTight = -1;
    for (let j = entry; j <= exit; j++) {
      if (Math.abs(kappa[wrapIndex(j, n)]!) >= 0.9 * peak) {
        if (first < 0) first = j;
        lastTight = j;
      }
    }
    let apex = Math.round((first + lastTight) / 2);
    let entryU = entry;
    let exitU = exit;
    // Unwrap so that the apex lies on the grid.
    const shift = Math.floor(apex / n) * n;
    apex -= shift;
    entryU -= shift;
    exitU -= shift;
    corners.push({
      id: 0,
      name: null,
      side: run.side,
      entryIndex: entryU,
      apexIndex: apex,
      exitIndex: exitU,
      entryM: wrapIndex(entryU, n) * step,
      apexM: apex * step,
      exitM: wrapIndex(exitU, n) * step,
      peakCurvaturePerM: peak,
      radiusM: 1 / peak,
      marker: null,
    });
  }
  corners.sort((a, b) => a.apexIndex - b.apexIndex);
  corners.forEach((corner, index) => (corner.id = index + 1));
  nameCorners(corners, track.corners, track.lengthM, track.closed, options.nameToleranceM, step);
  return corners;
}

function wholeLapCorner(track: TrackGrid, kappa: Float64Array): CornerSpan {
  const n = track.distanceM.length;
  let peak = 0;
  for (let i = 0; i < n; i++) peak = Math.max(peak, Math.abs(kappa[i]!));
  const apex = Math.floor(n / 2);
  return {
    id: 1,
    name: track.corners[0]?.name ?? null,
    side: Math.sign(kappa[apex]!) || 1,
    entryIndex: 0,
    apexIndex: apex,
    exitIndex: n - 1,
    entryM: 0,
    apexM: apex * track.stepM,
    exitM: (n - 1) * track.stepM,
    peakCurvaturePerM: peak,
    radiusM: peak > 0 ? 1 / peak : Infinity,
    marker: null,
  };
}

/** Gives each named place to the corner whose span holds it, else to the nearest apex within the tolerance. */
function nameCorners(
  corners: CornerSpan[],
  names: readonly NamedCorner[],
  lengthM: number,
  closed: boolean,
  toleranceM: number,
  stepM: number,
): void {
  for (const named of names) {
    let best: CornerSpan | null = null;
    let bestDistance = Infinity;
    for (const corner of corners) {
      if (corner.name !== null) continue;
      let at = named.atM;
      if (closed) {
        // Bring the named station next to this corner's unwrapped span.
        while (at < corner.entryIndex * stepM - lengthM / 2) at += lengthM;
        while (at > corner.exitIndex * stepM + lengthM / 2) at -= lengthM;
      }
      const inside = at >= corner.entryIndex * stepM && at <= corner.exitIndex * stepM;
      const distance = inside ? 0 : Math.abs(at - corner.apexIndex * stepM);
      if (distance < bestDistance) {
        bestDistance = distance;
        best = corner;
      }
    }
    if (best && bestDistance <= toleranceM) best.name = named.name;
  }
}
