// Rows of a telemetry read going out: latitude/longitude checked to be degrees, units taken to SI, and the rows
// handed to the sink as a chunk of views into the block, less the rows an earlier, abandoned pass delivered.

import type { ColumnBinding } from './columns.js';
import { channelArrays, type TelemetryChannel, type TelemetryChunk } from './chunk.js';
import type { ResolvedLayout } from './channel-layout.js';
import type { RowBlock } from './row-block.js';
import { scaleRowsToSi } from './si-scaling.js';
import type { ChannelLayout, DecidedUnits } from './units-from-data.js';

export type ChunkSink = (chunk: TelemetryChunk, layout: ChannelLayout) => void;

/** Delivery of a read's rows; the layout is resolved (by `resolve`) when the first rows go out, or at the end. */
export class ChunkDelivery {
  /** The first latitude and the first longitude out of range, as one-line messages. */
  latError: string | null = null;
  lonError: string | null = null;
  private resolvedLayout: ResolvedLayout | null = null;

  constructor(
    private readonly resolve: () => ResolvedLayout,
    private readonly bindings: ColumnBinding[],
    private readonly decided: DecidedUnits | null,
    private readonly skipRows: number,
    private readonly sink: ChunkSink,
    private readonly source: string,
  ) {}

  resolved(): ResolvedLayout {
    this.resolvedLayout ??= this.resolve();
    return this.resolvedLayout;
  }

  /** Rows [from, to) of a block: GPS range checked, units to SI, then handed to the sink. */
  deliver(block: RowBlock, from: number, to: number): void {
    const resolved = this.resolved();
    const { layout, columnOfField } = resolved;
    if (resolved.error !== null || this.latError !== null) return;
    const column = (field: TelemetryChannel) => block.values[columnOfField.get(field)!]!;
    if (layout.positions === 'latlon') {
      this.checkRange(block, column('xM'), from, to, -90, 90, 'xM');
      if (this.lonError === null) this.checkRange(block, column('yM'), from, to, -180, 180, 'yM');
      if (this.latError !== null || this.lonError !== null) return;
    }
    scaleRowsToSi(block, resolved, this.bindings, this.decided, from, to);
    const firstRow = block.firstRow + from;
    if (this.skipRows >= firstRow + (to - from)) return;
    const skip = Math.max(0, this.skipRows - firstRow);
    const view = (field: TelemetryChannel) =>
      columnOfField.has(field) && layout.channels.includes(field) ? column(field).subarray(from + skip, to) : null;
    this.sink({ firstRow: firstRow + skip, rows: to - from - skip, ...channelArrays(view) }, layout);
  }

  private checkRange(
    block: RowBlock,
    values: Float64Array,
    from: number,
    to: number,
    min: number,
    max: number,
    field: 'xM' | 'yM',
  ): void {
    for (let r = from; r < to; r++) {
      const v = values[r]!;
      if (v < min || v > max) {
        const header = this.resolved().layout.headers[field]!;
        const message = `${this.source}: line ${block.lines[r]}, column ${header}: ${v} is not a latitude/longitude in degrees`;
        if (field === 'xM') this.latError = message;
        else this.lonError = message;
        return;
      }
    }
  }
}
