/**
 * What changed between two plans of the same operation at the same worksite, as crews need to
 * hear it: a new usable window, a window lost (gone, or shortened below TR so no longer usable),
 * the earliest go-start moved by more than a set number of hours, "may start now" changed, and
 * a recurring occurrence turning no-go.
 */

export interface PlanSummary {
  operationId: string;
  siteId: string;
  operationName: string;
  siteName: string;
  timeZone: string;
  tr: number;
  windows: { start: string; end: string; hours: number }[];
  earliestStart: string | null;
  startNow: boolean;
  occurrences: { start: string; status: 'go' | 'marginal' | 'no_go' | 'no_data' | 'information' }[];
}

export type ChangeKind = 'window_opened' | 'window_lost' | 'earliest_moved' | 'start_now_changed' | 'occurrence_no_go';

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
}

const ms = (iso: string) => Date.parse(iso);
const overlaps = (a: { start: string; end: string }, b: { start: string; end: string }) => ms(a.start) < ms(b.end) && ms(b.start) < ms(a.end);

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
    const prevWindows = (p?.windows ?? []).filter((w) => ms(w.end) > options.nowMs);
    for (const w of n.windows) {
      if (!prevWindows.some((pw) => overlaps(pw, w))) {
        changes.push({ ...base, kind: 'window_opened', key: `opened:${w.start}`, start: w.start, end: w.end, hours: w.hours, previous: null });
      }
    }
    for (const pw of prevWindows) {
      if (!n.windows.some((w) => overlaps(pw, w))) {
        changes.push({ ...base, kind: 'window_lost', key: `lost:${pw.start}`, start: pw.start, end: pw.end, hours: pw.hours, previous: null });
      }
    }
    if (p && p.earliestStart && n.earliestStart) {
      const movedH = Math.abs(ms(n.earliestStart) - ms(p.earliestStart)) / 3_600_000;
      if (movedH > options.earliestMoveHours) {
        changes.push({ ...base, kind: 'earliest_moved', key: `earliest:${n.earliestStart}`, start: n.earliestStart, end: null, hours: null, previous: p.earliestStart });
      }
    }
    if (p && p.startNow !== n.startNow) {
      changes.push({ ...base, kind: 'start_now_changed', key: `startnow:${n.startNow}:${Math.floor(options.nowMs / 3_600_000)}`, start: null, end: null, hours: null, previous: null, startNow: n.startNow });
    }
    const prevOcc = new Map((p?.occurrences ?? []).map((o) => [o.start, o.status]));
    for (const o of n.occurrences) {
      const before = prevOcc.get(o.start);
      if (o.status === 'no_go' && before !== 'no_go' && ms(o.start) > options.nowMs) {
        changes.push({ ...base, kind: 'occurrence_no_go', key: `occurrence:${o.start}`, start: o.start, end: null, hours: n.tr, previous: before ?? null });
      }
    }
  }
  return changes;
}
