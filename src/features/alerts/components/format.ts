// Times and words of the alerts pages. Instants are shown in a named IANA zone through date-fns with
// @date-fns/tz (never hand-made offsets), always with the zone's abbreviation beside them.
import { DATE_STYLE, localTimeZone } from '../../../../shared/dates';
import { DASH, formatAt, zoneShort } from '../../../lib/format';

/** The browser's own IANA zone (for times that belong to no worksite: e-mails, runs). */
export const browserTimeZone = localTimeZone;

/** An instant in a zone, e.g. 'Tue 3 Dec 14:00 CET'. */
export function timeIn(iso: string | null | undefined, timeZone: string, pattern: string = DATE_STYLE.dateTime): string {
  const text = formatAt(iso, timeZone, pattern);
  return text === DASH ? DASH : `${text} ${zoneShort(iso!, timeZone)}`;
}

/** A UTC instant in ms, in a zone, e.g. 'Mon 6 Jan 2027 06:00 CET'. */
export const msIn = (ms: number, timeZone: string, pattern: string = DATE_STYLE.dateTimeYear) =>
  timeIn(new Date(ms).toISOString(), timeZone, pattern);

/** Every IANA zone the browser knows, with UTC and the given ones first among them. */
export function timeZoneList(...ensure: string[]): string[] {
  let all: string[];
  try {
    all = Intl.supportedValuesOf('timeZone');
  } catch {
    all = [];
  }
  const set = new Set([...all, 'UTC', ...ensure.filter(Boolean)]);
  return [...set].sort((a, b) => a.localeCompare(b));
}

/** Hours with their unit, e.g. '18 h'. */
export const hoursText = (h: number | null | undefined) =>
  h === null || h === undefined || !Number.isFinite(h) ? DASH : `${Math.round(h * 10) / 10} h`;

/** The engine's limit names in words (docs/domain.md#operations-and-limits; the same words as the alert e-mails). */
export { limitWords } from '../../../../shared/limit-words';
