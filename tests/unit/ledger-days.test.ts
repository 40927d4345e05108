// The ledger's day arithmetic on hand cases (shared/ledger/days.ts): calendar days and months in a
// worksite's time zone, and the tally of planned, lost and limiting hours. Clock changes are those
// of the IANA tz database for Europe/London and Australia/Sydney (from memory: last Sunday of
// March and of October for the UK; AEDT, UTC+11, in the southern summer).
import { describe, expect, it } from 'vitest';
import { calendarIndex, LIMIT, STATUS } from '../../shared/engine';
import { daysOf, tallyDay, tallyStitched, yearMonthLostHours, zonedDayMs, type StatusPart } from '../../shared/ledger/days';

const HOUR = 3_600_000;
const { WORKABLE, NOT_WORKABLE, NO_DATA } = STATUS;

function zonedIndex(timeMs: Float64Array, t: number): number {
  return timeMs.findIndex((x) => x >= t);
}

/** An hourly (or `stepH`-hourly) source of statuses from `startMs`. */
function part(startMs: number, statuses: number[], limits: number[] = [], stepH = 1): StatusPart {
  return {
    timeMs: Float64Array.from(statuses, (_, i) => startMs + i * stepH * HOUR),
    status: Uint8Array.from(statuses),
    limiting: Uint8Array.from(statuses, (_, i) => limits[i] ?? 0),
    stepMs: stepH * HOUR,
  };
}

describe('calendar days', () => {
  it('lists every date from one to another, inclusive, across month and year ends', () => {
    expect(daysOf('2026-12-30', '2027-01-02')).toEqual(['2026-12-30', '2026-12-31', '2027-01-01', '2027-01-02']);
    expect(daysOf('2028-02-28', '2028-03-01')).toEqual(['2028-02-28', '2028-02-29', '2028-03-01']); // 2028 is a leap year
    expect(daysOf('2026-05-01', '2026-05-01')).toEqual(['2026-05-01']);
    expect(daysOf('2026-05-02', '2026-05-01')).toEqual([]);
  });
});

describe('ledger day arithmetic (hand cases)', () => {
  it('takes the real length of a day in the worksite zone', () => {
    // Europe/London: clocks go forward on 29 March 2026 and back on 25 October 2026.
    const spring = zonedDayMs('2026-03-29', 'Europe/London');
    expect(spring).toEqual({ startMs: Date.UTC(2026, 2, 29, 0), endMs: Date.UTC(2026, 2, 29, 23) });
    const autumn = zonedDayMs('2026-10-25', 'Europe/London');
    expect((autumn.endMs - autumn.startMs) / HOUR).toBe(25);
    // Australia/Sydney in January is UTC+11: local midnight is 13:00 UTC the day before.
    expect(zonedDayMs('2027-01-10', 'Australia/Sydney').startMs).toBe(Date.UTC(2027, 0, 9, 13));
  });

  it('counts lost hours as planned minus workable, with gaps and no data lost, and the dominant limit', () => {
    const day = Date.UTC(2026, 5, 1);
    // 20 hourly records from 00:00 (hours 20-23 absent): 10 workable, 6 broken by wind, 3 by Hs, 1 no data.
    const timeMs = Float64Array.from({ length: 20 }, (_, i) => day + i * HOUR);
    const status = new Uint8Array(20);
    const limiting = new Uint8Array(20);
    for (let i = 0; i < 20; i++) {
      if (i < 10) status[i] = STATUS.WORKABLE;
      else if (i < 16) [status[i], limiting[i]] = [STATUS.NOT_WORKABLE, LIMIT.WIND];
      else if (i < 19) [status[i], limiting[i]] = [STATUS.NOT_WORKABLE, LIMIT.HS];
      else status[i] = STATUS.NO_DATA;
    }
    // Hand count: 24 planned - 10 workable = 14 lost; wind 6 h beats no data 1 + 4 absent = 5 h and Hs 3 h.
    expect(tallyDay(timeMs, status, limiting, HOUR, day, day + 24 * HOUR)).toEqual({ plannedHours: 24, lostHours: 14, limiting: 'wind' });
    // Two more hours of no data and no data leads (7 h > 6 h).
    status[9] = STATUS.NO_DATA;
    status[8] = STATUS.NO_DATA;
    expect(tallyDay(timeMs, status, limiting, HOUR, day, day + 24 * HOUR)).toEqual({ plannedHours: 24, lostHours: 16, limiting: 'noData' });
    // A wholly workable day loses nothing and names no limit; records of the next day do not count.
    const calm = Float64Array.from({ length: 48 }, (_, i) => day + i * HOUR);
    expect(tallyDay(calm, new Uint8Array(48).fill(STATUS.WORKABLE), new Uint8Array(48), HOUR, day, day + 24 * HOUR)).toEqual({
      plannedHours: 24,
      lostHours: 0,
      limiting: null,
    });
    // Three-hourly records stand for three hours each.
    const coarse = Float64Array.from({ length: 8 }, (_, i) => day + i * 3 * HOUR);
    const st = Uint8Array.from([3, 3, 1, 1, 3, 3, 3, 3]);
    expect(tallyDay(coarse, st, Uint8Array.from([0, 0, 7, 7, 0, 0, 0, 0]), 3 * HOUR, day, day + 24 * HOUR)).toEqual({
      plannedHours: 24,
      lostHours: 6,
      limiting: 'wind',
    });
  });

  it('stitches forecast issues minute by minute, the first source that covers a minute deciding', () => {
    const day = Date.UTC(2026, 5, 1);
    // Newest issue from 06:00, 12 h workable then 6 h broken by Hs; an older issue over the whole
    // day, broken by wind everywhere. Hand count: 00-06 wind (older), 06-18 workable, 18-24 Hs; wind
    // and Hs tie at 6 h, and a tie goes to the first limit in the engine's order (Hs, shared/engine/types.ts).
    const newer = part(
      day + 6 * HOUR,
      [...Array(12).fill(WORKABLE), ...Array(6).fill(NOT_WORKABLE)],
      [...Array(12).fill(0), ...Array(6).fill(LIMIT.HS)],
    );
    const older = part(day, Array(24).fill(NOT_WORKABLE), Array(24).fill(LIMIT.WIND));
    const t = tallyStitched([newer, older], day, day + 24 * HOUR);
    expect(t).toEqual({ plannedHours: 24, lostHours: 12, limiting: 'hs', minutesBySource: [18 * 60, 6 * 60] });
    // One source on whole hours gives what tallyDay gives.
    const one = part(day, [WORKABLE, WORKABLE, NOT_WORKABLE, NO_DATA], [0, 0, LIMIT.WIND, 0]);
    const { minutesBySource, ...alone } = tallyStitched([one], day, day + 24 * HOUR);
    expect(alone).toEqual(tallyDay(one.timeMs, one.status, one.limiting, HOUR, day, day + 24 * HOUR));
    expect(minutesBySource).toEqual([4 * 60]);
    // Nothing covers the day: all of it is lost to missing data.
    expect(tallyStitched([], day, day + 24 * HOUR)).toEqual({ plannedHours: 24, lostHours: 24, limiting: 'noData', minutesBySource: [] });
  });

  it('counts a 25-hour day of a clock change whole (Europe/London, 25 October 2026)', () => {
    const { startMs, endMs } = zonedDayMs('2026-10-25', 'Europe/London');
    const calm = part(startMs, Array(25).fill(WORKABLE));
    expect(tallyDay(calm.timeMs, calm.status, calm.limiting, HOUR, startMs, endMs)).toEqual({
      plannedHours: 25,
      lostHours: 0,
      limiting: null,
    });
    // Only 24 records: the 25th hour has no record and is lost to missing data.
    const short = part(startMs, Array(24).fill(WORKABLE));
    expect(tallyDay(short.timeMs, short.status, short.limiting, HOUR, startMs, endMs)).toEqual({
      plannedHours: 25,
      lostHours: 1,
      limiting: 'noData',
    });
  });

  it('takes the real length of months on clock-change dates (Europe/London March: 743 h)', () => {
    // Hourly from 2024-01-01 00:00Z to 2025-12-30 23:00Z; workable only for the first 100 records
    // of March 2024.
    const start = Date.UTC(2024, 0, 1);
    const n = 8784 + 8760 - 24;
    const timeMs = Float64Array.from({ length: n }, (_, i) => start + i * HOUR);
    const status = new Uint8Array(n).fill(STATUS.NOT_WORKABLE);
    const march = zonedIndex(timeMs, Date.UTC(2024, 2, 1));
    for (let i = march; i < march + 100; i++) status[i] = STATUS.WORKABLE;
    const cal = calendarIndex(timeMs, 'Europe/London');
    const lost = new Map(yearMonthLostHours(timeMs, status, cal.yearMonth, HOUR, 'Europe/London'));
    // 31 days less the hour skipped on the last Sunday of March (31 March 2024), minus 100 workable.
    expect(lost.get(2024 * 12 + 2)).toBe(743 - 100);
    expect(lost.get(2024 * 12 + 9)).toBe(745); // October: the hour repeated on 27 October 2024
    // December 2025 ends after the data (last record 2025-12-30 23:00Z + 1 h): left out.
    expect(lost.has(2025 * 12 + 11)).toBe(false);
  });
});
