import { describe, expect, it } from 'vitest';
import { expandRecurrence, recurrenceText, RecurrenceInput } from '../../shared/recurrence';

const utc = (ms: number[]) => ms.map((t) => new Date(t).toISOString());

describe('recurring operations against RFC 5545 section 3.8.5.3 examples (open standard)', () => {
  it('"Daily for 10 occurrences" from 1997-09-02 09:00 America/New_York (EDT, UTC-4)', () => {
    const r = { start: '1997-09-02T09:00', timeZone: 'America/New_York', rule: 'FREQ=DAILY;COUNT=10' };
    const got = utc(expandRecurrence(r, Date.UTC(1997, 0, 1), Date.UTC(1998, 0, 1)));
    // RFC 5545: "==> (1997 9:00 AM EDT) September 2-11"
    expect(got).toEqual(Array.from({ length: 10 }, (_, i) => `1997-09-${String(2 + i).padStart(2, '0')}T13:00:00.000Z`));
  });

  it('"Weekly on Tuesday and Thursday for five weeks"', () => {
    const r = { start: '1997-09-02T09:00', timeZone: 'America/New_York', rule: 'FREQ=WEEKLY;UNTIL=19971007T000000Z;WKST=SU;BYDAY=TU,TH' };
    const got = utc(expandRecurrence(r, Date.UTC(1997, 0, 1), Date.UTC(1998, 0, 1)));
    // RFC 5545: "==> (1997 9:00 AM EDT) September 2,4,9,11,16,18,23,25,30; October 2"
    const days = ['09-02', '09-04', '09-09', '09-11', '09-16', '09-18', '09-23', '09-25', '09-30', '10-02'];
    expect(got).toEqual(days.map((d) => `1997-${d}T13:00:00.000Z`));
  });

  it('"Every other week on Monday, Wednesday, and Friday until December 24, 1997", across the change from EDT to EST', () => {
    const r = {
      start: '1997-09-01T09:00',
      timeZone: 'America/New_York',
      rule: 'FREQ=WEEKLY;INTERVAL=2;WKST=SU;UNTIL=19971224T000000Z;BYDAY=MO,WE,FR',
    };
    const got = utc(expandRecurrence(r, Date.UTC(1997, 0, 1), Date.UTC(1998, 0, 1)));
    // RFC 5545: "(1997 9:00 AM EDT) September 1,3,5,15,17,19,29; October 1,3,13,15,17
    //            (1997 9:00 AM EST) October 27,29,31; November 10,12,14,24,26,28; December 8,10,12,22"
    const edt = ['09-01', '09-03', '09-05', '09-15', '09-17', '09-19', '09-29', '10-01', '10-03', '10-13', '10-15', '10-17'];
    const est = ['10-27', '10-29', '10-31', '11-10', '11-12', '11-14', '11-24', '11-26', '11-28', '12-08', '12-10', '12-12', '12-22'];
    expect(got).toEqual([...edt.map((d) => `1997-${d}T13:00:00.000Z`), ...est.map((d) => `1997-${d}T14:00:00.000Z`)]);
  });

  it('keeps a crew change at 06:00 local across the European change to summer time (EU Directive 2000/84/EC: last Sunday of March)', () => {
    const r = { start: '2027-03-22T06:00', timeZone: 'Europe/London', rule: 'FREQ=WEEKLY;BYDAY=MO,WE,FR' };
    const got = utc(expandRecurrence(r, Date.UTC(2027, 2, 20), Date.UTC(2027, 3, 3)));
    // 28 March 2027 is the last Sunday of March: GMT (UTC+0) before, BST (UTC+1) after.
    expect(got).toEqual([
      '2027-03-22T06:00:00.000Z',
      '2027-03-24T06:00:00.000Z',
      '2027-03-26T06:00:00.000Z',
      '2027-03-29T05:00:00.000Z',
      '2027-03-31T05:00:00.000Z',
      '2027-04-02T05:00:00.000Z',
    ]);
  });

  it('writes the rule as RFC 5545 text and refuses a malformed rule', () => {
    expect(recurrenceText({ start: '2027-01-04T06:00', timeZone: 'Europe/London', rule: 'FREQ=WEEKLY;BYDAY=MO' })).toBe(
      'DTSTART;TZID=Europe/London:20270104T060000\nRRULE:FREQ=WEEKLY;BYDAY=MO',
    );
    expect(RecurrenceInput.safeParse({ start: '2027-01-04T06:00', timeZone: 'Europe/London', rule: 'EVERY MONDAY' }).success).toBe(false);
    expect(RecurrenceInput.safeParse({ start: '2027-01-04T06:00', timeZone: 'Mars/Olympus', rule: 'FREQ=DAILY' }).success).toBe(false);
  });
});

/**
 * Every date at `hour`:00 UTC in [from, to) whose UTC calendar day passes `keep`, by a plain day
 * walk (written for this test, independent of rrule and of the product's expansion).
 */
function daysWhere(from: number, to: number, hour: number, keep: (day: Date) => boolean): string[] {
  const out: string[] = [];
  for (
    let t = Date.UTC(new Date(from).getUTCFullYear(), new Date(from).getUTCMonth(), new Date(from).getUTCDate(), hour);
    t < to;
    t += 86_400_000
  ) {
    if (t >= from && keep(new Date(t))) out.push(new Date(t).toISOString());
  }
  return out;
}

/** `r` expands over [from, to) to the days `keep` passes at `hour`:00 UTC, and there are at least `atLeast` of them. */
function expectDaysWhere(
  r: Parameters<typeof expandRecurrence>[0],
  [from, to]: [number, number],
  hour: number,
  keep: (day: Date) => boolean,
  atLeast: number,
) {
  const expected = daysWhere(from, to, hour, keep);
  expect(expected.length).toBeGreaterThanOrEqual(atLeast);
  expect(utc(expandRecurrence(r, from, to))).toEqual(expected);
}
const daysInMonth = (y: number, m0: number) => new Date(Date.UTC(y, m0 + 1, 0)).getUTCDate();

describe('a rule started years ago is expanded from near the window (RFC 5545 3.3.10)', () => {
  it('gives the two daily crew changes of a week in December 2026 for a rule started in 1950 (about 56,000 earlier occurrences)', () => {
    const r = { start: '1950-01-01T06:00', timeZone: 'Europe/London', rule: 'FREQ=DAILY;BYHOUR=6,18' };
    const from = Date.UTC(2026, 11, 7);
    const to = Date.UTC(2026, 11, 14);
    // London keeps GMT (UTC+0) in December (Summer Time Act 1972 and EU Directive 2000/84/EC, from memory).
    const expected = [...daysWhere(from, to, 6, () => true), ...daysWhere(from, to, 18, () => true)].sort();
    expect(expected).toHaveLength(14);
    expect(utc(expandRecurrence(r, from, to))).toEqual(expected);
  });

  it('keeps every third week of a WEEKLY;INTERVAL=3 rule from 1970 (weeks start on Monday, RFC 5545 WKST default)', () => {
    const r = { start: '1970-01-06T09:00', timeZone: 'UTC', rule: 'FREQ=WEEKLY;INTERVAL=3;BYDAY=TU,TH' };
    // 1970-01-05 was a Monday (1970-01-01 was a Thursday, common knowledge): the rule's first week.
    const firstMonday = Date.UTC(1970, 0, 5);
    const tuThEveryThirdWeek = (d: Date) => {
      const week = Math.floor((d.getTime() - 9 * 3_600_000 - firstMonday) / (7 * 86_400_000));
      return week % 3 === 0 && (d.getUTCDay() === 2 || d.getUTCDay() === 4);
    };
    expectDaysWhere(r, [Date.UTC(2026, 0, 1), Date.UTC(2026, 2, 1)], 9, tuThEveryThirdWeek, 5);
  });

  it('skips the months without a 31st in a MONTHLY;INTERVAL=5 rule from 31 January 1931 (invalid dates are ignored)', () => {
    const r = { start: '1931-01-31T12:00', timeZone: 'UTC', rule: 'FREQ=MONTHLY;INTERVAL=5' };
    const every5thMonth31st = (d: Date) => {
      const monthsSince = (d.getUTCFullYear() - 1931) * 12 + d.getUTCMonth();
      return monthsSince % 5 === 0 && d.getUTCDate() === 31;
    };
    expectDaysWhere(r, [Date.UTC(2025, 0, 1), Date.UTC(2030, 0, 1)], 12, every5thMonth31st, 4);
  });

  it('keeps the last Friday of each month of a rule from 1960, and a 29 February rule from 1904 in leap years only', () => {
    const lastFriday = { start: '1960-03-01T07:00', timeZone: 'UTC', rule: 'FREQ=MONTHLY;BYDAY=-1FR' };
    const from = Date.UTC(2026, 0, 1);
    const to = Date.UTC(2027, 0, 1);
    const expected = daysWhere(
      from,
      to,
      7,
      (d) => d.getUTCDay() === 5 && d.getUTCDate() + 7 > daysInMonth(d.getUTCFullYear(), d.getUTCMonth()),
    );
    expect(expected).toHaveLength(12);
    expect(utc(expandRecurrence(lastFriday, from, to))).toEqual(expected);

    const leapDay = { start: '1904-02-29T08:00', timeZone: 'UTC', rule: 'FREQ=YEARLY' };
    // Gregorian leap years between 2026 and 2032: 2028 and 2032 (divisible by 4, not centuries).
    expect(utc(expandRecurrence(leapDay, Date.UTC(2026, 0, 1), Date.UTC(2033, 0, 1)))).toEqual([
      '2028-02-29T08:00:00.000Z',
      '2032-02-29T08:00:00.000Z',
    ]);
  });

  it('still ends at UNTIL for a rule from 1950', () => {
    const r = { start: '1950-01-01T06:00', timeZone: 'UTC', rule: 'FREQ=DAILY;UNTIL=20261210T000000Z' };
    expect(utc(expandRecurrence(r, Date.UTC(2026, 11, 7), Date.UTC(2026, 11, 14)))).toEqual([
      '2026-12-07T06:00:00.000Z',
      '2026-12-08T06:00:00.000Z',
      '2026-12-09T06:00:00.000Z',
    ]);
  });
});
