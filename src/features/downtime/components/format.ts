// Numbers and dates of the downtime page. Dates go through date-fns with @date-fns/tz (never
// hand-made offsets); every number carries its unit.
import { format } from 'date-fns';
import { tz } from '@date-fns/tz';
import { DATE_STYLE } from '../../../../shared/dates';
import { formatAt } from '../../../lib/format';

export const MONTH_SHORT = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'] as const;
export const MONTH_LONG = [
  'January',
  'February',
  'March',
  'April',
  'May',
  'June',
  'July',
  'August',
  'September',
  'October',
  'November',
  'December',
] as const;

const DASH = '–';

/** A fraction 0-1 as a percentage, e.g. 0.4567 → '45.7 %'. */
export function pct(x: number | null | undefined, decimals = 1): string {
  return x === null || x === undefined || !Number.isFinite(x) ? DASH : `${(x * 100).toFixed(decimals)} %`;
}

/** Hours with their unit, e.g. '12.5 h'. */
export function hours(x: number | null | undefined, decimals = 1): string {
  return x === null || x === undefined || !Number.isFinite(x) ? DASH : `${x.toFixed(decimals)} h`;
}

/** Hours as days with their unit, e.g. 60 → '2.5 d'. */
export function days(h: number | null | undefined, decimals = 1): string {
  return h === null || h === undefined || !Number.isFinite(h) ? DASH : `${(h / 24).toFixed(decimals)} d`;
}

/** A plain number, or a dash. */
export function num(x: number | null | undefined, decimals = 1): string {
  return x === null || x === undefined || !Number.isFinite(x) ? DASH : x.toFixed(decimals);
}

/** An instant as a date in a time zone, e.g. '4 Dec 2026'. */
export const dateIn = (iso: string | null | undefined, timeZone: string, pattern: string = DATE_STYLE.dayYear): string =>
  formatAt(iso, timeZone, pattern);

/** A calendar day 'YYYY-MM-DD' as words, e.g. 'Fri 4 Dec 2026'. */
export function dayWords(day: string, pattern: string = DATE_STYLE.dayYear): string {
  return format(new Date(`${day}T12:00:00Z`), pattern, { in: tz('UTC') });
}

/** 'YYYY-MM' as words, e.g. 'December 2026'. */
export function monthWords(month: string): string {
  const m = Number(month.slice(5, 7));
  return `${MONTH_LONG[m - 1] ?? month} ${month.slice(0, 4)}`;
}

/** First and last day 'YYYY-MM-DD' of a month 'YYYY-MM'. */
export function monthRange(month: string): { from: string; to: string } {
  const y = Number(month.slice(0, 4));
  const m = Number(month.slice(5, 7));
  const last = new Date(Date.UTC(y, m, 0)).getUTCDate();
  return { from: `${month}-01`, to: `${month}-${String(last).padStart(2, '0')}` };
}

/** This month 'YYYY-MM' on the user's clock. */
export function thisMonth(now = new Date()): string {
  return format(now, 'yyyy-MM');
}
