// The line as CSV text, one row per grid sample: s_m (distance along the centreline), offset_m (positive to
// the left), x_m, y_m (plane position) and curvature_1pm (signed, positive = left turn). Read back by
// src/io/read-line.ts. Offsets keep a micrometre: the curvature read back is their second difference over the grid
// step, so a coarser rounding (0.1 mm gave 5e-5 1/m at 1 m) puts noise into it that a corner at the limit feels.

import type { LineGeometry } from './types.js';

export const LINE_CSV_COLUMNS = ['s_m', 'offset_m', 'x_m', 'y_m', 'curvature_1pm'] as const;

export function lineCsv(line: LineGeometry): string {
  const rows: string[] = [LINE_CSV_COLUMNS.join(',')];
  for (let i = 0; i < line.offsetM.length; i++) {
    rows.push(
      `${line.stationM[i]!.toFixed(3)},${line.offsetM[i]!.toFixed(6)},${line.xM[i]!.toFixed(4)},${line.yM[i]!.toFixed(4)},${line.path.curvaturePerM[i]!.toFixed(7)}`,
    );
  }
  return rows.join('\n') + '\n';
}
