import { recordSteps } from '../../../../shared/engine/record-steps';
/**
 * Thinning of long sea-state series for drawing: a 30-year hourly series has 263 000 records,
 * far more than a chart has pixels.
 */

/** One drawn point: time and value (null breaks the line at a gap). */
export interface ChartPoint {
  x: Date;
  y: number | null;
}

/** What {@link maxPerBucket} returns. */
export interface Thinned {
  points: ChartPoint[];
  /** Width of a bucket, ms; 0 when the records are drawn as they are. */
  bucketMs: number;
}

/**
 * The highest value in each of `buckets` equal time intervals of [fromMs, toMs]: an envelope that
 * keeps every storm peak visible however far the chart is zoomed out (a mean would flatten them;
 * common practice for sea-state overviews, no source). Intervals without a value give a null
 * point, so gaps in the data show as breaks. When there are no more records than buckets, the
 * records are returned as they are, with a break at every gap of the local step rule (a spacing over
 * 1.5 times the step on both sides of it; a forecast that turns 3-hourly is not broken up).
 *
 * @param timeMs record times, UTC ms, increasing.
 * @param values the variable (any unit), NaN = missing; same length as `timeMs`.
 * @param fromMs start of the drawn range, UTC ms.
 * @param toMs end of the drawn range, UTC ms (> fromMs).
 * @param buckets number of intervals (≥ 1).
 * @param stepMs the dataset's nominal time step, ms (the fallback of the gap test of raw records).
 */
export function maxPerBucket(
  timeMs: Float64Array,
  values: Float64Array,
  fromMs: number,
  toMs: number,
  buckets: number,
  stepMs: number,
): Thinned {
  const n = timeMs.length;
  const points: ChartPoint[] = [];
  if (n === 0) return { points, bucketMs: 0 };
  if (n <= buckets || !(toMs > fromMs)) {
    const { continues, durationMs } = recordSteps(timeMs, stepMs > 0 ? stepMs : undefined);
    for (let i = 0; i < n; i++) {
      if (i > 0 && continues[i - 1] === 0) points.push({ x: new Date(timeMs[i - 1] + durationMs[i - 1]), y: null });
      points.push({ x: new Date(timeMs[i]), y: Number.isNaN(values[i]) ? null : values[i] });
    }
    return { points, bucketMs: 0 };
  }
  const width = (toMs - fromMs) / buckets;
  const max = new Float64Array(buckets).fill(NaN);
  for (let i = 0; i < n; i++) {
    const v = values[i];
    if (Number.isNaN(v)) continue;
    const b = Math.min(buckets - 1, Math.max(0, Math.floor((timeMs[i] - fromMs) / width)));
    if (!(max[b] >= v)) max[b] = v;
  }
  for (let b = 0; b < buckets; b++) {
    points.push({ x: new Date(fromMs + (b + 0.5) * width), y: Number.isNaN(max[b]) ? null : max[b] });
  }
  return { points, bucketMs: width };
}
