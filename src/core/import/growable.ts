/** A Float64Array that grows by doubling, for columns of unknown length. */
export class GrowableFloat64 {
  data: Float64Array;
  length = 0;

  constructor(initialCapacity = 4096) {
    this.data = new Float64Array(initialCapacity);
  }

  push(value: number): void {
    if (this.length === this.data.length) {
      const bigger = new Float64Array(this.data.length * 2);
      bigger.set(this.data);
      this.data = bigger;
    }
    this.data[this.length++] = value;
  }

  /** Removes the last value. */
  pop(): void {
    if (this.length > 0) this.length--;
  }

  /** A copy trimmed to the length. */
  toArray(): Float64Array {
    return this.data.slice(0, this.length);
  }
}
