// The time column of a telemetry read, row by row: scaled to seconds in place and checked to be present and never
// running backwards; the first problem is kept, to be reported once the documented checks before it have run.

/** Time order of the rows read so far. */
export class TimeOrder {
  /** The first row whose time is empty or earlier than the one before it, as a one-line message. */
  error: string | null = null;
  firstTimeS = NaN;
  previousTimeS = NaN;

  /**
   * Row `r` of the time column `values`, in the file's unit until `scale` takes it to seconds; `source`, `line` and
   * `header` name it, and the message is only built when the row is wrong (this runs once per sample).
   */
  check(
    values: Float64Array,
    r: number,
    scale: number,
    source: string,
    line: number,
    header: string,
    firstRow: boolean,
  ): void {
    const timeS = values[r]! * scale;
    values[r] = timeS;
    if (Number.isNaN(timeS)) this.error = `${source}: line ${line}, column ${header}: empty time`;
    else if (timeS < this.previousTimeS) {
      this.error = `${source}: line ${line}, column ${header}: time runs backwards (${timeS} after ${this.previousTimeS})`;
    }
    if (firstRow) this.firstTimeS = timeS;
    this.previousTimeS = timeS;
  }
}
