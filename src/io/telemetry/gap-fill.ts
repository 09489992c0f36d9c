// Empty cells of a telemetry read filled by linear interpolation in time between the values either side (held
// at the first or last value at the ends), block by block as the rows arrive: a gap is filled when its closing
// value is read, so rows are held only while some gap is open. A scan pass notes the long gaps, so that a second
// pass fills them on the spot from the noted closing value without holding rows.

import { CHUNK_ROWS } from './chunk.js';
import type { RowBlock } from './row-block.js';
import { lerp } from '../../numeric/interpolate.js';

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

/** The gaps of every column but time (same index as the column bindings). */
export class GapFiller {
  /** Empty cells seen per column. */
  readonly nan: number[];
  /** Columns left out: empty throughout (known from a scan, or found at the end of the file). */
  readonly dropped: boolean[];
  /** Long gaps noted while scanning. */
  readonly longGaps: KnownGap[][];
  private readonly seen: boolean[];
  private readonly lastValue: number[];
  private readonly lastTimeS: number[];
  /** First row of the open gap of each column, or -1. */
  private readonly gapStart: number[];
  private readonly knownGap: (KnownGap | null)[];
  private readonly gapCursor: number[];

  constructor(
    count: number,
    private readonly timeIndex: number,
    private readonly scan: ColumnScan | null,
    private readonly scanning: boolean,
  ) {
    this.nan = new Array<number>(count).fill(0);
    this.seen = new Array<boolean>(count).fill(false);
    this.lastValue = new Array<number>(count).fill(NaN);
    this.lastTimeS = new Array<number>(count).fill(NaN);
    this.gapStart = new Array<number>(count).fill(-1);
    this.knownGap = new Array<KnownGap | null>(count).fill(null);
    this.gapCursor = new Array<number>(count).fill(0);
    this.dropped = Array.from({ length: count }, (_, b) => scan?.empty[b] === true);
    this.longGaps = Array.from({ length: count }, () => []);
  }

  /** A closed block: its gaps are tracked, and filled in it and in the `held` blocks before it where they close. */
  track(block: RowBlock, held: readonly RowBlock[]): void {
    const timeS = block.values[this.timeIndex]!;
    const scanning = this.scanning;
    for (let b = 0; b < this.nan.length; b++) {
      if (b === this.timeIndex || this.dropped[b]) continue;
      const values = block.values[b]!;
      for (let r = 0; r < block.rows; r++) {
        const value = values[r]!;
        const row = block.firstRow + r;
        if (Number.isNaN(value)) {
          this.nan[b]!++;
          let known = this.knownGap[b]!;
          if (known === null && this.gapStart[b]! < 0) {
            const candidates = this.scan?.longGaps[b];
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
            if (row - this.gapStart[b]! >= LONG_GAP_ROWS)
              this.longGaps[b]!.push({ start: this.gapStart[b]!, value, timeS: timeS[r]! });
          } else this.fillHeld(b, this.gapStart[b]!, row, held, block, value, timeS[r]!);
          this.gapStart[b] = -1;
        }
        this.seen[b] = true;
        this.lastValue[b] = value;
        this.lastTimeS[b] = timeS[r]!;
      }
    }
  }

  /** The first row of the oldest gap still open, or `upTo` when none opens before it. */
  oldestOpen(upTo: number): number {
    let ready = upTo;
    for (let b = 0; b < this.gapStart.length; b++)
      if (this.gapStart[b]! >= 0 && this.gapStart[b]! < ready) ready = this.gapStart[b]!;
    return ready;
  }

  /** The end of the file after `rows` rows: open gaps are held at the last value, or the whole column is empty. */
  closeAtEnd(rows: number, held: readonly RowBlock[]): void {
    for (let b = 0; b < this.gapStart.length; b++) {
      if (this.gapStart[b]! < 0) continue;
      if (!this.seen[b]) this.dropped[b] = true;
      else if (this.scanning) {
        if (rows - this.gapStart[b]! >= LONG_GAP_ROWS)
          this.longGaps[b]!.push({ start: this.gapStart[b]!, value: NaN, timeS: NaN });
      } else this.fillHeld(b, this.gapStart[b]!, rows, held, null, NaN, NaN);
      this.gapStart[b] = -1;
    }
  }

  /** The value fillGaps (session.ts) gives a cell of a gap: held at the ends, linear in time inside. */
  private fillValue(b: number, closeValue: number, closeTimeS: number, t: number): number {
    if (!this.seen[b]) return closeValue;
    if (Number.isNaN(closeTimeS)) return this.lastValue[b]!;
    const previous = this.lastValue[b]!;
    const span = closeTimeS - this.lastTimeS[b]!;
    const w = span > 0 ? (t - this.lastTimeS[b]!) / span : 0;
    return lerp(previous, closeValue, w);
  }

  /** Fills rows [from, to) of column b, in the held blocks and the current one, towards the closing value. */
  private fillHeld(
    b: number,
    from: number,
    to: number,
    held: readonly RowBlock[],
    current: RowBlock | null,
    closeValue: number,
    closeTimeS: number,
  ): void {
    const fillInto = (block: RowBlock) => {
      const start = Math.max(from, block.firstRow);
      const end = Math.min(to, block.firstRow + block.rows);
      const values = block.values[b]!;
      const timeS = block.values[this.timeIndex]!;
      for (let row = start; row < end; row++)
        values[row - block.firstRow] = this.fillValue(b, closeValue, closeTimeS, timeS[row - block.firstRow]!);
    };
    for (const block of held) fillInto(block);
    if (current) fillInto(current);
  }
}
