// Results worked from a long series kept by the series' values (server/services/series-value-cache.ts):
// an engine thread gets a new view of the same shared series with each task, and the worksite's
// predicted tide over a 30-year hindcast (about 0.6 s) was worked again on every task. No outside
// figures here: the checks are that an equal series finds the kept result and any change misses.
import { describe, expect, it } from 'vitest';
import { SeriesValueCache, sameValues } from '../../server/services/series-value-cache';
import { siteTide } from '../../server/services/site-context';

const HOUR_MS = 3_600_000;
const T0 = Date.UTC(2020, 0, 1);

describe('SeriesValueCache', () => {
  it('finds a value by equal values in another array, NaN equal to NaN; any changed value, length or key misses', () => {
    const cache = new SeriesValueCache<{ tag: string }>(1e6, () => 100);
    const times = Float64Array.from({ length: 500 }, (_, i) => T0 + i * HOUR_MS);
    const level = Float64Array.from({ length: 500 }, (_, i) => (i % 7 === 0 ? NaN : Math.sin(i)));
    const value = { tag: 'kept' };
    cache.set('k', [times, level], value);
    expect(cache.get('k', [times.slice(), level.slice()])).toBe(value);
    expect(cache.get('other', [times.slice(), level.slice()])).toBeUndefined();
    const moved = times.slice();
    moved[250] += 1;
    expect(cache.get('k', [moved, level])).toBeUndefined();
    const filled = level.slice();
    filled[7] = 0; // a missing value now known
    expect(cache.get('k', [times, filled])).toBeUndefined();
    expect(cache.get('k', [times.subarray(0, 499), level.subarray(0, 499)])).toBeUndefined();
    expect(cache.get('k', [times])).toBeUndefined();
  });

  it('drops the least recently used values beyond its byte bound (values and the inputs they keep)', () => {
    // Each entry: 100 bytes of value and 16 bytes of input (two float64), 116 in all.
    const cache = new SeriesValueCache<number>(250, () => 100);
    const a = (x: number) => Float64Array.of(x, x + 1);
    cache.set('k', [a(1)], 1);
    cache.set('k', [a(2)], 2);
    expect(cache.get('k', [a(1)])).toBe(1); // 1 is now the most recent
    cache.set('k', [a(3)], 3); // 348 bytes: the least recent (2) goes
    expect(cache.get('k', [a(2)])).toBeUndefined();
    expect(cache.get('k', [a(1)])).toBe(1);
    expect(cache.get('k', [a(3)])).toBe(3);
    // Inputs count too: with 128 bytes of input per entry (two make 256 > 250) only one fits.
    const inputs = new SeriesValueCache<number>(250, () => 0);
    const long = (x: number) => new Float64Array(16).fill(x);
    inputs.set('k', [long(1)], 1);
    inputs.set('k', [long(2)], 2);
    expect(inputs.get('k', [long(2)])).toBe(2);
    expect(inputs.get('k', [long(1)])).toBeUndefined();
  });

  it('sameValues: equal lengths and values, NaN equal to NaN, -0 equal to 0', () => {
    expect(sameValues(Float64Array.of(1, NaN, -0), Float64Array.of(1, NaN, 0))).toBe(true);
    expect(sameValues(Float64Array.of(1, NaN), Float64Array.of(1, 2))).toBe(false);
    expect(sameValues(Float64Array.of(1), Float64Array.of(1, 1))).toBe(false);
  });
});

describe('siteTide over a new view of the same times', () => {
  it('gives the result already worked (the same object), and a new one for other times or another tide', () => {
    const site = {
      tide: { source: 'constants' as const, constituents: [{ name: 'M2', amplitude: 1.5, phase: 0 }], z0: 2, datum: 'LAT' },
      latitude: null,
      longitude: null,
    };
    const times = Float64Array.from({ length: 24 * 60 }, (_, i) => T0 + i * HOUR_MS);
    const series = (timeMs: Float64Array) => ({ timeMs, extra: {}, waterLevelReference: undefined });
    const first = siteTide(site, series(times))!;
    expect(first.waterLevelM.length).toBe(times.length);
    // A message to an engine thread makes a new array over the same values.
    expect(siteTide(site, series(new Float64Array(times)))).toBe(first);
    const later = Float64Array.from(times, (t) => t + HOUR_MS);
    const shifted = siteTide(site, series(later))!;
    expect(shifted).not.toBe(first);
    // One hour later the level at record i is the first run's level at record i + 1.
    expect(shifted.waterLevelM[10]).toBeCloseTo(first.waterLevelM[11], 4); // node factors taken at each series' own time: 1e-6 m apart
    const otherTide = { ...site, tide: { ...site.tide, z0: 3 } };
    const raised = siteTide(otherTide, series(new Float64Array(times)))!;
    expect(raised).not.toBe(first);
    expect(raised.waterLevelM[5] - first.waterLevelM[5]).toBeCloseTo(1, 9);
  });
});
