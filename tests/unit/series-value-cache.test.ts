// Values kept by the contents of long series (server/services/series-value-cache.ts): an engine
// thread gets a new view of the same shared series with each task, and the worksite's predicted
// tide over a 30-year hindcast (about 0.6 s) was worked again on every task. No outside figures
// here: the checks are that an equal series finds the kept one and any change misses.
import { describe, expect, it } from 'vitest';
import { SeriesCanon, SeriesValueCache, sameValues } from '../../server/services/series-value-cache';
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

describe("SeriesCanon (the engine thread's task inputs)", () => {
  const site = {
    tide: { source: 'constants' as const, constituents: [{ name: 'M2', amplitude: 1.5, phase: 0 }], z0: 2, datum: 'LAT' },
    latitude: null,
    longitude: null,
  };
  const n = 24 * 60;
  const series = () => ({
    timeMs: Float64Array.from({ length: n }, (_, i) => T0 + i * HOUR_MS),
    hs: Float64Array.from({ length: n }, (_, i) => (i % 50 === 0 ? NaN : 1 + Math.sin(i / 9))),
    flags: new Uint8Array(n).fill(1),
    extra: { waterLevel: Float64Array.from({ length: n }, (_, i) => Math.cos(i / 12)) },
    waterLevelReference: 'residual' as const,
  });

  it('gives back the series seen first for an equal one (new arrays, every field equal), else the one given', () => {
    const canon = new SeriesCanon(64 * 2 ** 20);
    const first = series();
    expect(canon.canonical(first)).toBe(first);
    expect(canon.canonical(series())).toBe(first); // as a message to an engine thread makes new views
    const level = series();
    level.extra.waterLevel[700] += 0.01;
    expect(canon.canonical(level)).toBe(level);
    const flagged = series();
    flagged.flags[3] = 0;
    expect(canon.canonical(flagged)).toBe(flagged);
    const referred = { ...series(), waterLevelReference: 'chart-datum' as const };
    expect(canon.canonical(referred)).toBe(referred);
    const notSeries = { id: 'row', depthM: 12 };
    expect(canon.canonical(notSeries)).toBe(notSeries);
    expect(canon.canonical(null)).toBeNull();
  });

  it("so the worksite's tide, cached by its time array, is found again for a new view of the same series", () => {
    const canon = new SeriesCanon(64 * 2 ** 20);
    const asSeen = (s: ReturnType<typeof series>) => ({ timeMs: s.timeMs, extra: {}, waterLevelReference: undefined });
    const first = canon.canonical(series());
    const tide = siteTide(site, asSeen(first))!;
    expect(tide.waterLevelM.length).toBe(n);
    expect(siteTide(site, asSeen(canon.canonical(series())))).toBe(tide);
    // Without the canon a new view is a new array: the tide is worked again (a new object, equal values).
    const again = siteTide(site, asSeen(series()))!;
    expect(again).not.toBe(tide);
    expect(Array.from(again.waterLevelM)).toEqual(Array.from(tide.waterLevelM));
  });
});
