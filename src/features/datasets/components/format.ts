// Words and numbers of the sea-data pages. Every time shown here is UTC, the time base of stored
// records; zone handling goes through @date-fns/tz, never through hand-made offsets.
import { DATE_STYLE } from '../../../../shared/dates';
import type { DatasetSummary } from '../../../../shared/api-types-datasets';
import { formatAt, formatPosition } from '../../../lib/format';

/** A UTC instant as text, e.g. '3 Feb 2017 14:00' (date-fns pattern, read in UTC). */
export const formatUtc = (instant: string | number | Date, pattern: string = DATE_STYLE.dateHour): string =>
  formatAt(instant, 'UTC', pattern);

/** A UTC calendar day, e.g. '3 Feb 2017'. */
export const formatUtcDay = (instant: string | number | Date) => formatUtc(instant, DATE_STYLE.date);

/** 'yyyy-MM-dd' of a UTC instant, for date inputs. */
export const utcDateInput = (ms: number) => formatUtc(ms, 'yyyy-MM-dd');

/** Milliseconds of 00:00 UTC of a 'yyyy-MM-dd' date input, NaN when it is not a date. */
export function parseUtcDateInput(value: string): number {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(value);
  if (!m) return NaN;
  return Date.UTC(+m[1], +m[2] - 1, +m[3]);
}

/** A file size in bytes as kB/MB (1 MB = 1024 × 1024 bytes, as the upload limit is stated). */
export function formatBytes(bytes: number): string {
  if (bytes < 1024) return `${bytes} bytes`;
  if (bytes < 1024 * 1024) return `${(bytes / 1024).toFixed(1)} kB`;
  return `${(bytes / 1024 / 1024).toFixed(1)} MB`;
}

/** A record count with thousands separators. */
export const formatCount = (n: number) => n.toLocaleString('en-GB');

/** A time step in minutes as words: '10 min', '1 h', '3 h', '1 day'. */
export function formatStep(minutes: number): string {
  if (!(minutes > 0)) return '–';
  if (minutes < 60) return `${Math.round(minutes)} min`;
  if (minutes < 24 * 60) {
    const h = minutes / 60;
    return `${Number.isInteger(h) ? h : h.toFixed(1)} h`;
  }
  const d = minutes / 1440;
  return `${Number.isInteger(d) ? d : d.toFixed(1)} day${d === 1 ? '' : 's'}`;
}

/** A position in degrees as '36.606° N, 74.840° W'. */
export { formatPosition };

/** Data-point water depth: '42 m' or 'deep water' (null depth is stored as deep). */
export const formatDepth = (depthM: number | null) => (depthM === null ? 'deep water' : `${depthM} m`);

/** A 0-1 share as a percentage with one decimal below 10 %. */
export function formatShare(share: number): string {
  const p = share * 100;
  if (p === 0) return '0 %';
  if (p < 0.1) return '< 0.1 %';
  return `${p < 10 ? p.toFixed(1) : Math.round(p)} %`;
}

/** A number with a fixed number of decimals, or '–' when missing. */
export const formatValue = (x: number | null | undefined, decimals = 2) =>
  x === null || x === undefined || Number.isNaN(x) ? '–' : x.toFixed(decimals);

export const KIND_LABELS: Record<DatasetSummary['kind'], string> = {
  hindcast: 'Hindcast',
  forecast: 'Forecast',
  observation: 'Observation',
};

/** Where a dataset came from, in words. */
export function describeSource(d: DatasetSummary): string {
  if (d.source.kind === 'service') {
    return d.source.issuedAt ? `Forecast service, issued ${formatUtc(d.source.issuedAt)}` : 'Forecast service';
  }
  const fmt = d.source.format === 'ndbc' ? 'NDBC text' : d.source.format === 'csv' ? 'CSV' : d.source.format === 'netcdf' ? 'NetCDF' : null;
  return `${d.source.fileName ?? 'Uploaded file'}${fmt ? ` (${fmt})` : ''}`;
}

/** Names and units of the stored variables. */
export const VARIABLE_LABELS: Record<string, { label: string; unit: string }> = {
  hs: { label: 'Hs', unit: 'm' },
  tp: { label: 'Tp', unit: 's' },
  tz: { label: 'Tz', unit: 's' },
  te: { label: 'Te', unit: 's' },
  dir: { label: 'Wave direction', unit: '° from' },
  wind: { label: 'Wind speed', unit: 'm/s' },
  windDir: { label: 'Wind direction', unit: '° from' },
};

/** The preview tables' column headings, by stored variable. */
const COLUMN_HEADINGS = {
  hs: 'Hs (m)',
  tp: 'Tp (s)',
  tz: 'Tz (s)',
  te: 'Te (s)',
  dir: 'Dir (°)',
  wind: 'Wind (m/s)',
  windDir: 'Wind dir (°)',
};

/** A preview table's columns from [variable, decimals shown] pairs, in order, each with its heading. */
export const previewColumns = <K extends keyof typeof COLUMN_HEADINGS>(columns: [K, number][]) =>
  columns.map(([key, decimals]) => ({ key, label: COLUMN_HEADINGS[key], decimals }));
