// The recurrence builder: form fields <-> an RFC 5545 RRULE body (section 3.3.10), for the subset
// a crew plan needs (daily or weekly, an interval, weekdays, an end by count or last day). Rules
// with other parts (monthly, BYSETPOS, ...) can still be shown and removed, but not edited here.
import { z } from 'zod';
import type { Options } from 'rrule';
import { RecurrenceInput, rrule, WEEKDAYS } from '../../../../shared/recurrence';

const { RRule } = rrule;

export type Weekday = (typeof WEEKDAYS)[number];

export const WEEKDAY_SHORT: Record<Weekday, string> = { MO: 'Mo', TU: 'Tu', WE: 'We', TH: 'Th', FR: 'Fr', SA: 'Sa', SU: 'Su' };
export const WEEKDAY_LONG: Record<Weekday, string> = {
  MO: 'Monday',
  TU: 'Tuesday',
  WE: 'Wednesday',
  TH: 'Thursday',
  FR: 'Friday',
  SA: 'Saturday',
  SU: 'Sunday',
};

export const FREQUENCIES = ['DAILY', 'WEEKLY'] as const;
export const END_KINDS = ['never', 'count', 'until'] as const;

/** Upper bounds of the builder: every 99 days or weeks at most; at most 999 occurrences. */
export const MAX_INTERVAL = 99;
export const MAX_COUNT = 999;

const whole = (what: string, max: number) =>
  z
    .number({ error: `${what}: enter a whole number from 1 to ${max}` })
    .int(`${what}: enter a whole number from 1 to ${max}`)
    .min(1, `${what}: enter a whole number from 1 to ${max}`)
    .max(max, `${what}: enter a whole number from 1 to ${max}`);

/**
 * The builder's fields. Start date and time are the worksite's local wall-clock time in
 * `timeZone` (the zone check is the shared RecurrenceInput's). Interval is in days or weeks.
 */
export const RecurrenceForm = z
  .object({
    freq: z.enum(FREQUENCIES),
    byDay: z.array(z.enum(WEEKDAYS)),
    interval: whole('Repeat every', MAX_INTERVAL),
    startDate: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Enter the first date'),
    startTime: z.string().regex(/^([01]\d|2[0-3]):[0-5]\d$/, 'Enter the local start time, HH:MM'),
    timeZone: RecurrenceInput.shape.timeZone,
    endKind: z.enum(END_KINDS),
    /** NaN while the end is not by count (the field is then empty). */
    count: z.union([z.number(), z.nan()]),
    untilDate: z.string(),
  })
  .superRefine((v, ctx) => {
    if (v.freq === 'WEEKLY' && v.byDay.length === 0)
      ctx.addIssue({ code: 'custom', path: ['byDay'], message: 'Pick at least one weekday' });
    if (v.endKind === 'count') {
      const ok = whole('Number of occurrences', MAX_COUNT).safeParse(v.count);
      if (!ok.success) ctx.addIssue({ code: 'custom', path: ['count'], message: ok.error.issues[0].message });
    }
    if (v.endKind === 'until') {
      if (!/^\d{4}-\d{2}-\d{2}$/.test(v.untilDate)) ctx.addIssue({ code: 'custom', path: ['untilDate'], message: 'Enter the last date' });
      else if (v.untilDate < v.startDate)
        ctx.addIssue({ code: 'custom', path: ['untilDate'], message: 'The last date must be on or after the first date' });
    }
  });
export type RecurrenceForm = z.infer<typeof RecurrenceForm>;

/**
 * The RRULE body of the form, e.g. 'FREQ=WEEKLY;BYDAY=MO,WE,FR' or
 * 'FREQ=DAILY;INTERVAL=2;COUNT=10', written by rrule's own formatter. UNTIL is the end of the
 * chosen day, 'YYYYMMDDT235959Z': the app expands rules in floating local time
 * (shared/recurrence.ts), so the value is read as 23:59:59 local on that day and every occurrence
 * of the last day is kept.
 */
export function buildRule(v: RecurrenceForm): string {
  const options: Partial<Options> = { freq: v.freq === 'DAILY' ? RRule.DAILY : RRule.WEEKLY };
  if (v.interval > 1) options.interval = v.interval;
  if (v.freq === 'WEEKLY') options.byweekday = WEEKDAYS.filter((d) => v.byDay.includes(d)).map((d) => RRule[d]);
  if (v.endKind === 'count') options.count = v.count;
  if (v.endKind === 'until') {
    const [y, m, d] = v.untilDate.split('-').map(Number);
    options.until = new Date(Date.UTC(y, m - 1, d, 23, 59, 59));
  }
  return RRule.optionsToString(options).replace(/^RRULE:/, '');
}

/** The shared API input of the form: local start 'YYYY-MM-DDTHH:mm', zone and rule. */
export const toRecurrenceInput = (v: RecurrenceForm): RecurrenceInput => ({
  start: `${v.startDate}T${v.startTime}`,
  timeZone: v.timeZone,
  rule: buildRule(v),
});

/** Rule parts the builder offers; a rule with any other part is shown as text only. */
const BUILDER_PARTS = new Set(['freq', 'interval', 'byweekday', 'count', 'until', 'wkst']);

/**
 * Form fields from a stored rule (read by rrule's own parser), or null when the rule uses parts the
 * builder does not offer (it is then shown as text and can be replaced or removed).
 */
export function parseRule(input: RecurrenceInput): RecurrenceForm | null {
  let options: Partial<Options>;
  try {
    options = RRule.parseString(input.rule);
  } catch {
    return null;
  }
  if (Object.keys(options).some((k) => !BUILDER_PARTS.has(k))) return null;
  if (options.freq !== RRule.DAILY && options.freq !== RRule.WEEKLY) return null;
  const interval = options.interval ?? 1;
  if (!Number.isInteger(interval) || interval < 1 || interval > MAX_INTERVAL) return null;
  const wkst = options.wkst;
  if (wkst !== undefined && wkst !== null && (typeof wkst === 'number' ? wkst : wkst.weekday) !== 0) return null;
  const days = options.byweekday === undefined || options.byweekday === null ? [] : [options.byweekday].flat();
  const byDay: Weekday[] = [];
  for (const day of days) {
    // Only plain weekdays: an ordinal such as +1MO ("first Monday") is not something the builder writes.
    if (typeof day === 'string' || (typeof day === 'object' && day.n !== undefined && day.n !== 0)) return null;
    byDay.push(WEEKDAYS[typeof day === 'number' ? day : day.weekday]);
  }
  // A daily rule with BYDAY ("every weekday") is not something the builder writes either.
  if (options.freq === RRule.DAILY && byDay.length > 0) return null;
  const [startDate, startTime] = input.start.split('T');
  const out: RecurrenceForm = {
    freq: options.freq === RRule.DAILY ? 'DAILY' : 'WEEKLY',
    byDay,
    interval,
    startDate,
    startTime,
    timeZone: input.timeZone,
    endKind: 'never',
    count: Number.NaN,
    untilDate: '',
  };
  if (options.count !== undefined && options.count !== null) {
    if (!Number.isInteger(options.count) || options.count < 1 || options.count > MAX_COUNT) return null;
    out.endKind = 'count';
    out.count = options.count;
  }
  if (options.until) {
    out.endKind = 'until';
    out.untilDate = options.until.toISOString().slice(0, 10);
  }
  return out;
}

const dayList = (days: readonly Weekday[]) => {
  const names = WEEKDAYS.filter((d) => days.includes(d)).map((d) => WEEKDAY_LONG[d]);
  return names.length <= 1 ? names.join('') : `${names.slice(0, -1).join(', ')} and ${names[names.length - 1]}`;
};

/**
 * The rule in words, e.g. 'Every week on Monday, Wednesday and Friday at 06:00 (Europe/Oslo), 10 times'.
 * `pageZone`: the zone the page already states once; the rule names its zone only when it differs.
 */
export function ruleInWords(v: RecurrenceForm, pageZone?: string): string {
  const unit = v.freq === 'DAILY' ? 'day' : 'week';
  const every = v.interval > 1 ? `Every ${v.interval} ${unit}s` : `Every ${unit}`;
  const on = v.freq === 'WEEKLY' && v.byDay.length > 0 ? ` on ${dayList(v.byDay)}` : '';
  const end =
    v.endKind === 'count' && Number.isFinite(v.count)
      ? `, ${v.count} time${v.count === 1 ? '' : 's'} in all`
      : v.endKind === 'until' && v.untilDate
        ? `, until ${v.untilDate}`
        : '';
  const zone = v.timeZone === pageZone ? '' : ` (${v.timeZone})`;
  return `${every}${on} at ${v.startTime}${zone}, from ${v.startDate}${end}`;
}

/** The weekday of a calendar date 'YYYY-MM-DD' as an RFC 5545 code (no time zone involved). */
export function weekdayOf(date: string): Weekday | null {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(date);
  if (!m) return null;
  const js = new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3]))).getUTCDay();
  return WEEKDAYS[(js + 6) % 7];
}
