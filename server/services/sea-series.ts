import { completePeriodSeries } from '../../shared/waves';
import { detectStepMinutes } from '../../shared/seadata';
import { presentExtraColumns, type ExtraSeries } from '../../shared/seadata/extra-columns';
import type { SeaSeries } from './series-store';

/** Raw columns as read from a file or a service; NaN = missing; any period may be absent. */
export interface RawSeaColumns {
  timeMs: Float64Array;
  hs: Float64Array;
  tp?: Float64Array | null;
  tz?: Float64Array | null;
  te?: Float64Array | null;
  dir?: Float64Array | null;
  wind?: Float64Array | null;
  windDir?: Float64Array | null;
  /** Optional columns (water level, current, partitions), same length as `timeMs`. */
  extra?: ExtraSeries;
}

/**
 * Completes the periods per docs/domain.md#sea-states (JONSWAP ratios, gamma 3.3) and keeps which were given.
 * Missing columns become all-NaN.
 */
export function toSeaSeries(raw: RawSeaColumns): SeaSeries {
  const n = raw.timeMs.length;
  const nan = () => new Float64Array(n).fill(NaN);
  const periods = completePeriodSeries(raw.tp ?? nan(), raw.tz ?? null, raw.te ?? null);
  return {
    timeMs: raw.timeMs,
    hs: raw.hs,
    tp: periods.tpS,
    tz: periods.tzS,
    te: periods.teS,
    dir: raw.dir ?? nan(),
    wind: raw.wind ?? nan(),
    windDir: raw.windDir ?? nan(),
    givenPeriods: periods.givenMask,
    extra: raw.extra ?? {},
  };
}

export const SERIES_VARIABLES = ['hs', 'tp', 'tz', 'te', 'dir', 'wind', 'windDir'] as const;

/** Coverage figures of a series: step (median spacing), variables present, missing counts, derived periods. */
export function describeSeries(s: SeaSeries) {
  const n = s.timeMs.length;
  // Median spacing (docs/domain.md#convention-9), as the engine's detectStepMs takes it; one record: 1 h.
  const median = detectStepMinutes(s.timeMs);
  const stepMinutes = Number.isNaN(median) ? 60 : median;
  const missing: Record<string, number> = {};
  const variables: string[] = [];
  const columns: [string, Float64Array][] = [
    ...SERIES_VARIABLES.map((v): [string, Float64Array] => [v, s[v]]),
    ...presentExtraColumns(s.extra).map((c): [string, Float64Array] => [c, s.extra[c]!]),
  ];
  for (const [v, a] of columns) {
    let m = 0;
    for (let i = 0; i < n; i++) if (Number.isNaN(a[i])) m++;
    missing[v] = m;
    if (m < n) variables.push(v);
  }
  const derived = { tp: 0, tz: 0, te: 0 };
  for (let i = 0; i < n; i++) {
    const g = s.givenPeriods[i];
    if (!Number.isNaN(s.tp[i])) {
      if (!(g & 1)) derived.tp++;
      if (!(g & 2)) derived.tz++;
      if (!(g & 4)) derived.te++;
    }
  }
  return { records: n, stepMinutes, variables, missing, derived };
}
