import { describe, expect, it } from 'vitest';
import { comparePlans, usableStarts, type PlanSummary } from '../../shared/alerts/compare-plans';
import { alertEmail } from '../../server/services/alert-mail';

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
    expect(changes).toEqual([
      expect.objectContaining({ kind: 'window_lost', start: '2026-12-02T00:00:00Z', end: '2026-12-02T20:00:00Z', hours: 20 }),
    ]);
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
    expect(
      comparePlans([prev], [next], opts)
        .map((c) => c.kind)
        .sort(),
    ).toEqual(['occurrence_no_go', 'start_now_changed']);
  });
});

// Issue 22, item 5: "New window from Thu 3 Dec 12:00" was sent at 14:03 for a window whose last
// possible start had passed. A window of length L allows starts from its start to its end - TR
// (docs/domain.md#weather-windows: a go-start needs TR workable hours from it; hand-computed here).
describe('alerts speak of usable starts', () => {
  const at1403 = { nowMs: Date.parse('2026-12-03T14:03:00Z'), earliestMoveHours: 6 };
  const tr6 = (windows: ReturnType<typeof w>[], over: Partial<PlanSummary> = {}) => plan({ tr: 6, windows, ...over });

  it('announces no window whose last possible start has passed, and no such window as lost', () => {
    // 12:00-18:00 with TR 6 h: the only start was 12:00.
    expect(comparePlans(null, [tr6([w('2026-12-03T12:00:00Z', '2026-12-03T18:00:00Z')])], at1403)).toEqual([]);
    expect(usableStarts(w('2026-12-03T12:00:00Z', '2026-12-03T20:00:00Z'), 6, at1403.nowMs)).toBeNull(); // last start 14:00
    expect(comparePlans([tr6([w('2026-12-03T12:00:00Z', '2026-12-03T20:00:00Z')])], [tr6([])], at1403)).toEqual([]);
  });

  it('announces a running window from the next start still possible, with its last start', () => {
    // 12:00-22:00, TR 6 h: starts possible 15:00 (next whole hour after 14:03) to 16:00.
    const [c] = comparePlans(null, [tr6([w('2026-12-03T12:00:00Z', '2026-12-03T22:00:00Z')])], at1403);
    expect(c).toMatchObject({ kind: 'window_opened', usableFrom: '2026-12-03T15:00:00.000Z', lastStart: '2026-12-03T16:00:00.000Z' });
  });

  it('puts the project, the next possible start with its date, and the change in the subject', async () => {
    const window = w('2026-12-03T12:00:00Z', '2026-12-03T22:00:00Z');
    const next = tr6([window], { earliestStart: '2026-12-03T15:00:00Z', timeZone: 'UTC' });
    const changes = comparePlans(null, [next], at1403);
    const mail = await alertEmail({
      plan: next,
      changes,
      projectName: 'Varrow Reach',
      boardUrl: 'http://x/board',
      unsubscribeUrl: 'http://x/u',
    });
    // 3 December 2026 is a Thursday (GNU date).
    expect(mail.subject).toBe('Varrow Reach: Rock berm at KP 4.5, next start Thu 3 Dec 15:00 (new window, starts from Thu 3 Dec 15:00)');
    expect(mail.subject).not.toContain('12:00');
    expect(mail.text).toContain('starts possible from Thu 3 Dec 15:00 to Thu 3 Dec 16:00');
    const none = await alertEmail({
      plan: tr6([]),
      changes: [{ ...changes[0], kind: 'window_lost' }],
      projectName: 'Varrow Reach',
      boardUrl: 'b',
      unsubscribeUrl: 'u',
    });
    expect(none.subject).toMatch(/^Varrow Reach: Rock berm at KP 4\.5, no start possible in this forecast \(window lost/);
  });
});
