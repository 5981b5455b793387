/** A typed array that grows as values are pushed (doubling), for long lists of numbers built in one pass. */
export class TypedColumn<T extends Int32Array | Float64Array | Uint8Array> {
  length = 0;

  constructor(
    public values: T,
    private readonly make: (size: number) => T,
  ) {}

  /** Appends a value; returns its index. */
  push(value: number): number {
    if (this.length === this.values.length) this.reserve(this.length + 1);
    this.values[this.length] = value;
    return this.length++;
  }

  /** Makes room for `size` values in `values` (doubling), for a caller that writes them itself and sets `length`. */
  reserve(size: number): void {
    if (size <= this.values.length) return;
    const grown = this.make(Math.max(16, this.values.length * 2, size));
    grown.set(this.values.subarray(0, this.length));
    this.values = grown;
  }

  /** The values pushed, without copying: for a column that is done with. */
  done(): T {
    return this.values.subarray(0, this.length) as T;
  }
}

export const intColumn = (capacity = 256) => new TypedColumn(new Int32Array(capacity), (size) => new Int32Array(size));
export const floatColumn = (capacity = 256) =>
  new TypedColumn(new Float64Array(capacity), (size) => new Float64Array(size));

/**
 * Hands out typed arrays as views into large shared blocks: many short-lived arrays of a walk
 * then cost no allocation of their own (the blocks go when the walk is done with them).
 */
export class TypedArena<T extends Int32Array | Float64Array> {
  private block: T;
  private used = 0;

  constructor(
    private readonly make: (size: number) => T,
    private readonly blockSize = 1 << 18,
  ) {
    this.block = make(blockSize);
  }

  /** A zeroed array of `size` values. */
  take(size: number): T {
    if (this.used + size > this.block.length) {
      this.block = this.make(Math.max(this.blockSize, size));
      this.used = 0;
    }
    const taken = this.block.subarray(this.used, this.used + size) as T;
    this.used += size;
    return taken;
  }

  /** The values of a column, in an array of their own. */
  copyOf(column: TypedColumn<T>): T {
    const copy = this.take(column.length);
    copy.set(column.values.subarray(0, column.length));
    return copy;
  }
}
