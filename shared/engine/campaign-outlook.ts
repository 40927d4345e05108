import { nextGoStartIndex } from './go-starts';
import { quantileR7 } from './quantile-r7';
import { MS_PER_HOUR } from './workable-runs';
import { bisectLeft } from 'd3-array'; // first index whose time is >= t (times ascending)

/**
 * One forecast sample source: the deterministic forecast (its go-starts with alpha), or, once
 * ensembles are stored, one member (its go-starts at OPLIM: the spread stands for the
 * uncertainty, docs/domain.md#forecast-uncertainty). Each member gives one sample per hindcast
 * year.
 */
export interface OutlookForecastMember {
  /** 'forecast' for the deterministic forecast; a member's name for an ensemble member. */
  label: string;
  /** Record times, UTC epoch ms, ascending. */
  timeMs: Float64Array;
  /** End of the forecast, UTC epoch ms: the last record's time plus its step. */
  endMs: number;
  /** Go-start flags per remaining step (same order as the steps), each of `timeMs`'s length. */
  goStart: Uint8Array[];
}

/** The hindcast the outlook continues on after the forecast ends. */
export interface OutlookHindcast {
  /** Record times, UTC epoch ms, ascending. */
  timeMs: Float64Array;
  /** dt, ms (the data end is the last record + dt). */
  stepMs: number;
  /** Go-start flags per remaining step, each of `timeMs`'s length. */
  goStart: Uint8Array[];
}

/** Input of {@link simulateOutlook}. */
export interface OutlookInput {
  /** Where the remaining work starts, UTC epoch ms (now, or later when a step is still under way). */
  startMs: number;
  /** TPOP of each remaining step, h, in order. */
  tpopH: number[];
  /** Forecast members; empty when there is no forecast (then the hindcast starts at `startMs`). */
  members: OutlookForecastMember[];
  hindcast: OutlookHindcast;
}

/** One (forecast member) x (hindcast year) sample. */
export interface OutlookSample {
  /** Label of the forecast member, null without a forecast. */
  member: string | null;
  /** Hindcast year the sample continues in (the year of the calendar time where the forecast hands over). */
  year: number;
  /** Start of each remaining step, UTC epoch ms (shorter than the steps when censored). */
  stepStartMs: number[];
  /** Steps that started inside the forecast. */
  stepsInForecast: number;
  /** End of the last step, UTC epoch ms; null when censored. */
  finishMs: number | null;
  /** Waiting on weather: finish - start - sum of TPOP, h; null when censored. */
  wowHours: number | null;
  /** A step found no go-start before the hindcast ends. */
  censored: boolean;
}

/** Percentiles of an outlook. */
export interface OutlookPercentiles {
  samples: number;
  censored: number;
  /** Type-7 percentiles of the finish, UTC epoch ms, over the samples that are not censored. */
  finishMs: { p10: number; p50: number; p90: number } | null;
  remainingWowHours: { p10: number; p50: number; p90: number } | null;
  /** Per remaining step, P50 and P90 of its start over the samples that reached it. */
  stepStartMs: ({ p50: number; p90: number } | null)[];
}

/**
 * The hindcast years a sample can continue in, and the shift that takes a time of the simulated
 * future to the same calendar time (UTC month, day, hour) of that year: the years whose shifted
 * hand-over time lies within the data (from the first record to the last record + dt). 29 February
 * of a leap year falls on 1 March of other years.
 */
export function hindcastYearShifts(handoverMs: number, timeMs: Float64Array, stepMs: number): { year: number; shiftMs: number }[] {
  const n = timeMs.length;
  if (n === 0) return [];
  const firstMs = timeMs[0];
  const endMs = timeMs[n - 1] + stepMs;
  const h = new Date(handoverMs);
  const out: { year: number; shiftMs: number }[] = [];
  const fromYear = new Date(firstMs).getUTCFullYear();
  const toYear = new Date(endMs).getUTCFullYear();
  for (let year = fromYear; year <= toYear; year++) {
    const mapped = Date.UTC(
      year,
      h.getUTCMonth(),
      h.getUTCDate(),
      h.getUTCHours(),
      h.getUTCMinutes(),
      h.getUTCSeconds(),
      h.getUTCMilliseconds(),
    );
    if (mapped < firstMs || mapped >= endMs) continue;
    out.push({ year, shiftMs: mapped - handoverMs });
  }
  return out;
}

/**
 * The live campaign outlook (docs/domain.md#campaigns, #hindcast-statistics): from `startMs`, for
 * the remaining steps in order, each (forecast member) x (hindcast year) pair gives one finish time.
 *
 * - In the forecast: t = the member's first go-start at or after t for the step, then t + TPOP.
 * - When a step finds no go-start in the forecast (a go-start needs [t0, t0 + TR) inside it, so
 *   none lies in the last TR of the forecast), the hindcast year takes over at max(t, forecast
 *   end): the same calendar time of that year, then the same sequential rule on the hindcast's
 *   go-starts, the hindcast running on into the next year where needed. A window that would
 *   straddle the forecast's end is not counted (the cautious side).
 * - Without a forecast member the hindcast takes over at `startMs` (the hindcast-only simulation).
 * - A sample is censored when a step finds no go-start before the hindcast ends.
 *
 * Several members (an ensemble) simply give more samples; the deterministic forecast is one member.
 *
 * @returns every sample, members in order, years ascending within a member
 * @throws RangeError for a non-positive TPOP or flags of another length than their times.
 */
export function simulateOutlook(input: OutlookInput): OutlookSample[] {
  const { startMs, tpopH, hindcast } = input;
  for (const h of tpopH) if (!(h > 0 && Number.isFinite(h))) throw new RangeError(`TPOP ${h} h must be finite and positive`);
  const nSteps = tpopH.length;
  const tpopMs = tpopH.map((h) => h * MS_PER_HOUR);
  const sumTpopH = tpopH.reduce((a, b) => a + b, 0);
  const check = (flags: Uint8Array[], times: Float64Array, what: string) => {
    if (flags.length !== nSteps) throw new RangeError(`${what} has go-start flags for ${flags.length} steps, not ${nSteps}`);
    for (const f of flags) if (f.length !== times.length) throw new RangeError(`${what} has go-start flags for another number of records`);
  };
  check(hindcast.goStart, hindcast.timeMs, 'the hindcast');
  for (const m of input.members) check(m.goStart, m.timeMs, `forecast member ${m.label}`);
  const hindNext = hindcast.goStart.map((f) => nextGoStartIndex(f));

  const samples: OutlookSample[] = [];
  const sources: (OutlookForecastMember | null)[] = input.members.length > 0 ? input.members : [null];
  for (const member of sources) {
    // The forecast part is the same for every hindcast year of a member.
    let t = startMs;
    let k = 0;
    const fcStarts: number[] = [];
    if (member && nSteps > 0) {
      const next = member.goStart.map((f) => nextGoStartIndex(f));
      for (; k < nSteps; k++) {
        const i = bisectLeft(member.timeMs, t);
        const j = i < member.timeMs.length ? next[k][i] : -1;
        if (j < 0) break;
        fcStarts.push(member.timeMs[j]);
        t = member.timeMs[j] + tpopMs[k];
      }
    }
    const label = member?.label ?? null;
    if (k === nSteps) {
      // Finished inside the forecast: every hindcast year gives the same finish.
      for (const { year } of hindcastYearShifts(t, hindcast.timeMs, hindcast.stepMs)) {
        samples.push({
          member: label,
          year,
          stepStartMs: fcStarts.slice(),
          stepsInForecast: k,
          finishMs: t,
          wowHours: (t - startMs) / MS_PER_HOUR - sumTpopH,
          censored: false,
        });
      }
      continue;
    }
    const handoverMs = member ? Math.max(t, member.endMs) : t;
    for (const { year, shiftMs } of hindcastYearShifts(handoverMs, hindcast.timeMs, hindcast.stepMs)) {
      let tau = handoverMs + shiftMs;
      const starts = fcStarts.slice();
      let censored = false;
      for (let s = k; s < nSteps; s++) {
        const i = bisectLeft(hindcast.timeMs, tau);
        const j = i < hindcast.timeMs.length ? hindNext[s][i] : -1;
        if (j < 0) {
          censored = true;
          break;
        }
        starts.push(hindcast.timeMs[j] - shiftMs);
        tau = hindcast.timeMs[j] + tpopMs[s];
      }
      const finishMs = censored ? null : tau - shiftMs;
      samples.push({
        member: label,
        year,
        stepStartMs: starts,
        stepsInForecast: k,
        finishMs,
        wowHours: finishMs === null ? null : (finishMs - startMs) / MS_PER_HOUR - sumTpopH,
        censored,
      });
    }
  }
  return samples;
}

/**
 * P10, P50 and P90 (Hyndman & Fan type 7) of the finish and of the remaining waiting on weather
 * over the samples that are not censored, and P50 / P90 of each step's start over the samples
 * that reached it; null where there is no such sample.
 */
export function outlookPercentiles(samples: OutlookSample[], steps: number): OutlookPercentiles {
  const done = samples.filter((s) => !s.censored);
  const finish = Float64Array.from(done, (s) => s.finishMs as number);
  const wow = Float64Array.from(done, (s) => s.wowHours as number);
  const three = (xs: Float64Array) =>
    xs.length === 0 ? null : { p10: quantileR7(xs, 0.1), p50: quantileR7(xs, 0.5), p90: quantileR7(xs, 0.9) };
  const stepStartMs = Array.from({ length: steps }, (_, k) => {
    const xs = Float64Array.from(
      samples.filter((s) => s.stepStartMs.length > k),
      (s) => s.stepStartMs[k],
    );
    return xs.length === 0 ? null : { p50: quantileR7(xs, 0.5), p90: quantileR7(xs, 0.9) };
  });
  return {
    samples: samples.length,
    censored: samples.length - done.length,
    finishMs: three(finish),
    remainingWowHours: three(wow),
    stepStartMs,
  };
}

/** Progress of one campaign step. */
export interface StepProgress {
  status: 'planned' | 'started' | 'done';
  /** UTC epoch ms or null. */
  startedMs: number | null;
  doneMs: number | null;
}

/**
 * Where the remaining work starts: the steps not done, in order, and the time the first of them
 * can start: not before now, not before the actual end of the last done step, and, when a step is
 * under way, not before its start + TPOP (it is assumed to run on without waiting; it is not
 * simulated). Steps are done in order, so the remaining ones follow the last done step.
 *
 * @param progress per step, in order (missing entries are planned)
 * @param tpopH per step, h
 * @returns `firstIndex`: the first step to simulate (steps.length when none is left);
 *   `startMs`: where its simulation starts
 */
export function outlookStart(
  progress: (StepProgress | undefined)[],
  tpopH: number[],
  nowMs: number,
): { firstIndex: number; startMs: number } {
  let startMs = nowMs;
  let firstIndex = 0;
  for (let i = 0; i < tpopH.length; i++) {
    const p = progress[i];
    if (!p || p.status === 'planned') break;
    if (p.status === 'done') {
      if (p.doneMs !== null) startMs = Math.max(startMs, p.doneMs);
    } else {
      const began = p.startedMs ?? nowMs;
      startMs = Math.max(startMs, began + tpopH[i] * MS_PER_HOUR);
    }
    firstIndex = i + 1;
  }
  return { firstIndex, startMs };
}
