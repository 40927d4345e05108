// Pure helpers that turn a plan answer into what the board draws: the visible hours, the day
// runs of the header, the window boxes, and the start of a row in words.
import type { OccurrenceStatus, OperationSitePlan, PlanWindow } from '../../../../shared/api-types-plan';
import { capitalised, finishWords } from '../../../../shared/status-words';
import { dayKey, formatHours, formatIn, formatStart } from './board-format';

/** The hours on screen: indices [from, to) into the plan's `times`. */
export interface VisibleRange {
  from: number;
  to: number;
  /** The forecast has ended before now: the board shows it whole, for reference. */
  ended: boolean;
}

/**
 * From the record that covers now (each record stands for [t, t + dt), docs/domain.md#convention-9)
 * for `days` days; the whole forecast from its first record when `days` is null (past hours
 * included, for review). Before the forecast starts, from its first record; after it ends, the
 * whole forecast flagged `ended`.
 */
export function visibleRange(timesMs: number[], stepMs: number, nowMs: number, days: number | null): VisibleRange {
  const n = timesMs.length;
  if (n === 0) return { from: 0, to: 0, ended: false };
  if (nowMs >= timesMs[n - 1] + stepMs) return { from: 0, to: n, ended: true };
  if (days === null) return { from: 0, to: n, ended: false };
  let from = 0;
  while (from < n - 1 && timesMs[from + 1] <= nowMs) from++;
  const endMs = timesMs[from] + days * 86_400_000;
  let to = from;
  while (to < n && timesMs[to] < endMs) to++;
  return { from, to, ended: false };
}

/** A calendar day of the worksite on the header: its label and the hours it spans on screen. */
export interface DayRun {
  key: string;
  label: string;
  /** Index into `times` of its first hour on screen. */
  start: number;
  count: number;
}

export function dayRuns(timesMs: number[], range: VisibleRange, zone: string): DayRun[] {
  const runs: DayRun[] = [];
  for (let i = range.from; i < range.to; i++) {
    const key = dayKey(timesMs[i], zone);
    const last = runs[runs.length - 1];
    if (last && last.key === key) last.count++;
    else runs.push({ key, label: formatIn(timesMs[i], zone, 'EEE d MMM'), start: i, count: 1 });
  }
  return runs;
}

/** A usable window clipped to the screen: first index and number of hours drawn. */
export interface WindowBox {
  window: PlanWindow;
  start: number;
  count: number;
}

/**
 * Window boxes by record index: one cell per record, so a forecast that changes step (hourly,
 * then 3-hourly) places a window by looking its start and end up among the record times, not by
 * dividing by one step.
 */
export function windowBoxes(windows: PlanWindow[], timesMs: number[], range: VisibleRange): WindowBox[] {
  if (timesMs.length === 0) return [];
  const boxes: WindowBox[] = [];
  for (const w of windows) {
    const s = firstAtOrAfter(timesMs, Date.parse(w.start));
    const e = firstAtOrAfter(timesMs, Date.parse(w.end));
    const start = Math.max(s, range.from);
    const end = Math.min(e, range.to);
    if (end > start) boxes.push({ window: w, start, count: end - start });
  }
  return boxes;
}

/** One occurrence of a recurring operation as drawn on its row: the records of [start, start + TR). */
export interface OccurrenceMark {
  /** The occurrence's start, ISO UTC (as the plan answers it). */
  start: string;
  status: OccurrenceStatus;
  /** First record drawn (the one covering the start, or the first on screen). */
  from: number;
  /** Records drawn. */
  count: number;
  /** The occurrence starts before the hours on screen (its start is not drawn). */
  clippedStart: boolean;
}

/**
 * Marks of a recurring operation's occurrences on the hours on screen. An occurrence is judged on
 * [start, start + TR) (docs/domain.md#weather-windows), so its mark covers the records that
 * overlap that span: from the record covering the start (records stand for [t, t + dt),
 * docs/domain.md#convention-9) to the last record starting before start + TR. Occurrences that
 * do not overlap the hours on screen get no mark.
 */
export function occurrenceMarks(
  occurrences: OperationSitePlan['occurrences'],
  timesMs: number[],
  stepMs: number,
  range: VisibleRange,
  trHours: number,
): OccurrenceMark[] {
  const n = timesMs.length;
  if (n === 0 || range.to <= range.from) return [];
  const marks: OccurrenceMark[] = [];
  for (const o of occurrences) {
    const startMs = Date.parse(o.start);
    if (Number.isNaN(startMs)) continue;
    const endMs = startMs + Math.max(trHours, 0) * 3_600_000;
    // Outside the forecast altogether: nothing to draw.
    if (endMs <= timesMs[0] || startMs >= recordEndMs(timesMs, n - 1, stepMs)) continue;
    // The record covering the start: the last one starting at or before it (the first record
    // when the occurrence starts before the forecast).
    const covering = Math.max(0, firstAtOrAfter(timesMs, startMs + 1) - 1);
    const last = Math.max(covering + 1, firstAtOrAfter(timesMs, endMs));
    const from = Math.max(covering, range.from);
    const to = Math.min(last, range.to);
    if (to > from)
      marks.push({ start: o.start, status: o.status, from, count: to - from, clippedStart: from > covering || startMs < timesMs[0] });
  }
  return marks;
}

/** Index of the first time at or after `ms` (the length when none). */
export function firstAtOrAfter(timesMs: number[], ms: number): number {
  let lo = 0;
  let hi = timesMs.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (timesMs[mid] < ms) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/**
 * Index of the record that holds instant `ms` (its time at or before `ms`, before the next
 * record's time); -1 before the first record or at or after the last record's end.
 */
export function recordAt(timesMs: number[], ms: number, stepMs: number): number {
  if (timesMs.length === 0 || !(ms >= timesMs[0])) return -1;
  const after = firstAtOrAfter(timesMs, ms);
  const i = after < timesMs.length && timesMs[after] === ms ? after : after - 1;
  return ms < recordEndMs(timesMs, i, stepMs) ? i : -1;
}

/**
 * End of record i for drawing: the next record's time (a forecast that changes step has no single
 * step), or for the last one its time + the step of the spacing before it (else the nominal step).
 */
export function recordEndMs(timesMs: number[], i: number, stepMs: number): number {
  if (i + 1 < timesMs.length) return timesMs[i + 1];
  return i > 0 ? timesMs[i] + (timesMs[i] - timesMs[i - 1]) : timesMs[i] + stepMs;
}

/** The window that holds an instant, if any (end exclusive). */
export function windowAt(windows: PlanWindow[], ms: number): PlanWindow | undefined {
  return windows.find((w) => Date.parse(w.start) <= ms && ms < Date.parse(w.end));
}

/** The start of a row in words: "May start now", "Earliest start: ...", or no window. */
export interface StartWords {
  tone: 'now' | 'later' | 'none';
  text: string;
  /** Longer form for screen readers and tooltips (full date and zone). */
  detail: string;
  /**
   * When the work started at that go-start is planned to end (go-start + TPOP) and its contingency
   * runs out (go-start + TR), "Planned finish Wed 9 Dec 13:00, contingency to Thu 10 Dec 01:00";
   * null without a go-start.
   */
  finish: string | null;
}

/** The finish of work begun at a go-start, in the board's words (shared/status-words.ts); null without one. */
function finishOnBoard(goStart: string | null, plan: Pick<OperationSitePlan, 'tpop' | 'tr' | 'timeZone'>, nowMs: number): string | null {
  if (goStart === null) return null;
  return capitalised(finishWords(Date.parse(goStart), plan.tpop, plan.tr, (ms) => formatStart(ms, plan.timeZone, nowMs)));
}

export function startWords(plan: OperationSitePlan, nowMs: number): StartWords {
  const zone = plan.timeZone;
  if (plan.informationOnly) {
    return {
      tone: 'none',
      text: 'Not weather-restricted: for information only',
      finish: null,
      detail: `Not weather-restricted (TPOP ${plan.tpop} h, TR ${plan.tr} h; weather-restricted needs TPOP up to 72 h and TR up to 96 h, and the mark): its hours are shown against OPLIM for information only. It gets no go-start, window or "may start now" from a forecast: plan it for statistical extremes or split it into sub-operations with safe points.`,
    };
  }
  if (plan.startNow) {
    const w = windowAt(plan.windows, nowMs) ?? plan.windows[0];
    // What is left of the window matters on deck, not its whole length (which began earlier).
    const leftH = w ? Math.floor((Date.parse(w.end) - nowMs) / 3_600_000) : 0;
    const until = w ? `, window until ${formatStart(w.end, zone, nowMs)}, ${formatHours(leftH)} left` : '';
    return {
      tone: 'now',
      text: `May start now${until}`,
      // Started now: the plan's earliest go-start is then the record that covers now.
      finish: finishOnBoard(plan.earliestStart, plan, nowMs),
      detail: `May start now${w ? `: the window runs until ${formatIn(w.end, zone)}, ${formatHours(w.hours)} long in all` : ''}.`,
    };
  }
  if (plan.earliestStart) {
    const ms = Date.parse(plan.earliestStart);
    const w = windowAt(plan.windows, ms);
    return {
      tone: 'later',
      text: `Earliest start: ${formatStart(ms, zone, nowMs)}${w ? `, window ${formatHours(w.hours)}` : ''}`,
      finish: finishOnBoard(plan.earliestStart, plan, nowMs),
      detail: `Earliest go-start ${formatIn(ms, zone)}${w ? `, in a window of ${formatHours(w.hours)}` : ''}.`,
    };
  }
  return {
    tone: 'none',
    text: 'No window in this forecast',
    finish: null,
    detail: `No run of workable hours at least TR = ${plan.tr} h long in this forecast.`,
  };
}
