// The notes a telemetry read gives beside its data: unused columns, decimal commas, columns left out as empty,
// cells filled by interpolation and units decided from the data, in the order the session reader has always used.

import type { ColumnBinding, Quantity } from './columns.js';
import { FIELD_OF, type TelemetryChannel } from './chunk.js';
import type { DecidedUnits } from './units-from-data.js';

/** What the notes say of one bound column. */
export interface ColumnNote {
  field: TelemetryChannel;
  quantity: Quantity;
  header: string;
  empty: boolean;
  filled: number;
}

const NOTE_ORDER: Quantity[] = [
  'distance',
  'x',
  'y',
  'lat',
  'lon',
  'speed',
  'throttle',
  'brake',
  'brakePressure',
  'ax',
  'ay',
  'steering',
  'gear',
  'rpm',
];

/** The column notes in the order they are listed; `dropped` and `filled` by binding index. */
export function columnNotes(
  bindings: ColumnBinding[],
  dropped: readonly boolean[],
  filled: readonly number[],
): ColumnNote[] {
  const notes: ColumnNote[] = [];
  for (const quantity of NOTE_ORDER) {
    const b = bindings.findIndex((binding) => binding.quantity === quantity);
    if (b < 0) continue;
    notes.push({
      field: FIELD_OF[quantity],
      quantity,
      header: bindings[b]!.header,
      empty: dropped[b]!,
      filled: filled[b]!,
    });
  }
  return notes;
}

/** The notes of a read, in the order the session reader has always given them. */
export function composeNotes(
  result: { ignored: string[]; decimalComma: boolean; columnNotes: ColumnNote[]; loggerNotes: string[] },
  decided: DecidedUnits | null,
): string[] {
  const notes: string[] = [...result.loggerNotes];
  if (result.ignored.length > 0) notes.push(`columns not used: ${result.ignored.join(', ')}`);
  if (result.decimalComma) notes.push('decimal commas read');
  for (const column of result.columnNotes) {
    if (column.empty) {
      notes.push(`column ${column.header} is empty; left out`);
      continue;
    }
    if (column.filled > 0) notes.push(`column ${column.header}: ${column.filled} empty cells filled by interpolation`);
    const unitNote = decided?.notes[column.field];
    if (unitNote !== undefined) notes.push(unitNote);
  }
  return notes;
}
