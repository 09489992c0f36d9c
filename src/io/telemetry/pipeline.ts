// The one path every telemetry CSV row takes, for the streamed and the in-memory reader alike: cells to numbers
// (text in a numeric column stops the read, naming line and column), time order, empty cells filled by linear
// interpolation in time, units to SI, GPS range; rows go out in chunks of at most CHUNK_ROWS. Rows are held back
// only while a gap in some channel is still open (its closing value is needed to fill it), so memory follows the
// longest gap, not the file. Errors found after the text is read are reported in the order the documented
// checks run, whichever row comes first in the file.

import { InputError } from '../../errors.js';
import { bindColumns, type ColumnBinding, type Quantity } from './columns.js';
import { channelArrays, CHUNK_ROWS, FIELD_OF, type TelemetryChannel, type TelemetryChunk } from './chunk.js';
import { localPlane, type LocalPlane } from './geo.js';
import { applyFactor, projectInPlace, type ChannelLayout, type DecidedUnits } from './units-from-data.js';

/** Cells that mean "no value" (compared trimmed and in lower case). */
export const MISSING_CELLS: ReadonlySet<string> = new Set(['', 'nan', 'na', 'n/a', 'null', '-', '--']);

/** A gap this long or longer is noted by the scan pass, so that the next pass fills it without holding rows. */
export const LONG_GAP_ROWS = 4 * CHUNK_ROWS;

/** A gap found by a scan: it starts at data row `start` and closes on `value` at `timeS` (NaN: runs to the end). */
interface KnownGap {
  start: number;
  value: number;
  timeS: number;
}

/** What a scan pass learns about a file's columns: which are empty throughout, and where the long gaps are. */
export interface ColumnScan {
  empty: boolean[];
  longGaps: KnownGap[][];
}

/** Thrown when more rows are held than allowed and no scan is known yet: the caller scans and reads again. */
export class HeldTooLong extends Error {}

export type ChunkSink = (chunk: TelemetryChunk, layout: ChannelLayout) => void;

export interface PipelineOptions {
  source: string;
  headerLine: number;
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
  columnNotes: Array<{ field: TelemetryChannel; quantity: Quantity; header: string; empty: boolean; filled: number }>;
  ignored: string[];
  decimalComma: boolean;
}

interface Block {
  firstRow: number;
  rows: number;
  lines: Float64Array;
  values: Float64Array[];
}

const NOTE_ORDER: Quantity[] = ['distance', 'x', 'y', 'lat', 'lon', 'speed', 'throttle', 'brake', 'ax', 'ay', 'steering', 'gear', 'rpm'];

function listed(headers: string[]): string {
  const text = headers.join(', ');
  return text.length > 200 ? `${text.slice(0, 200)}... (${headers.length} columns)` : text;
}

export class RowPipeline {
  private headers: string[] = [];
  private bindings: ColumnBinding[] = [];
  private ignored: string[] = [];
  private timeIndex = -1;
  private records = 0;
  private rows = 0;
  private block: Block | null = null;
  private readonly held: Block[] = [];
  private readonly pool: Block[] = [];
  // Time order.
  private timeError: string | null = null;
  private previousTimeS = NaN;
  private firstTimeS = NaN;
  // Per column (same index as bindings): empty cells, the last value seen, the open gap.
  private nan: number[] = [];
  private seen: boolean[] = [];
  private lastValue: number[] = [];
  private lastTimeS: number[] = [];
  private gapStart: number[] = [];
  private knownGap: (KnownGap | null)[] = [];
  private gapCursor: number[] = [];
  private dropped: boolean[] = [];
  private longGaps: KnownGap[][] = [];
  // Delivery.
  private delivered = 0;
  private layout: ChannelLayout | null = null;
  private layoutError: string | null = null;
  private latError: string | null = null;
  private lonError: string | null = null;
  private plane: LocalPlane | null = null;
  private columnOfField = new Map<TelemetryChannel, number>();
  private finishing = false;

  constructor(private readonly options: PipelineOptions) {}

  /** One parsed record; its line is counted here (blank lines arrive as one empty field). */
  record(cells: string[]): void {
    const line = this.options.headerLine + this.records++;
    if (cells.length === 1 && cells[0]!.trim() === '') return;
    if (this.headers.length === 0) {
      this.header(cells);
      return;
    }
    const block = this.currentBlock();
    const r = block.rows;
    const { source, decimalComma } = this.options;
    for (let b = 0; b < this.bindings.length; b++) {
      const binding = this.bindings[b]!;
      const cell = cells[binding.index];
      let value: number;
      if (cell === undefined || cell.length === 0) value = NaN;
      else {
        // Number() trims white space itself; only a failed parse looks further (missing-value markers, text).
        value = Number(decimalComma ? cell.replace(',', '.') : cell);
        if (value === 0 && cell.trim() === '') value = NaN;
        else if (!Number.isFinite(value)) {
          if (!MISSING_CELLS.has(cell.trim().toLowerCase())) {
            const shown = cell.length > 40 ? `${cell.slice(0, 40)}...` : cell;
            throw new InputError(`${source}: line ${line}, column ${binding.header}: '${shown}' is not a number`);
          }
          value = NaN;
        }
      }
      block.values[b]![r] = value;
    }
    block.lines[r] = line;
    block.rows++;
    this.rows++;
    if (this.timeIndex >= 0 && this.timeError === null) this.checkTime(block, r);
    if (block.rows === CHUNK_ROWS) this.closeBlock();
  }

  private header(cells: string[]): void {
    this.headers = cells.map((cell, index) => (index === 0 ? cell.replace(/^\uFEFF/, '').replace(/^\s*#\s*/, '') : cell).trim());
    const { bindings, ignored } = bindColumns(this.headers, this.options.mapping, this.options.source);
    this.bindings = bindings;
    this.ignored = ignored;
    this.timeIndex = bindings.findIndex((binding) => binding.quantity === 'time');
    const count = bindings.length;
    this.nan = new Array<number>(count).fill(0);
    this.seen = new Array<boolean>(count).fill(false);
    this.lastValue = new Array<number>(count).fill(NaN);
    this.lastTimeS = new Array<number>(count).fill(NaN);
    this.gapStart = new Array<number>(count).fill(-1);
    this.knownGap = new Array<KnownGap | null>(count).fill(null);
    this.gapCursor = new Array<number>(count).fill(0);
    this.dropped = bindings.map((_, b) => this.options.scan?.empty[b] === true);
    this.longGaps = bindings.map(() => []);
  }

  private checkTime(block: Block, r: number): void {
    const binding = this.bindings[this.timeIndex]!;
    const values = block.values[this.timeIndex]!;
    const timeS = values[r]! * (binding.scale ?? 1);
    values[r] = timeS;
    const place = `${this.options.source}: line ${block.lines[r]}, column ${binding.header}`;
    if (Number.isNaN(timeS)) this.timeError = `${place}: empty time`;
    else if (timeS < this.previousTimeS) this.timeError = `${place}: time runs backwards (${timeS} after ${this.previousTimeS})`;
    if (this.rows === 1) this.firstTimeS = timeS;
    this.previousTimeS = timeS;
  }

  private currentBlock(): Block {
    if (this.block) return this.block;
    const block = this.pool.pop() ?? { firstRow: 0, rows: 0, lines: new Float64Array(CHUNK_ROWS), values: this.bindings.map(() => new Float64Array(CHUNK_ROWS)) };
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
    if (this.timeIndex < 0 || this.timeError !== null) {
      this.recycle(block);
      return;
    }
    const timeS = block.values[this.timeIndex]!;
    const scanning = this.options.mode === 'scan';
    for (let b = 0; b < this.bindings.length; b++) {
      if (b === this.timeIndex || this.dropped[b]) continue;
      const values = block.values[b]!;
      for (let r = 0; r < block.rows; r++) {
        const value = values[r]!;
        const row = block.firstRow + r;
        if (Number.isNaN(value)) {
          this.nan[b]!++;
          let known = this.knownGap[b]!;
          if (known === null && this.gapStart[b]! < 0) {
            const candidates = this.options.scan?.longGaps[b];
            const next = candidates?.[this.gapCursor[b]!];
            if (next !== undefined && next.start === row) {
              known = next;
              this.knownGap[b] = next;
              this.gapCursor[b]!++;
            } else this.gapStart[b] = row;
          }
          if (known !== null && !scanning) values[r] = this.fillValue(b, known.value, known.timeS, timeS[r]!);
          continue;
        }
        if (this.knownGap[b] !== null) this.knownGap[b] = null;
        else if (this.gapStart[b]! >= 0) {
          if (scanning) {
            if (row - this.gapStart[b]! >= LONG_GAP_ROWS) this.longGaps[b]!.push({ start: this.gapStart[b]!, value, timeS: timeS[r]! });
          } else this.fillHeld(b, this.gapStart[b]!, row, block, value, timeS[r]!);
          this.gapStart[b] = -1;
        }
        this.seen[b] = true;
        this.lastValue[b] = value;
        this.lastTimeS[b] = timeS[r]!;
      }
    }
    if (scanning) {
      this.recycle(block);
      return;
    }
    this.held.push(block);
    this.release();
    if (!this.finishing && this.held.length > this.options.maxHeldChunks && this.options.scan === null) throw new HeldTooLong();
  }

  /** The value fillGaps (session.ts) gives a cell of a gap: held at the ends, linear in time inside. */
  private fillValue(b: number, closeValue: number, closeTimeS: number, t: number): number {
    if (!this.seen[b]) return closeValue;
    if (Number.isNaN(closeTimeS)) return this.lastValue[b]!;
    const previous = this.lastValue[b]!;
    const span = closeTimeS - this.lastTimeS[b]!;
    const w = span > 0 ? (t - this.lastTimeS[b]!) / span : 0;
    return previous + w * (closeValue - previous);
  }

  /** Fills rows [from, to) of column b, held in the queue and the current block, towards the closing value. */
  private fillHeld(b: number, from: number, to: number, current: Block | null, closeValue: number, closeTimeS: number): void {
    const fillInto = (block: Block) => {
      const start = Math.max(from, block.firstRow);
      const end = Math.min(to, block.firstRow + block.rows);
      const values = block.values[b]!;
      const timeS = block.values[this.timeIndex]!;
      for (let row = start; row < end; row++) values[row - block.firstRow] = this.fillValue(b, closeValue, closeTimeS, timeS[row - block.firstRow]!);
    };
    for (const block of this.held) fillInto(block);
    if (current) fillInto(current);
  }

  /** Delivers every held row before the oldest open gap. */
  private release(upTo = Infinity): void {
    let ready = upTo;
    for (let b = 0; b < this.bindings.length; b++) if (this.gapStart[b]! >= 0 && this.gapStart[b]! < ready) ready = this.gapStart[b]!;
    while (this.held.length > 0) {
      const block = this.held[0]!;
      const end = Math.min(ready, block.firstRow + block.rows);
      if (end > this.delivered) {
        this.deliver(block, this.delivered - block.firstRow, end - block.firstRow);
        this.delivered = end;
      }
      if (this.delivered < block.firstRow + block.rows) break;
      this.recycle(this.held.shift()!);
    }
  }

  private recycle(block: Block): void {
    if (this.pool.length < 4) this.pool.push(block);
  }

  /** Which channels go out: known once every column has a value or the file has ended. */
  private resolveLayout(): ChannelLayout {
    const present = (quantity: Quantity): number => {
      const b = this.bindings.findIndex((binding) => binding.quantity === quantity);
      // Before the end of the file nothing goes out while a column has had no value, unless a scan knows it has one.
      return b >= 0 && !this.dropped[b] ? b : -1;
    };
    const source = this.options.source;
    const [x, y, lat, lon] = [present('x'), present('y'), present('lat'), present('lon')];
    if ((x < 0) !== (y < 0)) this.layoutError ??= `${source}: column ${this.bindings[Math.max(x, y)]!.header} has no partner; positions need both x_m and y_m`;
    if ((lat < 0) !== (lon < 0)) this.layoutError ??= `${source}: column ${this.bindings[Math.max(lat, lon)]!.header} has no partner; GPS positions need both latitude and longitude`;
    const positions = x >= 0 && y >= 0 ? 'xy' : lat >= 0 && lon >= 0 ? 'latlon' : null;
    if (present('speed') < 0 && present('distance') < 0 && positions === null) {
      this.layoutError ??= `${source}: no position, distance or speed column (found: ${listed(this.headers)}); map one with --telemetry-columns`;
    }
    const layout: ChannelLayout = { channels: ['timeS'], positions, pending: [], headers: { timeS: this.bindings[this.timeIndex]!.header } };
    this.columnOfField.set('timeS', this.timeIndex);
    const decided = this.options.decided;
    for (const quantity of ['distance', 'speed', 'throttle', 'brake', 'ax', 'ay', 'steering', 'gear', 'rpm', ...(positions === 'xy' ? ['x', 'y'] : positions === 'latlon' ? ['lat', 'lon'] : [])] as Quantity[]) {
      const b = present(quantity);
      if (b < 0) continue;
      const field = FIELD_OF[quantity];
      layout.channels.push(field);
      layout.headers[field] = this.bindings[b]!.header;
      this.columnOfField.set(field, b);
      const open = this.bindings[b]!.scale === null && ['speed', 'throttle', 'brake', 'ax', 'ay'].includes(quantity);
      if (open && decided?.factors[field] === undefined) layout.pending.push(field);
    }
    if (positions === 'latlon') {
      if (decided?.geoOrigin) this.plane = localPlane(decided.geoOrigin);
      else layout.pending.push('xM', 'yM');
    }
    return layout;
  }

  /** Rows [from, to) of a block: GPS range checked, units to SI, then handed to the sink. */
  private deliver(block: Block, from: number, to: number): void {
    this.layout ??= this.resolveLayout();
    const layout = this.layout;
    if (this.layoutError !== null || this.latError !== null) return;
    const column = (field: TelemetryChannel) => block.values[this.columnOfField.get(field)!]!;
    if (layout.positions === 'latlon') {
      this.checkRange(block, column('xM'), from, to, -90, 90, 'xM');
      if (this.lonError === null) this.checkRange(block, column('yM'), from, to, -180, 180, 'yM');
      if (this.latError !== null || this.lonError !== null) return;
    }
    const decided = this.options.decided;
    for (const field of layout.channels) {
      if (field === 'timeS' || layout.pending.includes(field)) continue;
      if (layout.positions === 'latlon' && (field === 'xM' || field === 'yM')) continue;
      const binding = this.bindings[this.columnOfField.get(field)!]!;
      const factor = field === 'xM' || field === 'yM' ? 1 : (binding.scale ?? decided?.factors[field] ?? 1);
      applyFactor(column(field), field, factor, from, to);
    }
    if (this.plane) projectInPlace(column('xM'), column('yM'), this.plane, from, to);
    const firstRow = block.firstRow + from;
    if (this.options.skipRows >= firstRow + (to - from)) return;
    const skip = Math.max(0, this.options.skipRows - firstRow);
    const view = (field: TelemetryChannel) => (this.columnOfField.has(field) && layout.channels.includes(field) ? column(field).subarray(from + skip, to) : null);
    this.options.sink({ firstRow: firstRow + skip, rows: to - from - skip, ...channelArrays(view) }, layout);
  }

  private checkRange(block: Block, values: Float64Array, from: number, to: number, min: number, max: number, field: 'xM' | 'yM'): void {
    for (let r = from; r < to; r++) {
      const v = values[r]!;
      if (v < min || v > max) {
        const header = this.layout!.headers[field]!;
        const message = `${this.options.source}: line ${block.lines[r]}, column ${header}: ${v} is not a latitude/longitude in degrees`;
        if (field === 'xM') this.latError = message;
        else this.lonError = message;
        return;
      }
    }
  }

  /** The end of the file: the checks that need every row, in the documented order; then the last rows go out. */
  finish(): PipelineResult {
    const source = this.options.source;
    if (this.headers.length === 0) throw new InputError(`${source}: empty file (no header)`);
    if (this.rows === 0) throw new InputError(`${source}: header only, no data rows (header: ${listed(this.headers)})`);
    if (this.timeIndex < 0) throw new InputError(`${source}: no time column (found: ${listed(this.headers) || 'nothing'}); name it time_s or map it with --telemetry-columns time_s=NAME`);
    if (this.rows < 2) throw new InputError(`${source}: only one data row; a lap needs many`);
    if (this.timeError !== null) throw new InputError(this.timeError);
    const timeBinding = this.bindings[this.timeIndex]!;
    if (!(this.previousTimeS > this.firstTimeS)) throw new InputError(`${source}: column ${timeBinding.header}: time does not advance`);
    this.finishing = true;
    this.closeBlock();
    const scanning = this.options.mode === 'scan';
    // Gaps still open run to the end of the file: held at the last value, or the whole column is empty.
    for (let b = 0; b < this.bindings.length; b++) {
      if (this.gapStart[b]! < 0) continue;
      if (!this.seen[b]) this.dropped[b] = true;
      else if (scanning) {
        if (this.rows - this.gapStart[b]! >= LONG_GAP_ROWS) this.longGaps[b]!.push({ start: this.gapStart[b]!, value: NaN, timeS: NaN });
      } else this.fillHeld(b, this.gapStart[b]!, this.rows, null, NaN, NaN);
      this.gapStart[b] = -1;
    }
    if (!scanning) this.release();
    this.layout ??= this.resolveLayout();
    if (this.layoutError !== null) throw new InputError(this.layoutError);
    if (this.latError !== null) throw new InputError(this.latError);
    if (this.lonError !== null) throw new InputError(this.lonError);
    const columnNotes: PipelineResult['columnNotes'] = [];
    for (const quantity of NOTE_ORDER) {
      const b = this.bindings.findIndex((binding) => binding.quantity === quantity);
      if (b < 0) continue;
      columnNotes.push({ field: FIELD_OF[quantity], quantity, header: this.bindings[b]!.header, empty: this.dropped[b]!, filled: this.nan[b]! });
    }
    return {
      rows: this.rows,
      layout: this.layout,
      startTimeS: this.firstTimeS,
      endTimeS: this.previousTimeS,
      scan: { empty: [...this.dropped], longGaps: this.longGaps },
      columnNotes,
      ignored: this.ignored,
      decimalComma: this.options.decimalComma,
    };
  }
}

/** The notes of a read, in the order the session reader has always given them. */
export function composeNotes(result: PipelineResult, decided: DecidedUnits | null): string[] {
  const notes: string[] = [];
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
