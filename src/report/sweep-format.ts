// Number and unit text shared by the sweep's printed tables and its report page.

import type { Sensitivity, SweepTable } from '../sweep/table.js';
import { readableField, userStep } from './field-steps.js';
import { zoneLabel } from '../track/corner-layout.js';
import { displayUnits, plainNumber, type DisplayUnits } from './units.js';

/** '620 kg', or the value alone for a dimensionless field. */
export function valueWithUnit(value: number, unit: string | undefined): string {
  return unit && unit !== '1' ? `${value} ${unit}` : String(value);
}

/** The sensitivity table, header and rows, per the step a person thinks in (the step in each column's header). */
export function sensitivityRows(
  table: SweepTable,
  found: Sensitivity[],
  units: DisplayUnits = displayUnits('metric'),
): { header: string[]; rows: string[][] } {
  const steps = found.map((s) =>
    userStep(s.field, s.unit, table.meta.baseValues[table.meta.fields.indexOf(s.field)] ?? 0),
  );
  const header = [
    'change per step',
    ...found.map((s, k) => `per +${steps[k]!.text} of ${readableField(s.field, undefined)}`),
  ];
  const rows = [
    ['lap time, s', ...found.map((s, k) => plainNumber(s.lapTimeSPerUnit * steps[k]!.size, 3, true))],
    ...table.meta.corners.map((corner, c) => [
      `${zoneLabel(corner)} braking point, ${units.distanceLabel}`,
      ...found.map((s, k) => {
        const perUnit = s.brakingPointMPerUnit[c];
        return perUnit === null || perUnit === undefined
          ? ''
          : plainNumber(units.distance(perUnit * steps[k]!.size), 1, true);
      }),
    ]),
    ['difference step ±', ...found.map((s) => `${s.stepUsed}${s.scheme === 'central' ? '' : ` (${s.scheme})`}`)],
  ];
  return { header, rows };
}
