// Rows of a telemetry read taken to SI units in place: each delivered channel whose unit is known (from its header
// or decided from the data) scaled by its factor, and latitude/longitude projected to the local plane.

import type { ColumnBinding } from './columns.js';
import type { TelemetryChannel } from './chunk.js';
import type { ResolvedLayout } from './channel-layout.js';
import type { RowBlock } from './row-block.js';
import { applyFactor, projectInPlace, type DecidedUnits } from './units-from-data.js';

/** Rows [from, to) of `block`; channels still pending stay in the file's units. */
export function scaleRowsToSi(
  block: RowBlock,
  resolved: ResolvedLayout,
  bindings: ColumnBinding[],
  decided: DecidedUnits | null,
  from: number,
  to: number,
): void {
  const { layout, columnOfField, plane } = resolved;
  const column = (field: TelemetryChannel) => block.values[columnOfField.get(field)!]!;
  for (const field of layout.channels) {
    if (field === 'timeS' || layout.pending.includes(field)) continue;
    if (layout.positions === 'latlon' && (field === 'xM' || field === 'yM')) continue;
    const binding = bindings[columnOfField.get(field)!]!;
    const factor = field === 'xM' || field === 'yM' ? 1 : (binding.scale ?? decided?.factors[field] ?? 1);
    applyFactor(column(field), field, factor, from, to);
  }
  if (plane) projectInPlace(column('xM'), column('yM'), plane, from, to);
}
