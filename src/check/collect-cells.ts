// Cell-by-cell passes over CSV files that list every bad cell (the readers stop at the first): centreline
// coordinates and widths, and the recognised numeric channels of a telemetry log with its time order.

import { csvParseSync } from '../io/lazy-libraries.js';
import { InputError } from '../errors.js';
import { numberCell, parseCsvTable } from '../io/csv-table.js';
import { TRACK_COLUMNS } from '../io/track-csv.js';
import { sniffDialect } from '../io/telemetry/csv.js';
import { headerNames } from '../io/telemetry/logger-preamble.js';
import { bindColumns, type ColumnBinding } from '../io/telemetry/columns.js';
import { MISSING_CELLS } from '../io/telemetry/cell-value.js';

/** Problems found, one line each, and notes that are not problems (repeated time stamps). */
export interface CellProblems {
  problems: string[];
  notes: string[];
}

function messageOf(error: unknown): string {
  if (error instanceof InputError) return error.message;
  throw error;
}

/** Every bad x_m, y_m, width cell of a centreline CSV, and rows that repeat the point before. */
export function centrelineCellProblems(text: string, source: string): CellProblems {
  const problems: string[] = [];
  let table;
  try {
    table = parseCsvTable(text, source);
  } catch (error) {
    return { problems: [messageOf(error)], notes: [] };
  }
  const { header, rows, lines } = table;
  const indexOf = (name: (typeof TRACK_COLUMNS)[number]) => header.indexOf(name);
  const columns = TRACK_COLUMNS.map((name) => ({ name, index: indexOf(name) })).filter((column) => column.index >= 0);
  for (const required of ['x_m', 'y_m']) {
    if (header.indexOf(required) < 0)
      problems.push(`${source}: required column ${required} not found; columns found: ${header.join(', ')}`);
  }
  if (problems.length > 0) return { problems, notes: [] };
  rows.forEach((row, r) => {
    for (const column of columns) {
      try {
        const value = numberCell(row[column.index] ?? '', source, lines[r]!, column.name);
        if (column.name.startsWith('width') && value < 0)
          problems.push(`${source}: row ${lines[r]}, column ${column.name}: negative width ${value} m`);
      } catch (error) {
        problems.push(messageOf(error));
      }
    }
  });
  return { problems, notes: [] };
}

/** Every non-numeric cell in a recognised channel of a telemetry CSV, every backwards step of time, and repeats. */
export function telemetryCellProblems(text: string, source: string): CellProblems {
  const problems: string[] = [];
  const notes: string[] = [];
  let dialect;
  let headers: string[] | null = null;
  let bindings: ColumnBinding[] = [];
  let time: ColumnBinding | undefined;
  let previousTime = NaN;
  let repeats = 0;
  let firstRepeatLine = 0;
  // Each record is checked as csv-parse reads it and then dropped, so a log of a hundred megabytes is not held
  // twice over as rows of strings.
  let unitsRowAhead = false;
  const check = (record: string[], line: number): void => {
    if (headers === null) {
      headers = headerNames(record, dialect!.logger);
      unitsRowAhead = (dialect!.logger?.units ?? null) !== null;
      bindings = bindColumns(headers, {}, source).bindings;
      time = bindings.find((binding) => binding.quantity === 'time');
      return;
    }
    if (unitsRowAhead) {
      unitsRowAhead = false;
      return;
    }
    for (const binding of bindings) {
      const cell = (record[binding.index] ?? '').trim();
      if (MISSING_CELLS.has(cell.toLowerCase())) continue;
      const value = Number(dialect!.decimalComma ? cell.replace(',', '.') : cell);
      if (!Number.isFinite(value)) {
        problems.push(
          `${source}: line ${line}, column ${binding.header}: '${cell.length > 40 ? `${cell.slice(0, 40)}...` : cell}' is not a number`,
        );
        continue;
      }
      if (binding === time) {
        if (value < previousTime)
          problems.push(
            `${source}: line ${line}, column ${binding.header}: time runs backwards (${value} after ${previousTime})`,
          );
        if (value === previousTime && repeats++ === 0) firstRepeatLine = line;
        previousTime = value;
      }
    }
  };
  try {
    dialect = sniffDialect(text.slice(0, 65536), source);
    csvParseSync().parse(text, {
      delimiter: dialect.delimiter,
      bom: true,
      from_line: dialect.headerLine,
      relax_column_count: true,
      relax_quotes: true,
      skip_empty_lines: true,
      on_record: (record: string[], context: { lines: number }) => {
        check(record, context.lines);
        return null;
      },
    });
  } catch (error) {
    if (error instanceof InputError) return { problems: [error.message], notes };
    return {
      problems: [
        `${source}: cannot read as CSV: ${error instanceof Error ? error.message.split('\n')[0] : String(error)}`,
      ],
      notes,
    };
  }
  if (headers === null) return { problems: [`${source}: empty file (no header)`], notes };
  if (repeats > 0)
    notes.push(
      `${repeats} row${repeats > 1 ? 's repeat' : ' repeats'} the time stamp of the row before (first at line ${firstRepeatLine})`,
    );
  return { problems, notes };
}
