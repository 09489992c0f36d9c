// Plain series for charts of a sweep (the HTML report draws them): lap time against each swept field,
// and each corner's braking-point shift from the baseline against the same field.

import type { SweepRecord, SweepTable } from './table.js';

export interface SweepSeries {
  field: string;
  unit: string;
  /** Values of the field, ascending. */
  values: number[];
  lapTimeS: number[];
  /** [corner][value]: braking point minus the baseline's, m (negative = earlier); NaN where not braked. */
  brakingPointShiftM: number[][];
  cornerBrakingPointsM: number[];
}

/**
 * One series per field. One-at-a-time sweeps give each field's own runs; in a grid the other fields are
 * held at the grid value nearest their baseline. Difference-pair runs and the baseline are left out.
 */
export function sweepChartData(table: SweepTable): SweepSeries[] {
  const { meta, records } = table;
  return meta.fields.map((field, k) => {
    let runs: SweepRecord[];
    if (meta.mode === 'one-at-a-time') {
      runs = records.filter((r) => r.kind === 'oat' && r.varies === field);
    } else {
      const grid = records.filter((r) => r.kind === 'grid');
      const held = meta.fields.map((_, j) => {
        if (j === k) return Number.NaN;
        const base = meta.baseValues[j]!;
        let best = Number.NaN;
        for (const r of grid) {
          const v = r.values[j]!;
          if (Number.isNaN(best) || Math.abs(v - base) < Math.abs(best - base)) best = v;
        }
        return best;
      });
      runs = grid.filter((r) => r.values.every((v, j) => j === k || v === held[j] || Number.isNaN(held[j]!)));
    }
    runs = [...runs].sort((a, b) => a.values[k]! - b.values[k]!);
    return {
      field,
      unit: meta.units[k] ?? '',
      values: runs.map((r) => r.values[k]!),
      lapTimeS: runs.map((r) => r.lapTimeS),
      brakingPointShiftM: meta.corners.map((corner, c) => runs.map((r) => r.brakingPointM[c]! - corner.brakingPointM)),
      cornerBrakingPointsM: meta.corners.map((corner) => corner.brakingPointM),
    };
  });
}
