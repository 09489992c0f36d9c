// The fast path of the telemetry CSV reader: each data line's bytes are scanned straight into numbers (sign,
// digits, decimal mark, exponent) without a string per cell. The value is the IEEE-754 double nearest the
// decimal, as Number() gives it: a mantissa of at most 15 digits times or over an exact power of ten up to 1e22
// is one correctly rounded operation (Clinger 1990, "How to read floating point numbers accurately", the fast
// path); any other number is handed to Number(). A line the scanner cannot read this way (text, white space,
// missing-value markers, a stray character) goes to the pipeline as its cells split at the separator, which is
// what csv-parse makes of a line without quotes, so its checks and messages are the general path's. A quote, a
// line break of another kind than the first one's, or a lone carriage return is a dialect for csv-parse itself:
// the scan stops and tells the caller how many records it has handed over.

import type { CsvDialect } from './csv.js';

/** The row pipeline as the scanner feeds it (RowPipeline). */
export interface ScanTarget {
  /** True once the header has been read. */
  readonly hasHeader: boolean;
  /** The file columns whose numbers the rows need (known once the header is read). */
  boundColumns(): number[];
  record(cells: string[]): void;
  recordNumbers(values: Float64Array, count: number): void;
}

const NL = 0x0a;
const CR = 0x0d;
const QUOTE = 0x22;
const PLUS = 0x2b;
const COMMA = 0x2c;
const MINUS = 0x2d;
const DOT = 0x2e;
const ZERO = 0x30;
const NINE = 0x39;
const LOWER_E = 0x65;
const UPPER_E = 0x45;
const BLANK: string[] = [''];
// Powers of ten that are exact doubles.
const EXACT_POWERS = Array.from({ length: 23 }, (_, k) => Number(`1e${k}`));

export class NumericLineScanner {
  private readonly delimiter: number;
  private readonly decimalComma: boolean;
  private linesToSkip: number;
  /** 'lf' or 'crlf' once the first line break is seen; csv-parse splits records at that kind only. */
  private lineBreak: 'lf' | 'crlf' | null = null;
  private atStart = true;
  private wanted = new Uint8Array(0);
  private lastWanted = -1;
  private values = new Float64Array(0);
  /** Where the field that field() last read ends: the delimiter after it or the end of the line. */
  private fieldEnd = 0;
  /** Records handed to the target: the general parser skips these many when it takes over. */
  records = 0;

  constructor(
    dialect: CsvDialect,
    private readonly target: ScanTarget,
  ) {
    this.delimiter = dialect.delimiter.charCodeAt(0);
    this.decimalComma = dialect.decimalComma;
    this.linesToSkip = dialect.headerLine - 1;
  }

  /**
   * Scans the complete lines of bytes[start, end) (and the last, unterminated one when `final`); returns where the
   * unscanned rest begins, or -1 when the bytes need the general parser (from the start of the file).
   */
  scan(bytes: Buffer, start: number, end: number, final: boolean): number {
    if (this.atStart) {
      if (end - start < 3 && !final) return start;
      if (bytes[start] === 0xef && bytes[start + 1] === 0xbb && bytes[start + 2] === 0xbf) start += 3;
      // UTF-16 LE text (its byte order mark first) is csv-parse's to decode.
      else if (bytes[start] === 0xff && bytes[start + 1] === 0xfe) return -1;
      this.atStart = false;
    }
    if (bytes.subarray(start, end).indexOf(QUOTE) >= 0) return -1;
    if (this.lineBreak === null) {
      // csv-parse takes the kind of line break from the first one in the file.
      const cr = bytes.subarray(start, end).indexOf(CR);
      const nl = bytes.subarray(start, end).indexOf(NL);
      if (cr >= 0 && (nl < 0 || cr < nl)) {
        if (cr + 1 === end - start && !final) return start;
        if (nl !== cr + 1) return -1;
        this.lineBreak = 'crlf';
      } else if (nl >= 0) this.lineBreak = 'lf';
    }
    let lineStart = start;
    while (lineStart < end) {
      let lineEnd = bytes.indexOf(NL, lineStart);
      if (lineEnd < 0 || lineEnd >= end) {
        if (!final) return lineStart;
        lineEnd = end;
      }
      let contentEnd = lineEnd;
      if (this.lineBreak === 'crlf' && lineEnd < end) {
        // A bare line feed in a CRLF file is data to csv-parse, not the end of a record.
        if (lineEnd === lineStart || bytes[lineEnd - 1] !== CR) return -1;
        contentEnd--;
      }
      this.line(bytes, lineStart, contentEnd);
      lineStart = lineEnd + 1;
    }
    return end;
  }

  private line(bytes: Buffer, start: number, end: number): void {
    if (this.linesToSkip > 0) {
      this.linesToSkip--;
      return;
    }
    this.records++;
    if (start === end) {
      this.target.record(BLANK);
      return;
    }
    if (!this.target.hasHeader) {
      this.general(bytes, start, end);
      if (this.target.hasHeader) this.learnColumns();
      return;
    }
    if (!this.numbers(bytes, start, end)) this.general(bytes, start, end);
  }

  private learnColumns(): void {
    const columns = this.target.boundColumns();
    this.lastWanted = columns.length > 0 ? Math.max(...columns) : -1;
    this.wanted = new Uint8Array(this.lastWanted + 1);
    for (const column of columns) this.wanted[column] = 1;
    this.values = new Float64Array(this.lastWanted + 1);
  }

  /** The line as csv-parse makes it without quotes: its cells split at the separator. */
  private general(bytes: Buffer, start: number, end: number): void {
    this.target.record(bytes.toString('utf8', start, end).split(String.fromCharCode(this.delimiter)));
  }

  /** Scans the wanted fields of a line into `values`; false when some field needs the general path. */
  private numbers(bytes: Buffer, start: number, end: number): boolean {
    const delimiter = this.delimiter;
    let column = 0;
    let p = start;
    for (;;) {
      if (this.wanted[column] === 1) {
        if (!this.field(bytes, p, end, column)) return false;
        p = this.fieldEnd;
      } else {
        const next = bytes.indexOf(delimiter, p);
        p = next < 0 || next >= end ? end : next;
      }
      column++;
      if (p >= end || column > this.lastWanted) break;
      p++; // past the delimiter; a line that ends in one has one more, empty, cell
    }
    this.target.recordNumbers(this.values, column);
    return true;
  }

  /**
   * Reads the field at `p` into values[column] (NaN when empty) and sets fieldEnd to the delimiter or the line's
   * end; false when the field is not a plain number.
   */
  private field(bytes: Buffer, p: number, end: number, column: number): boolean {
    const start = p;
    const delimiter = this.delimiter;
    if (p === end || bytes[p] === delimiter) {
      this.values[column] = NaN;
      this.fieldEnd = p;
      return true;
    }
    let negative = false;
    let c = bytes[p]!;
    if (c === MINUS || c === PLUS) {
      negative = c === MINUS;
      p++;
    }
    let mantissa = 0;
    let digits = 0;
    let significant = 0;
    let fraction = 0;
    let seenMark = false;
    for (; p < end; p++) {
      c = bytes[p]!;
      if (c >= ZERO && c <= NINE) {
        digits++;
        if (significant > 0 || c !== ZERO) significant++;
        mantissa = mantissa * 10 + (c - ZERO);
        if (seenMark) fraction++;
      } else if (!seenMark && (c === DOT || (c === COMMA && this.decimalComma))) {
        seenMark = true;
      } else break;
    }
    if (digits === 0) return false;
    let exponent = 0;
    if (p < end && (c === LOWER_E || c === UPPER_E)) {
      p++;
      let exponentNegative = false;
      if (p < end && (bytes[p] === MINUS || bytes[p] === PLUS)) {
        exponentNegative = bytes[p] === MINUS;
        p++;
      }
      let exponentDigits = 0;
      for (; p < end; p++) {
        c = bytes[p]!;
        if (c < ZERO || c > NINE) break;
        exponentDigits++;
        if (exponent < 1e6) exponent = exponent * 10 + (c - ZERO);
      }
      if (exponentDigits === 0) return false;
      if (exponentNegative) exponent = -exponent;
    }
    if (p < end && bytes[p] !== delimiter) return false;
    this.fieldEnd = p;
    const power = exponent - fraction;
    if (significant <= 15 && power >= -22 && power <= 22) {
      const value = power < 0 ? mantissa / EXACT_POWERS[-power]! : mantissa * EXACT_POWERS[power]!;
      this.values[column] = negative ? -value : value;
      return true;
    }
    // Beyond the exact fast path: Number() on the field's text (a decimal comma read as the point, as cellValue does).
    const value = Number(bytes.toString('latin1', start, p).replace(',', '.'));
    // Out of range (1e400): the general path words the error.
    if (!Number.isFinite(value)) return false;
    this.values[column] = value;
    return true;
  }
}
