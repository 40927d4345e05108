// "Window chance fell below" alerts (docs/domain.md#forecast-uncertainty): worked by hand on two
// plans of one operation at one worksite, and the e-mail's words from the shared status words.
import { describe, expect, it } from 'vitest';
import { chanceDrops, type PlanSummary } from '../../shared/alerts/compare-plans';
import { describeChange, shortChange } from '../../server/services/alert-mail';

const plan = (windows: PlanSummary['windows']): PlanSummary => ({
  operationId: 'op',
  siteId: 'site',
  operationName: 'Cable pull-in',
  siteName: 'Landfall',
  timeZone: 'UTC',
  tr: 6,
  windows,
  earliestStart: windows[0]?.start ?? null,
  startNow: false,
  occurrences: [],
});
const NOW = Date.parse('2026-12-03T06:00:00Z');
const w = (start: string, end: string, chance: number | null) => ({
  start,
  end,
  hours: (Date.parse(end) - Date.parse(start)) / 3_600_000,
  chance,
});

describe('window chance fell below a threshold', () => {
  it('fires once the overlapping window drops from at or above to below the threshold', () => {
    const before = plan([w('2026-12-03T12:00:00Z', '2026-12-04T00:00:00Z', 0.62), w('2026-12-05T00:00:00Z', '2026-12-05T12:00:00Z', 0.3)]);
    const after = plan([w('2026-12-03T13:00:00Z', '2026-12-04T00:00:00Z', 0.43), w('2026-12-05T00:00:00Z', '2026-12-05T12:00:00Z', 0.2)]);
    const got = chanceDrops(before, after, 0.5, NOW);
    // Only the first: the second was already below 50 % before (no new news).
    expect(got).toHaveLength(1);
    expect(got[0]).toMatchObject({
      kind: 'window_chance_fell',
      start: '2026-12-03T13:00:00Z',
      chance: 0.43,
      previousChance: 0.62,
      threshold: 0.5,
    });
    // Exactly at the threshold is not below it.
    expect(chanceDrops(before, plan([w('2026-12-03T13:00:00Z', '2026-12-04T00:00:00Z', 0.5)]), 0.5, NOW)).toEqual([]);
    // No chances (a single forecast) or no previous plan: nothing.
    expect(chanceDrops(before, plan([w('2026-12-03T13:00:00Z', '2026-12-04T00:00:00Z', null)]), 0.5, NOW)).toEqual([]);
    expect(chanceDrops(undefined, after, 0.5, NOW)).toEqual([]);
    // A window whose last start (end - TR) has passed says nothing.
    expect(chanceDrops(before, after, 0.5, Date.parse('2026-12-03T18:30:00Z'))).toEqual([]);
  });

  it('says so in the shared status words', () => {
    const before = plan([w('2026-12-03T12:00:00Z', '2026-12-04T00:00:00Z', 0.62)]);
    const after = plan([w('2026-12-03T12:00:00Z', '2026-12-04T00:00:00Z', 0.43)]);
    const [c] = chanceDrops(before, after, 0.5, NOW);
    expect(describeChange(c, after)).toBe(
      'Window chance fell below 50 %: the window Thu 3 Dec 12:00 to Fri 4 Dec 00:00 (12 h) now has a chance to hold TR of 43 % (was 62 %). The plan still counts it workable; the ensemble doubts it.',
    );
    expect(shortChange(c, 'UTC')).toBe('window chance fell below 50 % (Thu 3 Dec 12:00)');
  });
});
