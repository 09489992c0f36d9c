// A telemetry CSV cell to a number: empty cells and the usual missing-value markers become NaN (filled later
// from their neighbours in time); any other text stops the read with one line naming the line and the column.

import { InputError } from '../../errors.js';

/** Cells that mean "no value" (compared trimmed and in lower case). */
export const MISSING_CELLS: ReadonlySet<string> = new Set(['', 'nan', 'na', 'n/a', 'null', '-', '--']);

/** The number in `cell` (NaN where it is empty or a missing-value marker); `line` and `header` name it in the error. */
export function cellValue(
  cell: string | undefined,
  decimalComma: boolean,
  source: string,
  line: number,
  header: string,
): number {
  if (cell === undefined || cell.length === 0) return NaN;
  // Number() trims white space itself; only a failed parse looks further (missing-value markers, text).
  const value = Number(decimalComma ? cell.replace(',', '.') : cell);
  if (value === 0 && cell.trim() === '') return NaN;
  if (Number.isFinite(value)) return value;
  if (!MISSING_CELLS.has(cell.trim().toLowerCase())) {
    const shown = cell.length > 40 ? `${cell.slice(0, 40)}...` : cell;
    throw new InputError(`${source}: line ${line}, column ${header}: '${shown}' is not a number`);
  }
  return NaN;
}
