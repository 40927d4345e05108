/**
 * The downtime ledger's day arithmetic, pure: calendar days in a worksite's time zone, and the
 * tally of one day (or one month of a hindcast) from hourly statuses at OPLIM. The server's ledger
 * services (server/services/ledger-*.ts) read the data and store the rows.
 *
 * Choices (docs/domain.md leaves them open; written down here):
 * - Hours planned: every hour of the calendar day in the worksite's time zone, i.e. the day's real
 *   length (24 h; 23 or 25 h on daylight-saving change days). The ledger books weather downtime of
 *   a campaign in progress around the clock, as offshore spreads usually work; a day the spread
 *   did not work is corrected to 0 lost hours by the coordinator with a note.
 * - Hours lost to weather: planned hours that were not workable at OPLIM (alpha = false: this is
 *   what happened, not a forecast to be cautious about, docs/domain.md#convention-14). A record stands for
 *   [t, t + dt) and belongs to the day of its start; records with a missing value the limits need
 *   ("no data") and hours with no record at all count as lost too: nobody can show they were
 *   workable. Lost = planned - workable records x dt, within [0, planned].
 * - Limiting factor: among the lost hours, the engine's limiting factor that was deciding for the
 *   most hours (ties to the first in the engine's limit order), or "noData" when missing values
 *   and absent records account for the most; null when nothing was lost.
 * - A month of a hindcast: the month's hours in the zone minus its workable records x dt, for the
 *   year-months the data spans wholly.
 */
import { TZDate, tz } from '@date-fns/tz';
import { bisectLeft } from 'd3-array'; // first index whose time is >= t (times ascending)
import { eachDayOfInterval, format } from 'date-fns';
import { LIMIT_NAMES, STATUS } from '../engine/types';
import { recordSteps } from '../engine/record-steps';
import { zonedMonthStartMs } from '../engine/calendar-index';
import type { LedgerLimiting } from '../schemas/downtime';

const MS_PER_HOUR = 3_600_000;
const MS_PER_MINUTE = 60_000;
const round2 = (x: number) => Math.round(x * 100) / 100;

/** Every date from `from` to `to` (YYYY-MM-DD, inclusive). */
export function daysOf(from: string, to: string): string[] {
  if (to < from) return [];
  // Calendar dates carry no zone: counted in UTC, where every day is 24 h.
  const utc = tz('UTC');
  return eachDayOfInterval({ start: `${from}T00:00:00Z`, end: `${to}T00:00:00Z` }, { in: utc }).map((day) =>
    format(day, 'yyyy-MM-dd', { in: utc }),
  );
}

/**
 * The instants a calendar day starts and ends in a time zone, UTC ms: local midnight to the next
 * local midnight (@date-fns/tz; 23 or 25 h apart on daylight-saving change days).
 */
export function zonedDayMs(day: string, timeZone: string): { startMs: number; endMs: number } {
  const [y, m, d] = day.split('-').map(Number);
  return { startMs: new TZDate(y, m - 1, d, timeZone).getTime(), endMs: new TZDate(y, m - 1, d + 1, timeZone).getTime() };
}

/** Tally of one day: workable hours and lost hours by limiting factor. */
export interface DayTally {
  plannedHours: number;
  lostHours: number;
  limiting: LedgerLimiting | null;
}

/**
 * Planned and lost hours of one day from hourly statuses at OPLIM (see the module comment).
 * @param timeMs record times, ascending; @param status STATUS codes; @param limiting LIMIT codes
 * @param stepMs fallback dt, ms (each record counts its local step, record-steps.ts); @param startMs, endMs the day, UTC ms
 */
export function tallyDay(
  timeMs: Float64Array,
  status: Uint8Array,
  limiting: Uint8Array,
  stepMs: number,
  startMs: number,
  endMs: number,
): DayTally {
  const plannedHours = (endMs - startMs) / MS_PER_HOUR;
  const dur = recordSteps(timeMs, stepMs).durationMs;
  const byLimit = new Float64Array(LIMIT_NAMES.length);
  let noData = 0;
  let present = 0;
  let workable = 0;
  let i = bisectLeft(timeMs, startMs);
  for (; i < timeMs.length && timeMs[i] < endMs; i++) {
    const dtH = Math.min(dur[i], endMs - timeMs[i]) / MS_PER_HOUR;
    present += dtH;
    const s = status[i];
    if (s === STATUS.WORKABLE) workable += dtH;
    else if (s === STATUS.NO_DATA) noData += dtH;
    else byLimit[limiting[i]] += dtH;
  }
  noData += Math.max(0, plannedHours - present);
  return dayTally(plannedHours, workable, byLimit, noData);
}

/**
 * The tally from the day's counts: lost = planned - workable within [0, planned], and the
 * limiting factor that decided the most lost time (`byLimit` by LIMIT code and `noData` in one
 * unit, hours or minutes; ties to the first in the engine's order, no data last).
 */
function dayTally(plannedHours: number, workableHours: number, byLimit: Float64Array, noData: number): DayTally {
  const lostHours = Math.min(plannedHours, Math.max(0, plannedHours - workableHours));
  let best: LedgerLimiting | null = null;
  let bestAmount = 0;
  for (let c = 1; c < byLimit.length; c++) {
    if (byLimit[c] > bestAmount) {
      bestAmount = byLimit[c];
      best = LIMIT_NAMES[c] as LedgerLimiting;
    }
  }
  if (noData > bestAmount) best = 'noData';
  return { plannedHours, lostHours: round2(lostHours), limiting: lostHours > 0 ? best : null };
}

/** One source of statuses for {@link tallyStitched}: record times, statuses, limiting factors, fallback dt (each record counts its local step, record-steps.ts). */
export interface StatusPart {
  timeMs: Float64Array;
  status: Uint8Array;
  limiting: Uint8Array;
  stepMs: number;
}

/**
 * Planned and lost hours of one day from several sources in order of preference (for forecast
 * issues: the newest first). Each minute of the day takes the status of the first source with a
 * record starting in the day that covers it ([t, t + dt_i), dt_i the record's local step: a forecast
 * turns 3-hourly after a few days); minutes no source covers count as no
 * data, as in {@link tallyDay}. With one source on whole-hour records this equals tallyDay.
 * @returns the tally, and per source the minutes it decided
 */
export function tallyStitched(parts: StatusPart[], startMs: number, endMs: number): DayTally & { minutesBySource: number[] } {
  const plannedHours = (endMs - startMs) / MS_PER_HOUR;
  const minutes = Math.round((endMs - startMs) / MS_PER_MINUTE);
  const claimed = new Uint8Array(minutes);
  const byLimit = new Float64Array(LIMIT_NAMES.length);
  const minutesBySource = parts.map(() => 0);
  let workable = 0;
  let noData = 0;
  let covered = 0;
  parts.forEach((p, k) => {
    const dur = recordSteps(p.timeMs, p.stepMs).durationMs;
    for (let i = bisectLeft(p.timeMs, startMs); i < p.timeMs.length && p.timeMs[i] < endMs; i++) {
      const a = Math.floor((p.timeMs[i] - startMs) / MS_PER_MINUTE);
      const b = Math.min(minutes, Math.ceil((p.timeMs[i] + dur[i] - startMs) / MS_PER_MINUTE));
      let n = 0;
      for (let m = a; m < b; m++) {
        if (claimed[m] === 0) {
          claimed[m] = 1;
          n++;
        }
      }
      if (n === 0) continue;
      minutesBySource[k] += n;
      covered += n;
      const s = p.status[i];
      if (s === STATUS.WORKABLE) workable += n;
      else if (s === STATUS.NO_DATA) noData += n;
      else byLimit[p.limiting[i]] += n;
    }
  });
  noData += minutes - covered;
  return { ...dayTally(plannedHours, workable / 60, byLimit, noData), minutesBySource };
}

/**
 * Lost hours per year-month in the hindcast (hours of the month - the durations of the workable
 * records at OPLIM, each record its local step, record-steps.ts),
 * for the year-months the data spans wholly, as `[yearMonth (year*12 + month0), lostHours][]`.
 */
export function yearMonthLostHours(
  timeMs: Float64Array,
  status: Uint8Array,
  yearMonth: Int32Array,
  stepMs: number,
  timeZone: string,
): [number, number][] {
  const n = timeMs.length;
  if (n === 0) return [];
  const firstMs = timeMs[0];
  const dur = recordSteps(timeMs, stepMs).durationMs;
  const endMs = timeMs[n - 1] + dur[n - 1];
  const workable = new Map<number, number>();
  for (let i = 0; i < n; i++) {
    const ym = yearMonth[i];
    workable.set(ym, (workable.get(ym) ?? 0) + (status[i] === STATUS.WORKABLE ? dur[i] / MS_PER_HOUR : 0));
  }
  const out: [number, number][] = [];
  for (const [ym, count] of [...workable].sort((a, b) => a[0] - b[0])) {
    const y = Math.floor(ym / 12);
    const m = ym - y * 12 + 1;
    const a = zonedMonthStartMs(y, m, timeZone);
    const b = zonedMonthStartMs(y, m + 1, timeZone);
    if (a < firstMs || b > endMs) continue;
    out.push([ym, Math.max(0, (b - a) / MS_PER_HOUR - count)]);
  }
  return out;
}
