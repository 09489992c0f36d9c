// The logger dialect of a telemetry CSV: many loggers export a block of `key,value` lines (session, vehicle,
// date, rate) before the header row and a row of units right after it. Found from the shape of the head alone
// (cell counts and which rows are numbers, text or unit names), modelled on no one logger: the data rows are the
// first run of numeric rows of one width, the header is the text row of that width above them, a row of unit
// names between the two is the units row, and what comes before the header is the preamble.

/** What the head of the file shows beyond a plain header: none of it when the file is plain. */
export interface LoggerLayout {
  /** 0-based index (in the head's lines) of the header row. */
  headerIndex: number;
  /** The unit of each column from the units row, '' where its cell is empty; null when there is none. */
  units: string[] | null;
  /** The preamble's key/value pairs, in file order. */
  preamble: { key: string; value: string }[];
}

/** Unit names a units row holds (compared without case, spaces, brackets and dots). */
const UNIT_NAMES = new Set(
  [
    's sec ms min h hz m km ft mi',
    'km/h kmh kph mph m/s mps kn kt kts knots ft/s g m/s^2 m/s2 m/s² mps2',
    '% pct percent 0-1 bar mbar psi kpa mpa pa deg ° degrees rad deg/s °/s rad/s',
    'rpm 1/min v mv a °c degc c °f degf k l l/h nm n kg w kw # - raw bool count n/a none',
  ]
    .join(' ')
    .split(' '),
);

/** The separator a line uses: a tab, else a semicolon, else a comma (a separator in quotes is text). */
export function delimiterOf(line: string): string {
  const bare = line.replace(/"[^"]*"/g, '');
  return bare.includes('\t') ? '\t' : bare.includes(';') ? ';' : ',';
}

const stripCell = (cell: string): string =>
  cell
    .trim()
    .replace(/^"(.*)"$/, '$1')
    .trim();

function cellsOf(line: string, delimiter: string): string[] {
  return line.split(delimiter).map(stripCell);
}

function isNumber(cell: string): boolean {
  return cell !== '' && Number.isFinite(Number(cell.replace(',', '.')));
}

/** A row of numbers (empty cells allowed, at least half numeric and the first one numeric). */
function isNumericRow(cells: string[]): boolean {
  if (cells.length < 2 || !isNumber(cells[0]!)) return false;
  let numbers = 0;
  for (const cell of cells) if (isNumber(cell)) numbers++;
  return numbers * 2 >= cells.length;
}

/** A cell's unit as a units row writes it: `km/h`, `[km/h]`, `(g)`; null when it is no unit name. */
export function unitName(cell: string): string | null {
  const bare = cell
    .replace(/^[[(](.*)[\])]$/, '$1')
    .trim()
    .toLowerCase()
    .replace(/\s+/g, '');
  return UNIT_NAMES.has(bare) ? bare : null;
}

/** A row of unit names: no numbers, every non-empty cell a unit, at least one of them. */
function isUnitsRow(cells: string[]): boolean {
  let units = 0;
  for (const cell of cells) {
    if (cell === '') continue;
    if (unitName(cell) === null) return false;
    units++;
  }
  return units > 0;
}

/**
 * The logger layout of the head's lines, or null when the file is plain (the header is the first line that is
 * not blank or a comment, and no units row follows it): plain files read exactly as before.
 */
export function loggerLayout(lines: string[]): LoggerLayout | null {
  const rows: { index: number; cells: string[] }[] = [];
  for (let i = 0; i < lines.length; i++) {
    const line = lines[i]!.trim();
    if (line === '' || line.startsWith('#')) continue;
    rows.push({ index: i, cells: cellsOf(line, delimiterOf(line)) });
  }
  // The data: the first numeric row whose next row (if any in the head) is numeric and as wide.
  let first = -1;
  for (let r = 0; r < rows.length; r++) {
    const row = rows[r]!;
    const next = rows[r + 1];
    if (
      isNumericRow(row.cells) &&
      (next === undefined || (isNumericRow(next.cells) && next.cells.length === row.cells.length))
    ) {
      first = r;
      break;
    }
  }
  if (first < 1) return null;
  const width = rows[first]!.cells.length;
  let header = first - 1;
  let units: string[] | null = null;
  const above = rows[header]!;
  if (header >= 1 && isUnitsRow(above.cells) && rows[header - 1]!.cells.length === width) {
    units = Array.from({ length: width }, (_, k) => above.cells[k] ?? '');
    header--;
  }
  if (rows[header]!.cells.length !== width || isNumericRow(rows[header]!.cells)) return null;
  if (header === 0 && units === null) return null;
  const preamble = rows.slice(0, header).map(({ cells }) => ({
    key: cells[0] ?? '',
    value: cells
      .slice(1)
      .filter((cell) => cell !== '')
      .join(' '),
  }));
  return { headerIndex: rows[header]!.index, units, preamble };
}

/** The header row's names: a byte order mark and a leading '#' dropped, each completed by its unit from the units row. */
export function headerNames(cells: string[], layout: LoggerLayout | null): string[] {
  return cells.map((cell, index) =>
    headerWithUnit(
      (index === 0 ? cell.replace(/^\uFEFF/, '').replace(/^\s*#\s*/, '') : cell).trim(),
      layout?.units?.[index],
    ),
  );
}

/** The header a units row completes: `Speed` with `km/h` reads as `Speed [km/h]`; a header with a unit keeps it. */
export function headerWithUnit(header: string, unit: string | undefined): string {
  if (unit === undefined || unit.trim() === '' || /[[(]/.test(header)) return header;
  return `${header} [${unit.trim().replace(/^[[(](.*)[\])]$/, '$1')}]`;
}

/** The notes that say what was understood of a logger's preamble and units row. */
export function loggerNotes(layout: LoggerLayout | null): string[] {
  if (!layout) return [];
  const notes: string[] = [];
  if (layout.preamble.length > 0) {
    const pairs = layout.preamble.map(({ key, value }) => (value ? `${key}: ${value}` : key));
    notes.push(
      `logger preamble of ${layout.preamble.length} line${layout.preamble.length > 1 ? 's' : ''} before the header: ${pairs.join('; ')}`,
    );
  }
  if (layout.units)
    notes.push(`units taken from the row under the header: ${layout.units.filter((u) => u !== '').join(', ')}`);
  return notes;
}
