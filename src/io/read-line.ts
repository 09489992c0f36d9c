// Reads a line CSV back onto a track's grid, for `--line FILE`: either s_m, offset_m (and optionally x_m, y_m,
// curvature_1pm; see src/line/line-csv.ts), or plane positions x_m, y_m alone (a line from elsewhere, in the
// track's plane). Validated here, once: the line must belong to this track (its stations span the track, its
// positions lie where its offsets put them), its points must be close enough to resolve the corners, and it
// must stay inside the edges. A line on another spacing goes onto this grid through a cubic spline
// (src/line/resample-line.ts), never by straight joins.

import { readTextFile } from './read-text.js';
import { InputError } from '../errors.js';
import type { TrackGrid } from '../track/types.js';
import { numberCell, parseCsvTable } from './csv-table.js';
import {
  MAX_TURN_BETWEEN_POINTS_RAD,
  projectLinePositions,
  splineOffsets,
  worstPointTurn,
  worstStationTurn,
  type WorstTurn,
} from '../line/resample-line.js';

/** Positions further than this from where the offset puts them mean another track (or another layout), m. */
const POSITION_TOLERANCE_M = 2;
/** Offsets may stray this far beyond the edges (rounding in the file), m. */
const EDGE_TOLERANCE_M = 0.01;

export function readLineFile(file: string, track: TrackGrid): Float64Array {
  return parseLineCsv(readTextFile(file, 'line file', 'line'), file, track);
}

export function parseLineCsv(text: string, source: string, track: TrackGrid): Float64Array {
  const { header, rows, lines } = parseCsvTable(text, source);
  const column = (name: string, required: boolean) => {
    const index = header.indexOf(name);
    if (index < 0 && required)
      throw new InputError(
        `${source}: required column ${name} not found; a line file has s_m,offset_m,x_m,y_m,curvature_1pm (columns found: ${header.join(', ')})`,
      );
    return index;
  };
  const xIndex = column('x_m', false);
  const yIndex = column('y_m', false);
  if (rows.length < 2) throw new InputError(`${source}: only ${rows.length} rows; a line needs at least 2`);
  if (header.indexOf('s_m') < 0 && header.indexOf('offset_m') < 0 && xIndex >= 0 && yIndex >= 0)
    return positionsOnly(rows, lines, xIndex, yIndex, source, track);
  const sIndex = column('s_m', true);
  const offsetIndex = column('offset_m', true);
  const count = rows.length;
  const stations = new Float64Array(count);
  const offsets = new Float64Array(count);
  for (let r = 0; r < count; r++) {
    const row = rows[r]!;
    const line = lines[r]!;
    stations[r] = numberCell(row[sIndex] ?? '', source, line, 's_m');
    offsets[r] = numberCell(row[offsetIndex] ?? '', source, line, 'offset_m');
    if (r > 0 && !(stations[r]! > stations[r - 1]!)) {
      throw new InputError(
        `${source}: row ${line}, column s_m: ${stations[r]} does not increase (previous row ${stations[r - 1]})`,
      );
    }
  }
  // The line must span this track: first station at the start, last one lap (closed) or the length (open) on.
  const step = track.stepM;
  const lastExpected = track.closed ? track.lengthM - step : track.lengthM;
  // A line on a coarser spacing ends up to one of its own gaps short of the end.
  let fileGapM = 0;
  for (let r = 1; r < count; r++) fileGapM = Math.max(fileGapM, stations[r]! - stations[r - 1]!);
  const spanTolerance = Math.max(2 * step, 0.01 * track.lengthM, fileGapM);
  if (Math.abs(stations[0]!) > spanTolerance || Math.abs(stations[count - 1]! - lastExpected) > spanTolerance) {
    throw new InputError(
      `${source}: the line runs from ${stations[0]!.toFixed(1)} to ${stations[count - 1]!.toFixed(1)} m but ${track.source} runs from 0 to ${lastExpected.toFixed(1)} m on its grid; the line belongs to another track or layout`,
    );
  }
  // Positions, where given, must lie where the offsets put them on this track.
  if (xIndex >= 0 && yIndex >= 0) {
    for (let r = 0; r < count; r++) {
      const row = rows[r]!;
      const line = lines[r]!;
      const x = numberCell(row[xIndex] ?? '', source, line, 'x_m');
      const y = numberCell(row[yIndex] ?? '', source, line, 'y_m');
      const i = Math.min(track.distanceM.length - 1, Math.max(0, Math.round(stations[r]! / step)));
      const psi = track.headingRad[i]!;
      const ds = stations[r]! - track.distanceM[i]!;
      const expectedX = track.xM[i]! + ds * Math.cos(psi) - offsets[r]! * Math.sin(psi);
      const expectedY = track.yM[i]! + ds * Math.sin(psi) + offsets[r]! * Math.cos(psi);
      const missM = Math.hypot(x - expectedX, y - expectedY);
      if (missM > POSITION_TOLERANCE_M + step) {
        throw new InputError(
          `${source}: row ${line}: x_m, y_m lie ${missM.toFixed(1)} m from where offset_m puts the line on ${track.source}; the line belongs to another track`,
        );
      }
    }
  }
  // On the same grid (the usual case) take the offsets as they are; otherwise through the spline.
  const n = track.distanceM.length;
  const sameGrid = count === n && stations.every((s, i) => Math.abs(s - track.distanceM[i]!) <= 1e-3 * step + 1e-6);
  let out: Float64Array = offsets;
  if (!sameGrid) {
    const worst = worstStationTurn(track, stations);
    checkSpacing(worst, lines[worst.index]!, source);
    out = splineOffsets(track, stations, offsets);
  }
  checkInsideEdges(
    out,
    source,
    track,
    (i) => lines[Math.min(count - 1, sameGrid ? i : nearestRow(stations, track.distanceM[i]!))]!,
  );
  return out;
}

/** The points must be close enough to resolve the corners (criterion in src/line/resample-line.ts). */
function checkSpacing(worst: WorstTurn, line: number, source: string): void {
  if (worst.turnRad <= MAX_TURN_BETWEEN_POINTS_RAD) return;
  const radiusM = worst.gapM / worst.turnRad;
  throw new InputError(
    `${source}: row ${line}: the line's points are ${worst.gapM.toFixed(1)} m apart where it turns ${((worst.turnRad * 180) / Math.PI).toFixed(0)} degrees between them, too far apart to resolve a corner of radius about ${radiusM.toFixed(1)} m; give points at most ${(MAX_TURN_BETWEEN_POINTS_RAD * radiusM).toFixed(1)} m apart there (half the radius: at most ${((MAX_TURN_BETWEEN_POINTS_RAD * 180) / Math.PI).toFixed(0)} degrees of turn from one point to the next)`,
  );
}

/** A line of x_m, y_m alone: projected onto the track's grid along each sample's normal. */
function positionsOnly(
  rows: string[][],
  lines: number[],
  xIndex: number,
  yIndex: number,
  source: string,
  track: TrackGrid,
): Float64Array {
  const count = rows.length;
  const x = new Float64Array(count);
  const y = new Float64Array(count);
  for (let r = 0; r < count; r++) {
    x[r] = numberCell(rows[r]![xIndex] ?? '', source, lines[r]!, 'x_m');
    y[r] = numberCell(rows[r]![yIndex] ?? '', source, lines[r]!, 'y_m');
    if (r > 0 && x[r] === x[r - 1] && y[r] === y[r - 1])
      throw new InputError(`${source}: row ${lines[r]}: the same point as the row before; give each point once`);
  }
  // A closed line may repeat its first point at the end; the spline closes the loop itself.
  let used = count;
  if (track.closed && count > 2 && x[0] === x[count - 1] && y[0] === y[count - 1]) used = count - 1;
  const worst = worstPointTurn(x.subarray(0, used), y.subarray(0, used), track.closed);
  checkSpacing(worst, lines[worst.index]!, source);
  const projected = projectLinePositions(track, x.subarray(0, used), y.subarray(0, used));
  if (projected.lostAtM !== null)
    throw new InputError(
      `${source}: the line does not follow ${track.source} at ${projected.lostAtM.toFixed(1)} m (no point of it beside the track there); the line belongs to another track or layout, or its x_m, y_m are in another plane`,
    );
  // Each projected sample lies where its offset puts it; the positions must then lie near the track.
  checkInsideEdges(projected.offsetM, source, track, (i) => lines[nearestPoint(x, y, track, i)]!);
  return projected.offsetM;
}

function nearestPoint(x: Float64Array, y: Float64Array, track: TrackGrid, i: number): number {
  let best = 0;
  let bestD = Infinity;
  for (let r = 0; r < x.length; r++) {
    const d = Math.hypot(x[r]! - track.xM[i]!, y[r]! - track.yM[i]!);
    if (d < bestD) {
      bestD = d;
      best = r;
    }
  }
  return best;
}

/** Inside the edges (the margin is the maker's choice, the edges are not). */
function checkInsideEdges(out: Float64Array, source: string, track: TrackGrid, rowOf: (i: number) => number): void {
  const n = out.length;
  if (track.widthLeftM && track.widthRightM) {
    for (let i = 0; i < n; i++) {
      const left = track.widthLeftM[i]!;
      const right = track.widthRightM[i]!;
      if (out[i]! > left + EDGE_TOLERANCE_M || out[i]! < -right - EDGE_TOLERANCE_M) {
        throw new InputError(
          `${source}: row ${rowOf(i)}: offset ${out[i]!.toFixed(2)} m at ${track.distanceM[i]!.toFixed(1)} m is outside the track (left edge ${left.toFixed(2)} m, right edge -${right.toFixed(2)} m)`,
        );
      }
    }
  }
}

function nearestRow(stations: Float64Array, s: number): number {
  let best = 0;
  for (let r = 1; r < stations.length; r++) if (Math.abs(stations[r]! - s) < Math.abs(stations[best]! - s)) best = r;
  return best;
}
