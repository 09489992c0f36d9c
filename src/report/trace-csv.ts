// The reference lap as a CSV trace, one row per grid sample. The same columns read back as telemetry.
// `power_limited` (1 = the engine's full drive in use) and `shift` (1 = an upshift's gap in drive) are states, 0/1.

import type { LapResult } from '../solve/types.js';
import { mpsToKph } from '../units.js';
import { roadProfileOf } from '../track/road-profile.js';
import { requireFiniteLap } from './finite.js';

export interface ExtraColumn {
  name: string;
  values: ArrayLike<number>;
  digits: number;
}

const fixed = (value: number, digits: number) => (Number.isFinite(value) ? value.toFixed(digits) : '');

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

export function traceCsv(result: LapResult, extra: ExtraColumn[] = []): string {
  requireFiniteLap(result);
  const t = result.trace;
  const extraColumns = [...roadColumns(result), ...extra];
  const header = [
    'distance_m',
    'time_s',
    'speed_mps',
    'speed_kph',
    'ax_mps2',
    'ay_mps2',
    'curvature_1pm',
    'throttle',
    'brake',
    'grip_use',
    'power_limited',
  ];
  if (t.hasGears) header.push('gear', 'shift');
  for (const column of extraColumns) header.push(column.name);
  const lines: string[] = [header.join(',')];
  for (let i = 0; i < t.count; i++) {
    const row = [
      fixed(t.distanceM[i]!, 3),
      fixed(t.timeS[i]!, 4),
      fixed(t.speedMps[i]!, 4),
      fixed(mpsToKph(t.speedMps[i]!), 3),
      fixed(t.axMps2[i]!, 4),
      fixed(t.ayMps2[i]!, 4),
      fixed(t.curvaturePerM[i]!, 6),
      fixed(t.throttle[i]!, 4),
      fixed(t.brake[i]!, 4),
      fixed(t.gripUse[i]!, 4),
      String(t.powerLimited[i]),
    ];
    if (t.hasGears) row.push(String(t.gear[i]), String(t.shift[i]));
    for (const column of extraColumns) row.push(fixed(column.values[i]!, column.digits));
    lines.push(row.join(','));
  }
  return lines.join('\n') + '\n';
}
