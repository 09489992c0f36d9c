// The line as CSV text, one row per grid sample: s_m (distance along the centreline), offset_m (positive to
// the left), x_m, y_m (plane position) and curvature_1pm (signed, positive = left turn). Read back by
// src/io/read-line.ts.

import type { LineGeometry } from './types.js';

export const LINE_CSV_COLUMNS = ['s_m', 'offset_m', 'x_m', 'y_m', 'curvature_1pm'] as const;

export function lineCsv(line: LineGeometry): string {
  const rows: string[] = [LINE_CSV_COLUMNS.join(',')];
  for (let i = 0; i < line.offsetM.length; i++) {
    rows.push(
      `${line.stationM[i]!.toFixed(3)},${line.offsetM[i]!.toFixed(4)},${line.xM[i]!.toFixed(3)},${line.yM[i]!.toFixed(3)},${line.path.curvaturePerM[i]!.toFixed(7)}`,
    );
  }
  return rows.join('\n') + '\n';
}
