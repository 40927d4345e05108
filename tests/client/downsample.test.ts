// The chart thinning of long series (src/features/datasets/components/downsample.ts), on hand
// cases: the highest value per equal time bucket, null for an empty bucket, and records as they
// are when there are few, broken at gaps by the local step rule (docs/domain.md#convention-9 to
// #convention-10: a spacing over 1.5 times the step on both sides is a gap).
import { describe, expect, it } from 'vitest';
import { maxPerBucket } from '../../src/features/datasets/components/downsample';

const HOUR = 3_600_000;
const T0 = Date.UTC(2026, 0, 1);
const hours = (...h: number[]) => Float64Array.from(h, (x) => T0 + x * HOUR);

/**
 * Thins records at these hours after T0 (step 1 h) over [T0, T0 + endH hours) into at most maxPoints;
 * the points as their hours after T0 and their values.
 */
function thinHourly(at: number[], values: number[], endH: number, maxPoints: number) {
  const { points, bucketMs } = maxPerBucket(hours(...at), Float64Array.from(values), T0, T0 + endH * HOUR, maxPoints, HOUR);
  return { points: { hours: points.map((p) => (p.x.getTime() - T0) / HOUR), values: points.map((p) => p.y) }, bucketMs };
}

describe('maxPerBucket', () => {
  it('keeps each bucket’s highest value, so a one-hour storm peak survives thinning', () => {
    // 12 hourly records into 3 buckets of 4 h; a peak of 5.2 m at hour 6, a missing value at hour 9.
    const hs = [1, 1.2, 1.1, 0.9, 2, 2.5, 5.2, 2.1, 1.5, NaN, 1.4, 1.3];
    const { points, bucketMs } = thinHourly([0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11], hs, 12, 3);
    expect(bucketMs).toBe(4 * HOUR);
    // Points at the middle of each bucket (2 h, 6 h, 10 h); maxima counted by hand.
    expect(points).toEqual({ hours: [2, 6, 10], values: [1.2, 5.2, 1.5] });
  });

  it('gives a null point for a bucket without a value, so the line breaks there', () => {
    const { points } = thinHourly([0, 1, 2, 3, 8, 9, 10, 11], [1, 2, 3, 4, 5, 6, 7, 8], 12, 3);
    expect(points).toEqual({ hours: [2, 6, 10], values: [4, null, 8] });
  });

  it('returns few records as they are, missing values as null, with no break inside a steady step', () => {
    const { points, bucketMs } = thinHourly([0, 1, 2, 3, 4], [1, NaN, 3, 4, 5], 5, 10);
    expect(bucketMs).toBe(0);
    expect(points).toEqual({ hours: [0, 1, 2, 3, 4], values: [1, null, 3, 4, 5] });
  });

  it('breaks raw records at a gap, one step after the last record before it', () => {
    // Hourly, then 5 h missing (a spacing of 6 h > 1.5 x 1 h on both sides), then hourly again.
    const { points } = thinHourly([0, 1, 2, 3, 9, 10, 11, 12], [1, 1, 1, 1, 2, 2, 2, 2], 13, 100);
    expect(points).toEqual({ hours: [0, 1, 2, 3, 4, 9, 10, 11, 12], values: [1, 1, 1, 1, null, 2, 2, 2, 2] });
  });

  it('does not break a forecast that turns from hourly to 3-hourly', () => {
    const at = [0, 1, 2, 3, 4, 7, 10, 13, 16];
    const { points } = thinHourly(at, Array<number>(at.length).fill(1), 19, 100);
    expect(points.values.some((y) => y === null)).toBe(false);
    expect(points.hours).toEqual(at);
  });

  it('answers nothing for no records', () => {
    expect(maxPerBucket(new Float64Array(0), new Float64Array(0), T0, T0 + HOUR, 4, HOUR)).toEqual({ points: [], bucketMs: 0 });
  });
});
