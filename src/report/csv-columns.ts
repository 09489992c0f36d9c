// A CSV a person reads, built column by column: every column's name ends in its unit, and in imperial units the
// columns in metres, km/h, m/s and bar are written in feet, mph and psi instead (NIST SP 811 appendix B factors:
// 1 ft = 0.3048 m, 1 mph = 0.44704 m/s, 1 psi = 6894.757 Pa). Accelerations, curvatures, angles and times keep
// their units, which the names give.

import { METRES_PER_FOOT, METRES_PER_MILE, type DisplayUnits } from './units.js';

export interface CsvColumn {
  /** Name with its unit suffix, e.g. `speed_kph`, `distance_m`; a 0-1 share or a state has none. */
  name: string;
  /** The value at row i in the unit the name gives; NaN writes an empty cell. */
  value: (i: number) => number;
  digits: number;
}

const PASCALS_PER_PSI = 6894.757293168;
const MPH_PER_MPS = 3600 / METRES_PER_MILE;

/** Metric unit suffix -> the imperial one and the factor between them. */
const IMPERIAL_SUFFIXES: ReadonlyArray<[string, string, number]> = [
  ['_m', '_ft', 1 / METRES_PER_FOOT],
  ['_kph', '_mph', MPH_PER_MPS / 3.6],
  ['_mps', '_mph', MPH_PER_MPS],
  ['_bar', '_psi', 1e5 / PASCALS_PER_PSI],
];

/** The columns in the chosen units. In imperial a speed given both in m/s and km/h is written once, in mph. */
export function columnsInUnits(columns: CsvColumn[], units: DisplayUnits): CsvColumn[] {
  if (units.system === 'metric') return columns;
  const seen = new Set<string>();
  const out: CsvColumn[] = [];
  for (const column of columns) {
    const rule = IMPERIAL_SUFFIXES.find(([suffix]) => column.name.endsWith(suffix));
    const converted: CsvColumn = rule
      ? {
          name: column.name.slice(0, -rule[0].length) + rule[1],
          value: (i) => column.value(i) * rule[2],
          digits: column.digits,
        }
      : column;
    if (seen.has(converted.name)) continue;
    seen.add(converted.name);
    out.push(converted);
  }
  return out;
}

/** The header and one line per row. */
export function csvText(columns: CsvColumn[], rowCount: number): string {
  const lines: string[] = [columns.map((column) => column.name).join(',')];
  const cells: string[] = new Array<string>(columns.length);
  for (let i = 0; i < rowCount; i++) {
    for (let c = 0; c < columns.length; c++) {
      const column = columns[c]!;
      const value = column.value(i);
      cells[c] = Number.isFinite(value) ? value.toFixed(column.digits) : '';
    }
    lines.push(cells.join(','));
  }
  return lines.join('\n') + '\n';
}
