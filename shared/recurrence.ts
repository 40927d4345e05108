import * as rruleModule from 'rrule';
import { TZDate } from '@date-fns/tz';
import { z } from 'zod';
import './schemas/words';

// rrule ships a UMD main that Node's ESM loader exposes as a default export; Vite exposes names.
export const rrule = (
  (rruleModule as unknown as { RRule?: unknown }).RRule ? rruleModule : (rruleModule as unknown as { default: typeof rruleModule }).default
) as typeof rruleModule;

export const WEEKDAYS = ['MO', 'TU', 'WE', 'TH', 'FR', 'SA', 'SU'] as const;

/**
 * A recurring operation, as the form builds it: occurrences start at a local wall-clock time in
 * an IANA zone, by an iCalendar (RFC 5545) recurrence rule.
 */
export const RecurrenceInput = z.object({
  /** First occurrence, local wall time 'YYYY-MM-DDTHH:mm' in `timeZone`. */
  start: z.string().regex(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}$/, 'must be a local date and time YYYY-MM-DDTHH:mm'),
  timeZone: z.string().refine((z) => {
    try {
      new Intl.DateTimeFormat('en', { timeZone: z });
      return true;
    } catch {
      return false;
    }
  }, 'unknown time zone'),
  /** The rule's body, e.g. 'FREQ=WEEKLY;BYDAY=MO,WE,FR' (no DTSTART: `start` is it). */
  rule: z
    .string()
    .max(500)
    .refine(
      (r) => /^FREQ=(DAILY|WEEKLY|MONTHLY|YEARLY)(;[A-Z]+=[A-Z0-9,+-]+)*$/.test(r),
      'must be an RRULE like FREQ=WEEKLY;BYDAY=MO,WE,FR',
    )
    .superRefine((r, ctx) => {
      const problem = ruleProblem(r);
      if (problem) ctx.addIssue({ code: 'custom', message: problem });
    }),
});
export type RecurrenceInput = z.infer<typeof RecurrenceInput>;

/**
 * Limits that keep a rule cheap to expand. Operations start at most every hour, so a rule may not
 * name minutes or seconds (BYMINUTE, BYSECOND: up to 86,400 occurrences a day), and all its BY*
 * parts together list at most MAX_BY_VALUES values.
 */
export const MAX_BY_VALUES = 60;
/** The first occurrence lies within this many years of now (expansion walks from it). */
export const START_WITHIN_YEARS = 2;
/** Expansion stops after this many candidate dates or this much time, whatever the rule. */
export const MAX_EXPANDED = 50_000;
export const EXPAND_BUDGET_MS = 100;

export function ruleProblem(rule: string): string | null {
  const parts = rule.split(';').map((p) => p.split('='));
  let values = 0;
  for (const [name, value = ''] of parts) {
    if (name === 'BYSECOND' || name === 'BYMINUTE') return `must not use ${name}: occurrences start on the hour at most once an hour`;
    if (name.startsWith('BY')) values += value.split(',').length;
  }
  if (values > MAX_BY_VALUES) return `lists ${values} BY values: at most ${MAX_BY_VALUES}`;
  return null;
}

/** Why the first occurrence is refused (more than START_WITHIN_YEARS years from now), or null. */
export function recurrenceStartProblem(r: Pick<RecurrenceInput, 'start'>, nowMs: number): string | null {
  const [y, mo, d] = r.start.slice(0, 10).split('-').map(Number);
  const startMs = Date.UTC(y, mo - 1, d);
  const span = START_WITHIN_YEARS * 365.25 * 86_400_000;
  if (!Number.isFinite(startMs) || Math.abs(startMs - nowMs) > span) return `must be within ${START_WITHIN_YEARS} years of today`;
  return null;
}

/** The rule as one RFC 5545 text: DTSTART;TZID=...:YYYYMMDDTHHMMSS and RRULE:... */
export function recurrenceText(r: RecurrenceInput): string {
  return `DTSTART;TZID=${r.timeZone}:${r.start.replace(/[-:]/g, '')}00\nRRULE:${r.rule}`;
}

/**
 * Occurrence start times (UTC ms) in [fromMs, toMs]. The rule is expanded in local wall-clock
 * time (rrule treating dates as floating), and each local time is placed in the zone with
 * @date-fns/tz, so 06:00 stays 06:00 across a daylight-saving change (RFC 5545 3.3.5, "local time
 * with time zone reference"). A local time that does not exist (in a spring-forward gap) moves
 * forward by the gap, as @date-fns/tz resolves it.
 */
export function expandRecurrence(r: RecurrenceInput, fromMs: number, toMs: number, max = 1000): number[] {
  const [datePart, timePart] = r.start.split('T');
  const [y, mo, d] = datePart.split('-').map(Number);
  const [h, mi] = timePart.split(':').map(Number);
  const options = rrule.RRule.parseString(r.rule);
  const rule = new rrule.RRule({ ...options, dtstart: new Date(Date.UTC(y, mo - 1, d, h, mi)) });
  // Expand floating local times two days wider than the window on each side, then filter in UTC.
  const floatingFrom = new Date(fromMs - 2 * 86_400_000);
  const floatingTo = new Date(toMs + 2 * 86_400_000);
  const out: number[] = [];
  // rrule walks from DTSTART whatever the window: a rule stored before the limits above (or a
  // start far in the past) must not hold the server, so the walk (rrule's `all` with an iterator
  // callback, which stops at the first false) ends past the window, after MAX_EXPANDED dates, or
  // after EXPAND_BUDGET_MS, whichever comes first.
  const deadline = Date.now() + EXPAND_BUDGET_MS;
  const fromF = floatingFrom.getTime();
  const toF = floatingTo.getTime();
  rule.all((f, i) => {
    const ms = f.getTime();
    if (ms > toF || i >= MAX_EXPANDED || out.length >= max) return false;
    if ((i & 63) === 63 && Date.now() > deadline) return false;
    if (ms >= fromF) {
      const t = new TZDate(
        f.getUTCFullYear(),
        f.getUTCMonth(),
        f.getUTCDate(),
        f.getUTCHours(),
        f.getUTCMinutes(),
        0,
        r.timeZone,
      ).getTime();
      if (t >= fromMs && t <= toMs) out.push(t);
    }
    return true;
  });
  return out;
}
