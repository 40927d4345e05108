// The Overview's plain line per operation and worksite (src/features/overview/components/plain-line.ts).
// The wording is the issue's own (issue 17: "may start now"; "next go-start Thu 4 Dec 14:00 (in 20 h),
// window 35 h"; "no window in this forecast (to Sun 13 Dec)"), with the limiting factor and the
// chance after it. Weekdays are from the calendar: 3 Dec 2026 is a Thursday, so 4 Dec 2026 is a
// Friday and 13 Dec 2026 a Sunday. Zones from the IANA time zone database (from memory): Europe/Oslo
// is UTC+1 in December, Europe/London UTC+0, America/St_Johns UTC-3:30.
import { describe, expect, it } from 'vitest';
import type { OverviewLine } from '../../shared/api-types-overview';
import {
  aheadWords,
  changeCountWords,
  forecastAgeWords,
  goStartWords,
  hoursWords,
  plainLine,
  startSentence,
} from '../../src/features/overview/components/plain-line';

const NOW = Date.parse('2026-12-03T18:00:00Z');
const FORECAST_END = '2026-12-13T18:00:00Z';

const line = (over: Partial<OverviewLine>): OverviewLine => ({
  operationId: 'op',
  operationName: 'Cable pull-in',
  siteId: 'site',
  siteName: 'Landfall',
  timeZone: 'Europe/London',
  tr: 12,
  tpop: 8,
  informationOnly: false,
  mine: false,
  startNow: false,
  earliestStart: null,
  windowHours: null,
  limiting: null,
  chance: null,
  next: { times: [], status: [] },
  ...over,
});

describe('the plain line', () => {
  it('says "may start now" with the window left, and no limiting factor', () => {
    expect(plainLine(line({ startNow: true, windowHours: 35, limiting: 'hs' }), NOW, FORECAST_END)).toBe('may start now, window 35 h');
  });

  it('names the next go-start with its date, how far ahead and the window, then what limits it', () => {
    // 4 Dec 14:00 UTC is 20 h after 3 Dec 18:00 UTC; London reads it as 14:00.
    const l = line({ earliestStart: '2026-12-04T14:00:00Z', windowHours: 35, limiting: 'hs' });
    expect(plainLine(l, NOW, FORECAST_END)).toBe('next go-start Fri 4 Dec 14:00 (in 20 h), window 35 h; limited by wave height (Hs)');
  });

  it('reads the go-start in the worksite’s zone, not the browser’s', () => {
    const oslo = line({ timeZone: 'Europe/Oslo', earliestStart: '2026-12-04T14:00:00Z', windowHours: 6.5 });
    expect(startSentence(oslo, NOW, FORECAST_END)).toBe('next go-start Fri 4 Dec 15:00 (in 20 h), window 6.5 h');
    const stJohns = line({ timeZone: 'America/St_Johns', earliestStart: '2026-12-04T14:00:00Z', windowHours: 6.5 });
    expect(startSentence(stJohns, NOW, FORECAST_END)).toBe('next go-start Fri 4 Dec 10:30 (in 20 h), window 6.5 h');
  });

  it('adds the year when the go-start falls in another year', () => {
    const l = line({ earliestStart: '2027-01-02T06:00:00Z', windowHours: 12 });
    // 3 Dec 18:00 to 2 Jan 06:00 is 29 days 12 h; 2 Jan 2027 is a Saturday.
    expect(startSentence(l, NOW, '2027-01-05T00:00:00Z')).toBe('next go-start Sat 2 Jan 2027 06:00 (in 29 days 12 h), window 12 h');
  });

  it('says there is no window up to the forecast’s last day, with the limit that decides', () => {
    const l = line({ limiting: 'wind' });
    expect(plainLine(l, NOW, FORECAST_END)).toBe('no window in this forecast (to Sun 13 Dec); limited by wind speed');
  });

  it('gives the chance where an ensemble forecast gives one', () => {
    const l = line({ earliestStart: '2026-12-04T14:00:00Z', windowHours: 35, limiting: 'hs', chance: 0.8 });
    expect(plainLine(l, NOW, FORECAST_END)).toBe(
      'next go-start Fri 4 Dec 14:00 (in 20 h), window 35 h; limited by wave height (Hs); chance 80 %',
    );
  });

  it('never promises a go-start for an operation that is not weather-restricted (docs/domain.md#convention-5)', () => {
    const l = line({ informationOnly: true, limiting: 'hs', earliestStart: null });
    expect(plainLine(l, NOW, FORECAST_END)).toBe('not weather-restricted: statuses for information, no go-start planned');
  });
});

describe('the go-start field of a skipper’s card (labelled “Next go-start” already)', () => {
  it('gives the go-start without repeating its label', () => {
    const l = line({ earliestStart: '2026-12-04T14:00:00Z', windowHours: 35 });
    expect(goStartWords(l, NOW, FORECAST_END)).toBe('Fri 4 Dec 14:00 (in 20 h)');
  });
  it('says now, none in the forecast, or none planned', () => {
    expect(goStartWords(line({ startNow: true, windowHours: 35 }), NOW, FORECAST_END)).toBe('now');
    expect(goStartWords(line({}), NOW, FORECAST_END)).toBe('no window in this forecast (to Sun 13 Dec)');
    expect(goStartWords(line({ informationOnly: true }), NOW, FORECAST_END)).toBe('none planned: not weather-restricted');
  });
});

describe('hours and ages in words', () => {
  it('writes hours plainly below three days and in days and hours from there', () => {
    expect(hoursWords(35)).toBe('35 h');
    expect(hoursWords(6.54)).toBe('6.5 h');
    expect(hoursWords(72)).toBe('3 days');
    expect(hoursWords(123)).toBe('5 days 3 h');
  });
  it('says how far ahead a start is', () => {
    expect(aheadWords(NOW + 35 * 60_000, NOW)).toBe('in 35 min');
    expect(aheadWords(NOW + 20 * 3_600_000, NOW)).toBe('in 20 h');
  });
  it('gives the forecast’s issue time and age', () => {
    expect(forecastAgeWords('2026-12-03T06:00:00Z', 'Europe/London', NOW)).toBe('Forecast issued Thu 3 Dec 06:00, 12 h old');
    expect(forecastAgeWords(null, 'Europe/London', NOW)).toBe('Forecast issue time unknown');
  });
});

describe('a planning run’s changes at one operation and worksite', () => {
  const change = (counts: Record<string, number>) => ({
    operationId: 'op',
    operationName: 'Cable pull-in',
    siteId: 'site',
    siteName: 'Landfall',
    counts,
  });

  it('counts each kind in a fixed order, singular and plural', () => {
    expect(changeCountWords(change({ occurrence_no_go: 2, window_opened: 4 }))).toBe('4 new windows, 2 occurrences not workable');
    expect(changeCountWords(change({ window_lost: 1, earliest_moved: 1, start_now_changed: 1 }))).toBe(
      '1 window lost, 1 earliest start moved, 1 “may start now” changed',
    );
    expect(changeCountWords(change({ window_opened: 1, window_lost: 3 }))).toBe('1 new window, 3 windows lost');
  });

  it('counts a kind it has no words for as other changes, never drops it', () => {
    expect(changeCountWords(change({ window_opened: 2, some_new_kind: 3 }))).toBe('2 new windows, 3 other changes');
  });
});
