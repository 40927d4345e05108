/**
 * Hs limits on a target and excluded Tp bands over partitions (docs/domain.md#partitions).
 * A target other than the total takes sqrt(sum Hs_i^2) over its partitions at the worksite:
 * 'swell' both swells, 'windSea' the wind sea, 'longPeriod' every partition with Tp >= T*.
 * Absent partitions (Hs 0) add nothing; an unknown one (NaN, or a series without partitions)
 * makes the value unknown, so the hour is "no data" (docs/domain.md#convention-7).
 */
import type { EnginePartitionName, EnginePartitions, HsTarget, SiteSeries } from './types';

/** Excluded Tp bands test partitions whose worksite Hs is at least this, m (docs/domain.md#partitions). */
export const DEFAULT_BAND_MIN_HS_M = 0.2;

const PARTS: readonly EnginePartitionName[] = ['windSea', 'swell1', 'swell2'];
const TAKES: Record<Exclude<HsTarget, 'total' | 'longPeriod'>, readonly EnginePartitionName[]> = {
  swell: ['swell1', 'swell2'],
  windSea: ['windSea'],
};

/**
 * The value an Hs limit on `target` is compared with at record i, m; NaN when unknown.
 * @param minPeriodS - T* for 'longPeriod', s.
 */
export function targetHsAt(
  hsTotal: Float64Array,
  parts: EnginePartitions | undefined,
  i: number,
  target: HsTarget,
  minPeriodS: number,
): number {
  if (target === 'total') return hsTotal[i];
  if (!parts) return NaN;
  let e = 0;
  for (const k of target === 'longPeriod' ? PARTS : TAKES[target]) {
    const hs = parts[k].hsM[i];
    if (hs !== hs) return NaN;
    if (hs === 0) continue;
    if (target === 'longPeriod') {
      const tp = parts[k].tpS[i];
      if (tp !== tp) return NaN;
      if (tp < minPeriodS) continue;
    }
    e += hs * hs;
  }
  return Math.sqrt(e);
}

/** {@link targetHsAt} for every record of a series. */
export function targetHsSeries(series: SiteSeries, target: HsTarget, minPeriodS: number): Float64Array {
  if (target === 'total') return series.hsM;
  const n = series.timeMs.length;
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[i] = targetHsAt(series.hsM, series.partitions, i, target, minPeriodS);
  return out;
}

/**
 * The Tp values of record i that excluded bands test: the worksite Tp, and the Tp of every
 * partition whose worksite Hs is at least `minHs` (a resonant swell under a larger wind sea still
 * counts, docs/domain.md#partitions). Writes them to `out` and returns how many.
 */
export function bandPeriodsAt(series: SiteSeries, i: number, minHs: number, out: Float64Array): number {
  let n = 0;
  out[n++] = series.tpS[i];
  const parts = series.partitions;
  if (!parts) return n;
  for (const k of PARTS) {
    const hs = parts[k].hsM[i];
    const tp = parts[k].tpS[i];
    if (hs >= minHs && hs > 0 && tp === tp) out[n++] = tp;
  }
  return n;
}
