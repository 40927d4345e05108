import type { TideExtremes, TideWindowLimit } from './types';

const HOUR_MS = 3_600_000;

/**
 * How far a time sits inside a tide window, h (docs/domain.md#tide): the largest over the
 * predicted high (or low) waters E of min(t - (E - before), (E + after) - t). The window of E is
 * the closed span [E - before, E + after] (limits are inclusive, docs/domain.md#convention-6), so a
 * value >= 0 meets the limit and a negative one is the time still to wait (or past). NaN (no data)
 * when there are no extremes or t is outside the span they were predicted over.
 */
export function tideWindowMarginH(tide: TideExtremes | undefined, limit: TideWindowLimit, tMs: number): number {
  if (!tide || !(tMs >= tide.fromMs && tMs <= tide.toMs)) return NaN;
  const list = limit.reference === 'high' ? tide.highMs : tide.lowMs;
  const n = list.length;
  if (n === 0) return NaN;
  const beforeMs = limit.before * HOUR_MS;
  const afterMs = limit.after * HOUR_MS;
  // First extreme after t (binary search); the best window is around it or the one before.
  let lo = 0;
  let hi = n;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (list[mid] <= tMs) lo = mid + 1;
    else hi = mid;
  }
  let best = -Infinity;
  for (let k = Math.max(0, lo - 2); k <= Math.min(n - 1, lo + 1); k++) {
    const e = list[k];
    const m = Math.min(tMs - (e - beforeMs), e + afterMs - tMs);
    if (m > best) best = m;
  }
  return best / HOUR_MS;
}
