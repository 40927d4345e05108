// The watch board's model (src/features/board/components/board-model.ts): which hours are on
// screen, the worksite's day runs of the header, and the window boxes. Records stand for
// [t, t + dt) (docs/domain.md#convention-9) and windows end exclusive (#convention-10). The
// series and the expected indices are worked by hand beside each check.
import { describe, expect, it } from 'vitest';
import {
  dayRuns,
  occurrenceMarks,
  recordAt,
  startWords,
  visibleRange,
  windowAt,
  windowBoxes,
} from '../../src/features/board/components/board-model';
import type { OperationSitePlan } from '../../shared/api-types-plan';

const H = 3_600_000;
const T0 = Date.parse('2026-03-28T00:00:00Z');
const hourly = (n: number) => Array.from({ length: n }, (_, i) => T0 + i * H);

describe('visibleRange', () => {
  const times = hourly(72);
  it('starts at the record that covers now and runs for the chosen days', () => {
    // now = 05:30 is covered by the 05:00 record (index 5); one day = 24 records.
    expect(visibleRange(times, H, T0 + 5.5 * H, 1)).toEqual({ from: 5, to: 29, ended: false });
  });
  it('shows the whole forecast with days = null, and before it starts', () => {
    expect(visibleRange(times, H, T0 + 5.5 * H, null)).toEqual({ from: 0, to: 72, ended: false });
    expect(visibleRange(times, H, T0 - 10 * H, 1)).toEqual({ from: 0, to: 24, ended: false });
  });
  it('flags a forecast that ended before now (the last record covers up to 72 h)', () => {
    expect(visibleRange(times, H, T0 + 71.9 * H, 1).ended).toBe(false);
    expect(visibleRange(times, H, T0 + 72 * H, 1)).toEqual({ from: 0, to: 72, ended: true });
  });
  it('is empty for an empty forecast', () => {
    expect(visibleRange([], H, T0, 1)).toEqual({ from: 0, to: 0, ended: false });
  });
});

describe('dayRuns', () => {
  it("groups hours by the worksite's calendar day, across a daylight-saving change", () => {
    // Europe/Oslo goes from UTC+1 to UTC+2 at 01:00 UTC on 29 March 2026 (EU rule: last Sunday
    // of March). 28 Mar 00:00 UTC is 01:00 local: 23 hours remain of 28 March (00:00-22:00 UTC);
    // 29 March local is 28 Mar 23:00 UTC to 29 Mar 22:00 UTC, 23 hours long (the short day).
    const times = hourly(48);
    const runs = dayRuns(times, { from: 0, to: 48, ended: false }, 'Europe/Oslo');
    expect(runs.map((r) => [r.key, r.start, r.count])).toEqual([
      ['2026-03-28', 0, 23],
      ['2026-03-29', 23, 23],
      ['2026-03-30', 46, 2],
    ]);
  });
});

describe('windowBoxes and windowAt', () => {
  const times = hourly(48);
  const w = { start: new Date(T0 + 10 * H).toISOString(), end: new Date(T0 + 20 * H).toISOString(), hours: 10 };
  it('clips a window to the hours on screen', () => {
    expect(windowBoxes([w as never], times, { from: 0, to: 48, ended: false })).toEqual([{ window: w, start: 10, count: 10 }]);
    expect(windowBoxes([w as never], times, { from: 15, to: 48, ended: false })).toEqual([{ window: w, start: 15, count: 5 }]);
    expect(windowBoxes([w as never], times, { from: 20, to: 48, ended: false })).toEqual([]);
  });
  it('finds the window holding an instant, end exclusive', () => {
    expect(windowAt([w as never], T0 + 10 * H)).toBe(w);
    expect(windowAt([w as never], T0 + 19.99 * H)).toBe(w);
    expect(windowAt([w as never], T0 + 20 * H)).toBeUndefined();
  });
});

describe('occurrenceMarks (recurring operations on the board, as the Alerts page promises)', () => {
  // Hourly records from 28 Mar 00:00 UTC for 48 h; the whole forecast on screen.
  const times = hourly(48);
  const all = { from: 0, to: 48, ended: false };
  const at = (h: number) => new Date(T0 + h * H).toISOString();

  it('covers [start, start + TR) from the record holding the start', () => {
    // Start 06:00 UTC (record 6), TR 5 h: records 6-10 (5 records); start 06:30, TR 5 h ends
    // 11:30, so records 6-11 overlap it (the 11:00 record holds 11:00-11:30).
    const marks = occurrenceMarks(
      [
        { start: at(6), status: 'go' },
        { start: at(30.5), status: 'no_go' },
      ],
      times,
      H,
      all,
      5,
    );
    expect(marks).toEqual([
      { start: at(6), status: 'go', from: 6, count: 5, clippedStart: false },
      { start: at(30.5), status: 'no_go', from: 30, count: 6, clippedStart: false },
    ]);
  });

  it('clips to the hours on screen and leaves out occurrences outside them or the forecast', () => {
    const occ = [
      { start: at(2), status: 'marginal' as const }, // 02:00-07:00: records 2-6, on screen 5-6
      { start: at(20), status: 'go' as const }, // after the hours on screen
      { start: at(-10), status: 'go' as const }, // ends before the forecast
      { start: at(48), status: 'go' as const }, // after the last record (47:00-48:00)
    ];
    expect(occurrenceMarks(occ, times, H, { from: 5, to: 20, ended: false }, 5)).toEqual([
      { start: at(2), status: 'marginal', from: 5, count: 2, clippedStart: true },
    ]);
  });

  it('draws at least the record holding the start when TR is shorter than a record', () => {
    // 3-hourly records: an occurrence at 04:00 with TR 1 h lies in the 03:00 record (index 1).
    const three = Array.from({ length: 8 }, (_, i) => T0 + i * 3 * H);
    expect(occurrenceMarks([{ start: at(4), status: 'go' }], three, 3 * H, { from: 0, to: 8, ended: false }, 1)).toEqual([
      { start: at(4), status: 'go', from: 1, count: 1, clippedStart: false },
    ]);
  });
});

describe('startWords', () => {
  const plan = (over: Partial<OperationSitePlan>): OperationSitePlan => ({
    operationId: 'o',
    operationName: 'Crew change',
    siteId: 's',
    siteName: 'Landfall',
    timeZone: 'Europe/London',
    tpop: 4,
    tc: 2,
    tr: 6,
    weatherRestricted: true,
    informationOnly: false,
    skipperIds: [],
    windows: [],
    earliestStart: null,
    startNow: false,
    times: [],
    status: [],
    limiting: [],
    marginRel: [],
    chance: null,
    startChance: null,
    occurrences: [],
    ...over,
  });

  it('gives the earliest start with its date, not the weekday alone (issue 17: "Tue 8 Dec 20:00")', () => {
    // 8 December 2026 is a Tuesday (calendar); London is on GMT (UTC+0) in December.
    const words = startWords(plan({ earliestStart: '2026-12-08T20:00:00Z' }), Date.parse('2026-12-03T14:00:00Z'));
    // The page states the zone once (issue 22), so the words carry no zone of their own.
    expect(words.text).toBe('Earliest start: Tue 8 Dec 20:00');
  });

  it('adds the year when the start is in another year than now', () => {
    // 5 January 2027 is a Tuesday (calendar).
    const words = startWords(plan({ earliestStart: '2027-01-05T07:00:00Z' }), Date.parse('2026-12-30T14:00:00Z'));
    expect(words.text).toBe('Earliest start: Tue 5 Jan 2027 07:00');
  });

  it('gives the planned finish at go-start + TPOP and the end of the contingency at go-start + TR', () => {
    // Go-start Tue 8 Dec 20:00 GMT; TPOP 4 h -> Wed 9 Dec 00:00; TR 6 h -> Wed 9 Dec 02:00
    // (9 December 2026 is a Wednesday, calendar): the finish crosses midnight into the next day.
    const words = startWords(plan({ earliestStart: '2026-12-08T20:00:00Z' }), Date.parse('2026-12-03T14:00:00Z'));
    expect(words.finish).toBe('Planned finish Wed 9 Dec 00:00, contingency to Wed 9 Dec 02:00');
  });

  it('finishes from the hour that covers now when the operation may start now, in the worksite zone', () => {
    // Records 12:00, 13:00, 14:00 UTC; now 13:40 UTC is in the 13:00 record. Oslo is UTC+1 in
    // December: the go-start is 14:00 local, TPOP 4 h -> 18:00, TR 6 h -> 20:00 (Thu 3 Dec 2026).
    const times = ['2026-12-03T12:00:00Z', '2026-12-03T13:00:00Z', '2026-12-03T14:00:00Z'];
    const words = startWords(
      plan({
        timeZone: 'Europe/Oslo',
        startNow: true,
        // The engine gives a plan that may start now its covering record as the earliest go-start.
        earliestStart: times[1],
        times,
        windows: [{ start: times[0], end: '2026-12-03T20:00:00Z', hours: 8 } as never],
      }),
      Date.parse('2026-12-03T13:40:00Z'),
    );
    expect(words.finish).toBe('Planned finish Thu 3 Dec 18:00, contingency to Thu 3 Dec 20:00');
  });

  it('names no finish without a go-start, nor for work that is not weather-restricted', () => {
    expect(startWords(plan({}), Date.parse('2026-12-03T14:00:00Z')).finish).toBeNull();
    expect(startWords(plan({ informationOnly: true }), Date.parse('2026-12-03T14:00:00Z')).finish).toBeNull();
  });
});

describe('recordAt: the record that holds an instant (the Overview card link opens its chain)', () => {
  // Hourly to 02:00, then 3-hourly (a forecast that changes step; docs/domain.md#forecast-service).
  const h = 3_600_000;
  const times = [0, h, 2 * h, 5 * h];
  it('finds the record whose span holds the instant, across a change of step', () => {
    expect(recordAt(times, 0, h)).toBe(0);
    expect(recordAt(times, 1.5 * h, h)).toBe(1);
    expect(recordAt(times, 4 * h, h)).toBe(2); // 02:00-05:00 is one 3-hourly record
    expect(recordAt(times, 5 * h, h)).toBe(3);
    expect(recordAt(times, 7.9 * h, h)).toBe(3); // the last record lasts as long as the spacing before it
  });
  it('answers -1 outside the records', () => {
    expect(recordAt(times, -1, h)).toBe(-1);
    expect(recordAt(times, 8 * h, h)).toBe(-1);
    expect(recordAt([], 0, h)).toBe(-1);
    expect(recordAt(times, Number.NaN, h)).toBe(-1);
  });
});
