/**
 * What changed between two plans of the same operation at the same worksite, as crews need to
 * hear it: a new usable window, a window lost (gone, or shortened below TR so no longer usable),
 * the earliest go-start moved by more than a set number of hours, "may start now" changed, and
 * a recurring occurrence turning no-go.
 *
 * Alerts speak of usable starts (issue 22): a window's last possible start is its end less TR; a
 * window whose last possible start has passed is neither announced nor reported lost, and a new
 * window that is already running is announced from the next whole hour it can still be started.
 */

export interface PlanSummary {
  operationId: string;
  siteId: string;
  operationName: string;
  siteName: string;
  timeZone: string;
  tr: number;
  /** Planned duration TPOP, h; absent in plan runs stored before it was kept. */
  tpop?: number;
  /** `chance`: the ensemble chance to hold TR from the window's start (absent or null without an ensemble). */
  windows: { start: string; end: string; hours: number; chance?: number | null }[];
  earliestStart: string | null;
  startNow: boolean;
  occurrences: { start: string; status: 'go' | 'marginal' | 'no_go' | 'no_data' | 'information' }[];
}

export type ChangeKind =
  'window_opened' | 'window_lost' | 'earliest_moved' | 'start_now_changed' | 'occurrence_no_go' | 'window_chance_fell';

export interface PlanChange {
  kind: ChangeKind;
  /** Stable key of the change within the operation and worksite (part of the e-mail idempotency key). */
  key: string;
  operationId: string;
  siteId: string;
  /** The window, occurrence or start time the change is about. */
  start: string | null;
  end: string | null;
  hours: number | null;
  /** The time before the change (earliest start moved: the previous earliest start). */
  previous: string | null;
  startNow?: boolean;
  /** Window opened or lost: the first and the last start still possible at planning time. */
  usableFrom?: string | null;
  lastStart?: string | null;
  /** Window chance fell: the chance now and in the previous plan (0-1), and the threshold crossed. */
  chance?: number;
  previousChance?: number;
  threshold?: number;
}

/**
 * A subscriber's "window chance fell below" alerts (docs/domain.md#forecast-uncertainty): each
 * window of the new plan still usable at `nowMs` whose ensemble chance to hold TR is below
 * `threshold` (0-1) while the previous plan's overlapping window had it at or above the threshold.
 * Nothing without chances in both plans, or without an overlapping window before (a new window is
 * already announced as new).
 */
export function chanceDrops(previous: PlanSummary | undefined, next: PlanSummary, threshold: number, nowMs: number): PlanChange[] {
  if (!previous) return [];
  const out: PlanChange[] = [];
  for (const w of next.windows) {
    if (w.chance === null || w.chance === undefined || !(w.chance < threshold)) continue;
    const usable = usableStarts(w, next.tr, nowMs);
    if (usable === null) continue;
    const before = previous.windows.find((pw) => overlaps(pw, w) && pw.chance !== null && pw.chance !== undefined);
    if (!before || !(before.chance! >= threshold)) continue;
    out.push({
      kind: 'window_chance_fell',
      key: `chance<${Math.round(threshold * 100)}:${w.start}`,
      operationId: next.operationId,
      siteId: next.siteId,
      start: w.start,
      end: w.end,
      hours: w.hours,
      previous: before.start,
      usableFrom: usable.from,
      lastStart: usable.last,
      chance: w.chance,
      previousChance: before.chance!,
      threshold,
    });
  }
  return out;
}

const MS_PER_HOUR = 3_600_000;

/**
 * The starts of a window still possible at `nowMs`: from the window's start, or the next whole
 * hour once it has begun, to its end less TR; null when the last possible start has passed.
 * @example usableStarts({ start: '2026-12-03T12:00:00Z', end: '2026-12-03T20:00:00Z' }, 6, Date.parse('2026-12-03T14:03:00Z'))
 *   // null: the last start was 14:00
 */
export function usableStarts(w: { start: string; end: string }, trHours: number, nowMs: number): { from: string; last: string } | null {
  const last = Date.parse(w.end) - trHours * MS_PER_HOUR;
  const start = Date.parse(w.start);
  const from = start >= nowMs ? start : Math.ceil(nowMs / MS_PER_HOUR) * MS_PER_HOUR;
  if (from > last) return null;
  return { from: new Date(from).toISOString(), last: new Date(last).toISOString() };
}

const ms = (iso: string) => Date.parse(iso);
const overlaps = (a: { start: string; end: string }, b: { start: string; end: string }) =>
  ms(a.start) < ms(b.end) && ms(b.start) < ms(a.end);

export function comparePlans(
  previous: PlanSummary[] | null,
  next: PlanSummary[],
  options: { nowMs: number; earliestMoveHours: number },
): PlanChange[] {
  const changes: PlanChange[] = [];
  const prevByKey = new Map((previous ?? []).map((p) => [`${p.operationId}|${p.siteId}`, p]));
  for (const n of next) {
    const p = prevByKey.get(`${n.operationId}|${n.siteId}`);
    const base = { operationId: n.operationId, siteId: n.siteId };
    const prevWindows = (p?.windows ?? []).filter((w) => usableStarts(w, p!.tr, options.nowMs) !== null);
    for (const w of n.windows) {
      const usable = usableStarts(w, n.tr, options.nowMs);
      if (usable === null) continue;
      if (!prevWindows.some((pw) => overlaps(pw, w))) {
        changes.push({
          ...base,
          kind: 'window_opened',
          key: `opened:${w.start}`,
          start: w.start,
          end: w.end,
          hours: w.hours,
          previous: null,
          usableFrom: usable.from,
          lastStart: usable.last,
        });
      }
    }
    for (const pw of prevWindows) {
      if (!n.windows.some((w) => overlaps(pw, w))) {
        const usable = usableStarts(pw, p!.tr, options.nowMs)!;
        changes.push({
          ...base,
          kind: 'window_lost',
          key: `lost:${pw.start}`,
          start: pw.start,
          end: pw.end,
          hours: pw.hours,
          previous: null,
          usableFrom: usable.from,
          lastStart: usable.last,
        });
      }
    }
    if (p && p.earliestStart && n.earliestStart) {
      const movedH = Math.abs(ms(n.earliestStart) - ms(p.earliestStart)) / 3_600_000;
      if (movedH > options.earliestMoveHours) {
        changes.push({
          ...base,
          kind: 'earliest_moved',
          key: `earliest:${n.earliestStart}`,
          start: n.earliestStart,
          end: null,
          hours: null,
          previous: p.earliestStart,
        });
      }
    }
    if (p && p.startNow !== n.startNow) {
      changes.push({
        ...base,
        kind: 'start_now_changed',
        key: `startnow:${n.startNow}:${Math.floor(options.nowMs / 3_600_000)}`,
        start: null,
        end: null,
        hours: null,
        previous: null,
        startNow: n.startNow,
      });
    }
    const prevOcc = new Map((p?.occurrences ?? []).map((o) => [o.start, o.status]));
    for (const o of n.occurrences) {
      const before = prevOcc.get(o.start);
      if (o.status === 'no_go' && before !== 'no_go' && ms(o.start) > options.nowMs) {
        changes.push({
          ...base,
          kind: 'occurrence_no_go',
          key: `occurrence:${o.start}`,
          start: o.start,
          end: null,
          hours: n.tr,
          previous: before ?? null,
        });
      }
    }
  }
  return changes;
}
