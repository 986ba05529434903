/**
 * A small LRU bounded both in entries and in bytes (as the caller's `sizeOf` counts them). A value larger than
 * a quarter of the byte bound is not kept (and drops the key's older value). Used by the per-sheet results cache
 * and the evaluate answer cache: both are optimisations only, so losing an entry only costs recomputing it.
 */
export class ByteBoundedLru<K, V> {
  private entries = new Map<K, { value: V; bytes: number }>();
  private totalBytes = 0;

  constructor(
    private readonly capacity: number,
    private readonly maxBytes: number,
    private readonly sizeOf: (value: V) => number,
  ) {}

  /** The value, marked as the most recently used. */
  get(key: K): V | undefined {
    const slot = this.entries.get(key);
    if (slot) {
      this.entries.delete(key);
      this.entries.set(key, slot);
    }
    return slot?.value;
  }

  /** The value without touching its place in the order. */
  peek(key: K): V | undefined {
    return this.entries.get(key)?.value;
  }

  set(key: K, value: V): void {
    this.delete(key);
    const bytes = this.sizeOf(value);
    if (bytes > this.maxBytes / 4) return;
    this.entries.set(key, { value, bytes });
    this.totalBytes += bytes;
    while (this.entries.size > this.capacity || this.totalBytes > this.maxBytes) {
      const oldest = this.entries.keys().next().value;
      if (oldest === undefined) break;
      this.delete(oldest);
    }
  }

  delete(key: K): void {
    const slot = this.entries.get(key);
    if (!slot) return;
    this.entries.delete(key);
    this.totalBytes -= slot.bytes;
  }

  get size(): number {
    return this.entries.size;
  }

  /** Bytes held, as sizeOf counts them. */
  get bytes(): number {
    return this.totalBytes;
  }
}
