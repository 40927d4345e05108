// Values kept by the contents of long series rather than by the array objects. An engine thread
// receives new typed-array objects over the same shared memory with every task (a message makes
// new views), so every cache keyed by the array object (a worksite's predicted tide, the calendar's
// groups, the record steps) missed on every task and the work was done again each time. A hit needs
// every value equal, checked element by element (about a millisecond per 30-year column): equal
// inputs, same result, never a stale one. Bounded by the bytes held.
import { LRUCache } from 'lru-cache';

/** The typed arrays a series is made of. */
export type NumericArray = Float64Array | Float32Array | Int32Array | Uint8Array;

interface Entry<V> {
  arrays: NumericArray[];
  value: V;
}

/** Equal lengths and equal values, NaN equal to NaN. */
export function sameValues(a: NumericArray, b: NumericArray): boolean {
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

  private static slot(key: string, arrays: NumericArray[]): string {
    return `${key}|${arrays.map((a) => `${a.length}:${a[0]}:${a[a.length - 1]}`).join('|')}`;
  }

  /** The value kept for `key` worked from arrays with exactly these values, if any. */
  get(key: string, arrays: NumericArray[]): V | undefined {
    const e = this.entries.get(SeriesValueCache.slot(key, arrays));
    if (!e || e.arrays.length !== arrays.length) return undefined;
    for (let k = 0; k < arrays.length; k++) if (!sameValues(e.arrays[k], arrays[k])) return undefined;
    return e.value;
  }

  set(key: string, arrays: NumericArray[], value: V): void {
    this.entries.set(SeriesValueCache.slot(key, arrays), { arrays, value });
  }
}

/** The typed arrays of a series and their field paths (nested objects such as `extra` included). */
function seriesArrays(value: object, prefix: string, names: string[], arrays: NumericArray[], depth: number): void {
  for (const [k, v] of Object.entries(value)) {
    if (v instanceof Float64Array || v instanceof Float32Array || v instanceof Int32Array || v instanceof Uint8Array) {
      names.push(prefix + k);
      arrays.push(v);
    } else if (v && typeof v === 'object' && !ArrayBuffer.isView(v) && depth < 3)
      seriesArrays(v as object, `${prefix}${k}.`, names, arrays, depth + 1);
    else names.push(`${prefix}${k}=${JSON.stringify(v) ?? ''}`);
  }
}

/**
 * A series (an object with a `timeMs` Float64Array) equal in every field to one seen before is
 * replaced by that earlier object, so that every cache keyed by its arrays finds it again; any other
 * value comes back as it is. For an engine thread's task inputs (engine-worker.ts).
 */
export class SeriesCanon {
  private readonly seen: SeriesValueCache<object>;

  constructor(maxBytes: number) {
    this.seen = new SeriesValueCache<object>(maxBytes, () => 0);
  }

  canonical<T>(value: T): T {
    if (!value || typeof value !== 'object' || !((value as { timeMs?: unknown }).timeMs instanceof Float64Array)) return value;
    const names: string[] = [];
    const arrays: NumericArray[] = [];
    seriesArrays(value, '', names, arrays, 0);
    const key = names.join(',');
    const earlier = this.seen.get(key, arrays);
    if (earlier) return earlier as T;
    this.seen.set(key, arrays, value);
    return value;
  }
}
