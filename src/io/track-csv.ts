// Reads a centreline CSV (x_m, y_m and optional width_left_m, width_right_m, in metres on a local plane, x east,
// y north) into centreline points, validated once here, then hands them to trackFromCentreline.

import path from 'node:path';
import { InputError } from '../errors.js';
import type { TrackGrid } from '../track/types.js';
import { firstFold, MAX_TURN_AT_POINT_DEG, trackFromCentreline } from '../track/resample.js';
import { numberCell, parseCsvTable } from './csv-table.js';
import type { TrackReadOptions } from './track-read-options.js';
import { median } from '../numeric/quantile.js';

export const TRACK_COLUMNS = ['x_m', 'y_m', 'width_left_m', 'width_right_m', 'z_m', 'bank_deg'] as const;
type TrackColumn = (typeof TRACK_COLUMNS)[number];

/** Default shortest wavelength kept by the smoothing, m. */
export const DEFAULT_SMOOTHING_M = 30;
/** Coordinates beyond this are not metres on a local plane (a quarter of the Earth's circumference), m. */
const MAX_COORDINATE_M = 1e7;
/** Steepest grade between neighbouring points taken as a real road; more is a height in the wrong unit or a typo
 * (the steepest public streets are about 35 %: from memory). */
export const MAX_GRADE = 0.4;
/** Steepest bank taken as a real road, degrees (banked ovals reach about 33: from memory). */
export const MAX_BANK_DEG = 45;
/** Points closer than this count as the same point, m. */
const SAME_POINT_M = 1e-3;
/** 'auto' layout: closed when the last point is within this many median spacings of the first... */
const CLOSING_GAP_SPACINGS = 3;
/** ...or within this distance, m, whichever is larger. */
const CLOSING_GAP_MIN_M = 1;

/** True when the ends meet: the gap from the last point to the first is under max(3 x median spacing, 1 m). */
export function endsMeet(x: Float64Array, y: Float64Array): boolean {
  const n = x.length;
  const spacing = new Float64Array(n - 1);
  for (let i = 0; i < n - 1; i++) spacing[i] = Math.hypot(x[i + 1]! - x[i]!, y[i + 1]! - y[i]!);
  const gap = Math.hypot(x[n - 1]! - x[0]!, y[n - 1]! - y[0]!);
  return gap < Math.max(CLOSING_GAP_SPACINGS * median(spacing), CLOSING_GAP_MIN_M);
}

function columnIndex(
  header: string[],
  ours: TrackColumn,
  mapping: Record<string, string>,
  required: boolean,
  source: string,
): number {
  const theirs = mapping[ours] ?? ours;
  const index = header.indexOf(theirs);
  if (index < 0 && required) {
    const via = theirs === ours ? '' : ` (read from '${theirs}')`;
    throw new InputError(`${source}: required column ${ours}${via} not found; columns found: ${header.join(', ')}`);
  }
  return index;
}

export function parseTrackCsv(text: string, source: string, options: TrackReadOptions): TrackGrid {
  for (const key of Object.keys(options.columns)) {
    if (!(TRACK_COLUMNS as readonly string[]).includes(key)) {
      throw new InputError(
        `${source}: --columns names '${key}', which is not a track column (${TRACK_COLUMNS.join(', ')})`,
      );
    }
  }
  const table = parseCsvTable(text, source);
  const { header, rows, lines } = table;
  const xIndex = columnIndex(header, 'x_m', options.columns, true, source);
  const yIndex = columnIndex(header, 'y_m', options.columns, true, source);
  const leftIndex = columnIndex(header, 'width_left_m', options.columns, false, source);
  const rightIndex = columnIndex(header, 'width_right_m', options.columns, false, source);
  if (leftIndex < 0 !== rightIndex < 0) {
    const [has, lacks] = leftIndex >= 0 ? ['width_left_m', 'width_right_m'] : ['width_right_m', 'width_left_m'];
    throw new InputError(
      `${source}: column ${has} found but ${lacks} missing; give both or neither (columns found: ${header.join(', ')})`,
    );
  }
  const hasWidths = leftIndex >= 0;
  const zIndex = columnIndex(header, 'z_m', options.columns, false, source);
  const bankIndex = columnIndex(header, 'bank_deg', options.columns, false, source);

  let n = rows.length;
  if (n < 4) throw new InputError(`${source}: only ${n} points; a centreline needs at least 4`);
  let x = new Float64Array(n);
  let y = new Float64Array(n);
  let left = hasWidths ? new Float64Array(n) : null;
  let right = hasWidths ? new Float64Array(n) : null;
  let z = zIndex >= 0 ? new Float64Array(n) : null;
  let bank = bankIndex >= 0 ? new Float64Array(n) : null;
  const names = header;
  for (let i = 0; i < n; i++) {
    const row = rows[i]!;
    const line = lines[i]!;
    x[i] = numberCell(row[xIndex] ?? '', source, line, names[xIndex]!);
    y[i] = numberCell(row[yIndex] ?? '', source, line, names[yIndex]!);
    if (!(Math.abs(x[i]!) <= MAX_COORDINATE_M && Math.abs(y[i]!) <= MAX_COORDINATE_M)) {
      throw new InputError(
        `${source}: row ${line}: point (${x[i]}, ${y[i]}) is over 10,000 km from the origin; coordinates must be metres on a local plane`,
      );
    }
    if (left && right) {
      left[i] = numberCell(row[leftIndex] ?? '', source, line, names[leftIndex]!);
      right[i] = numberCell(row[rightIndex] ?? '', source, line, names[rightIndex]!);
      if (left[i]! < 0)
        throw new InputError(`${source}: row ${line}, column ${names[leftIndex]}: negative width ${left[i]} m`);
      if (right[i]! < 0)
        throw new InputError(`${source}: row ${line}, column ${names[rightIndex]}: negative width ${right[i]} m`);
    }
    if (i > 0 && Math.hypot(x[i]! - x[i - 1]!, y[i]! - y[i - 1]!) < SAME_POINT_M) {
      throw new InputError(`${source}: row ${line}: the point repeats the one before it (row ${lines[i - 1]})`);
    }
    if (z) {
      z[i] = numberCell(row[zIndex] ?? '', source, line, names[zIndex]!);
      const runM = i > 0 ? Math.hypot(x[i]! - x[i - 1]!, y[i]! - y[i - 1]!) : 0;
      if (i > 0 && Math.abs(z[i]! - z[i - 1]!) > MAX_GRADE * runM)
        throw new InputError(
          `${source}: row ${line}, column ${names[zIndex]}: the height jumps ${(z[i]! - z[i - 1]!).toFixed(2)} m over ${runM.toFixed(2)} m from row ${lines[i - 1]} (a grade over ${MAX_GRADE * 100} %)`,
        );
    }
    if (bank) {
      bank[i] = numberCell(row[bankIndex] ?? '', source, line, names[bankIndex]!);
      if (Math.abs(bank[i]!) > MAX_BANK_DEG)
        throw new InputError(
          `${source}: row ${line}, column ${names[bankIndex]}: bank ${bank[i]} degrees is over ${MAX_BANK_DEG} degrees`,
        );
    }
  }

  const closingDuplicate = Math.hypot(x[n - 1]! - x[0]!, y[n - 1]! - y[0]!) < SAME_POINT_M;
  const closed = options.layout === 'closed' || (options.layout === 'auto' && (closingDuplicate || endsMeet(x, y)));
  if (closed && closingDuplicate) {
    n -= 1;
    x = x.subarray(0, n);
    y = y.subarray(0, n);
    left = left && left.subarray(0, n);
    right = right && right.subarray(0, n);
    z = z && z.subarray(0, n);
    bank = bank && bank.subarray(0, n);
    if (n < 4) throw new InputError(`${source}: only ${n} distinct points; a closed centreline needs at least 4`);
  }
  const fold = firstFold(x, y, closed);
  if (fold >= 0)
    throw new InputError(
      `${source}: row ${lines[fold]}: the centreline turns back on itself at (${x[fold]}, ${y[fold]}) (over ${MAX_TURN_AT_POINT_DEG} degrees at one point); a track does not run out and back along itself`,
    );
  if (!left && options.widthM !== null) {
    left = new Float64Array(n).fill(options.widthM / 2);
    right = new Float64Array(n).fill(options.widthM / 2);
  }
  return trackFromCentreline(
    {
      xM: x,
      yM: y,
      widthLeftM: left,
      widthRightM: right,
      zM: z,
      bankRad: bank && bank.map((deg) => (deg * Math.PI) / 180),
    },
    {
      name: path.basename(source, path.extname(source)),
      closed,
      stepM: options.stepM,
      smoothingM: options.smoothingM ?? DEFAULT_SMOOTHING_M,
      source,
    },
  );
}
