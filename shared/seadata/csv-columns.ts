/**
 * Which CSV column holds which variable: the column mapping and its detection from header names.
 *
 * Header names are compared after normalisation: case is ignored; a BOM, quotes and units in
 * brackets (`Hs [m]`, `Tp (s)`, `Dir {deg}`) are removed; a trailing unit word after a separator
 * (`hs_m`, `wind speed m/s`, `time UTC`) is removed; then all separators and blanks are dropped
 * (`Wind_Speed`, `wind-speed`, `WindSpeed` all become `windspeed`). Each variable takes the first
 * header that matches one of its names; a header is used once.
 *
 * Names recognised (common in hindcast, buoy and model files; common practice, no source):
 * - time: time, date, datetime, date time, timestamp, valid time, time utc; when the file has
 *   both a `date` and a `time` column (and no combined one), they are read together.
 * - hs: hs, hm0, swh, wvht, hsig, vhm0, significant wave height, wave height.
 * - tp: tp, dpd, peak period, peak wave period, tpeak, vtpk.
 * - tz: tz, tm02, tm2, apd, zero crossing period, mean zero crossing period, vtm02.
 * - te: te, tm-10, tm10, tm-1,0, energy period, vtm10.
 * - dir: dir, mwd, mdir, dirm, wave direction, mean wave direction, mean direction, vmdr.
 * - wind: wind speed, wspd, ws, u10, wind, windspeed, ws10, wind speed 10m.
 * - windDir: wind direction, wdir, wd, winddir, wind dir.
 * - partitions (docs/domain.md#partitions), detected in the columns left over: a partition word
 *   and a quantity word in either order, e.g. `hs_windsea`, `wind_sea_hs`, `Hs swell1 [m]`,
 *   `swell_tp`, `swell2_dir`, `tp_swell_2`. Partition words: wind sea (windsea, wind sea,
 *   wind_sea, sea, wsea), swell 1 (swell, swell1, swell 1, primary swell, sw1), swell 2
 *   (swell2, swell 2, secondary swell, sw2). Quantity words: Hs (hs, hm0, swh, height, h),
 *   Tp (tp, peak period, period, tpeak), direction (dir, direction, mwd, mdir). See
 *   {@link detectPartitionColumns}.
 */
import { z } from 'zod';
import '../schemas/words';
import { SEA_VARIABLES, type SeaVariable } from './records';

/** Header name of each column used; the time column is required. */
export const ColumnMappingSchema = z.object({
  /** Column with the timestamp (or with the time of day when `date` is set). */
  time: z.string().min(1),
  /** Optional separate date column (then `time` holds the time of day). */
  date: z.string().min(1).optional(),
  hs: z.string().min(1).optional(),
  tp: z.string().min(1).optional(),
  tz: z.string().min(1).optional(),
  te: z.string().min(1).optional(),
  dir: z.string().min(1).optional(),
  wind: z.string().min(1).optional(),
  windDir: z.string().min(1).optional(),
});
export type ColumnMapping = z.infer<typeof ColumnMappingSchema>;

/** What {@link detectColumns} found: a mapping that may lack the time column. */
export type DetectedColumns = Partial<ColumnMapping>;

/** Characters of a header name that {@link normaliseHeader} reads. */
const MAX_HEADER_CHARS = 200;

const UNIT_WORDS = new Set([
  'm',
  'meter',
  'meters',
  'metre',
  'metres',
  'ft',
  'feet',
  's',
  'sec',
  'secs',
  'seconds',
  'deg',
  'degt',
  'degree',
  'degrees',
  'ms',
  'mps',
  'kn',
  'kt',
  'kts',
  'knots',
  'kmh',
  'kph',
  'utc',
  'gmt',
  'z',
]);

/**
 * Normalised form of a header name (see the module comment).
 * @example normaliseHeader(' Wind_Speed [m/s] ') // 'windspeed'
 */
export function normaliseHeader(header: string): string {
  // Only the start of a long header is looked at: no known name is near this length, and the
  // bracket pattern below is quadratic on a long run of unclosed brackets.
  let s = header
    .slice(0, MAX_HEADER_CHARS)
    .replace(/^\uFEFF/, '')
    .toLowerCase();
  s = s.replace(/\[[^\]]*\]|\([^)]*\)|\{[^}]*\}/g, ' ');
  s = s.replace(/["']/g, '');
  s = s.replace(/m\/s|km\/h/g, (u) => (u === 'm/s' ? ' ms ' : ' kmh '));
  const words = s.split(/[\s_\-./:,;|]+/).filter((w) => w !== '');
  while (words.length > 1 && UNIT_WORDS.has(words[words.length - 1])) words.pop();
  return words.join('');
}

const NAMES: Record<SeaVariable | 'time', string[]> = {
  time: ['time', 'date', 'datetime', 'date time', 'timestamp', 'valid time', 'date and time', 'time stamp'],
  hs: ['hs', 'hm0', 'swh', 'wvht', 'hsig', 'vhm0', 'significant wave height', 'wave height', 'h s'],
  tp: ['tp', 'dpd', 'peak period', 'peak wave period', 'tpeak', 'vtpk', 'wave peak period'],
  tz: ['tz', 'tm02', 'tm2', 'apd', 'zero crossing period', 'mean zero crossing period', 'vtm02', 'average period'],
  te: ['te', 'tm-10', 'tm10', 'tm-1,0', 'tm-1', 'energy period', 'vtm10'],
  dir: ['dir', 'mwd', 'mdir', 'dirm', 'wave direction', 'mean wave direction', 'mean direction', 'vmdr'],
  wind: ['wind speed', 'wspd', 'ws', 'u10', 'wind', 'windspeed', 'ws10', 'wind speed 10m', 'wind speed at 10m'],
  windDir: ['wind direction', 'wdir', 'wd', 'winddir', 'wind dir', 'wind from direction'],
};

const LOOKUP = new Map<string, SeaVariable | 'time'>();
for (const [key, names] of Object.entries(NAMES) as [SeaVariable | 'time', string[]][]) {
  for (const n of names) {
    const norm = normaliseHeader(n);
    if (!LOOKUP.has(norm)) LOOKUP.set(norm, key);
  }
}

/**
 * Detects the column mapping from header names (see the module comment for the names).
 * @param headers the header row as written.
 * @returns the columns found (header names as written); `time` is missing when no time column
 *   was recognised: the user must then choose it.
 * @example detectColumns(['Date', 'Hs [m]', 'Tp (s)']) // { time: 'Date', hs: 'Hs [m]', tp: 'Tp (s)' }
 */
export function detectColumns(headers: readonly string[]): DetectedColumns {
  const out: DetectedColumns = {};
  const norms = headers.map(normaliseHeader);
  const dateIdx = norms.indexOf('date');
  const timeIdx = norms.indexOf('time');
  const combined = norms.findIndex((n) => n !== 'date' && n !== 'time' && LOOKUP.get(n) === 'time');
  const used = new Set<number>();
  if (combined !== -1) {
    out.time = headers[combined];
    used.add(combined);
  } else if (dateIdx !== -1 && timeIdx !== -1) {
    out.date = headers[dateIdx];
    out.time = headers[timeIdx];
    used.add(dateIdx).add(timeIdx);
  }
  for (let i = 0; i < headers.length; i++) {
    if (used.has(i)) continue;
    const key = LOOKUP.get(norms[i]);
    if (key === undefined || out[key] !== undefined) continue;
    out[key] = headers[i];
    used.add(i);
  }
  return out;
}

/** The partition columns (optional series columns, docs/domain.md#partitions). */
export type PartitionColumn =
  'windSea.hs' | 'windSea.tp' | 'windSea.dir' | 'swell1.hs' | 'swell1.tp' | 'swell1.dir' | 'swell2.hs' | 'swell2.tp' | 'swell2.dir';

const PARTITION_WORDS: Record<'windSea' | 'swell1' | 'swell2', string[]> = {
  windSea: ['windsea', 'wind sea', 'sea', 'wsea'],
  swell1: ['swell', 'swell1', 'swell 1', 'primary swell', 'sw1'],
  swell2: ['swell2', 'swell 2', 'secondary swell', 'sw2'],
};
const QUANTITY_WORDS: Record<'hs' | 'tp' | 'dir', string[]> = {
  hs: ['hs', 'hm0', 'swh', 'height', 'h'],
  tp: ['tp', 'peak period', 'period', 'tpeak'],
  dir: ['dir', 'direction', 'mwd', 'mdir'],
};

const PARTITION_LOOKUP = new Map<string, PartitionColumn>();
for (const [part, pWords] of Object.entries(PARTITION_WORDS)) {
  for (const [qty, qWords] of Object.entries(QUANTITY_WORDS)) {
    for (const pw of pWords) {
      for (const qw of qWords) {
        const column = `${part}.${qty}` as PartitionColumn;
        for (const name of [`${qw} ${pw}`, `${pw} ${qw}`]) {
          const norm = normaliseHeader(name);
          if (!PARTITION_LOOKUP.has(norm) && !LOOKUP.has(norm)) PARTITION_LOOKUP.set(norm, column);
        }
      }
    }
  }
}

/**
 * Detects partition columns (see the module comment) among the headers that the sea-state mapping
 * does not use; each partition column takes the first header that matches.
 * @example detectPartitionColumns(['time', 'hs', 'hs_windsea', 'swell_tp'], {}) // { 'windSea.hs': 'hs_windsea', 'swell1.tp': 'swell_tp' }
 */
export function detectPartitionColumns(headers: readonly string[], mapping: DetectedColumns): Partial<Record<PartitionColumn, string>> {
  const used = new Set(Object.values(mapping).filter((v): v is string => typeof v === 'string'));
  const out: Partial<Record<PartitionColumn, string>> = {};
  for (const h of headers) {
    if (used.has(h)) continue;
    const column = PARTITION_LOOKUP.get(normaliseHeader(h));
    if (column === undefined || out[column] !== undefined) continue;
    out[column] = h;
  }
  return out;
}

/**
 * Units suggested by the header names of the mapped height and wind-speed columns: a unit in
 * brackets or as the last word (`Hs [ft]`, `wind speed (kn)`, `WSPD_kmh`). Only what the headers
 * say is returned; the user confirms it in the mapping step.
 * @example detectUnits({ time: 't', hs: 'Hs (ft)' }) // { height: 'ft' }
 */
export function detectUnits(mapping: DetectedColumns): { height?: 'm' | 'ft'; speed?: 'm/s' | 'kn' | 'km/h' } {
  const out: { height?: 'm' | 'ft'; speed?: 'm/s' | 'kn' | 'km/h' } = {};
  if (mapping.hs !== undefined) {
    const w = unitWords(mapping.hs);
    if (w.has('ft') || w.has('feet')) out.height = 'ft';
    else if (w.has('m') || w.has('metres') || w.has('meters')) out.height = 'm';
  }
  if (mapping.wind !== undefined) {
    const w = unitWords(mapping.wind);
    if (w.has('kn') || w.has('kt') || w.has('kts') || w.has('knots')) out.speed = 'kn';
    else if (w.has('kmh') || w.has('kph')) out.speed = 'km/h';
    else if (w.has('ms') || w.has('mps')) out.speed = 'm/s';
  }
  return out;
}

// Words of a header that may name a unit: bracket contents and the trailing words.
function unitWords(header: string): Set<string> {
  const s = header.toLowerCase().replace(/m\/s|km\/h/g, (u) => (u === 'm/s' ? ' ms ' : ' kmh '));
  const words = s.split(/[\s_\-./:,;|()[\]{}"']+/).filter((w) => w !== '');
  return new Set(words.slice(1));
}

/** The variables a mapping reads, in SEA_VARIABLES order. */
export function mappedVariables(mapping: DetectedColumns): SeaVariable[] {
  return SEA_VARIABLES.filter((v) => mapping[v] !== undefined);
}
