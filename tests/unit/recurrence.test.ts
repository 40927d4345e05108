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
