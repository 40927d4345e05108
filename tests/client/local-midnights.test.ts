/**
 * Date-axis ticks of the client's charts (src/lib/local-midnights.ts): midnights of the worksite's
 * local days, never two ticks on one day. The expected instants are worked by hand from the
 * zone's rules: Europe/London is UTC+0 in winter and UTC+1 from the last Sunday of March (29 March
 * 2026, 01:00 UTC), as the UK's Summer Time Order sets it.
 */
import { describe, expect, it } from 'vitest';
import { dayTicks, localMidnights } from '../../src/lib/local-midnights';

const iso = (ms: number[]) => ms.map((t) => new Date(t).toISOString());

describe('local midnights and day ticks', () => {
  it('gives the local midnights across a change to summer time', () => {
    const from = Date.parse('2026-03-28T12:00:00Z');
    const to = Date.parse('2026-03-31T12:00:00Z');
    expect(iso(localMidnights(from, to, 'Europe/London'))).toEqual([
      '2026-03-29T00:00:00.000Z',
      '2026-03-29T23:00:00.000Z',
      '2026-03-30T23:00:00.000Z',
    ]);
  });

  it('never puts two ticks on one day when the range is short (a flat finish date)', () => {
    const finish = Date.parse('2027-02-25T14:00:00Z');
    const day = 86_400_000;
    const ticks = dayTicks(finish - day, finish + day, 'Europe/London', 5);
    expect(iso(ticks)).toEqual(['2027-02-25T00:00:00.000Z', '2027-02-26T00:00:00.000Z']);
  });

  it('thins long ranges to whole-day steps, at most the ticks asked for', () => {
    const from = Date.parse('2026-11-17T06:00:00Z');
    const to = Date.parse('2026-12-03T06:00:00Z');
    const ticks = dayTicks(from, to, 'UTC', 6);
    expect(ticks.length).toBeLessThanOrEqual(6);
    expect(ticks.length).toBeGreaterThanOrEqual(4);
    // 16 days in at most 6 ticks: every 3 days from the first midnight in the range.
    expect(iso(ticks)[0]).toBe('2026-11-18T00:00:00.000Z');
    expect(ticks[1] - ticks[0]).toBe(3 * 86_400_000);
  });
});
