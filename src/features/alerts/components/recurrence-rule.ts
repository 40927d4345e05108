// The recurrence builder: form fields <-> an RFC 5545 RRULE body (section 3.3.10), for the subset
// a crew plan needs (daily or weekly, an interval, weekdays, an end by count or last day). Rules
// with other parts (monthly, BYSETPOS, ...) can still be shown and removed, but not edited here.
import { z } from 'zod';
import { RecurrenceInput, WEEKDAYS } from '../../../../shared/recurrence';

export type Weekday = (typeof WEEKDAYS)[number];

export const WEEKDAY_SHORT: Record<Weekday, string> = { MO: 'Mo', TU: 'Tu', WE: 'We', TH: 'Th', FR: 'Fr', SA: 'Sa', SU: 'Su' };
export const WEEKDAY_LONG: Record<Weekday, string> = {
  MO: 'Monday', TU: 'Tuesday', WE: 'Wednesday', TH: 'Thursday', FR: 'Friday', SA: 'Saturday', SU: 'Sunday',
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
    if (v.freq === 'WEEKLY' && v.byDay.length === 0) ctx.addIssue({ code: 'custom', path: ['byDay'], message: 'Pick at least one weekday' });
    if (v.endKind === 'count') {
      const ok = whole('Number of occurrences', MAX_COUNT).safeParse(v.count);
      if (!ok.success) ctx.addIssue({ code: 'custom', path: ['count'], message: ok.error.issues[0].message });
    }
    if (v.endKind === 'until') {
      if (!/^\d{4}-\d{2}-\d{2}$/.test(v.untilDate)) ctx.addIssue({ code: 'custom', path: ['untilDate'], message: 'Enter the last date' });
      else if (v.untilDate < v.startDate) ctx.addIssue({ code: 'custom', path: ['untilDate'], message: 'The last date must be on or after the first date' });
    }
  });
export type RecurrenceForm = z.infer<typeof RecurrenceForm>;

/**
 * The RRULE body of the form, e.g. 'FREQ=WEEKLY;BYDAY=MO,WE,FR' or
 * 'FREQ=DAILY;INTERVAL=2;COUNT=10'. UNTIL is written as the end of the chosen day,
 * 'YYYYMMDDT235959Z': the app expands rules in floating local time (shared/recurrence.ts), so
 * the value is read as 23:59:59 local on that day and every occurrence of the last day is kept.
 */
export function buildRule(v: RecurrenceForm): string {
  const parts = [`FREQ=${v.freq}`];
  if (v.interval > 1) parts.push(`INTERVAL=${v.interval}`);
  if (v.freq === 'WEEKLY') parts.push(`BYDAY=${WEEKDAYS.filter((d) => v.byDay.includes(d)).join(',')}`);
  if (v.endKind === 'count') parts.push(`COUNT=${v.count}`);
  if (v.endKind === 'until') parts.push(`UNTIL=${v.untilDate.replace(/-/g, '')}T235959Z`);
  return parts.join(';');
}

/** The shared API input of the form: local start 'YYYY-MM-DDTHH:mm', zone and rule. */
export const toRecurrenceInput = (v: RecurrenceForm): RecurrenceInput => ({
  start: `${v.startDate}T${v.startTime}`,
  timeZone: v.timeZone,
  rule: buildRule(v),
});

/**
 * Form fields from a stored rule, or null when the rule uses parts the builder does not offer
 * (it is then shown as text and can be replaced or removed).
 */
export function parseRule(input: RecurrenceInput): RecurrenceForm | null {
  const [startDate, startTime] = input.start.split('T');
  const out: RecurrenceForm = {
    freq: 'WEEKLY', byDay: [], interval: 1, startDate, startTime, timeZone: input.timeZone, endKind: 'never', count: Number.NaN, untilDate: '',
  };
  for (const part of input.rule.split(';')) {
    const [key, value = ''] = part.split('=');
    switch (key) {
      case 'FREQ':
        if (value !== 'DAILY' && value !== 'WEEKLY') return null;
        out.freq = value;
        break;
      case 'INTERVAL':
        if (!/^\d+$/.test(value) || Number(value) < 1 || Number(value) > MAX_INTERVAL) return null;
        out.interval = Number(value);
        break;
      case 'BYDAY': {
        const days = value.split(',');
        if (!days.every((d): d is Weekday => (WEEKDAYS as readonly string[]).includes(d))) return null;
        out.byDay = days;
        break;
      }
      case 'COUNT':
        if (!/^\d+$/.test(value) || Number(value) < 1 || Number(value) > MAX_COUNT) return null;
        out.endKind = 'count';
        out.count = Number(value);
        break;
      case 'UNTIL': {
        const m = /^(\d{4})(\d{2})(\d{2})(T\d{6}Z?)?$/.exec(value);
        if (!m) return null;
        out.endKind = 'until';
        out.untilDate = `${m[1]}-${m[2]}-${m[3]}`;
        break;
      }
      case 'WKST':
        if (value !== 'MO') return null;
        break;
      default:
        return null;
    }
  }
  // A daily rule with BYDAY ("every weekday") is not something the builder writes.
  if (out.freq === 'DAILY' && out.byDay.length > 0) return null;
  return out;
}

const dayList = (days: readonly Weekday[]) => {
  const names = WEEKDAYS.filter((d) => days.includes(d)).map((d) => WEEKDAY_LONG[d]);
  return names.length <= 1 ? names.join('') : `${names.slice(0, -1).join(', ')} and ${names[names.length - 1]}`;
};

/** The rule in words, e.g. 'Every week on Monday, Wednesday and Friday at 06:00 (Europe/Oslo), 10 times'. */
export function ruleInWords(v: RecurrenceForm): string {
  const unit = v.freq === 'DAILY' ? 'day' : 'week';
  const every = v.interval > 1 ? `Every ${v.interval} ${unit}s` : `Every ${unit}`;
  const on = v.freq === 'WEEKLY' && v.byDay.length > 0 ? ` on ${dayList(v.byDay)}` : '';
  const end =
    v.endKind === 'count' && Number.isFinite(v.count)
      ? `, ${v.count} time${v.count === 1 ? '' : 's'} in all`
      : v.endKind === 'until' && v.untilDate
        ? `, until ${v.untilDate}`
        : '';
  return `${every}${on} at ${v.startTime} (${v.timeZone}), from ${v.startDate}${end}`;
}

/** The weekday of a calendar date 'YYYY-MM-DD' as an RFC 5545 code (no time zone involved). */
export function weekdayOf(date: string): Weekday | null {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(date);
  if (!m) return null;
  const js = new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3]))).getUTCDay();
  return WEEKDAYS[(js + 6) % 7];
}
