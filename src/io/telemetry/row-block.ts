// The buffer a telemetry read fills: CHUNK_ROWS rows of every bound column as numbers, with the file line of
// each row, held until its gaps are filled and its rows delivered, then reused.

/** Rows `firstRow` to `firstRow + rows - 1` (data rows counted from 0); `values` has one array per bound column. */
export interface RowBlock {
  firstRow: number;
  rows: number;
  lines: Float64Array;
  values: Float64Array[];
}
