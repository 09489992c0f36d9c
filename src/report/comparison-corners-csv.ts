// The corner table of a comparison as CSV (corners.csv of `compare --out` and the demo): one row per corner,
// speeds and distances in the chosen units with the unit in each column name.

import type { SessionComparison } from '../compare/compare-session.js';
import { compareSummaryJson } from './compare-summary.js';
import type { DisplayUnits } from './units.js';
import { kphToMps } from '../units.js';

export function comparisonCornersCsv(comparison: SessionComparison, units: DisplayUnits): string {
  const rows = compareSummaryJson(comparison.result).corners;
  const columns = [
    'id',
    'name',
    'entryM',
    'apexM',
    'exitM',
    'brakingPointDeltaM',
    'brakingPointDeltaS',
    'entrySpeedDriverKph',
    'entrySpeedReferenceKph',
    'minSpeedDriverKph',
    'minSpeedReferenceKph',
    'minSpeedDeltaKph',
    'minSpeedOffsetFromApexM',
    'exitSpeedDriverKph',
    'exitSpeedReferenceKph',
    'entryTimeLostS',
    'middleTimeLostS',
    'exitTimeLostS',
    'timeLostS',
    'coastingS',
    'meanGripUse',
    'peakGripUse',
  ] as const;
  const cell = (value: unknown) =>
    value === null || value === undefined
      ? ''
      : typeof value === 'string'
        ? `"${value.replace(/"/g, '""')}"`
        : String(value);
  // The corner table is read by people: speeds and distances in the chosen units, the unit in each column name.
  const shown = columns.map((column) => displayColumn(column, units));
  return (
    [
      shown.map((c) => c.name).join(','),
      ...rows.map((row) => columns.map((column, k) => cell(shown[k]!.value(row[column]))).join(',')),
    ].join('\n') + '\n'
  );
}

/** A corner-table column in the chosen units: `...Kph` becomes `...Mph` and `...M` becomes `...Ft` in imperial. */
function displayColumn(column: string, units: DisplayUnits): { name: string; value: (v: unknown) => unknown } {
  const convert = (suffix: string, to: string, factor: (x: number) => number, digits: number) => ({
    name: column.slice(0, -suffix.length) + to,
    value: (v: unknown) => (typeof v === 'number' ? Number(factor(v).toFixed(digits)) : v),
  });
  if (units.system === 'imperial' && column.endsWith('Kph'))
    return convert('Kph', 'Mph', (kph) => units.speed(kphToMps(kph)), 2);
  if (units.system === 'imperial' && column.endsWith('M')) return convert('M', 'Ft', units.distance, 1);
  return { name: column, value: (v) => v };
}
