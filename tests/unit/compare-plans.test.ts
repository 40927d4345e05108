import { describe, expect, it } from 'vitest';
import { comparePlans, type PlanSummary } from '../../shared/alerts/compare-plans';

const NOW = Date.parse('2026-12-01T06:00:00Z');
const plan = (over: Partial<PlanSummary>): PlanSummary => ({
  operationId: 'op',
  siteId: 'site',
  operationName: 'Rock berm',
  siteName: 'KP 4.5',
  timeZone: 'UTC',
  tr: 14,
  windows: [],
  earliestStart: null,
  startNow: false,
  occurrences: [],
  ...over,
});
const w = (start: string, end: string) => ({ start, end, hours: (Date.parse(end) - Date.parse(start)) / 3_600_000 });
const opts = { nowMs: NOW, earliestMoveHours: 6 };

describe('comparing two plans (hand cases)', () => {
  it('reports nothing when the plan is unchanged', () => {
    const p = plan({ windows: [w('2026-12-02T00:00:00Z', '2026-12-02T20:00:00Z')], earliestStart: '2026-12-02T00:00:00Z' });
    expect(comparePlans([p], [p], opts)).toEqual([]);
  });

  it('reports a new window, and every window on a first plan', () => {
    const next = plan({ windows: [w('2026-12-03T00:00:00Z', '2026-12-03T18:00:00Z')], earliestStart: '2026-12-03T00:00:00Z' });
    expect(comparePlans([plan({})], [next], opts).map((c) => c.kind)).toEqual(['window_opened']);
    expect(comparePlans(null, [next], opts).map((c) => c.key)).toEqual(['opened:2026-12-03T00:00:00Z']);
  });

  it('reports a window lost (gone, or too short to be usable so no longer listed)', () => {
    const prev = plan({ windows: [w('2026-12-02T00:00:00Z', '2026-12-02T20:00:00Z')], earliestStart: '2026-12-02T00:00:00Z' });
    const changes = comparePlans([prev], [plan({})], opts);
    expect(changes).toEqual([expect.objectContaining({ kind: 'window_lost', start: '2026-12-02T00:00:00Z', end: '2026-12-02T20:00:00Z', hours: 20 })]);
  });

  it('does not report past windows as lost', () => {
    const prev = plan({ windows: [w('2026-11-30T00:00:00Z', '2026-11-30T20:00:00Z')] });
    expect(comparePlans([prev], [plan({})], opts)).toEqual([]);
  });

  it('reports an earliest start that moved by more than the set hours, not less', () => {
    const prev = plan({ windows: [w('2026-12-02T00:00:00Z', '2026-12-02T20:00:00Z')], earliestStart: '2026-12-02T00:00:00Z' });
    const moved4 = plan({ windows: [w('2026-12-02T04:00:00Z', '2026-12-02T20:00:00Z')], earliestStart: '2026-12-02T04:00:00Z' });
    const moved7 = plan({ windows: [w('2026-12-02T07:00:00Z', '2026-12-02T23:00:00Z')], earliestStart: '2026-12-02T07:00:00Z' });
    expect(comparePlans([prev], [moved4], opts)).toEqual([]);
    expect(comparePlans([prev], [moved7], opts).map((c) => [c.kind, c.previous])).toEqual([['earliest_moved', '2026-12-02T00:00:00Z']]);
  });

  it('reports "may start now" changing and an occurrence turning no-go', () => {
    const prev = plan({ startNow: true, occurrences: [{ start: '2026-12-02T06:00:00Z', status: 'go' }] });
    const next = plan({ startNow: false, occurrences: [{ start: '2026-12-02T06:00:00Z', status: 'no_go' }] });
    expect(comparePlans([prev], [next], opts).map((c) => c.kind).sort()).toEqual(['occurrence_no_go', 'start_now_changed']);
  });
});
