import { tzOffset } from '@date-fns/tz';

/** Calendar month of every record in a time zone. */
export interface CalendarIndex {
  /** IANA time zone the months are taken in. */
  timeZone: string;
  /** Calendar month per record, 0 (January) to 11. */
  month: Uint8Array;
  /** year * 12 + month (month 0-11) per record. */
  yearMonth: Int32Array;
}

const DAY_MS = 86_400_000;

/**
 * UTC offset of a time zone at an instant, ms (positive east of Greenwich), from the runtime's
 * time-zone data through @date-fns/tz's `tzOffset` (Intl.DateTimeFormat).
 *
 * @throws RangeError for a time zone the runtime does not know.
 */
export function zoneOffsetMs(timeZone: string, utcMs: number): number {
  if (timeZone === 'UTC') return 0;
  const minutes = tzOffset(timeZone, new Date(utcMs));
  if (!Number.isFinite(minutes)) throw new RangeError(`unknown time zone: ${timeZone}`);
  return Math.round(minutes * 60_000);
}

/**
 * Start of a calendar month in a time zone, UTC epoch ms: the first instant whose local wall-clock
 * time is on or after the 1st at 00:00. When 00:00 does not exist (a daylight-saving change at
 * midnight), that is the instant of the change; when it occurs twice, the first of the two.
 *
 * Method: the two offsets found a day either side of the naive instant give the candidates
 * wall - offset; a candidate is kept when its own offset maps it back to 00:00 exactly (a check
 * with the time-zone data, not an assumption); with none, a bisection finds the change instant.
 * Assumes at most one offset change within a day of the month boundary (true of the IANA data).
 *
 * @param year calendar year
 * @param month 1-12 (values outside roll over, as Date.UTC does)
 * @param timeZone IANA time zone, e.g. 'Europe/Oslo'
 * @throws RangeError for an unknown time zone.
 * @example zonedMonthStartMs(2024, 4, 'Europe/Oslo') // Date.UTC(2024, 2, 31, 22) (CEST, UTC+2)
 */
export function zonedMonthStartMs(year: number, month: number, timeZone: string): number {
  const wall = Date.UTC(year, month - 1, 1);
  const oBefore = zoneOffsetMs(timeZone, wall - DAY_MS);
  const oAfter = zoneOffsetMs(timeZone, wall + DAY_MS);
  const cBefore = wall - oBefore;
  const cAfter = wall - oAfter;
  let best = Infinity;
  if (cBefore + zoneOffsetMs(timeZone, cBefore) === wall) best = cBefore;
  if (cAfter !== cBefore && cAfter < best && cAfter + zoneOffsetMs(timeZone, cAfter) === wall) best = cAfter;
  if (best !== Infinity) return best;
  // 00:00 skipped: bisection for the first instant whose wall clock is at or past 00:00.
  let lo = Math.min(wall - oBefore, wall - oAfter, wall - DAY_MS / 2);
  let hi = Math.max(wall - oBefore, wall - oAfter, wall + DAY_MS / 2);
  // Invariant: wall clock at lo < wall <= wall clock at hi.
  while (hi - lo > 1) {
    const mid = Math.floor((lo + hi) / 2);
    if (mid + zoneOffsetMs(timeZone, mid) >= wall) hi = mid;
    else lo = mid;
  }
  return hi;
}

/**
 * Calendar month of every record in a time zone (docs/domain.md#convention-11: months are calendar months in the
 * worksite's time zone).
 *
 * Fast for long series: instead of one time-zone lookup per record, it computes the UTC start of
 * each calendar month the series spans ({@link zonedMonthStartMs}, a few Intl calls a month, each
 * checked against the zone data) and walks the ascending times through those boundaries. 30 years
 * hourly (263k records) take a few ms.
 *
 * @param timeMs record times, UTC epoch ms, ascending
 * @param timeZone IANA time zone
 * @param into buffers (each at least as long as the series) to write into instead of new arrays,
 *   for repeated runs (fresh memory costs a page fault per 4 kB); the result's arrays are new views
 *   of them, valid until the buffers are used again
 * @throws RangeError for an unknown time zone or times that are not finite and ascending.
 */
export function calendarIndex(timeMs: Float64Array, timeZone: string, into?: { month: Uint8Array; yearMonth: Int32Array }): CalendarIndex {
  const n = timeMs.length;
  if (into && (into.month.length < n || into.yearMonth.length < n)) {
    throw new RangeError(`calendarIndex: buffers shorter than the series (${n} records)`);
  }
  const month = into ? into.month.subarray(0, n) : new Uint8Array(n);
  const yearMonth = into ? into.yearMonth.subarray(0, n) : new Int32Array(n);
  zoneOffsetMs(timeZone, 0); // throws for an unknown zone, also for an empty series
  if (n === 0) return { timeZone, month, yearMonth };
  const tFirst = timeMs[0];
  const tLast = timeMs[n - 1];
  if (!Number.isFinite(tFirst) || !Number.isFinite(tLast) || tLast < tFirst)
    throw new RangeError('calendarIndex: times must be finite and ascending');
  // Month starts from the month before the first record's to the month after the last's.
  let ymFirst = localYearMonth(tFirst, timeZone);
  while (monthStart(ymFirst, timeZone) > tFirst) ymFirst--;
  const ymLast = localYearMonth(tLast, timeZone) + 1;
  const starts = new Float64Array(ymLast - ymFirst + 2);
  for (let k = 0; k < starts.length; k++) starts[k] = monthStart(ymFirst + k, timeZone);
  assignMonths(timeMs, starts, ymFirst, month, yearMonth);
  return { timeZone, month, yearMonth };
}

/** year * 12 + month (0-11) of an instant's local date. */
function localYearMonth(utcMs: number, timeZone: string): number {
  const local = new Date(utcMs + zoneOffsetMs(timeZone, utcMs));
  return local.getUTCFullYear() * 12 + local.getUTCMonth();
}

/** Walks the ascending times through the ascending month starts. */
function assignMonths(timeMs: Float64Array, starts: Float64Array, ymFirst: number, month: Uint8Array, yearMonth: Int32Array): void {
  let k = 0;
  let next = starts[1];
  const last = starts.length - 1;
  for (let i = 0; i < timeMs.length; i++) {
    const t = timeMs[i];
    if (!(t >= starts[k])) throw new RangeError(`calendarIndex: times must be finite and ascending (index ${i})`);
    while (t >= next && k < last - 1) next = starts[++k + 1];
    const ym = ymFirst + k;
    yearMonth[i] = ym;
    month[i] = ym - Math.floor(ym / 12) * 12;
  }
}

function monthStart(ym: number, timeZone: string): number {
  const year = Math.floor(ym / 12);
  return zonedMonthStartMs(year, ym - year * 12 + 1, timeZone);
}
