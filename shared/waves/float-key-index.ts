/**
 * A small open-addressing hash index from exact float64 keys to dense ids 0, 1, 2, ..., for caching
 * per-period quantities in long series (periods repeat: a 30-year hourly series rounded to 0.1 s
 * has a few hundred distinct values). Keys are compared exactly (===), so a cached quantity is
 * bit-for-bit what a fresh computation would give. Faster than a `Map` with number keys and
 * allocation-free once grown.
 */
export class FloatKeyIndex {
  private keys: Float64Array;
  private slots: Int32Array;
  private mask: number;
  private count = 0;
  private readonly scratch = new Float64Array(1);
  private readonly scratchBits = new Uint32Array(this.scratch.buffer);

  /** @param initialCapacity - expected number of distinct keys (grows as needed). */
  constructor(initialCapacity = 256) {
    let size = 16;
    while (size < initialCapacity * 2) size *= 2;
    this.keys = new Float64Array(size);
    this.slots = new Int32Array(size).fill(-1);
    this.mask = size - 1;
  }

  /** Number of distinct keys stored; ids run from 0 to size - 1. */
  get size(): number {
    return this.count;
  }

  private hash(key: number): number {
    this.scratch[0] = key;
    const h = Math.imul(this.scratchBits[0] ^ Math.imul(this.scratchBits[1], 0x85ebca6b), 0x9e3779b1);
    return (h ^ (h >>> 15)) & this.mask;
  }

  /**
   * The id of `key`, or -1 if absent. NaN is never found.
   * @param key - any number except NaN (+0 and -0 are the same key).
   */
  find(key: number): number {
    let i = this.hash(key === 0 ? 0 : key);
    for (;;) {
      const id = this.slots[i];
      if (id < 0) return -1;
      if (this.keys[i] === key) return id;
      i = (i + 1) & this.mask;
    }
  }

  /**
   * Adds `key` (which must be absent) and returns its new id (= the previous size).
   * @throws RangeError for NaN.
   */
  add(key: number): number {
    if (Number.isNaN(key)) throw new RangeError('NaN cannot be a key');
    if ((this.count + 1) * 2 > this.slots.length) this.grow();
    const id = this.count++;
    this.place(key === 0 ? 0 : key, id);
    return id;
  }

  private place(key: number, id: number): void {
    let i = this.hash(key);
    while (this.slots[i] >= 0) i = (i + 1) & this.mask;
    this.keys[i] = key;
    this.slots[i] = id;
  }

  /**
   * The id of every value of `values` into `ids`, adding the new ones (-1 for NaN and, with
   * `positiveFinite`, for any value not in (0, Infinity)); returns the distinct values by id. On
   * an empty index.
   */
  assignIds(values: Float64Array, ids: Int32Array, positiveFinite: boolean): Float64Array {
    if (this.count > 0) throw new RangeError('assignIds works on an empty index');
    let keys = new Float64Array(1024);
    for (let n = 0; n < values.length; n++) {
      const v = values[n];
      if (v !== v || (positiveFinite && !(v > 0 && v < Infinity))) {
        ids[n] = -1;
        continue;
      }
      // The same as the record before (which then has its id): compared with the array, not with
      // a number kept from the last turn, which the optimiser boxed on every turn (8 MB of
      // garbage a 30-year series, measured).
      if (n > 0 && v === values[n - 1]) {
        ids[n] = ids[n - 1];
        continue;
      }
      let id = this.find(v);
      if (id < 0) {
        id = this.add(v);
        if (id >= keys.length) {
          const grown = new Float64Array(keys.length * 2);
          grown.set(keys);
          keys = grown;
        }
        keys[id] = v;
      }
      ids[n] = id;
    }
    return keys.subarray(0, this.count);
  }

  private grow(): void {
    const oldKeys = this.keys;
    const oldSlots = this.slots;
    const size = oldSlots.length * 2;
    this.keys = new Float64Array(size);
    this.slots = new Int32Array(size).fill(-1);
    this.mask = size - 1;
    for (let i = 0; i < oldSlots.length; i++) {
      if (oldSlots[i] >= 0) this.place(oldKeys[i], oldSlots[i]);
    }
  }
}
