// In-process memos bounded by the bytes they hold (lru-cache's maxSize with a size per entry),
// not by a count of entries: one 20-year answer weighs as much as a thousand small ones. A value
// still being produced is shared by every caller who asks meanwhile and counted once it is done.
import { LRUCache } from 'lru-cache';

export class ByteBoundedMemo<V extends object> {
  private readonly done: LRUCache<string, V>;
  private readonly pending = new Map<string, Promise<V>>();
  /** Bumped by clear() and delete(): a value produced before is not stored after. */
  private generation = 0;

  constructor(
    readonly maxBytes: number,
    sizeOf: (value: V) => number,
  ) {
    this.done = new LRUCache<string, V>({ maxSize: maxBytes, sizeCalculation: (v) => Math.max(1, Math.ceil(sizeOf(v))) });
  }

  /** The kept value for `key`, else the one being produced, else `produce()` (kept when it succeeds). */
  get(key: string, produce: () => Promise<V>): Promise<V> {
    const hit = this.done.get(key);
    if (hit !== undefined) return Promise.resolve(hit);
    const waiting = this.pending.get(key);
    if (waiting) return waiting;
    const started = this.generation;
    const p = produce().then(
      (value) => {
        if (this.pending.get(key) === p) this.pending.delete(key);
        if (started === this.generation) this.done.set(key, value);
        return value;
      },
      (err: unknown) => {
        if (this.pending.get(key) === p) this.pending.delete(key);
        throw err;
      },
    );
    this.pending.set(key, p);
    return p;
  }

  delete(key: string): void {
    this.generation++;
    this.done.delete(key);
    this.pending.delete(key);
  }

  clear(): void {
    this.generation++;
    this.done.clear();
    this.pending.clear();
  }

  keys(): string[] {
    return [...this.done.keys(), ...this.pending.keys()];
  }

  /** Bytes held by finished values. */
  get bytes(): number {
    return this.done.calculatedSize;
  }
}

/** Bytes of a sea-state series' typed arrays. */
export const seriesBytes = (s: Record<string, unknown>) =>
  Object.values(s).reduce<number>((sum, a) => sum + (ArrayBuffer.isView(a) ? a.byteLength : 0), 0);

/** Approximate bytes of a plain JSON-able value (its UTF-16 JSON text length × 2 is an upper bound; length is close enough). */
export const jsonBytes = (v: unknown) => {
  try {
    return JSON.stringify(v)?.length ?? 1;
  } catch {
    return 1;
  }
};
