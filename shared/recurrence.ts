import * as rruleModule from 'rrule';
import { TZDate } from '@date-fns/tz';
import { z } from 'zod';
import './schemas/words';

// rrule ships a UMD main that Node's ESM loader exposes as a default export; Vite exposes names.
export const rrule = ((rruleModule as unknown as { RRule?: unknown }).RRule ? rruleModule : (rruleModule as unknown as { default: typeof rruleModule }).default) as typeof rruleModule;

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
    .refine((r) => /^FREQ=(DAILY|WEEKLY|MONTHLY|YEARLY)(;[A-Z]+=[A-Z0-9,+-]+)*$/.test(r), 'must be an RRULE like FREQ=WEEKLY;BYDAY=MO,WE,FR'),
});
export type RecurrenceInput = z.infer<typeof RecurrenceInput>;

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
  for (const f of rule.between(floatingFrom, floatingTo, true)) {
    const t = new TZDate(f.getUTCFullYear(), f.getUTCMonth(), f.getUTCDate(), f.getUTCHours(), f.getUTCMinutes(), 0, r.timeZone).getTime();
    if (t >= fromMs && t <= toMs) out.push(t);
    if (out.length >= max) break;
  }
  return out;
}
