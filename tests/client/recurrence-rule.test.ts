// The alerts page's recurrence builder (src/features/alerts/components/recurrence-rule.ts): form
// fields to an RRULE body and back, on rrule's own parser and formatter. Expected rule texts are
// written by hand from RFC 5545 section 3.3.10 (RECUR value: FREQ first, BYDAY two-letter
// weekdays, UNTIL as a UTC date-time "YYYYMMDDTHHMMSSZ"); none are copied from the code's output.
import { describe, expect, it } from 'vitest';
import { buildRule, parseRule, ruleInWords, weekdayOf, type RecurrenceForm } from '../../src/features/alerts/components/recurrence-rule';

const base: RecurrenceForm = {
  freq: 'WEEKLY',
  byDay: ['MO', 'WE', 'FR'],
  interval: 1,
  startDate: '2026-03-02',
  startTime: '06:00',
  timeZone: 'Europe/Oslo',
  endKind: 'never',
  count: Number.NaN,
  untilDate: '',
};
const input = (rule: string) => ({ start: '2026-03-02T06:00', timeZone: 'Europe/Oslo', rule });

describe('buildRule (RFC 5545 RECUR)', () => {
  it('writes weekly rules with weekdays in week order', () => {
    expect(buildRule({ ...base, byDay: ['FR', 'MO', 'WE'] })).toBe('FREQ=WEEKLY;BYDAY=MO,WE,FR');
  });
  it('writes an interval only above 1, and an end by count', () => {
    expect(buildRule({ ...base, freq: 'DAILY', byDay: [], interval: 2, endKind: 'count', count: 10 })).toBe(
      'FREQ=DAILY;INTERVAL=2;COUNT=10',
    );
  });
  it('writes UNTIL as the end of the last day', () => {
    expect(buildRule({ ...base, byDay: ['TU'], endKind: 'until', untilDate: '2026-12-31' })).toBe(
      'FREQ=WEEKLY;BYDAY=TU;UNTIL=20261231T235959Z',
    );
  });
});

describe('parseRule', () => {
  it('reads back what the builder writes', () => {
    for (const form of [
      base,
      { ...base, freq: 'DAILY' as const, byDay: [], interval: 3, endKind: 'count' as const, count: 7 },
      { ...base, interval: 2, byDay: ['SA' as const, 'SU' as const], endKind: 'until' as const, untilDate: '2027-01-15' },
    ]) {
      const back = parseRule({ start: `${form.startDate}T${form.startTime}`, timeZone: form.timeZone, rule: buildRule(form) });
      expect(back).toEqual(form);
    }
  });
  it('accepts WKST=MO (the RFC default) and refuses another week start', () => {
    expect(parseRule(input('FREQ=WEEKLY;BYDAY=MO;WKST=MO'))?.byDay).toEqual(['MO']);
    expect(parseRule(input('FREQ=WEEKLY;BYDAY=MO;WKST=SU'))).toBeNull();
  });
  it('returns null for rules the builder does not offer, so they are shown as text only', () => {
    for (const rule of [
      'FREQ=MONTHLY;BYDAY=MO', // monthly
      'FREQ=WEEKLY;BYDAY=+1MO', // an ordinal weekday
      'FREQ=WEEKLY;BYSETPOS=1;BYDAY=MO', // a part the builder has no field for
      'FREQ=DAILY;BYDAY=MO,TU', // daily on weekdays
      'FREQ=WEEKLY;INTERVAL=100;BYDAY=MO', // above the builder's 99
      'FREQ=WEEKLY;COUNT=1000;BYDAY=MO', // above the builder's 999
      'FREQ=WEEKLY;NOTAPART=1', // not RFC 5545 at all
    ]) {
      expect({ rule, form: parseRule(input(rule)) }).toEqual({ rule, form: null });
    }
  });
});

describe('ruleInWords and weekdayOf', () => {
  it('says the rule in words', () => {
    expect(ruleInWords({ ...base, endKind: 'count', count: 10 })).toBe(
      'Every week on Monday, Wednesday and Friday at 06:00 (Europe/Oslo), from 2026-03-02, 10 times in all',
    );
  });
  it('names the weekday of a date (2026-03-02 is a Monday, 2024-02-29 a Thursday: any calendar)', () => {
    expect(weekdayOf('2026-03-02')).toBe('MO');
    expect(weekdayOf('2024-02-29')).toBe('TH');
    expect(weekdayOf('02/03/2026')).toBeNull();
  });
});
