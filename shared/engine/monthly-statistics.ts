import type { CalendarIndex } from './calendar-index';
import { quantileR7Upper } from './quantile-r7';
import { STATUS } from './types';
import { recordSteps } from './record-steps';
import { MS_PER_HOUR, assertStep, trThresholdMs } from './workable-runs';

/** Statistics of one group of records (a calendar month over all years, or one year-month). */
export interface MonthStatisticsBase {
  /** Calendar month, 1-12, in the worksite's time zone. */
  month: number;
  /** Records in the group (all statuses; absent rows are not records). */
  records: number;
  /** Records whose status is not "no data" (docs/domain.md#convention-13). */
  recordsWithData: number;
  /** Workable time / time with data (records weighted by duration; with one step, records), 0-1; null without data. */
  workability: number | null;
  /** Go-start time / time with data (records weighted by duration), 0-1; null without data. */
  goStartShare: number | null;
  /** Mean waiting on weather over the non-censored records, h; null when all are censored. */
  wowMeanHours: number | null;
  /** 90th percentile (Hyndman & Fan type 7) of waiting on weather, h; null when all are censored. */
  wowP90Hours: number | null;
  /** Records with no go-start at or after them before the series ends (excluded from WoW). */
  censored: number;
  /** Usable windows whose first record is in the group. */
  windows: number;
  /** Usable windows per month: windows / years with records in the month; null without records. */
  windowsPerMonth: number | null;
  /** Mean length of those windows (sums of record durations; count * dt with one step), h; null without windows. */
  meanWindowHours: number | null;
}

/** Statistics of a calendar month over all years of the series. */
export interface MonthStatistics extends MonthStatisticsBase {
  /** Years that have records in this month. */
  years: number;
}

/** Statistics of one year and month (for heat maps); windowsPerMonth equals windows. */
export interface YearMonthStatistics extends MonthStatisticsBase {
  year: number;
}

/** Result of {@link monthlyStatistics}. */
export interface MonthlyStatistics {
  /** Twelve entries, January (month 1) to December. */
  months: MonthStatistics[];
  /** One entry per year-month with records, in year-month order. */
  yearMonths: YearMonthStatistics[];
}

/** Reusable scratch buffers for {@link monthlyStatistics}. */
export interface StatisticsScratch {
  wowMs: Float64Array;
  byMonth: Float64Array;
  /** Work space of the percentile selection. */
  tmp: Float64Array;
  /** Waiting-on-weather ramps (see {@link RampSet}): first value in steps, and length. */
  rampFirst: Int32Array;
  rampLength: Int32Array;
}

/** Scratch buffers for series of up to `length` records. */
export function createStatisticsScratch(length: number): StatisticsScratch {
  return {
    wowMs: new Float64Array(length),
    byMonth: new Float64Array(length),
    tmp: new Float64Array(length),
    rampFirst: new Int32Array(length),
    rampLength: new Int32Array(length),
  };
}

/** Type-7 90th percentile of buf[from, to), ms; the slice is left unchanged. */
function p90Ms(buf: Float64Array, from: number, to: number, tmp: Float64Array): number {
  return quantileR7Upper(buf, from, to, 0.9, tmp);
}

/**
 * Record groups of a calendar: the records of each year-month, listed contiguously in `order`
 * (the identity when the calendar ascends, as calendarIndex's does). Computed once per calendar
 * and shared by every operation at the worksite.
 */
interface CalendarGroups {
  ymMin: number;
  /** Number of year-months from the first to the last, K. */
  K: number;
  /** Record indices grouped by year-month; null means the identity (ascending calendar). */
  order: Int32Array | null;
  /** Group g holds order positions [start[g], start[g + 1]). */
  start: Int32Array;
}

const groupCache = new WeakMap<Int32Array, CalendarGroups>();

function calendarGroups(ym: Int32Array): CalendarGroups {
  const cached = groupCache.get(ym);
  if (cached) return cached;
  const n = ym.length;
  let ymMin = ym[0];
  let ymMax = ym[0];
  let ascending = true;
  for (let i = 1; i < n; i++) {
    const v = ym[i];
    if (v < ym[i - 1]) ascending = false;
    if (v < ymMin) ymMin = v;
    if (v > ymMax) ymMax = v;
  }
  const K = ymMax - ymMin + 1;
  const start = new Int32Array(K + 1);
  for (let i = 0; i < n; i++) start[ym[i] - ymMin + 1]++;
  for (let g = 0; g < K; g++) start[g + 1] += start[g];
  let order: Int32Array | null = null;
  if (!ascending) {
    order = new Int32Array(n);
    const fill = start.slice(0, K);
    for (let i = 0; i < n; i++) order[fill[ym[i] - ymMin]++] = i;
  }
  const groups = { ymMin, K, order, start };
  groupCache.set(ym, groups);
  return groups;
}

/**
 * Hindcast statistics per calendar month and per year-month (docs/domain.md#hindcast-statistics;
 * docs/domain.md#convention-9 to #convention-14):
 * - workability W = workable records / records with data, each record weighted by its duration
 *   (local step, record-steps.ts: a series 3-hourly early and hourly later counts time, not
 *   records; with one step the plain counts) (only STATUS.WORKABLE counts; pass statuses computed
 *   with alpha: false for "without alpha", docs/domain.md#convention-14);
 * - go-start share = go-start records / records with data, weighted the same way;
 * - waiting on weather (WoW) for every record, no-data records included: the next go-start's time
 *   minus the record's time in real hours (gaps included), 0 at a go-start; censored, and counted as
 *   such, when there is no go-start at or after it (docs/domain.md#convention-12); mean and type-7 90th percentile
 *   over the non-censored records;
 * - usable windows (workable runs at least TR long in time; a gap breaks a run, a change of step
 *   does not) counted in the month of their first record; per calendar month divided by the number
 *   of years with records in that month (docs/domain.md#convention-11); their mean length (sums of durations).
 *
 * Cost: for an ascending calendar (calendarIndex's), one backward pass over the records does the
 * WoW, the windows and every per-year-month sum; the percentiles take O(n) selection (see
 * quantileR7Upper). When every time is a whole number of steps after the first (hindcasts, regular
 * forecasts), the waits are not stored per record but as ramps (a wait grows by one step per record
 * back from a go-start), and each percentile is found by bisection on the value, counting through
 * the ramps (exact: the waits are whole steps). A series of one step throughout whose go-starts
 * are found here (monthlyStatisticsWithGoStarts on a hindcast) goes back through stretches of equal
 * status instead of single records (backwardPassOneStep). Nothing is allocated per record, and nothing proportional to n when `scratch` is
 * given. The calendar's grouping is cached per calendar array, which must not change afterwards
 * (reuse one calendarIndex for every operation at a worksite). Any other calendar (for example
 * hand-made groups) is handled too, through an index permutation.
 *
 * @param timeMs record times, UTC epoch ms, ascending
 * @param status STATUS code per record
 * @param goStart go-start flags for TR (see goStarts)
 * @param stepMs fallback dt, ms (a series without any stretch of equal spacings, record-steps.ts)
 * @param calendar calendar months of the records in the worksite's time zone (see calendarIndex)
 * @param trH reference period TR = TPOP + TC, h: sets the usable window length
 * @param scratch optional reusable buffers
 * @throws RangeError for arrays of unequal length or a non-positive dt or TR.
 */
export function monthlyStatistics(
  timeMs: Float64Array,
  status: Uint8Array,
  goStart: Uint8Array,
  stepMs: number,
  calendar: CalendarIndex,
  trH: number,
  scratch?: StatisticsScratch,
): MonthlyStatistics {
  return statisticsCore(timeMs, status, goStart, false, stepMs, calendar, trH, scratch);
}

/**
 * monthlyStatistics that also finds the go-starts (written into `goStart`) in its backward pass,
 * saving a pass over the records. Same results as goStarts followed by monthlyStatistics; for
 * operationStatistics.
 */
export function monthlyStatisticsWithGoStarts(
  timeMs: Float64Array,
  status: Uint8Array,
  goStartOut: Uint8Array,
  stepMs: number,
  calendar: CalendarIndex,
  trH: number,
  scratch?: StatisticsScratch,
): MonthlyStatistics {
  return statisticsCore(timeMs, status, goStartOut, true, stepMs, calendar, trH, scratch);
}

/**
 * monthlyStatisticsWithGoStarts by the general record-by-record pass only, never the one-step
 * shortcut (see {@link backwardPassOneStep}): the reference the tests hold that shortcut to.
 */
export function monthlyStatisticsGeneralPath(
  timeMs: Float64Array,
  status: Uint8Array,
  goStartOut: Uint8Array,
  stepMs: number,
  calendar: CalendarIndex,
  trH: number,
  scratch?: StatisticsScratch,
): MonthlyStatistics {
  return statisticsCore(timeMs, status, goStartOut, true, stepMs, calendar, trH, scratch, false);
}

function statisticsCore(
  timeMs: Float64Array,
  status: Uint8Array,
  goStart: Uint8Array,
  findGoStarts: boolean,
  stepMs: number,
  calendar: CalendarIndex,
  trH: number,
  scratch: StatisticsScratch | undefined,
  allowOneStep = true,
): MonthlyStatistics {
  assertStep(stepMs);
  const trMs = trThresholdMs(trH);
  const n = timeMs.length;
  const ymArr = calendar.yearMonth;
  if (status.length !== n || goStart.length !== n || ymArr.length !== n) {
    throw new RangeError('monthlyStatistics: times, status, go-starts and calendar must have the same length');
  }
  const months: MonthStatistics[] = Array.from({ length: 12 }, (_, m) => emptyMonth(m + 1));
  if (n === 0) return { months, yearMonths: [] };
  const { durationMs, continues } = recordSteps(timeMs, stepMs);

  const s =
    scratch &&
    scratch.wowMs.length >= n &&
    scratch.byMonth.length >= n &&
    scratch.tmp.length >= n &&
    scratch.rampFirst.length >= n &&
    scratch.rampLength.length >= n
      ? scratch
      : createStatisticsScratch(n);
  const wow = s.wowMs;
  const { ymMin, K, order, start } = calendarGroups(ymArr);
  // On a grid of whole steps (an ascending calendar), the waits are kept as ramps, not per record.
  const ramps = order === null && onStepGrid(timeMs, stepMs) ? rampSet(K, s) : null;
  const records = new Int32Array(K);
  const withData = new Int32Array(K);
  const censored = new Int32Array(K);
  const wowCount = new Int32Array(K);
  const wowSumMs = new Float64Array(K);
  const windows = new Int32Array(K);
  const windowMs = new Float64Array(K);
  const withDataMs = new Float64Array(K);
  const workableMs = new Float64Array(K);
  const startsMs = new Float64Array(K);
  const acc: Accumulators = { withData, withDataMs, workableMs, startsMs, wowSumMs, windows, windowMs };
  for (let g = 0; g < K; g++) records[g] = start[g + 1] - start[g];
  let firstCensored: number;
  if (order === null) {
    // Ascending calendar: one backward pass, year-month by year-month, does everything.
    firstCensored =
      ramps !== null && findGoStarts && allowOneStep && oneStepThroughout(timeMs, durationMs, continues, stepMs)
        ? backwardPassOneStep(status, goStart, start, recordsReaching(trMs, stepMs), acc, ramps, stepMs)
        : backwardPassGrouped(timeMs, durationMs, continues, status, goStart, findGoStarts, start, trMs, wow, acc, ramps, stepMs);
  } else {
    firstCensored = backwardPass(timeMs, durationMs, continues, status, goStart, findGoStarts, ymArr, ymMin, trMs, wow, windows, windowMs);
    const sums = new Float64Array(5);
    for (let g = 0; g < K; g++) {
      if (records[g] === 0) continue;
      groupSumsOrdered(durationMs, status, goStart, wow, order, start[g], start[g + 1], sums);
      withData[g] = sums[0];
      withDataMs[g] = sums[1];
      workableMs[g] = sums[2];
      startsMs[g] = sums[3];
      wowSumMs[g] = sums[4];
    }
  }
  // WoW counts per year-month and the calendar-month layout of `byMonth`.
  const monthStart = new Int32Array(13);
  for (let g = 0; g < K; g++) {
    const a = start[g];
    const b = start[g + 1];
    const c = order === null ? Math.max(0, b - Math.max(a, firstCensored)) : countCensoredOrdered(order, a, b, firstCensored);
    censored[g] = c;
    wowCount[g] = b - a - c;
    monthStart[((g + ymMin) % 12) + 1] += wowCount[g];
  }
  for (let m = 0; m < 12; m++) monthStart[m + 1] += monthStart[m];
  const byMonth = s.byMonth;
  const monthFill = monthStart.slice(0, 12);
  // Grouped WoW values of a year-month: contiguous in `wow` for an ascending calendar (censored
  // records are the series' tail), else gathered through `order` into the calendar-month buffer.
  for (let g = 0; g < K; g++) {
    if (wowCount[g] === 0 || ramps !== null) continue;
    const m = (g + ymMin) % 12;
    if (order === null) byMonth.set(wow.subarray(start[g], start[g] + wowCount[g]), monthFill[m]);
    else gatherOrdered(wow, order, start[g], start[g + 1], firstCensored, byMonth, monthFill[m]);
    monthFill[m] += wowCount[g];
  }

  const yearMonths: YearMonthStatistics[] = [];
  const W = 11;
  const mAcc = new Float64Array(12 * W);
  for (let g = 0; g < K; g++) {
    if (records[g] === 0) continue;
    const m = (g + ymMin) % 12;
    const o = m * W;
    mAcc[o] += records[g];
    mAcc[o + 1] += withData[g];
    mAcc[o + 2] += workableMs[g];
    mAcc[o + 3] += startsMs[g];
    mAcc[o + 4] += wowCount[g];
    mAcc[o + 5] += wowSumMs[g];
    mAcc[o + 6] += censored[g];
    mAcc[o + 7] += windows[g];
    mAcc[o + 8] += windowMs[g];
    mAcc[o + 9] += 1;
    mAcc[o + 10] += withDataMs[g];
    let p90: number | null = null;
    if (wowCount[g] > 0) {
      // The year-month's values: a slice of `wow` (ascending calendar) or its part of `byMonth`.
      if (ramps !== null) p90 = rampQuantileMs(ramps, g, g, wowCount[g], 0.9, stepMs) / MS_PER_HOUR;
      else if (order === null) p90 = p90Ms(wow, start[g], start[g] + wowCount[g], s.tmp) / MS_PER_HOUR;
      else {
        const at = yearMonthOffsetInMonth(g, ymMin, wowCount, monthStart);
        p90 = p90Ms(byMonth, at, at + wowCount[g], s.tmp) / MS_PER_HOUR;
      }
    }
    yearMonths.push(
      yearMonthSummary(
        Math.floor((g + ymMin) / 12),
        m + 1,
        records[g],
        withData[g],
        withDataMs[g],
        workableMs[g],
        startsMs[g],
        wowCount[g],
        wowSumMs[g],
        p90,
        censored[g],
        windows[g],
        windowMs[g],
      ),
    );
  }
  for (let m = 0; m < 12; m++) {
    const o = m * W;
    if (mAcc[o] === 0) continue;
    let p90: number | null = null;
    if (mAcc[o + 4] > 0) {
      // The month's year-months: g = first, first + 12, ... (first: the first g of calendar month m).
      const first = (((m - ymMin) % 12) + 12) % 12;
      p90 =
        (ramps !== null
          ? rampQuantileMs(ramps, first, K - 1, mAcc[o + 4], 0.9, stepMs)
          : p90Ms(byMonth, monthStart[m], monthStart[m + 1], s.tmp)) / MS_PER_HOUR;
    }
    months[m] = summarise(
      m + 1,
      mAcc[o],
      mAcc[o + 1],
      mAcc[o + 10],
      mAcc[o + 2],
      mAcc[o + 3],
      mAcc[o + 4],
      mAcc[o + 5],
      p90,
      mAcc[o + 6],
      mAcc[o + 7],
      mAcc[o + 8],
      mAcc[o + 9],
    );
  }
  return { months, yearMonths };
}

// The passes are separate small functions so that the JIT optimizes each loop on its own type
// feedback (one large function with several long loops deoptimizes between them).

interface Accumulators {
  /** Records with data (a count). */
  withData: Int32Array;
  /** Durations of the records with data, workable records and go-starts, ms. */
  withDataMs: Float64Array;
  workableMs: Float64Array;
  startsMs: Float64Array;
  wowSumMs: Float64Array;
  windows: Int32Array;
  /** Summed lengths of the usable windows, ms. */
  windowMs: Float64Array;
}

/**
 * Backward pass over an ascending calendar, year-month by year-month (group g holds records
 * [start[g], start[g + 1])): go-starts (read, or found from the run's covered time when
 * `findGoStarts`), waiting on weather per record (ms; NaN = censored), usable windows counted in
 * the year-month of their first record, and the per-year-month sums (durations for the shares).
 * Returns the index of the first censored record: every record after the last go-start (n when
 * none is censored, 0 when all are).
 */
function backwardPassGrouped(
  timeMs: Float64Array,
  dur: Float64Array,
  cont: Uint8Array,
  status: Uint8Array,
  goStart: Uint8Array,
  findGoStarts: boolean,
  start: Int32Array,
  trMs: number,
  wow: Float64Array,
  acc: Accumulators,
  ramps: RampSet | null,
  stepMs: number,
): number {
  const WORKABLE: number = STATUS.WORKABLE;
  const NO_DATA: number = STATUS.NO_DATA;
  const n = timeMs.length;
  const useRamps = ramps !== null;
  const rFirst = ramps === null ? EMPTY : ramps.first;
  const rLength = ramps === null ? EMPTY : ramps.length;
  let nR = 0;
  let nextT = NaN;
  let firstCensored = n;
  let runMs = 0;
  for (let g = start.length - 2; g >= 0; g--) {
    let withData = 0;
    let withDataMs = 0;
    let workableMs = 0;
    let startsMs = 0;
    let wowSum = 0;
    // The open ramp: waits a, a + 1, ... (steps) of the records after i back to here.
    const groupRamps = nR;
    let zeros = 0;
    let open = false;
    let rampA = 0;
    let rampLen = 0;
    let maxV = 0;
    let tAfter = NaN;
    for (let i = start[g + 1] - 1; i >= start[g]; i--) {
      const t = timeMs[i];
      const st = status[i];
      const d = dur[i];
      let go: boolean;
      if (st === WORKABLE) {
        workableMs += d;
        runMs = cont[i] === 0 ? d : runMs + d;
        go = findGoStarts ? runMs >= trMs : goStart[i] !== 0;
        // i starts its run when the record before it does not continue the run.
        if (i === 0 || status[i - 1] !== WORKABLE || cont[i - 1] === 0) {
          if (runMs >= trMs) {
            acc.windows[g]++;
            acc.windowMs[g] += runMs;
          }
        }
      } else {
        runMs = 0;
        go = !findGoStarts && goStart[i] !== 0;
      }
      if (findGoStarts) goStart[i] = go ? 1 : 0;
      if (st !== NO_DATA) {
        withData++;
        withDataMs += d;
      }
      if (go) {
        startsMs += d;
        if (nextT !== nextT) firstCensored = i + 1;
        nextT = t;
      }
      const w = nextT - t;
      if (w === w) wowSum += w;
      if (!useRamps) wow[i] = w;
      else if (open && !go && tAfter - t === stepMs) rampLen++;
      else if (w === w) {
        // This record ends the open ramp (a go-start, a longer spacing) and starts a new one or is a zero.
        if (open) {
          rFirst[nR] = rampA;
          rLength[nR++] = rampLen;
          if (rampA + rampLen - 1 > maxV) maxV = rampA + rampLen - 1;
        }
        open = !go;
        if (go) zeros++;
        else {
          rampA = w / stepMs;
          rampLen = 1;
        }
      }
      tAfter = t;
    }
    if (ramps !== null) {
      if (open) {
        rFirst[nR] = rampA;
        rLength[nR++] = rampLen;
        if (rampA + rampLen - 1 > maxV) maxV = rampA + rampLen - 1;
      }
      ramps.from[g] = groupRamps;
      ramps.to[g] = nR;
      ramps.zeros[g] = zeros;
      ramps.max[g] = maxV;
    }
    acc.withData[g] = withData;
    acc.withDataMs[g] = withDataMs;
    acc.workableMs[g] = workableMs;
    acc.startsMs[g] = startsMs;
    acc.wowSumMs[g] = wowSum;
  }
  return nextT !== nextT ? 0 : firstCensored;
}

const EMPTY = new Int32Array(0);
const EMPTY_U32 = new Uint32Array(0);

const oneStepCache = new WeakMap<Float64Array, { stepMs: number; oneStep: boolean }>();

/**
 * True when every spacing of the series is exactly `stepMs`, so that every record lasts one step
 * and continues the one before it (kept per time array, which must not change afterwards).
 */
function oneStepThroughout(timeMs: Float64Array, durationMs: Float64Array, continues: Uint8Array, stepMs: number): boolean {
  const hit = oneStepCache.get(timeMs);
  if (hit && hit.stepMs === stepMs) return hit.oneStep;
  const n = timeMs.length;
  let oneStep = n >= 2;
  for (let i = 0; oneStep && i < n - 1; i++) {
    if (timeMs[i + 1] - timeMs[i] !== stepMs || durationMs[i] !== stepMs || continues[i] !== 1) oneStep = false;
  }
  if (oneStep && durationMs[n - 1] !== stepMs) oneStep = false;
  oneStepCache.set(timeMs, { stepMs, oneStep });
  return oneStep;
}

/** The fewest records of `stepMs` each whose summed duration reaches trMs (as the record-by-record sums reach it). */
function recordsReaching(trMs: number, stepMs: number): number {
  let k = Math.max(1, Math.ceil(trMs / stepMs));
  while (k > 1 && (k - 1) * stepMs >= trMs) k--;
  while (k * stepMs < trMs) k++;
  return k;
}

/**
 * backwardPassGrouped for a series of one step throughout (every spacing exactly `stepMs`, a whole
 * number of ms; see oneStepThroughout) that finds its go-starts, in whole records instead of ms:
 * a run's covered time is its record count times the step, the wait of record i is (next go-start
 * - i) steps, and every sum of durations is a count times the step. Those products and sums are
 * whole numbers of ms far below 2^53, so they equal the record-by-record float sums exactly.
 *
 * It goes back through stretches of equal status rather than record by record: in a stretch of
 * workable records the go-starts are its first records (those with at least `need` workable
 * records from them on), so each stretch is one scan for its start and a few sums; the waits are
 * the ramps between go-starts, never stored per record. Same results as backwardPassGrouped (a
 * property test holds the two equal).
 *
 * @param need records of a usable window (recordsReaching(TR))
 */
function backwardPassOneStep(
  status: Uint8Array,
  goStart: Uint8Array,
  start: Int32Array,
  need: number,
  acc: Accumulators,
  ramps: RampSet,
  stepMs: number,
): number {
  const WORKABLE: number = STATUS.WORKABLE;
  const NO_DATA: number = STATUS.NO_DATA;
  const n = status.length;
  const rFirst = ramps.first;
  const rLength = ramps.length;
  // Stretches are scanned four records at a time where the status buffer allows 32-bit reads.
  const words = status.byteOffset % 4 === 0 ? new Uint32Array(status.buffer, status.byteOffset, n >>> 2) : EMPTY_U32;
  // Every record is written 0 here and only the go-starts 1 below.
  goStart.fill(0, 0, n);
  let nR = 0;
  let next = -1;
  let firstCensored = n;
  let run = 0;
  for (let g = start.length - 2; g >= 0; g--) {
    let withData = 0;
    let workable = 0;
    let starts = 0;
    let windows = 0;
    let windowRecords = 0;
    let waitSteps = 0;
    const groupRamps = nR;
    let zeros = 0;
    let open = false;
    let rampA = 0;
    let rampLen = 0;
    let maxV = 0;
    const lo = start[g];
    let i = start[g + 1] - 1;
    while (i >= lo) {
      // The stretch [j, i] of equal status, within the year-month.
      const st = status[i];
      let j = i;
      while (j > lo && (j & 3) !== 0 && status[j - 1] === st) j--;
      if ((j & 3) === 0 && j - 4 >= lo && words.length > 0) {
        // Whole words of four equal codes, then the rest one by one.
        const four = st * 0x01010101;
        while (j - 4 >= lo && words[(j >>> 2) - 1] === four) j -= 4;
      }
      while (j > lo && status[j - 1] === st) j--;
      const c = i - j + 1;
      let gc = 0;
      if (st === WORKABLE) {
        // Record k has run + (i - k + 1) workable records from it on: a go-start from k <= kMax.
        const kMax = i + 1 + run - need;
        if (kMax >= j) gc = (kMax < i ? kMax : i) - j + 1;
        run += c;
        workable += c;
      } else run = 0;
      if (st !== NO_DATA) withData += c;
      if (gc > 16) goStart.fill(1, j, j + gc);
      else for (let k = j; k < j + gc; k++) goStart[k] = 1;
      // The records after the go-starts (back from i): they extend the open ramp, or open one.
      const rest = c - gc;
      if (rest > 0) {
        if (open) rampLen += rest;
        else if (next >= 0) {
          open = true;
          rampA = next - i;
          rampLen = rest;
        }
      }
      if (gc > 0) {
        starts += gc;
        zeros += gc;
        if (next < 0) firstCensored = j + gc;
        next = j;
        if (open) {
          // Waits rampA .. rampA + rampLen - 1 steps.
          rFirst[nR] = rampA;
          rLength[nR++] = rampLen;
          waitSteps += rampLen * rampA + (rampLen * (rampLen - 1)) / 2;
          if (rampA + rampLen - 1 > maxV) maxV = rampA + rampLen - 1;
          open = false;
        }
      }
      // j starts its run when the record before it is not workable.
      if (st === WORKABLE && (j === 0 || status[j - 1] !== WORKABLE) && run >= need) {
        windows++;
        windowRecords += run;
      }
      i = j - 1;
    }
    if (open) {
      rFirst[nR] = rampA;
      rLength[nR++] = rampLen;
      waitSteps += rampLen * rampA + (rampLen * (rampLen - 1)) / 2;
      if (rampA + rampLen - 1 > maxV) maxV = rampA + rampLen - 1;
    }
    ramps.from[g] = groupRamps;
    ramps.to[g] = nR;
    ramps.zeros[g] = zeros;
    ramps.max[g] = maxV;
    acc.withData[g] = withData;
    acc.withDataMs[g] = withData * stepMs;
    acc.workableMs[g] = workable * stepMs;
    acc.startsMs[g] = starts * stepMs;
    acc.wowSumMs[g] = waitSteps * stepMs;
    acc.windows[g] = windows;
    acc.windowMs[g] = windowRecords * stepMs;
  }
  return next < 0 ? 0 : firstCensored;
}

/**
 * The waits on weather of a series on a grid of whole steps, by year-month, without one value per
 * record: a wait is 0 at a go-start, and going back from it grows by one step per record while the
 * records are one step apart. Group g holds `zeros[g]` zeros and the ramps from[g] to to[g] - 1,
 * ramp r being the waits first[r], first[r] + 1, ..., first[r] + length[r] - 1 (in steps; the
 * censored records are in none). `max[g]` is the group's largest wait, in steps.
 */
interface RampSet {
  first: Int32Array;
  length: Int32Array;
  from: Int32Array;
  to: Int32Array;
  zeros: Int32Array;
  max: Int32Array;
}

function rampSet(K: number, s: StatisticsScratch): RampSet {
  return {
    first: s.rampFirst,
    length: s.rampLength,
    from: new Int32Array(K),
    to: new Int32Array(K),
    zeros: new Int32Array(K),
    max: new Int32Array(K),
  };
}

const gridCache = new WeakMap<Float64Array, { stepMs: number; onGrid: boolean }>();

/**
 * True when every time is a whole number of ms and a whole number of steps after the first (kept
 * per time array), so that every wait is a whole number of steps, exactly; and the series spans
 * under 2^30 steps.
 */
function onStepGrid(timeMs: Float64Array, stepMs: number): boolean {
  const hit = gridCache.get(timeMs);
  if (hit && hit.stepMs === stepMs) return hit.onGrid;
  const n = timeMs.length;
  const t0 = timeMs[0];
  let onGrid = Number.isInteger(stepMs) && Number.isInteger(t0) && (timeMs[n - 1] - t0) / stepMs < 2 ** 30;
  // A spacing of exactly one step keeps a time on the grid when the one before is (whole ms, so
  // the sums are exact): only the other spacings need the remainder, which costs far more.
  for (let i = 1; onGrid && i < n; i++) {
    if (timeMs[i] - timeMs[i - 1] !== stepMs && (timeMs[i] - t0) % stepMs !== 0) onGrid = false;
  }
  gridCache.set(timeMs, { stepMs, onGrid });
  return onGrid;
}

/** Waits of the groups g = gFrom, gFrom + 12, ... up to gTo that are at most v steps. */
function rampCount(r: RampSet, gFrom: number, gTo: number, v: number): number {
  const { first, length, from, to, zeros } = r;
  let c = 0;
  for (let g = gFrom; g <= gTo; g += 12) {
    c += zeros[g];
    for (let k = from[g]; k < to[g]; k++) {
      const x = v - first[k] + 1;
      if (x > 0) c += x < length[k] ? x : length[k];
    }
  }
  return c;
}

/**
 * Type-7 quantile (quantile-r7.ts, the same arithmetic) of the `count` waits of groups gFrom,
 * gFrom + 12, ... up to gTo, ms: the order statistics found by bisection on the value, counting
 * through the ramps. Exact (the waits are whole steps).
 */
function rampQuantileMs(r: RampSet, gFrom: number, gTo: number, count: number, p: number, stepMs: number): number {
  const h = (count - 1) * p;
  const lo = Math.floor(h);
  const frac = h - lo;
  let hi = 0;
  for (let g = gFrom; g <= gTo; g += 12) if (r.max[g] > hi) hi = r.max[g];
  // Smallest v with more than `lo` waits at most v.
  let a = 0;
  let b = hi;
  while (a < b) {
    const mid = (a + b) >>> 1;
    if (rampCount(r, gFrom, gTo, mid) > lo) b = mid;
    else a = mid + 1;
  }
  const v0 = a * stepMs;
  if (frac === 0 || lo + 1 >= count) return v0;
  let v1 = v0;
  if (rampCount(r, gFrom, gTo, a) <= lo + 1) {
    // The next order statistic is the smallest wait above v0.
    let next = Infinity;
    for (let g = gFrom; g <= gTo; g += 12) {
      for (let k = r.from[g]; k < r.to[g]; k++) {
        const f = r.first[k];
        if (f + r.length[k] - 1 > a) {
          const c = f > a ? f : a + 1;
          if (c < next) next = c;
        }
      }
    }
    v1 = next * stepMs;
  }
  return v0 + frac * (v1 - v0);
}

/** backwardPassGrouped for any calendar: WoW and windows only, windows by their first record's year-month. */
function backwardPass(
  timeMs: Float64Array,
  dur: Float64Array,
  cont: Uint8Array,
  status: Uint8Array,
  goStart: Uint8Array,
  findGoStarts: boolean,
  ymArr: Int32Array,
  ymMin: number,
  trMs: number,
  wow: Float64Array,
  windows: Int32Array,
  windowMs: Float64Array,
): number {
  const n = timeMs.length;
  const WORKABLE: number = STATUS.WORKABLE;
  let nextT = NaN;
  let firstCensored = n;
  let runMs = 0;
  for (let i = n - 1; i >= 0; i--) {
    const t = timeMs[i];
    let go: boolean;
    if (status[i] === WORKABLE) {
      runMs = cont[i] === 0 ? dur[i] : runMs + dur[i];
      go = findGoStarts ? runMs >= trMs : goStart[i] !== 0;
      if (i === 0 || status[i - 1] !== WORKABLE || cont[i - 1] === 0) {
        if (runMs >= trMs) {
          const g = ymArr[i] - ymMin;
          windows[g]++;
          windowMs[g] += runMs;
        }
      }
    } else {
      runMs = 0;
      go = !findGoStarts && goStart[i] !== 0;
    }
    if (findGoStarts) goStart[i] = go ? 1 : 0;
    if (go) {
      if (nextT !== nextT) firstCensored = i + 1;
      nextT = t;
    }
    wow[i] = nextT - t;
  }
  return nextT !== nextT ? 0 : firstCensored;
}

function groupSumsOrdered(
  dur: Float64Array,
  status: Uint8Array,
  goStart: Uint8Array,
  wow: Float64Array,
  order: Int32Array,
  a: number,
  b: number,
  out: Float64Array,
): void {
  let withData = 0;
  let withDataMs = 0;
  let workableMs = 0;
  let startsMs = 0;
  let wowSum = 0;
  const NO_DATA: number = STATUS.NO_DATA;
  const WORKABLE: number = STATUS.WORKABLE;
  for (let k = a; k < b; k++) {
    const i = order[k];
    const st = status[i];
    const d = dur[i];
    if (st !== NO_DATA) {
      withData++;
      withDataMs += d;
    }
    if (st === WORKABLE) workableMs += d;
    if (goStart[i] !== 0) startsMs += d;
    const w = wow[i];
    if (w === w) wowSum += w;
  }
  out[0] = withData;
  out[1] = withDataMs;
  out[2] = workableMs;
  out[3] = startsMs;
  out[4] = wowSum;
}

function countCensoredOrdered(order: Int32Array, a: number, b: number, firstCensored: number): number {
  let c = 0;
  for (let k = a; k < b; k++) if (order[k] >= firstCensored) c++;
  return c;
}

function gatherOrdered(
  wow: Float64Array,
  order: Int32Array,
  a: number,
  b: number,
  firstCensored: number,
  dest: Float64Array,
  at: number,
): void {
  let p = at;
  for (let k = a; k < b; k++) {
    const i = order[k];
    if (i < firstCensored) dest[p++] = wow[i];
  }
}

/** Offset of year-month g's values inside its calendar month's slice of `byMonth`. */
function yearMonthOffsetInMonth(g: number, ymMin: number, wowCount: Int32Array, monthStart: Int32Array): number {
  const m = (g + ymMin) % 12;
  let at = monthStart[m];
  for (let h = g - 12; h >= 0; h -= 12) at += wowCount[h];
  return at;
}

function emptyMonth(month: number): MonthStatistics {
  return {
    month,
    records: 0,
    recordsWithData: 0,
    workability: null,
    goStartShare: null,
    wowMeanHours: null,
    wowP90Hours: null,
    censored: 0,
    windows: 0,
    windowsPerMonth: null,
    meanWindowHours: null,
    years: 0,
  };
}

/** A share of the time with data (workable, go-starts), null without data. */
function shareOfData(partMs: number, withData: number, withDataMs: number): number | null {
  return withData > 0 ? partMs / withDataMs : null;
}

/** A mean in hours of `count` summed durations (ms), null for none. */
function meanHours(sumMs: number, count: number): number | null {
  return count > 0 ? sumMs / count / MS_PER_HOUR : null;
}

/** A calendar month's figures over the years from its sums: a year-month's, with the windows shared over its years. */
function summarise(
  month: number,
  records: number,
  withData: number,
  withDataMs: number,
  workableMs: number,
  startsMs: number,
  wowCount: number,
  wowSumMs: number,
  wowP90Hours: number | null,
  censored: number,
  windows: number,
  windowMs: number,
  years: number,
): MonthStatistics {
  // Twelve a series: the spread costs nothing that matters here.
  const { year: _year, ...figures } = yearMonthSummary(
    0,
    month,
    records,
    withData,
    withDataMs,
    workableMs,
    startsMs,
    wowCount,
    wowSumMs,
    wowP90Hours,
    censored,
    windows,
    windowMs,
  );
  return { ...figures, windowsPerMonth: years > 0 ? windows / years : null, years };
}

/**
 * One year-month's figures from its sums, as {@link summarise} gives a month's (one year: the
 * windows per month are its windows). Written out rather than `{ year, ...summarise(...) }`: the
 * spread took about 10 ms per 18,000 year-months (30 years, 50 operations), measured.
 */
function yearMonthSummary(
  year: number,
  month: number,
  records: number,
  withData: number,
  withDataMs: number,
  workableMs: number,
  startsMs: number,
  wowCount: number,
  wowSumMs: number,
  wowP90Hours: number | null,
  censored: number,
  windows: number,
  windowMs: number,
): YearMonthStatistics {
  return {
    year,
    month,
    records,
    recordsWithData: withData,
    workability: shareOfData(workableMs, withData, withDataMs),
    goStartShare: shareOfData(startsMs, withData, withDataMs),
    wowMeanHours: meanHours(wowSumMs, wowCount),
    wowP90Hours,
    censored,
    windows,
    windowsPerMonth: windows,
    meanWindowHours: meanHours(windowMs, windows),
  };
}
