/**
 * The one date style of the product, for pages, reports and e-mails alike: weekday, day and month
 * with a 24-hour time ("Thu 3 Dec 14:00"), the year added where a page spans years. Instants are
 * read in a named IANA zone through date-fns with @date-fns/tz, never through hand-made offsets.
 * A page states its zone once ({@link zoneStatement}) instead of repeating it beside each time.
 */
import { format } from 'date-fns';
import { tz, tzName } from '@date-fns/tz';

/** date-fns patterns of the date style, by name. */
export const DATE_STYLE = {
  /** "Thu 3 Dec 14:00" */
  dateTime: 'EEE d MMM HH:mm',
  /** "Thu 3 Dec 2026 14:00" */
  dateTimeYear: 'EEE d MMM yyyy HH:mm',
  /** "Thu 3 Dec 2026 14:00:05" (logs, mail boxes) */
  dateTimeSeconds: 'EEE d MMM yyyy HH:mm:ss',
  /** "Thu 3 Dec" */
  day: 'EEE d MMM',
  /** "Thu 3 Dec 2026" */
  dayYear: 'EEE d MMM yyyy',
  /** "3 Dec 2026" (ranges of data over years, where the weekday says nothing) */
  date: 'd MMM yyyy',
  /** "3 Dec 2026 14:00" */
  dateHour: 'd MMM yyyy HH:mm',
  /** "14:00" */
  time: 'HH:mm',
  /** "December 2026" (a calendar month) */
  month: 'MMMM yyyy',
} as const;

export type DateStyle = keyof typeof DATE_STYLE;

const DASH = '–';

function toDate(instant: string | number | Date | null | undefined): Date | null {
  if (instant === null || instant === undefined || instant === '') return null;
  const d = instant instanceof Date ? instant : new Date(instant);
  return Number.isNaN(d.getTime()) ? null : d;
}

/** An instant in a zone in the product's date style, e.g. "Thu 3 Dec 14:00"; a dash when missing. */
export function formatInstant(instant: string | number | Date | null | undefined, timeZone: string, style: DateStyle = 'dateTime'): string {
  const d = toDate(instant);
  if (!d) return DASH;
  try {
    return format(d, DATE_STYLE[style], { in: tz(timeZone) });
  } catch {
    return format(d, DATE_STYLE[style], { in: tz('UTC') });
  }
}

/** A calendar day 'YYYY-MM-DD' in the date style, e.g. "Thu 3 Dec 2026" (no zone: a day is a day). */
export function formatDay(day: string, style: 'day' | 'dayYear' | 'date' = 'dayYear'): string {
  if (!/^\d{4}-\d{2}-\d{2}$/.test(day)) return day;
  return format(new Date(`${day}T12:00:00Z`), DATE_STYLE[style], { in: tz('UTC') });
}

/** A calendar month 'YYYY-MM' in the date style, e.g. "December 2026" (no zone: a month is a month). */
export function formatMonth(month: string): string {
  if (!/^\d{4}-\d{2}$/.test(month)) return month;
  return format(new Date(`${month}-15T12:00:00Z`), DATE_STYLE.month, { in: tz('UTC') });
}

/** The zone's short name at that instant ("CET", "GMT+1"), or the zone's own name when unknown. */
export function zoneShortName(instant: string | number | Date, timeZone: string): string {
  const d = toDate(instant) ?? new Date();
  try {
    return tzName(timeZone, d, 'short');
  } catch {
    return timeZone;
  }
}

/** The browser's or server's own IANA zone (for times that belong to no worksite). */
export const localTimeZone = (): string => Intl.DateTimeFormat().resolvedOptions().timeZone || 'UTC';

/**
 * The one statement of a page's time zone, e.g. "Times are in Europe/Oslo (CET), the worksite's
 * local time." `whose` says whose clock it is.
 */
export function zoneStatement(timeZone: string, whose = '', at: string | number | Date = Date.now()): string {
  const short = zoneShortName(at, timeZone);
  const named = short && short !== timeZone ? `${timeZone} (${short})` : timeZone;
  return `Times are in ${named}${whose ? `, ${whose}` : ''}.`;
}

/**
 * The one statement of a page whose times belong to worksites: one zone for every worksite gives
 * {@link zoneStatement}; several zones name the worksites in each, and the zone used for times that
 * belong to no worksite (the first worksite's). No worksite: `fallbackZone` (the browser's).
 */
export function worksiteZoneStatement(
  sites: readonly { name: string; timeZone: string }[],
  fallbackZone: string,
  at: string | number | Date = Date.now(),
): { zone: string; statement: string } {
  if (sites.length === 0) return { zone: fallbackZone, statement: zoneStatement(fallbackZone, 'your own clock (no worksite yet)', at) };
  const byZone = new Map<string, string[]>();
  for (const s of sites) byZone.set(s.timeZone, [...(byZone.get(s.timeZone) ?? []), s.name]);
  const zone = sites[0].timeZone;
  if (byZone.size === 1)
    return { zone, statement: zoneStatement(zone, sites.length === 1 ? 'the worksite’s local time' : 'the worksites’ local time', at) };
  const named = (z: string) => {
    const short = zoneShortName(at, z);
    return short && short !== z ? `${z} (${short})` : z;
  };
  const parts = [...byZone].map(([z, names]) => `${names.join(', ')} in ${named(z)}`);
  return { zone, statement: `Times are each worksite’s local time: ${parts.join('; ')}. Other times are in ${named(zone)}.` };
}
