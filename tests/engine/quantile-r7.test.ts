import { quantile } from 'd3-array';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { quantileR7, quantileR7Sorted } from '../../shared/engine';
import { quantileR7Upper } from '../../shared/engine/quantile-r7';

describe('quantileR7: Hyndman & Fan type 7', () => {
  it('hand cases: (n - 1) p interpolation', () => {
    // 1, 2, 3, 4 at p = 0.9: h = 2.7 -> 3 + 0.7 * (4 - 3) = 3.7.
    expect(quantileR7(Float64Array.of(4, 1, 3, 2), 0.9)).toBeCloseTo(3.7, 12);
    expect(quantileR7([10], 0.9)).toBe(10);
    expect(quantileR7([1, 2], 0.5)).toBe(1.5);
    expect(quantileR7([5, 1, 3], 0)).toBe(1);
    expect(quantileR7([5, 1, 3], 1)).toBe(5);
    expect(Number.isNaN(quantileR7([], 0.5))).toBe(true);
    expect(() => quantileR7([1], 1.1)).toThrow(RangeError);
  });

  it('does not change its input', () => {
    const xs = Float64Array.of(3, 1, 2);
    quantileR7(xs, 0.5);
    expect(Array.from(xs)).toEqual([3, 1, 2]);
  });

  it('matches d3-array quantile (R-7, reference library) on random samples with ties, NaN ignored', () => {
    fc.assert(
      fc.property(
        fc.array(fc.oneof(fc.integer({ min: -50, max: 50 }), fc.double({ min: -1e6, max: 1e6, noNaN: true }), fc.constant(NaN)), {
          minLength: 1,
          maxLength: 3000,
        }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        (xs, p) => {
          const ref = quantile(xs, p);
          const got = quantileR7(Float64Array.from(xs), p);
          if (ref === undefined) expect(Number.isNaN(got)).toBe(true);
          else expect(got).toBeCloseTo(ref, 6);
        },
      ),
      { numRuns: 300 },
    );
  });

  it('quantileR7Sorted matches d3-array quantile on sorted samples', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -1e3, max: 1e3, noNaN: true }), { minLength: 1, maxLength: 200 }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        (xs, p) => {
          const sorted = [...xs].sort((a, b) => a - b);
          expect(quantileR7Sorted(sorted, p)).toBeCloseTo(quantile(sorted, p) as number, 9);
        },
      ),
    );
  });

  it('quantileR7Upper (sampled threshold, exact fallback) matches d3-array quantile and leaves the slice unchanged', () => {
    const patterns = fc.oneof(
      fc.array(fc.integer({ min: 0, max: 40 }), { minLength: 1, maxLength: 4000 }),
      fc.integer({ min: 1, max: 12000 }).map((n) => Array.from({ length: n }, (_, i) => i)), // ascending
      fc.integer({ min: 1, max: 12000 }).map((n) => Array.from({ length: n }, (_, i) => n - i)), // descending
      fc.integer({ min: 1, max: 12000 }).map((n) => new Array<number>(n).fill(7)), // all equal
      fc.integer({ min: 1, max: 12000 }).map((n) => Array.from({ length: n }, (_, i) => (i % 97 === 0 ? 1000 + i : i % 50))), // sawtooth with spikes
      fc.integer({ min: 300, max: 12000 }).map((n) => Array.from({ length: n }, (_, i) => (i % 64 === 32 ? 0 : 500 + i))),
      // The strided sample (positions floor((j + 0.5) n / 64)) sees only high values while nearly
      // all values are low: the threshold is too high and the exact fallback must take over.
      fc.integer({ min: 1000, max: 12000 }).map((n) => {
        const xs = new Array<number>(n).fill(0);
        for (let j = 0; j < 64; j++) xs[Math.floor(((j + 0.5) * n) / 64)] = 1000;
        return xs;
      }),
      // The same for the 256-value sample of slices from 4,096 values on.
      fc.integer({ min: 4096, max: 12000 }).map((n) => {
        const xs = new Array<number>(n).fill(0);
        for (let j = 0; j < 256; j++) xs[Math.floor(((j + 0.5) * n) / 256)] = 1000;
        return xs;
      }),
    );
    fc.assert(
      fc.property(patterns, fc.constantFrom(0.5, 0.75, 0.9, 0.95, 0.99, 1), fc.nat(20), (xs, p, pad) => {
        const a = new Float64Array(xs.length + 2 * pad).fill(-1);
        a.set(xs, pad);
        const before = Array.from(a);
        const got = quantileR7Upper(a, pad, pad + xs.length, p, new Float64Array(a.length).fill(12345)); // stale scratch must not leak
        expect(got).toBeCloseTo(quantile(xs, p) as number, 9);
        expect(Array.from(a)).toEqual(before);
      }),
      { numRuns: 400 },
    );
  });
});
