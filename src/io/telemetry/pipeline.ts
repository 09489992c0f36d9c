// The one path every telemetry CSV row takes, for the streamed and the in-memory reader alike: cells to numbers
// (cell-value.ts), time order (time-order.ts), empty cells filled by linear interpolation in time (gap-fill.ts),
// units to SI and GPS range (chunk-delivery.ts); rows go out in chunks of at most CHUNK_ROWS. Rows are held back
// only while a gap in some channel is still open (its closing value is needed to fill it), so memory follows the
// longest gap, not the file. Errors found after the text is read are reported in the order the documented
// checks run, whichever row comes first in the file.

import { InputError } from '../../errors.js';
import { cellValue } from './cell-value.js';
import { resolveLayout } from './channel-layout.js';
import { CHUNK_ROWS } from './chunk.js';
import { ChunkDelivery, type ChunkSink } from './chunk-delivery.js';
import { bindColumns, listedHeaders, type ColumnBinding } from './columns.js';
import { headerNames, loggerNotes, type LoggerLayout } from './logger-preamble.js';
import { GapFiller, type ColumnScan } from './gap-fill.js';
import { columnNotes, type ColumnNote } from './read-notes.js';
import type { RowBlock } from './row-block.js';
import { TimeOrder } from './time-order.js';
import type { ChannelLayout, DecidedUnits } from './units-from-data.js';

/** Most columns a log's header may have: loggers write tens to a few hundred channels (from memory). */
export const MAX_COLUMNS = 10_000;

/** Thrown when more rows are held than allowed and no scan is known yet: the caller scans and reads again. */
export class HeldTooLong extends Error {}

export interface PipelineOptions {
  source: string;
  headerLine: number;
  /** A logger's units row (skipped, its units joined to the headers) and preamble; null for a plain file. */
  logger: LoggerLayout | null;
  decimalComma: boolean;
  mapping: Record<string, string>;
  /** Units decided by an earlier pass; null delivers the open ones in the file's units (see ChannelLayout.pending). */
  decided: DecidedUnits | null;
  scan: ColumnScan | null;
  /** 'scan' only learns the ColumnScan; 'read' delivers chunks. */
  mode: 'read' | 'scan';
  /** Chunks held back before giving up with HeldTooLong (only when no scan is known). */
  maxHeldChunks: number;
  /** Rows already delivered by an earlier, abandoned pass: read again but not delivered twice. */
  skipRows: number;
  sink: ChunkSink;
}

/** The end of a read: everything the notes and the summary need. */
export interface PipelineResult {
  rows: number;
  layout: ChannelLayout;
  startTimeS: number;
  endTimeS: number;
  scan: ColumnScan;
  /** In the order the notes list them. */
  columnNotes: ColumnNote[];
  ignored: string[];
  decimalComma: boolean;
  /** What was understood of a logger's preamble and units row. */
  loggerNotes: string[];
}

export class RowPipeline {
  private headers: string[] = [];
  private bindings: ColumnBinding[] = [];
  private ignored: string[] = [];
  private timeIndex = -1;
  private records = 0;
  private rows = 0;
  private block: RowBlock | null = null;
  private readonly held: RowBlock[] = [];
  private readonly pool: RowBlock[] = [];
  private readonly time = new TimeOrder();
  // Set by the header.
  private gaps!: GapFiller;
  private delivery!: ChunkDelivery;
  private delivered = 0;
  private finishing = false;
  /** True while the units row under the header is still to come. */
  private unitsRowAhead = false;

  constructor(private readonly options: PipelineOptions) {}

  /** True once the header has been read. */
  get hasHeader(): boolean {
    return this.headers.length > 0;
  }

  /** The file columns (0-based) whose cells become the rows' numbers; known once the header is read. */
  boundColumns(): number[] {
    return this.bindings.map((binding) => binding.index);
  }

  /** One parsed record; its line is counted here (blank lines arrive as one empty field). */
  record(cells: string[]): void {
    const line = this.options.headerLine + this.records++;
    if (cells.length === 1 && cells[0]!.trim() === '') return;
    if (this.headers.length === 0) {
      this.header(cells);
      return;
    }
    if (this.unitsRowAhead) {
      this.unitsRowAhead = false;
      return;
    }
    const block = this.currentBlock();
    const r = block.rows;
    const { source, decimalComma } = this.options;
    for (let b = 0; b < this.bindings.length; b++) {
      const binding = this.bindings[b]!;
      block.values[b]![r] = cellValue(cells[binding.index], decimalComma, source, line, binding.header);
    }
    this.endRow(block, r, line);
  }

  /**
   * One data record already read as numbers by the byte scanner (numeric-scan.ts): values[column] for the
   * first `count` cells (NaN where a cell is empty); the cells past `count` are missing, as in record().
   */
  recordNumbers(values: Float64Array, count: number): void {
    const line = this.options.headerLine + this.records++;
    const block = this.currentBlock();
    const r = block.rows;
    for (let b = 0; b < this.bindings.length; b++) {
      const index = this.bindings[b]!.index;
      block.values[b]![r] = index < count ? values[index]! : NaN;
    }
    this.endRow(block, r, line);
  }

  private endRow(block: RowBlock, r: number, line: number): void {
    block.lines[r] = line;
    block.rows++;
    this.rows++;
    if (this.timeIndex >= 0 && this.time.error === null) {
      const binding = this.bindings[this.timeIndex]!;
      this.time.check(
        block.values[this.timeIndex]!,
        r,
        binding.scale ?? 1,
        this.options.source,
        line,
        binding.header,
        this.rows === 1,
      );
    }
    if (block.rows === CHUNK_ROWS) this.closeBlock();
  }

  private header(cells: string[]): void {
    // A line of a million cells is not a logger's header (a file of numbers with no line breaks): refused before
    // each cell is matched against the known channel names.
    if (cells.length > MAX_COLUMNS)
      throw new InputError(
        `${this.options.source}: line ${this.options.headerLine}: a header of ${cells.length} columns; a log has at most ${MAX_COLUMNS}`,
      );
    this.headers = headerNames(cells, this.options.logger);
    this.unitsRowAhead = (this.options.logger?.units ?? null) !== null;
    const { source, scan, mode, decided, skipRows, sink } = this.options;
    const { bindings, ignored } = bindColumns(this.headers, this.options.mapping, source);
    this.bindings = bindings;
    this.ignored = ignored;
    this.timeIndex = bindings.findIndex((binding) => binding.quantity === 'time');
    this.gaps = new GapFiller(bindings.length, this.timeIndex, scan, mode === 'scan');
    const resolve = () =>
      resolveLayout(this.bindings, this.headers, this.timeIndex, this.gaps.dropped, decided, source);
    this.delivery = new ChunkDelivery(resolve, bindings, decided, skipRows, sink, source);
  }

  private currentBlock(): RowBlock {
    if (this.block) return this.block;
    const block = this.pool.pop() ?? {
      firstRow: 0,
      rows: 0,
      lines: new Float64Array(CHUNK_ROWS),
      values: this.bindings.map(() => new Float64Array(CHUNK_ROWS)),
    };
    block.firstRow = this.rows;
    block.rows = 0;
    this.block = block;
    return block;
  }

  /** A full (or the last) block: its gaps are tracked and filled where they close, then ready rows go out. */
  private closeBlock(): void {
    const block = this.block;
    if (!block) return;
    this.block = null;
    if (this.timeIndex < 0 || this.time.error !== null) {
      this.recycle(block);
      return;
    }
    this.gaps.track(block, this.held);
    if (this.options.mode === 'scan') {
      this.recycle(block);
      return;
    }
    this.held.push(block);
    this.release();
    if (!this.finishing && this.held.length > this.options.maxHeldChunks && this.options.scan === null)
      throw new HeldTooLong();
  }

  /** Delivers every held row before the oldest open gap. */
  private release(upTo = Infinity): void {
    const ready = this.gaps.oldestOpen(upTo);
    while (this.held.length > 0) {
      const block = this.held[0]!;
      const end = Math.min(ready, block.firstRow + block.rows);
      if (end > this.delivered) {
        this.delivery.deliver(block, this.delivered - block.firstRow, end - block.firstRow);
        this.delivered = end;
      }
      if (this.delivered < block.firstRow + block.rows) break;
      this.recycle(this.held.shift()!);
    }
  }

  private recycle(block: RowBlock): void {
    if (this.pool.length < 4) this.pool.push(block);
  }

  /** The end of the file: the checks that need every row, in the documented order; then the last rows go out. */
  finish(): PipelineResult {
    const source = this.options.source;
    if (this.headers.length === 0) throw new InputError(`${source}: empty file (no header)`);
    if (this.rows === 0)
      throw new InputError(`${source}: header only, no data rows (header: ${listedHeaders(this.headers)})`);
    if (this.timeIndex < 0)
      throw new InputError(
        `${source}: no time column (found: ${listedHeaders(this.headers) || 'nothing'}); name it time_s or map it with --telemetry-columns time_s=NAME`,
      );
    if (this.rows < 2) throw new InputError(`${source}: only one data row; a lap needs many`);
    if (this.time.error !== null) throw new InputError(this.time.error);
    const timeBinding = this.bindings[this.timeIndex]!;
    if (!(this.time.previousTimeS > this.time.firstTimeS))
      throw new InputError(`${source}: column ${timeBinding.header}: time does not advance`);
    this.finishing = true;
    this.closeBlock();
    const scanning = this.options.mode === 'scan';
    // Gaps still open run to the end of the file: held at the last value, or the whole column is empty.
    this.gaps.closeAtEnd(this.rows, this.held);
    if (!scanning) this.release();
    const { layout, error } = this.delivery.resolved();
    if (error !== null) throw new InputError(error);
    if (this.delivery.latError !== null) throw new InputError(this.delivery.latError);
    if (this.delivery.lonError !== null) throw new InputError(this.delivery.lonError);
    return {
      rows: this.rows,
      layout,
      startTimeS: this.time.firstTimeS,
      endTimeS: this.time.previousTimeS,
      scan: { empty: [...this.gaps.dropped], longGaps: this.gaps.longGaps },
      columnNotes: columnNotes(this.bindings, this.gaps.dropped, this.gaps.nan),
      ignored: this.ignored,
      decimalComma: this.options.decimalComma,
      loggerNotes: loggerNotes(this.options.logger),
    };
  }
}
