import { zonedMonthStartMs, zoneOffsetMs } from './calendar-index';
import { nextGoStartIndex } from './go-starts';
import { quantileR7 } from './quantile-r7';
import { recordSteps } from './record-steps';
import { MS_PER_HOUR, assertStep } from './workable-runs';
import { bisectLeft } from 'd3-array'; // first index whose time is >= t (times ascending)

/** One campaign step: an operation at a worksite. */
export interface CampaignStep {
  /** Go-start flags of the operation at its worksite (for its TR), per record. */
  goStart: Uint8Array;
  /** Planned duration TPOP, h (> 0). */
  tpopH: number;
  /** Record times of this step's series when they differ from the campaign's time axis. */
  timeMs?: Float64Array;
}

/** Options of {@link simulateCampaign}. */
export interface CampaignOptions {
  /** Start months to simulate, 1-12; default all twelve. */
  startMonths?: number[];
  /** IANA time zone of the start dates (the 1st at 00:00); default 'UTC' (docs/domain.md#convention-15). */
  timeZone?: string;
}

/** One simulated campaign run (one year, one start month). */
export interface CampaignRun {
  /** Calendar year of the start date. */
  year: number;
  /** Start, UTC epoch ms. */
  startMs: number;
  /** End of the last step, UTC epoch ms; null when censored. */
  endMs: number | null;
  /** Duration D = end - start, h; null when censored. */
  durationHours: number | null;
  /** Waiting on weather D - sum of TPOP, h; null when censored. */
  wowHours: number | null;
  /** A step found no go-start before the data end. */
  censored: boolean;
  /** Index of the step that found no go-start (censored runs); null otherwise. */
  stuckStep: number | null;
}

/** Campaign duration statistics for one start month. */
export interface CampaignMonthResult {
  /** Start month, 1-12. */
  startMonth: number;
  /** Years simulated (censored ones included). */
  years: number;
  /** Calendar years whose run was censored. */
  censoredYears: number[];
  /** Per step index, how many censored years stopped at it (only steps that stopped some). */
  stuckSteps: { step: number; years: number }[];
  /** Type-7 percentiles over the non-censored years, h; null when every year is censored. */
  p50Hours: number | null;
  p90Hours: number | null;
  wowP50Hours: number | null;
  wowP90Hours: number | null;
  /** Every simulated year, in year order. */
  runs: CampaignRun[];
}

/**
 * Campaign simulation over a hindcast (docs/domain.md#hindcast-statistics, #convention-15): for every
 * hindcast year and start month, start at the 1st at 00:00 in the campaign's time zone; for each
 * step in order, t = the first go-start at or after t for that step, then t = t + TPOP. Duration
 * D = end - start, waiting on weather = D - sum of TPOP. P50 and P90 (Hyndman & Fan type 7) of D
 * and of WoW over the years that are not censored; a year is censored when a step finds no
 * go-start before the data end.
 *
 * Hindcast years for a start month: the years whose start date lies within the data, from the
 * first record's time to the last record's end (its time + its local step, record-steps.ts) (a start before the data begins would count
 * the missing months as waiting; a start after its end has no data at all).
 *
 * Each step's "next go-start at or after record i" is precomputed once by a backward scan; a
 * lookup is one binary search for the first record at or after t.
 *
 * @param timeMs the campaign's time axis (the hindcast records), UTC epoch ms, ascending
 * @param stepMs fallback dt, ms (a series without any stretch of equal spacings)
 * @param steps ordered steps; each step's go-start flags match `timeMs` (or the step's own `timeMs`)
 * @returns one entry per start month, in the order of `startMonths`
 * @throws RangeError for no steps, a non-positive TPOP, mismatched lengths, a start month outside
 *   1-12 or an unknown time zone.
 */
export function simulateCampaign(
  timeMs: Float64Array,
  stepMs: number,
  steps: CampaignStep[],
  options: CampaignOptions = {},
): CampaignMonthResult[] {
  assertStep(stepMs);
  if (steps.length === 0) throw new RangeError('a campaign needs at least one step');
  const timeZone = options.timeZone ?? 'UTC';
  const startMonths = options.startMonths ?? [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12];
  for (const m of startMonths) if (!(Number.isInteger(m) && m >= 1 && m <= 12)) throw new RangeError(`start month ${m} outside 1-12`);

  const nextCache = new Map<Uint8Array, Int32Array>();
  const prepared = steps.map((s) => {
    if (!(s.tpopH > 0 && Number.isFinite(s.tpopH))) throw new RangeError(`TPOP ${s.tpopH} h must be finite and positive`);
    const times = s.timeMs ?? timeMs;
    if (s.goStart.length !== times.length) throw new RangeError('a step has go-start flags for another number of records');
    let next = nextCache.get(s.goStart);
    if (!next) {
      next = nextGoStartIndex(s.goStart);
      nextCache.set(s.goStart, next);
    }
    return { times, next, tpopMs: s.tpopH * MS_PER_HOUR };
  });
  const sumTpopH = steps.reduce((a, s) => a + s.tpopH, 0);

  const n = timeMs.length;
  if (n === 0) {
    zoneOffsetMs(timeZone, 0);
    return startMonths.map((startMonth) => ({
      startMonth,
      years: 0,
      censoredYears: [],
      stuckSteps: [],
      p50Hours: null,
      p90Hours: null,
      wowP50Hours: null,
      wowP90Hours: null,
      runs: [],
    }));
  }
  const firstMs = timeMs[0];
  const endMs = timeMs[n - 1] + recordSteps(timeMs, stepMs).durationMs[n - 1];
  const firstYear = new Date(firstMs + zoneOffsetMs(timeZone, firstMs)).getUTCFullYear();
  const lastYear = new Date(endMs + zoneOffsetMs(timeZone, endMs)).getUTCFullYear();

  return startMonths.map((startMonth) => {
    const runs: CampaignRun[] = [];
    for (let year = firstYear; year <= lastYear; year++) {
      const startMs = zonedMonthStartMs(year, startMonth, timeZone);
      if (startMs < firstMs || startMs >= endMs) continue;
      let t = startMs;
      let censored = false;
      let stuckStep: number | null = null;
      for (let k = 0; k < prepared.length; k++) {
        const step = prepared[k];
        const i = bisectLeft(step.times, t);
        const j = i < step.times.length ? step.next[i] : -1;
        if (j < 0) {
          censored = true;
          stuckStep = k;
          break;
        }
        t = step.times[j] + step.tpopMs;
      }
      const durationHours = censored ? null : (t - startMs) / MS_PER_HOUR;
      runs.push({
        year,
        startMs,
        endMs: censored ? null : t,
        durationHours,
        wowHours: durationHours === null ? null : durationHours - sumTpopH,
        censored,
        stuckStep,
      });
    }
    const done = runs.filter((r) => !r.censored);
    const d = Float64Array.from(done, (r) => r.durationHours as number);
    const w = Float64Array.from(done, (r) => r.wowHours as number);
    const q = (xs: Float64Array, p: number): number | null => (xs.length > 0 ? quantileR7(xs, p) : null);
    return {
      startMonth,
      years: runs.length,
      censoredYears: runs.filter((r) => r.censored).map((r) => r.year),
      stuckSteps: stuckCounts(runs),
      p50Hours: q(d, 0.5),
      p90Hours: q(d, 0.9),
      wowP50Hours: q(w, 0.5),
      wowP90Hours: q(w, 0.9),
      runs,
    };
  });
}

/** How many censored runs stopped at each step, by step index. */
function stuckCounts(runs: CampaignRun[]): { step: number; years: number }[] {
  const counts = new Map<number, number>();
  for (const r of runs) if (r.stuckStep !== null) counts.set(r.stuckStep, (counts.get(r.stuckStep) ?? 0) + 1);
  return [...counts].sort((a, b) => a[0] - b[0]).map(([step, years]) => ({ step, years }));
}
