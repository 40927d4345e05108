import { describe, expect, it } from 'vitest';
import { FloatKeyIndex } from '../../shared/waves/float-key-index';
import { mulberry32 } from '../../bench/lib/random';

/**
 * The index's ids against a reference written here with a Map (ids in order of first sight,
 * compared as ===, so +0 and -0 are one key), on series with repeats, runs, NaN, zeros of both
 * signs, negatives and infinities. Enough distinct values to make the index grow.
 */
function reference(values: Float64Array, positiveFinite: boolean): { ids: number[]; keys: number[] } {
  const seen = new Map<number, number>();
  const keys: number[] = [];
  const ids = Array.from(values, (v) => {
    if (Number.isNaN(v) || (positiveFinite && !(v > 0 && v < Infinity))) return -1;
    const key = v === 0 ? 0 : v;
    let id = seen.get(key);
    if (id === undefined) {
      id = keys.length;
      seen.set(key, id);
      keys.push(v);
    }
    return id;
  });
  return { ids, keys };
}

describe('FloatKeyIndex.assignIds', () => {
  it('gives every value the id of its first sight (NaN and, when asked, values outside (0, inf) get -1)', () => {
    const rnd = mulberry32(20261205);
    const n = 20_000;
    const values = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const u = rnd();
      values[i] =
        i > 0 && u < 0.3
          ? values[i - 1] // runs of one value
          : u < 0.33
            ? NaN
            : u < 0.35
              ? i % 2 === 0
                ? 0
                : -0
              : u < 0.37
                ? -rnd() * 5
                : u < 0.38
                  ? Infinity
                  : Math.round(rnd() * 30_000) / 10; // about 3,000 distinct periods
    }
    for (const positiveFinite of [true, false]) {
      const ids = new Int32Array(n);
      const keys = new FloatKeyIndex(16).assignIds(values, ids, positiveFinite);
      const want = reference(values, positiveFinite);
      expect(Array.from(ids)).toEqual(want.ids);
      expect(Array.from(keys)).toEqual(want.keys);
    }
  });

  it('refuses an index that already holds keys', () => {
    const index = new FloatKeyIndex(16);
    index.add(1.5);
    expect(() => index.assignIds(Float64Array.of(1), new Int32Array(1), true)).toThrow(/empty index/);
  });
});
