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

/** Where each track column is in the header (-1 where absent), after the user's --columns mapping. */
interface TrackColumnIndices {
  x: number;
  y: number;
  left: number;
  right: number;
  z: number;
  bank: number;
}

/** A --columns mapping may only name track columns; checked before the file is read. */
function checkColumnMapping(options: TrackReadOptions, source: string): void {
  for (const key of Object.keys(options.columns)) {
    if (!(TRACK_COLUMNS as readonly string[]).includes(key)) {
      throw new InputError(
        `${source}: --columns names '${key}', which is not a track column (${TRACK_COLUMNS.join(', ')})`,
      );
    }
  }
}

function trackColumnIndices(header: string[], options: TrackReadOptions, source: string): TrackColumnIndices {
  const at = (column: TrackColumn, required: boolean) => columnIndex(header, column, options.columns, required, source);
  const indices = {
    x: at('x_m', true),
    y: at('y_m', true),
    left: at('width_left_m', false),
    right: at('width_right_m', false),
    z: at('z_m', false),
    bank: at('bank_deg', false),
  };
  if (indices.left < 0 !== indices.right < 0) {
    const [has, lacks] = indices.left >= 0 ? ['width_left_m', 'width_right_m'] : ['width_right_m', 'width_left_m'];
    throw new InputError(
      `${source}: column ${has} found but ${lacks} missing; give both or neither (columns found: ${header.join(', ')})`,
    );
  }
  return indices;
}

/** The centreline's points as read, each row checked: a place on a local plane, widths, grade and bank. */
interface CentrelineColumns {
  x: Float64Array;
  y: Float64Array;
  left: Float64Array | null;
  right: Float64Array | null;
  z: Float64Array | null;
  bank: Float64Array | null;
}

function readCentrelineRows(
  table: ReturnType<typeof parseCsvTable>,
  at: TrackColumnIndices,
  source: string,
): CentrelineColumns {
  const { header: names, rows, lines } = table;
  const n = rows.length;
  const hasWidths = at.left >= 0;
  const points: CentrelineColumns = {
    x: new Float64Array(n),
    y: new Float64Array(n),
    left: hasWidths ? new Float64Array(n) : null,
    right: hasWidths ? new Float64Array(n) : null,
    z: at.z >= 0 ? new Float64Array(n) : null,
    bank: at.bank >= 0 ? new Float64Array(n) : null,
  };
  const { x, y, left, right, z, bank } = points;
  for (let i = 0; i < n; i++) {
    const row = rows[i]!;
    const line = lines[i]!;
    const cell = (index: number) => numberCell(row[index] ?? '', source, line, names[index]!);
    x[i] = cell(at.x);
    y[i] = cell(at.y);
    if (!(Math.abs(x[i]!) <= MAX_COORDINATE_M && Math.abs(y[i]!) <= MAX_COORDINATE_M)) {
      throw new InputError(
        `${source}: row ${line}: point (${x[i]}, ${y[i]}) is over 10,000 km from the origin; coordinates must be metres on a local plane`,
      );
    }
    if (left && right) {
      left[i] = cell(at.left);
      right[i] = cell(at.right);
      if (left[i]! < 0)
        throw new InputError(`${source}: row ${line}, column ${names[at.left]}: negative width ${left[i]} m`);
      if (right[i]! < 0)
        throw new InputError(`${source}: row ${line}, column ${names[at.right]}: negative width ${right[i]} m`);
    }
    if (i > 0 && Math.hypot(x[i]! - x[i - 1]!, y[i]! - y[i - 1]!) < SAME_POINT_M) {
      throw new InputError(`${source}: row ${line}: the point repeats the one before it (row ${lines[i - 1]})`);
    }
    if (z) {
      z[i] = cell(at.z);
      const runM = i > 0 ? Math.hypot(x[i]! - x[i - 1]!, y[i]! - y[i - 1]!) : 0;
      if (i > 0 && Math.abs(z[i]! - z[i - 1]!) > MAX_GRADE * runM)
        throw new InputError(
          `${source}: row ${line}, column ${names[at.z]}: the height jumps ${(z[i]! - z[i - 1]!).toFixed(2)} m over ${runM.toFixed(2)} m from row ${lines[i - 1]} (a grade over ${MAX_GRADE * 100} %)`,
        );
    }
    if (bank) {
      bank[i] = cell(at.bank);
      if (Math.abs(bank[i]!) > MAX_BANK_DEG)
        throw new InputError(
          `${source}: row ${line}, column ${names[at.bank]}: bank ${bank[i]} degrees is over ${MAX_BANK_DEG} degrees`,
        );
    }
  }
  return points;
}

/** The first n points of every column (a closed centreline whose last row repeats its first drops that row). */
function firstPoints(points: CentrelineColumns, n: number): CentrelineColumns {
  const head = (values: Float64Array | null) => values && values.subarray(0, n);
  return {
    x: points.x.subarray(0, n),
    y: points.y.subarray(0, n),
    left: head(points.left),
    right: head(points.right),
    z: head(points.z),
    bank: head(points.bank),
  };
}

export function parseTrackCsv(text: string, source: string, options: TrackReadOptions): TrackGrid {
  checkColumnMapping(options, source);
  const table = parseCsvTable(text, source);
  const indices = trackColumnIndices(table.header, options, source);
  let n = table.rows.length;
  if (n < 4) throw new InputError(`${source}: only ${n} points; a centreline needs at least 4`);
  let points = readCentrelineRows(table, indices, source);

  const closingDuplicate = Math.hypot(points.x[n - 1]! - points.x[0]!, points.y[n - 1]! - points.y[0]!) < SAME_POINT_M;
  const closed =
    options.layout === 'closed' || (options.layout === 'auto' && (closingDuplicate || endsMeet(points.x, points.y)));
  if (closed && closingDuplicate) {
    n -= 1;
    points = firstPoints(points, n);
    if (n < 4) throw new InputError(`${source}: only ${n} distinct points; a closed centreline needs at least 4`);
  }
  const { x, y, z, bank } = points;
  const fold = firstFold(x, y, closed);
  if (fold >= 0)
    throw new InputError(
      `${source}: row ${table.lines[fold]}: the centreline turns back on itself at (${x[fold]}, ${y[fold]}) (over ${MAX_TURN_AT_POINT_DEG} degrees at one point); a track does not run out and back along itself`,
    );
  let { left, right } = points;
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
