// A Float64Array that grows by doubling, so a streamed log keeps only its numeric channels in memory.

export class GrowableFloat64 {
  private data: Float64Array;
  length = 0;

  constructor(initialCapacity = 4096) {
    this.data = new Float64Array(Math.max(16, initialCapacity));
  }

  push(value: number): void {
    if (this.length === this.data.length) {
      const grown = new Float64Array(this.data.length * 2);
      grown.set(this.data);
      this.data = grown;
    }
    this.data[this.length++] = value;
  }

  /** A trimmed copy holding exactly the pushed values. */
  toArray(): Float64Array {
    return this.data.slice(0, this.length);
  }
}
