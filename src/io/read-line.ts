// Reads a line CSV (s_m, offset_m, and optionally x_m, y_m, curvature_1pm; see src/line/line-csv.ts) back onto
// a track's grid, for `simulate --line FILE`. Validated here, once: the line must belong to this track (its
// stations span the track, its positions lie where its offsets put them) and stay inside the edges. A line on
// another grid spacing is resampled linearly onto this one.

import { readTextFile } from './read-text.js';
import { InputError } from '../errors.js';
import type { TrackGrid } from '../track/types.js';
import { numberCell, parseCsvTable } from './csv-table.js';

/** Positions further than this from where the offset puts them mean another track (or another layout), m. */
const POSITION_TOLERANCE_M = 2;
/** Offsets may stray this far beyond the edges (rounding in the file), m. */
const EDGE_TOLERANCE_M = 0.01;

export function readLineFile(file: string, track: TrackGrid): Float64Array {
  return parseLineCsv(readTextFile(file, 'line file'), file, track);
}

function interpolateStation(
  stations: Float64Array,
  values: Float64Array,
  s: number,
  closed: boolean,
  lengthM: number,
): number {
  const n = stations.length;
  // Binary search for the last station <= s.
  let lo = 0;
  let hi = n - 1;
  if (s <= stations[0]!) {
    if (!closed) return values[0]!;
    // Between the last row (one lap earlier) and the first.
    const before = stations[n - 1]! - lengthM;
    const t = (s - before) / (stations[0]! - before);
    return values[n - 1]! + t * (values[0]! - values[n - 1]!);
  }
  if (s >= stations[n - 1]!) {
    if (!closed) return values[n - 1]!;
    const after = stations[0]! + lengthM;
    const t = (s - stations[n - 1]!) / (after - stations[n - 1]!);
    return values[n - 1]! + t * (values[0]! - values[n - 1]!);
  }
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (stations[mid]! <= s) lo = mid;
    else hi = mid;
  }
  const t = (s - stations[lo]!) / (stations[hi]! - stations[lo]!);
  return values[lo]! + t * (values[hi]! - values[lo]!);
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
  const sIndex = column('s_m', true);
  const offsetIndex = column('offset_m', true);
  const xIndex = column('x_m', false);
  const yIndex = column('y_m', false);
  if (rows.length < 2) throw new InputError(`${source}: only ${rows.length} rows; a line needs at least 2`);
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
  const spanTolerance = Math.max(2 * step, 0.01 * track.lengthM);
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
  // On the same grid (the usual case) take the offsets as they are; otherwise resample.
  const n = track.distanceM.length;
  const sameGrid = count === n && stations.every((s, i) => Math.abs(s - track.distanceM[i]!) <= 1e-3 * step + 1e-6);
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++)
    out[i] = sameGrid
      ? offsets[i]!
      : interpolateStation(stations, offsets, track.distanceM[i]!, track.closed, track.lengthM);
  // Inside the edges (the margin is the maker's choice, the edges are not).
  if (track.widthLeftM && track.widthRightM) {
    for (let i = 0; i < n; i++) {
      const left = track.widthLeftM[i]!;
      const right = track.widthRightM[i]!;
      if (out[i]! > left + EDGE_TOLERANCE_M || out[i]! < -right - EDGE_TOLERANCE_M) {
        const r = Math.min(count - 1, sameGrid ? i : nearestRow(stations, track.distanceM[i]!));
        throw new InputError(
          `${source}: row ${lines[r]}: offset ${out[i]!.toFixed(2)} m at ${track.distanceM[i]!.toFixed(1)} m is outside the track (left edge ${left.toFixed(2)} m, right edge -${right.toFixed(2)} m)`,
        );
      }
    }
  }
  return out;
}

function nearestRow(stations: Float64Array, s: number): number {
  let best = 0;
  for (let r = 1; r < stations.length; r++) if (Math.abs(stations[r]! - s) < Math.abs(stations[best]! - s)) best = r;
  return best;
}
