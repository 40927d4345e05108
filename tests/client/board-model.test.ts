// The watch board's model (src/features/board/components/board-model.ts): which hours are on
// screen, the worksite's day runs of the header, and the window boxes. Records stand for
// [t, t + dt) (docs/domain.md#convention-9) and windows end exclusive (#convention-10). The
// series and the expected indices are worked by hand beside each check.
import { describe, expect, it } from 'vitest';
import { dayRuns, visibleRange, windowAt, windowBoxes } from '../../src/features/board/components/board-model';

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
  it('groups hours by the worksite\'s calendar day, across a daylight-saving change', () => {
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
