// Small series builders for the engine tests.
import type { SiteSeries } from '../../shared/engine';

export const HOUR = 3_600_000;
export const T0 = Date.UTC(2024, 0, 1);

/** Columns of a series as plain arrays; missing columns are filled with `fill` (default 0). */
export interface Columns {
  timeMs?: number[];
  hsM?: number[];
  tpS?: number[];
  bedVelocityLinearMps?: number[];
  bedVelocitySoulsbyMps?: number[];
  windMps?: number[];
}

/** A series of n records; times hourly from T0 unless given. */
export function makeSeries(cols: Columns, fill = 0): SiteSeries {
  const n = Math.max(...Object.values(cols).map((c) => (c as number[]).length));
  const col = (c: number[] | undefined): Float64Array => (c ? Float64Array.from(c) : new Float64Array(n).fill(fill));
  return {
    timeMs: cols.timeMs ? Float64Array.from(cols.timeMs) : Float64Array.from({ length: n }, (_, i) => T0 + i * HOUR),
    hsM: col(cols.hsM),
    tpS: col(cols.tpS),
    bedVelocityLinearMps: col(cols.bedVelocityLinearMps),
    bedVelocitySoulsbyMps: col(cols.bedVelocitySoulsbyMps),
    windMps: col(cols.windMps),
  };
}

/** Hourly times from T0 at the given hour offsets (gaps where hours are skipped). */
export function hoursAt(offsets: number[]): number[] {
  return offsets.map((h) => T0 + h * HOUR);
}
