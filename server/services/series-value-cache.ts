// Results worked from a long series (a worksite's predicted tide or current over a hindcast), kept
// by the series' values rather than by the array object. An engine thread receives a new view of
// the same shared series with every task (a message makes new typed-array objects over the same
// memory), so a cache keyed by the array object alone misses on every task and the work is done
// again each time. A hit needs every value equal, checked element by element (about a millisecond
// for 30 years hourly): equal inputs, same result, never a stale one. Bounded by the bytes held.
import { LRUCache } from 'lru-cache';

interface Entry<V> {
  arrays: Float64Array[];
  value: V;
}

/** Equal lengths and equal values, NaN equal to NaN. */
export function sameValues(a: Float64Array, b: Float64Array): boolean {
  if (a === b) return true;
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) {
    const x = a[i];
    const y = b[i];
    if (x !== y && (x === x || y === y)) return false;
  }
  return true;
}

export class SeriesValueCache<V> {
  private readonly entries: LRUCache<string, Entry<V>>;

  /**
   * @param maxBytes bound on the bytes held: each value's own arrays, and the input arrays it keeps
   *   for the check (counted with every entry that keeps them, so the bound is never exceeded)
   * @param sizeOf bytes a value's own arrays hold
   */
  constructor(maxBytes: number, sizeOf: (value: V) => number) {
    this.entries = new LRUCache<string, Entry<V>>({
      maxSize: maxBytes,
      sizeCalculation: (e) => Math.max(1, Math.ceil(sizeOf(e.value) + e.arrays.reduce((sum, a) => sum + a.byteLength, 0))),
    });
  }

  private static slot(key: string, arrays: Float64Array[]): string {
    return `${key}|${arrays.map((a) => `${a.length}:${a[0]}:${a[a.length - 1]}`).join('|')}`;
  }

  /** The value kept for `key` worked from arrays with exactly these values, if any. */
  get(key: string, arrays: Float64Array[]): V | undefined {
    const e = this.entries.get(SeriesValueCache.slot(key, arrays));
    if (!e || e.arrays.length !== arrays.length) return undefined;
    for (let k = 0; k < arrays.length; k++) if (!sameValues(e.arrays[k], arrays[k])) return undefined;
    return e.value;
  }

  set(key: string, arrays: Float64Array[], value: V): void {
    this.entries.set(SeriesValueCache.slot(key, arrays), { arrays, value });
  }

  clear(): void {
    this.entries.clear();
  }
}
