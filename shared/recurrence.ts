import * as rruleModule from 'rrule';
import type { Options } from 'rrule';
import { TZDate } from '@date-fns/tz';
import { z } from 'zod';
import { knownTimeZone } from './schemas/common';

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
  timeZone: knownTimeZone(),
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
/** The first occurrence lies within this many years of now when a rule is saved (expansion itself starts near the window). */
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

const DAY_MS = 86_400_000;

/**
 * The rule with its DTSTART moved forward by whole periods (INTERVAL × FREQ) to at least a day
 * before `beforeMs`, so expansion starts near the window instead of years before it. Every date
 * is a floating local time (UTC fields). It gives the same occurrences from `beforeMs` on because
 * each period is expanded alone (RFC 5545 3.3.10): what rrule would take from DTSTART (the day of
 * the month, the month, the weekday) is written into the rule first, the time of day stays, a
 * shift by whole weeks keeps the week start (WKST), and UNTIL still ends it. A rule with COUNT
 * counts from the first DTSTART, so it is never moved.
 */
function movedForward(options: Partial<Options>, dtstart: Date, beforeMs: number): Partial<Options> {
  const { Frequency } = rrule;
  if (options.count != null) return { ...options, dtstart };
  const interval = Math.max(1, options.interval ?? 1);
  // At least one whole period and a day before the window: a rule's times earlier in the day than
  // DTSTART (BYHOUR) and a first period cut by DTSTART then both lie before the window.
  const target = beforeMs - DAY_MS;
  const h = dtstart.getUTCHours();
  const mi = dtstart.getUTCMinutes();
  const noDayParts = options.byweekno == null && options.byyearday == null && options.bymonthday == null && options.byweekday == null;
  switch (options.freq) {
    case Frequency.DAILY:
    case Frequency.WEEKLY: {
      const periodMs = (options.freq === Frequency.DAILY ? 1 : 7) * interval * DAY_MS;
      const periods = Math.floor((target - dtstart.getTime()) / periodMs) - 1;
      return periods > 0 ? { ...options, dtstart: new Date(dtstart.getTime() + periods * periodMs) } : { ...options, dtstart };
    }
    case Frequency.MONTHLY:
    case Frequency.YEARLY: {
      const monthsPerPeriod = (options.freq === Frequency.MONTHLY ? 1 : 12) * interval;
      const t = new Date(target);
      const months = (t.getUTCFullYear() - dtstart.getUTCFullYear()) * 12 + (t.getUTCMonth() - dtstart.getUTCMonth());
      const periods = Math.floor(months / monthsPerPeriod) - 1;
      if (periods <= 0) return { ...options, dtstart };
      // rrule's defaults from DTSTART (its day of the month, and for YEARLY its month), made explicit.
      const explicit: Partial<Options> = { ...options };
      if (noDayParts) {
        explicit.bymonthday = dtstart.getUTCDate();
        if (options.freq === Frequency.YEARLY && options.bymonth == null) explicit.bymonth = dtstart.getUTCMonth() + 1;
      }
      // A YEARLY period starts on 1 January, a MONTHLY one on the 1st: the new DTSTART is that day.
      const shifted = dtstart.getUTCMonth() + periods * monthsPerPeriod;
      const month = options.freq === Frequency.YEARLY ? 0 : shifted;
      const year = options.freq === Frequency.YEARLY ? dtstart.getUTCFullYear() + Math.floor(shifted / 12) : dtstart.getUTCFullYear();
      return { ...explicit, dtstart: new Date(Date.UTC(year, month, 1, h, mi)) };
    }
    default:
      return { ...options, dtstart };
  }
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
  // Expand floating local times two days wider than the window on each side, then filter in UTC.
  const fromF = fromMs - 2 * DAY_MS;
  const toF = toMs + 2 * DAY_MS;
  // A rule started long ago begins its walk near the window (whole periods skipped, see movedForward).
  const rule = new rrule.RRule(movedForward(rrule.RRule.parseString(r.rule), new Date(Date.UTC(y, mo - 1, d, h, mi)), fromF));
  const out: number[] = [];
  // The guard stays for what cannot be moved (a COUNT rule started long ago) and for rules stored
  // before the limits above: rrule's `between` with an iterator callback, which stops at the first
  // false, ends after MAX_EXPANDED dates, `max` occurrences or EXPAND_BUDGET_MS, whichever comes first.
  const deadline = Date.now() + EXPAND_BUDGET_MS;
  rule.between(new Date(fromF), new Date(toF), true, (f, i) => {
    if (i >= MAX_EXPANDED || out.length >= max) return false;
    if ((i & 63) === 63 && Date.now() > deadline) return false;
    const t = new TZDate(f.getUTCFullYear(), f.getUTCMonth(), f.getUTCDate(), f.getUTCHours(), f.getUTCMinutes(), 0, r.timeZone).getTime();
    if (t >= fromMs && t <= toMs) out.push(t);
    return true;
  });
  return out;
}
