// The client's one set of formatting helpers: instants in a worksite's zone (on the product's date
// style, shared/dates.ts, which the e-mails use too), positions, and numbers with their units.
// Feature formatters build on these; they never format a date or a position their own way.
import { format } from 'date-fns';
import { tz } from '@date-fns/tz';
import { DATE_STYLE, zoneShortName } from '../../shared/dates';

export const DASH = '–';

/** An instant in a zone by a date-fns pattern (default "Thu 3 Dec 14:00"); a dash when missing or invalid. */
export function formatAt(instant: string | number | Date | null | undefined, zone: string, pattern: string = DATE_STYLE.dateTime): string {
  if (instant === null || instant === undefined || instant === '') return DASH;
  const d = instant instanceof Date ? instant : new Date(instant);
  if (Number.isNaN(d.getTime())) return DASH;
  return format(d, pattern, { in: tz(zone) });
}

/** The zone's short name at that instant ("CET", "GMT+1"). */
export const zoneShort = (instant: string | number | Date, zone: string): string => zoneShortName(instant, zone);

/** A position in degrees, e.g. "36.606° N, 74.840° W" (3 decimals: about 100 m). */
export function formatPosition(latitudeDeg: number, longitudeDeg: number, decimals = 3): string {
  const lat = `${Math.abs(latitudeDeg).toFixed(decimals)}° ${latitudeDeg < 0 ? 'S' : 'N'}`;
  const lon = `${Math.abs(longitudeDeg).toFixed(decimals)}° ${longitudeDeg < 0 ? 'W' : 'E'}`;
  return `${lat}, ${lon}`;
}

/** A number rounded to at most `decimals` places, trailing zeros dropped ("1.5", "16", "0.35"); a dash when not finite. */
export function trimmed(value: number | null | undefined, decimals = 2): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return DASH;
  return String(Number(value.toFixed(decimals)));
}

/** A number with a fixed number of decimals and its unit ("2.50 m"); a dash when missing. */
export function fixedWithUnit(value: number | null | undefined, decimals: number, unit = ''): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return DASH;
  return unit ? `${value.toFixed(decimals)} ${unit}` : value.toFixed(decimals);
}

/** A count with its noun, singular or plural: "1 worksite", "3 operations". */
export const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;
