/** A typed array that grows as values are pushed (doubling), for long lists of numbers built in one pass. */
export class TypedColumn<T extends Int32Array | Float64Array | Uint8Array> {
  length = 0;

  constructor(
    public values: T,
    private readonly make: (size: number) => T,
  ) {}

  /** Appends a value; returns its index. */
  push(value: number): number {
    if (this.length === this.values.length) {
      const grown = this.make(Math.max(16, this.values.length * 2));
      grown.set(this.values);
      this.values = grown;
    }
    this.values[this.length] = value;
    return this.length++;
  }

  /** The values pushed, in an array of their own. */
  copy(): T {
    return this.values.slice(0, this.length) as T;
  }
}

export const intColumn = (capacity = 256) => new TypedColumn(new Int32Array(capacity), (size) => new Int32Array(size));
export const floatColumn = (capacity = 256) =>
  new TypedColumn(new Float64Array(capacity), (size) => new Float64Array(size));
export const byteColumn = (capacity = 256) => new TypedColumn(new Uint8Array(capacity), (size) => new Uint8Array(size));
