// The reference lap as a CSV trace, one row per grid sample. The metric columns read back as telemetry.
// `power_limited` (1 = the engine's full drive in use) and `shift` (1 = an upshift's gap in drive) are states, 0/1.

import type { LapResult } from '../solve/types.js';
import { mpsToKph } from '../units.js';
import { roadProfileOf } from '../track/road-profile.js';
import { requireFiniteLap } from './finite.js';
import { columnsInUnits, csvText, type CsvColumn } from './csv-columns.js';
import { displayUnits, type DisplayUnits } from './units.js';

export interface ExtraColumn {
  name: string;
  values: ArrayLike<number>;
  digits: number;
}

/** Height, grade and bank columns where the track has them (z_m, grade_pct, bank_deg); none on a flat track. */
export function roadColumns(result: LapResult): ExtraColumn[] {
  const road = roadProfileOf(result.track);
  if (!road) return [];
  return [
    { name: 'z_m', values: road.zM, digits: 3 },
    { name: 'grade_pct', values: road.gradeRad.map((a) => 100 * Math.tan(a)), digits: 3 },
    { name: 'bank_deg', values: road.bankRad.map((a) => (a * 180) / Math.PI), digits: 3 },
  ];
}

/** The trace in the chosen units (metric when omitted): distances in m or ft, speeds in km/h (and m/s) or mph. */
export function traceCsv(
  result: LapResult,
  extra: ExtraColumn[] = [],
  units: DisplayUnits = displayUnits('metric'),
): string {
  requireFiniteLap(result);
  const t = result.trace;
  const of = (name: string, values: ArrayLike<number>, digits: number): CsvColumn => ({
    name,
    value: (i) => values[i]!,
    digits,
  });
  const columns: CsvColumn[] = [
    of('distance_m', t.distanceM, 3),
    of('time_s', t.timeS, 4),
    of('speed_mps', t.speedMps, 4),
    { name: 'speed_kph', value: (i) => mpsToKph(t.speedMps[i]!), digits: 3 },
    of('ax_mps2', t.axMps2, 4),
    of('ay_mps2', t.ayMps2, 4),
    of('curvature_1pm', t.curvaturePerM, 6),
    of('throttle', t.throttle, 4),
    of('brake', t.brake, 4),
    of('grip_use', t.gripUse, 4),
    of('power_limited', t.powerLimited, 0),
  ];
  if (t.hasGears) columns.push(of('gear', t.gear, 0), of('shift', t.shift, 0));
  for (const column of [...roadColumns(result), ...extra]) columns.push(of(column.name, column.values, column.digits));
  return csvText(columnsInUnits(columns, units), t.count);
}
