/**
 * Sea states from NetCDF files that follow the CF conventions (docs/domain.md#netcdf): which
 * variable is which (by `standard_name`, else by the CSV import's column names), CF time units and
 * calendars, packed values with fill, missing and valid ranges, going-to directions, grid points
 * and the nearest sea point.
 *
 * Pure TypeScript: the file itself is reached through {@link NcFile}, which the server implements
 * for NetCDF-4 (HDF5) and classic files. Only the chosen point's series is read, plus, for a grid,
 * the reference wave height in time slabs to count missing values per point.
 *
 * Source: NetCDF Climate and Forecast (CF) Metadata Conventions 1.x, sections 3.1 (units),
 * 3.3 (standard names), 2.5.1 (_FillValue, missing_value, valid_min/valid_max/valid_range),
 * 8.1 (scale_factor, add_offset), 4.4 (time coordinate, calendars), 5.2 (2-D latitude and
 * longitude through the coordinates attribute); the CF standard name table.
 */
import { detectColumns } from './csv-columns';
import { ImportError, type ImportIssue } from './issues';
import { SEA_VARIABLES, type SeaRecords, type SeaVariable } from './records';
import { implausibleReason } from './validate';

/** An attribute value: text, or numbers (a scalar attribute is a one-element list). */
export type NcAttr = string | number[];

/** One variable of a NetCDF file, as the file adapter describes it. */
export interface NcVar {
  name: string;
  /** Dimension names, slowest first. */
  dims: string[];
  /** Length of each dimension. */
  shape: number[];
  attrs: Record<string, NcAttr>;
}

/** A NetCDF file open for reading (the server's adapters: NetCDF-4 and classic). */
export interface NcFile {
  format: 'netcdf4' | 'classic';
  variables: NcVar[];
  /**
   * Raw (still packed) values of a hyperslab: `start[k]`, `count[k]` per dimension, row-major,
   * as stored (no fill, scale or offset applied).
   */
  readRaw(name: string, start: number[], count: number[]): Float64Array;
}

/** Sea-state partitions (docs/domain.md#partitions). */
export const PARTITIONS = ['windSea', 'swell1', 'swell2', 'swell'] as const;
export type Partition = (typeof PARTITIONS)[number];
export const PARTITION_LABELS: Record<Partition, string> = {
  windSea: 'wind sea',
  swell1: 'primary swell',
  swell2: 'secondary swell',
  swell: 'swell (all)',
};

/** What a variable can be used as. */
export type CfRole =
  | SeaVariable
  | 'u'
  | 'v'
  | `${Partition}.${'hs' | 'tp' | 'dir'}`
  | 'depth'
  | 'waterLevel'
  | 'forecastReferenceTime'
  | 'currentSpeed'
  | 'currentDir'
  | 'currentU'
  | 'currentV';

/** Standard names read for the total sea state and wind (CF standard name table). */
export const TOTAL_NAMES: Record<SeaVariable, { from: string[]; to?: string[] }> = {
  hs: { from: ['sea_surface_wave_significant_height'] },
  tp: { from: ['sea_surface_wave_period_at_variance_spectral_density_maximum'] },
  tz: {
    from: [
      'sea_surface_wave_mean_period_from_variance_spectral_density_second_frequency_moment',
      'sea_surface_wave_zero_upcrossing_period',
    ],
  },
  te: { from: ['sea_surface_wave_mean_period_from_variance_spectral_density_inverse_frequency_moment'] },
  dir: { from: ['sea_surface_wave_from_direction'], to: ['sea_surface_wave_to_direction'] },
  wind: { from: ['wind_speed'] },
  windDir: { from: ['wind_from_direction'], to: ['wind_to_direction'] },
};

const PARTITION_PREFIX: Record<Partition, string> = {
  windSea: 'sea_surface_wind_wave_',
  swell1: 'sea_surface_primary_swell_wave_',
  swell2: 'sea_surface_secondary_swell_wave_',
  swell: 'sea_surface_swell_wave_',
};

/** Standard names read for the partitions. */
export const PARTITION_NAMES: Record<Partition, { hs: string; tp: string; dirFrom: string; dirTo: string }> = Object.fromEntries(
  PARTITIONS.map((p) => [
    p,
    {
      hs: `${PARTITION_PREFIX[p]}significant_height`,
      tp: `${PARTITION_PREFIX[p]}period_at_variance_spectral_density_maximum`,
      dirFrom: `${PARTITION_PREFIX[p]}from_direction`,
      dirTo: `${PARTITION_PREFIX[p]}to_direction`,
    },
  ]),
) as Record<Partition, { hs: string; tp: string; dirFrom: string; dirTo: string }>;

export const WIND_COMPONENT_NAMES = { u: 'eastward_wind', v: 'northward_wind' } as const;

/**
 * Current (docs/domain.md#tide): speed with the direction the water flows towards (CF's
 * direction_of_sea_water_velocity is "to"; currents are stored going-to, the oceanographic
 * convention), or eastward and northward components.
 */
export const CURRENT_NAMES = {
  speed: 'sea_water_speed',
  dirTo: 'direction_of_sea_water_velocity',
  u: 'eastward_sea_water_velocity',
  v: 'northward_sea_water_velocity',
} as const;

/** Fastest current accepted, m/s (the fastest tidal races run at about 10 m/s, from memory). */
export const CURRENT_MAX_MS = 15;

/** Model depth at the point (positive down), m. */
export const DEPTH_NAMES = ['sea_floor_depth_below_sea_surface', 'sea_floor_depth_below_mean_sea_level', 'sea_floor_depth_below_geoid'];

/**
 * Water level: every standard name carries its datum (what follows "_above_"). Tidal names leave
 * the surge out.
 */
export const WATER_LEVEL_NAMES = [
  'sea_surface_height_above_mean_sea_level',
  'sea_surface_height_above_geoid',
  'sea_surface_height_above_reference_ellipsoid',
  'tidal_sea_surface_height_above_lowest_astronomical_tide',
  'tidal_sea_surface_height_above_mean_sea_level',
  'tidal_sea_surface_height_above_mean_lower_low_water',
  'tidal_sea_surface_height_above_mean_low_water_springs',
  'tidal_sea_surface_height_above_mean_higher_high_water',
  'tidal_sea_surface_height_above_mean_high_water_springs',
];

/** Every standard name this reader uses, for the README and the import page. */
export function standardNamesRead(): string[] {
  const out = new Set<string>();
  for (const v of SEA_VARIABLES) for (const n of [...TOTAL_NAMES[v].from, ...(TOTAL_NAMES[v].to ?? [])]) out.add(n);
  for (const p of PARTITIONS) for (const n of Object.values(PARTITION_NAMES[p])) out.add(n);
  out.add(WIND_COMPONENT_NAMES.u).add(WIND_COMPONENT_NAMES.v);
  for (const n of Object.values(CURRENT_NAMES)) out.add(n);
  for (const n of [...DEPTH_NAMES, ...WATER_LEVEL_NAMES, 'forecast_reference_time', 'time', 'latitude', 'longitude']) out.add(n);
  return [...out];
}

// ---------------------------------------------------------------------------------------------
// Attributes

export function attrText(v: NcVar, key: string): string | undefined {
  const a = v.attrs[key];
  return typeof a === 'string' ? a.trim() : undefined;
}

export function attrNumbers(v: NcVar, key: string): number[] | undefined {
  const a = v.attrs[key];
  return Array.isArray(a) && a.length > 0 ? a : undefined;
}

const fmt = (n: number) => n.toLocaleString('en-US');

function fail(variable: string, reason: string): ImportError {
  return new ImportError([{ line: 0, column: variable, value: '', reason }], 1, `variable ${variable}: ${reason}`);
}

// ---------------------------------------------------------------------------------------------
// Time (CF 4.4)

const UNIT_MS: Record<string, number> = {
  day: 86_400_000,
  days: 86_400_000,
  d: 86_400_000,
  hour: 3_600_000,
  hours: 3_600_000,
  hr: 3_600_000,
  hrs: 3_600_000,
  h: 3_600_000,
  minute: 60_000,
  minutes: 60_000,
  min: 60_000,
  mins: 60_000,
  second: 1000,
  seconds: 1000,
  sec: 1000,
  secs: 1000,
  s: 1000,
};

/** Calendars read as the proleptic Gregorian calendar of `Date` (CF 4.4.1). */
export const ACCEPTED_CALENDARS = ['standard', 'gregorian', 'proleptic_gregorian', 'none'] as const;
/** Calendars refused: their dates are not instants of the real calendar. */
export const REFUSED_CALENDARS = ['noleap', '365_day', '360_day', 'all_leap', '366_day', 'julian'] as const;

/** First day of the Gregorian calendar: 'standard' mixes Julian dates before it (CF 4.4.1). */
const GREGORIAN_START_MS = Date.UTC(1582, 9, 15);

/**
 * Parses a CF time units string ("hours since 1900-01-01 00:00:00", "days since 2023-6-1",
 * "seconds since 2024-03-01T00:00:00Z", "minutes since 1990-1-1 0:0:0 -6:00").
 * @returns milliseconds per unit and the reference instant (UTC ms).
 * @throws ImportError naming the variable for anything else (months and years are refused: their
 *   length is not fixed).
 */
export function parseTimeUnits(units: string, calendar: string | undefined, variable = 'time'): { unitMs: number; originMs: number } {
  const cal = (calendar ?? 'standard').trim().toLowerCase() || 'standard';
  if ((REFUSED_CALENDARS as readonly string[]).includes(cal)) {
    throw fail(
      variable,
      `calendar "${cal}" is not supported: its dates are not real-calendar instants (only ${ACCEPTED_CALENDARS.join(', ')} are read; convert the file with its producer's tools)`,
    );
  }
  if (!(ACCEPTED_CALENDARS as readonly string[]).includes(cal)) {
    throw fail(variable, `unknown calendar "${cal}" (only ${ACCEPTED_CALENDARS.join(', ')} are read)`);
  }
  const m =
    /^\s*([A-Za-z]+)\s+since\s+(\d{1,4})-(\d{1,2})-(\d{1,2})(?:[T\s]+(\d{1,2}):(\d{1,2})(?::(\d{1,2}(?:\.\d*)?))?)?\s*(Z|UTC|GMT|[+-]\d{1,2}(?::?\d{2})?)?\s*$/i.exec(
      units,
    );
  if (!m) throw fail(variable, `time units "${units}" are not "<unit> since <date>" (CF 4.4)`);
  const unitMs = UNIT_MS[m[1].toLowerCase()];
  if (unitMs === undefined) {
    throw fail(variable, `time unit "${m[1]}" is not read (use days, hours, minutes or seconds; months and years have no fixed length)`);
  }
  const [y, mo, d] = [Number(m[2]), Number(m[3]), Number(m[4])];
  const [hh, mm, ss] = [Number(m[5] ?? 0), Number(m[6] ?? 0), Number(m[7] ?? 0)];
  if (mo < 1 || mo > 12 || d < 1 || d > 31 || hh > 23 || mm > 59 || ss >= 61) {
    throw fail(variable, `time units "${units}": the reference date is not a valid date`);
  }
  let originMs = Date.UTC(y, mo - 1, d, hh, mm, 0) + ss * 1000;
  if (y < 100) originMs = new Date(originMs).setUTCFullYear(y);
  const zone = m[8];
  if (zone && !/^(Z|UTC|GMT)$/i.test(zone)) {
    const z = /^([+-])(\d{1,2}):?(\d{2})?$/.exec(zone);
    if (z) originMs -= (z[1] === '-' ? -1 : 1) * (Number(z[2]) * 60 + Number(z[3] ?? 0)) * 60_000;
  }
  if (cal !== 'proleptic_gregorian' && originMs < GREGORIAN_START_MS) {
    throw fail(
      variable,
      `time units "${units}" with the ${cal} calendar: a reference date before 1582-10-15 mixes Julian dates; give the file with calendar proleptic_gregorian`,
    );
  }
  return { unitMs, originMs };
}

/**
 * Decodes CF time values to UTC ms (rounded to the millisecond), checking they strictly increase.
 * @throws ImportError "variable time: ... at time index N" for a missing or repeated time.
 */
export function decodeTimes(timeVar: NcVar, raw: Float64Array): Float64Array {
  const units = attrText(timeVar, 'units');
  if (!units) throw fail(timeVar.name, 'has no units attribute (CF 4.4 needs "<unit> since <date>")');
  const { unitMs, originMs } = parseTimeUnits(units, attrText(timeVar, 'calendar'), timeVar.name);
  const fills = [...(attrNumbers(timeVar, '_FillValue') ?? []), ...(attrNumbers(timeVar, 'missing_value') ?? [])];
  const scale = attrNumbers(timeVar, 'scale_factor')?.[0] ?? 1;
  const offset = attrNumbers(timeVar, 'add_offset')?.[0] ?? 0;
  const out = new Float64Array(raw.length);
  for (let i = 0; i < raw.length; i++) {
    const r = raw[i];
    if (!Number.isFinite(r) || fills.includes(r)) throw fail(timeVar.name, `missing time at time index ${fmt(i)}`);
    const ms = Math.round(originMs + (r * scale + offset) * unitMs);
    if (!Number.isFinite(ms) || Math.abs(ms) > 8.64e15)
      throw fail(timeVar.name, `time ${r} ${units} is out of range at time index ${fmt(i)}`);
    if (i > 0 && ms <= out[i - 1]) {
      throw fail(
        timeVar.name,
        `times must increase: ${new Date(ms).toISOString()} at time index ${fmt(i)} is ${ms === out[i - 1] ? 'a repeat of' : 'before'} the one before`,
      );
    }
    out[i] = ms;
  }
  return out;
}

// ---------------------------------------------------------------------------------------------
// Packed values (CF 2.5.1 and 8.1)

/** Default fill of NetCDF float and double variables (netcdf.h NC_FILL_FLOAT / NC_FILL_DOUBLE). */
const NC_FILL_FLOAT = 9.969209968386869e36;

/**
 * Raw packed values to physical values, NaN for missing: a raw value equal to _FillValue or to
 * any missing_value, outside valid_min/valid_max/valid_range (all compared with the raw packed
 * values, CF 2.5.1), or not finite, is missing; the rest become raw * scale_factor + add_offset
 * (CF 8.1). Writes into `out` (may be `raw` itself).
 */
export function unpack(v: NcVar, raw: Float64Array, out: Float64Array = new Float64Array(raw.length)): Float64Array {
  const fills = [...(attrNumbers(v, '_FillValue') ?? []), ...(attrNumbers(v, 'missing_value') ?? [])];
  const range = attrNumbers(v, 'valid_range');
  const lo = range && range.length >= 2 ? range[0] : (attrNumbers(v, 'valid_min')?.[0] ?? -Infinity);
  const hi = range && range.length >= 2 ? range[1] : (attrNumbers(v, 'valid_max')?.[0] ?? Infinity);
  const scale = attrNumbers(v, 'scale_factor')?.[0] ?? 1;
  const offset = attrNumbers(v, 'add_offset')?.[0] ?? 0;
  const f0 = fills[0] ?? NaN;
  const f1 = fills[1] ?? NaN;
  const more = fills.slice(2);
  for (let i = 0; i < raw.length; i++) {
    const r = raw[i];
    if (
      r !== r ||
      r === f0 ||
      r === f1 ||
      r < lo ||
      r > hi ||
      r === NC_FILL_FLOAT ||
      !Number.isFinite(r) ||
      (more.length > 0 && more.includes(r))
    ) {
      out[i] = NaN;
    } else {
      out[i] = r * scale + offset;
    }
  }
  return out;
}

// ---------------------------------------------------------------------------------------------
// Finding the variables

/** A variable chosen for a role. */
export interface CfChoice {
  role: CfRole;
  variable: string;
  /** Standard name that matched, or how it was found otherwise. */
  via: string;
  /** The direction is "to" in the file and is turned to "coming from". */
  goingTo?: boolean;
  /** For water level: the datum its standard name states. */
  datum?: string;
}

/** Which variables the import reads. */
export interface CfPlan {
  time: NcVar;
  choices: CfChoice[];
  /** Dimensions of the points (the reference variable's dimensions besides time and size-1 ones). */
  pointDims: string[];
  /** Reference variable: the total Hs, else the first partition Hs. */
  reference: NcVar;
  /** Variables that look like sea-state data but are not used, with why. */
  ignored: { variable: string; reason: string }[];
}

/** An explicit mapping of roles to variable names (the CSV import's column map). */
export type NcColumnMap = Partial<Record<SeaVariable | 'time', string>>;

/**
 * A NetCDF-4 variable in a group is named by its path without the leading '/' ("waves/hs"); these
 * give its own name ("hs") and its group ("waves", "" for the root group).
 */
export function baseName(name: string): string {
  return name.slice(name.lastIndexOf('/') + 1);
}
export function groupOf(name: string): string {
  const k = name.lastIndexOf('/');
  return k === -1 ? '' : name.slice(0, k);
}

/**
 * The variable a name refers to from `from`'s group: an absolute path ("/ocean/ssh"), a relative
 * one, or a bare name looked up in `from`'s group and then its parents (CF 1.8 section 2.7,
 * search by proximity).
 */
export function resolveVariable(vars: readonly NcVar[], name: string, from = ''): NcVar | undefined {
  if (name.startsWith('/')) return vars.find((v) => v.name === name.slice(1));
  for (let g = from; ; g = groupOf(g)) {
    const v = vars.find((x) => x.name === (g === '' ? name : `${g}/${name}`));
    if (v || g === '') return v;
  }
}

function byStandardName(vars: NcVar[], names: readonly string[]): NcVar | undefined {
  for (const n of names) {
    const v = vars.find((x) => attrText(x, 'standard_name') === n);
    if (v) return v;
  }
  return undefined;
}

/**
 * Finds the time variable and every variable the import uses: an explicit column map first, then
 * CF standard names, then (for variables without a standard name) the CSV import's column names.
 * @throws ImportError when there is no time variable or no wave height at all.
 */
export function planCfImport(file: NcFile, columns: NcColumnMap = {}): CfPlan {
  const vars = file.variables;
  const get = (name: string, role: string) => {
    // The column map may give a variable's path ("waves/hs") or, when only one has it, its name.
    const same = vars.filter((x) => baseName(x.name) === name);
    const v = vars.find((x) => x.name === name) ?? (same.length === 1 ? same[0] : undefined);
    if (!v && same.length > 1) {
      throw fail(
        name,
        `is named in the column map for ${role} but several groups have it (${same.map((x) => x.name).join(', ')}): give the path`,
      );
    }
    if (!v)
      throw fail(
        name,
        `is named in the column map for ${role} but the file has no such variable (it has ${vars.map((x) => x.name).join(', ')})`,
      );
    return v;
  };
  const unnamed = vars.filter((v) => attrText(v, 'standard_name') === undefined);
  // The CSV column names are matched on each variable's own name (without its group); the first
  // variable of a name wins (root group first).
  const guessedNames = detectColumns([...new Set(unnamed.map((v) => baseName(v.name)))]);
  const unnamedBy = (name: string | undefined) => (name === undefined ? undefined : unnamed.find((v) => baseName(v.name) === name));
  const guessed = Object.fromEntries(Object.entries(guessedNames).map(([k, n]) => [k, unnamedBy(n as string)?.name])) as Partial<
    Record<keyof typeof guessedNames, string>
  >;

  // The time variable: with several (groups with a time each), the one the wave heights run along.
  const hsNames = [...TOTAL_NAMES.hs.from, ...PARTITIONS.map((p) => PARTITION_NAMES[p].hs)];
  const hsDims = new Set(vars.filter((v) => hsNames.includes(attrText(v, 'standard_name') ?? '')).flatMap((v) => v.dims));
  const timeCandidates = [
    ...vars.filter((v) => attrText(v, 'standard_name') === 'time'),
    ...vars.filter((v) => attrText(v, 'axis') === 'T'),
    ...vars.filter((v) => baseName(v.name) === 'time'),
    ...(guessed.time ? vars.filter((v) => v.name === guessed.time) : []),
  ].filter((v) => v.dims.length === 1);
  const time =
    (columns.time ? get(columns.time, 'time') : undefined) ?? timeCandidates.find((v) => hsDims.has(v.dims[0])) ?? timeCandidates[0];
  if (!time) throw fail('time', 'the file has no time variable (standard_name "time", axis "T" or a variable named time)');
  if (time.dims.length !== 1) throw fail(time.name, 'the time variable must have one dimension');
  const tDim = time.dims[0];
  const timed = vars.filter((v) => v !== time && v.dims.includes(tDim));

  const choices: CfChoice[] = [];
  const used = new Set<string>();
  const choose = (role: CfRole, v: NcVar | undefined, via: string, extra: Partial<CfChoice> = {}) => {
    if (!v || used.has(v.name)) return false;
    used.add(v.name);
    choices.push({ role, variable: v.name, via, ...extra });
    return true;
  };

  for (const key of SEA_VARIABLES) {
    const mapped = columns[key];
    if (mapped) {
      choose(key, get(mapped, key), 'column map');
      continue;
    }
    const names = TOTAL_NAMES[key];
    const from = byStandardName(timed, names.from);
    if (from) choose(key, from, attrText(from, 'standard_name')!);
    else if (names.to) {
      const to = byStandardName(timed, names.to);
      if (to) choose(key, to, attrText(to, 'standard_name')!, { goingTo: true });
    }
  }
  for (const p of PARTITIONS) {
    const n = PARTITION_NAMES[p];
    const hs = byStandardName(timed, [n.hs]);
    if (!hs) continue;
    choose(`${p}.hs`, hs, n.hs);
    choose(`${p}.tp`, byStandardName(timed, [n.tp]), n.tp);
    const from = byStandardName(timed, [n.dirFrom]);
    if (from) choose(`${p}.dir`, from, n.dirFrom);
    else choose(`${p}.dir`, byStandardName(timed, [n.dirTo]), n.dirTo, { goingTo: true });
  }
  const has = (role: CfRole) => choices.some((c) => c.role === role);
  if (!has('wind')) {
    const u = byStandardName(timed, [WIND_COMPONENT_NAMES.u]);
    const v = byStandardName(timed, [WIND_COMPONENT_NAMES.v]);
    if (u && v) {
      choose('u', u, WIND_COMPONENT_NAMES.u);
      choose('v', v, WIND_COMPONENT_NAMES.v);
    }
  }
  // Column names for what the standard names did not give (variables without a standard name).
  for (const key of SEA_VARIABLES) {
    if (has(key) || (key === 'wind' && has('u'))) continue;
    const name = guessed[key];
    const v = name ? timed.find((x) => x.name === name) : undefined;
    if (v) choose(key, v, `name "${v.name}" (no standard_name; the CSV column names)`);
  }
  const speed = byStandardName(timed, [CURRENT_NAMES.speed]);
  if (speed) {
    choose('currentSpeed', speed, CURRENT_NAMES.speed);
    choose('currentDir', byStandardName(timed, [CURRENT_NAMES.dirTo]), CURRENT_NAMES.dirTo);
  } else {
    const cu = byStandardName(timed, [CURRENT_NAMES.u]);
    const cv = byStandardName(timed, [CURRENT_NAMES.v]);
    if (cu && cv) {
      choose('currentU', cu, CURRENT_NAMES.u);
      choose('currentV', cv, CURRENT_NAMES.v);
    }
  }
  const depth = byStandardName(vars, DEPTH_NAMES);
  if (depth) choose('depth', depth, attrText(depth, 'standard_name')!);
  const level = byStandardName(timed, WATER_LEVEL_NAMES);
  if (level) {
    const sn = attrText(level, 'standard_name')!;
    choose('waterLevel', level, sn, { datum: sn.slice(sn.indexOf('_above_') + '_above_'.length).replace(/_/g, ' ') });
  }
  const ref = byStandardName(vars, ['forecast_reference_time']);
  if (ref) choose('forecastReferenceTime', ref, 'forecast_reference_time');

  const refChoice = choices.find((c) => c.role === 'hs') ?? choices.find((c) => c.role.endsWith('.hs'));
  if (!refChoice) {
    throw fail(
      '(file)',
      `no significant wave height found: no variable has standard_name ${TOTAL_NAMES.hs.from[0]} or a partition's (${PARTITIONS.map((p) => PARTITION_NAMES[p].hs).join(', ')}), and no variable is named like an Hs column (hs, hm0, swh, vhm0...). Variables: ${vars.map((v) => v.name).join(', ')}`,
    );
  }
  const reference = vars.find((v) => v.name === refChoice.variable)!;
  if (!reference.dims.includes(tDim)) throw fail(reference.name, `does not run along the time dimension ${tDim}`);
  const pointDims = reference.dims.filter((d, k) => d !== tDim && reference.shape[k] !== 1);
  for (const c of choices) {
    if (c.role === 'depth' || c.role === 'forecastReferenceTime') continue;
    const v = vars.find((x) => x.name === c.variable)!;
    if (!v.dims.includes(tDim)) throw fail(v.name, `does not run along the time dimension ${tDim}`);
    const dims = v.dims.filter((d, k) => d !== tDim && v.shape[k] !== 1);
    if (dims.join(',') !== pointDims.join(',')) {
      throw fail(
        v.name,
        `has dimensions (${v.dims.join(', ')}) where ${reference.name} has (${reference.dims.join(', ')}): the variables of one import must share their grid`,
      );
    }
    if (v.dims.indexOf(tDim) !== reference.dims.indexOf(tDim)) {
      throw fail(v.name, `has time at another position than ${reference.name}`);
    }
  }
  const ignored = timed
    .filter((v) => !used.has(v.name) && /wave|wind|swell|sea_surface|sea_water/.test(attrText(v, 'standard_name') ?? ''))
    .map((v) => {
      const sn = attrText(v, 'standard_name');
      const twin = choices.find((c) => c.via === sn);
      return {
        variable: v.name,
        reason: twin
          ? `has the same standard_name ${sn} as ${twin.variable}, which is read (the first found, root group first)`
          : `standard_name ${sn} is not read`,
      };
    });
  return { time, choices, pointDims, reference, ignored };
}

// ---------------------------------------------------------------------------------------------
// Grid points

/** One point of the file's grid. */
export interface GridPoint {
  /** Index along each of the plan's `pointDims`. */
  index: number[];
  /** Latitude, degrees north (NaN when the file gives none). */
  lat: number;
  /** Longitude, degrees east in -180..180 (NaN when the file gives none). */
  lon: number;
  /** Share of the reference variable's values that are missing, 0-1 (NaN until scanned). */
  missingShare: number;
}

const LAT_NAMES = ['lat', 'latitude', 'nav_lat', 'y_lat'];
const LON_NAMES = ['lon', 'longitude', 'nav_lon', 'x_lon'];

function findCoord(file: NcFile, reference: NcVar, axis: 'lat' | 'lon'): NcVar | undefined {
  const vars = file.variables;
  const sn = axis === 'lat' ? 'latitude' : 'longitude';
  const units = axis === 'lat' ? /^degrees?_?n(orth)?$/i : /^degrees?_?e(ast)?$/i;
  // CF 5.2: a `coordinates` attribute names the auxiliary coordinates (2-D latitude, longitude).
  const listed = (attrText(reference, 'coordinates') ?? '').split(/\s+/).filter(Boolean);
  // Coordinates in the reference's own group and its parents come before those of other groups.
  const home = groupOf(reference.name);
  const ancestry: string[] = [];
  for (let g = home; ; g = groupOf(g)) {
    ancestry.push(g);
    if (g === '') break;
  }
  const rank = (v: NcVar) => {
    const k = ancestry.indexOf(groupOf(v.name));
    return k === -1 ? ancestry.length : k;
  };
  const candidates = [
    ...listed.map((n) => resolveVariable(vars, n, home)).filter((v): v is NcVar => !!v),
    ...[...vars].sort((x, y) => rank(x) - rank(y)),
  ];
  return (
    candidates.find((v) => attrText(v, 'standard_name') === sn) ??
    candidates.find((v) => units.test(attrText(v, 'units') ?? '')) ??
    candidates.find((v) => (axis === 'lat' ? LAT_NAMES : LON_NAMES).includes(baseName(v.name).toLowerCase()))
  );
}

/** Longitude in -180..180 (0-360 files too). */
export function normaliseLongitude(lon: number): number {
  const x = ((((lon + 180) % 360) + 360) % 360) - 180;
  return x === -180 && lon > 0 ? 180 : x;
}

/**
 * Lists the points of the reference variable with their position (1-D latitude and longitude
 * axes, 2-D latitude and longitude, a station list, or one scalar position).
 */
export function listGridPoints(file: NcFile, plan: CfPlan): GridPoint[] {
  const ref = plan.reference;
  const sizes = plan.pointDims.map((d) => ref.shape[ref.dims.indexOf(d)]);
  const total = sizes.reduce((a, b) => a * b, 1);
  const lat = findCoord(file, ref, 'lat');
  const lon = findCoord(file, ref, 'lon');
  const coordValues = (v: NcVar | undefined) => {
    if (!v) return undefined;
    if (v.dims.some((d) => !plan.pointDims.includes(d) && v.shape[v.dims.indexOf(d)] !== 1)) return undefined;
    return {
      v,
      values: unpack(
        v,
        file.readRaw(
          v.name,
          v.shape.map(() => 0),
          v.shape,
        ),
      ),
    };
  };
  const la = coordValues(lat);
  const lo = coordValues(lon);
  const at = (c: { v: NcVar; values: Float64Array } | undefined, index: number[]) => {
    if (!c) return NaN;
    let flat = 0;
    for (let k = 0; k < c.v.dims.length; k++) {
      const p = plan.pointDims.indexOf(c.v.dims[k]);
      flat = flat * c.v.shape[k] + (p === -1 ? 0 : index[p]);
    }
    return c.values[flat];
  };
  const points: GridPoint[] = [];
  for (let f = 0; f < total; f++) {
    const index: number[] = new Array<number>(sizes.length);
    for (let k = sizes.length - 1, r = f; k >= 0; k--) {
      index[k] = r % sizes[k];
      r = Math.floor(r / sizes[k]);
    }
    const y = at(la, index);
    const x = at(lo, index);
    points.push({ index, lat: y, lon: Number.isNaN(x) ? NaN : normaliseLongitude(x), missingShare: NaN });
  }
  return points;
}

/** Values held in memory at once while scanning a grid (about 32 MB of Float64). */
const SCAN_VALUES = 4_000_000;

/**
 * Counts, for every point, the share of the reference variable's values that are missing, reading
 * the variable in time slabs (a large grid is never in memory whole).
 */
export function scanMissingShares(file: NcFile, plan: CfPlan, points: GridPoint[]): void {
  const ref = plan.reference;
  const tAxis = ref.dims.indexOf(plan.time.dims[0]);
  const nt = ref.shape[tAxis];
  const perStep = ref.shape.reduce((a, b, k) => (k === tAxis ? a : a * b), 1);
  const slab = Math.max(1, Math.floor(SCAN_VALUES / Math.max(1, perStep)));
  const missing = new Float64Array(points.length);
  const pointOf = new Int32Array(perStep).fill(-1);
  // Flat position of each point within one time step (size-1 dimensions at index 0).
  points.forEach((p, n) => {
    let flat = 0;
    for (let k = 0; k < ref.dims.length; k++) {
      if (k === tAxis) continue;
      const j = plan.pointDims.indexOf(ref.dims[k]);
      flat = flat * ref.shape[k] + (j === -1 ? 0 : p.index[j]);
    }
    pointOf[flat] = n;
  });
  for (let t0 = 0; t0 < nt; t0 += slab) {
    const count = ref.shape.map((s, k) => (k === tAxis ? Math.min(slab, nt - t0) : s));
    const start = ref.shape.map((_, k) => (k === tAxis ? t0 : 0));
    const values = unpack(ref, file.readRaw(ref.name, start, count));
    // Row-major: the time axis may sit anywhere; compute each value's position within its step.
    const inner = ref.shape.slice(tAxis + 1).reduce((a, b) => a * b, 1);
    const steps = count[tAxis];
    for (let i = 0; i < values.length; i++) {
      if (values[i] === values[i]) continue;
      const outer = Math.floor(i / (steps * inner));
      const within = (i % inner) + outer * inner;
      const n = pointOf[within];
      if (n >= 0) missing[n]++;
    }
  }
  points.forEach((p, n) => (p.missingShare = nt === 0 ? 1 : missing[n] / nt));
}

/** Mean Earth radius, m (IUGG; common practice for great-circle distances). */
const EARTH_RADIUS_M = 6_371_008.8;

/** Great-circle distance by the haversine formula, m. */
export function greatCircleM(lat1: number, lon1: number, lat2: number, lon2: number): number {
  const r = Math.PI / 180;
  const dLat = (lat2 - lat1) * r;
  const dLon = (lon2 - lon1) * r;
  const a = Math.sin(dLat / 2) ** 2 + Math.cos(lat1 * r) * Math.cos(lat2 * r) * Math.sin(dLon / 2) ** 2;
  return 2 * EARTH_RADIUS_M * Math.asin(Math.min(1, Math.sqrt(a)));
}

/** Largest share of missing values a point may have and still be chosen (over half is skipped). */
export const MAX_MISSING_SHARE = 0.5;

/**
 * The sea point nearest to (lat, lon) by great-circle distance, skipping points with over half
 * their values missing (land, ice, dry cells); null when no point qualifies.
 */
export function nearestSeaPoint(points: GridPoint[], lat: number, lon: number): { point: GridPoint; distanceM: number } | null {
  let best: { point: GridPoint; distanceM: number } | null = null;
  for (const p of points) {
    if (!(p.missingShare <= MAX_MISSING_SHARE)) continue;
    if (Number.isNaN(p.lat) || Number.isNaN(p.lon)) continue;
    const d = greatCircleM(lat, lon, p.lat, p.lon);
    if (!best || d < best.distanceM) best = { point: p, distanceM: d };
  }
  return best;
}

// ---------------------------------------------------------------------------------------------
// Reading one point

/** Options of {@link readCfPoint}. */
export interface CfPointOptions {
  /** Index of the point along `plan.pointDims` ([] for a single point). */
  index: number[];
  /**
   * Height of the file's water-level datum above the worksite's chart datum, m (chart datum level
   * = file level + offset). Without it the water level is refused.
   */
  waterLevelOffsetM?: number;
  /** Called after each variable is read, with the number of times (records) of the file. */
  onVariable?: (done: number, total: number, records: number) => void;
}

/** A partition series as read (SI, directions coming-from), NaN = missing. */
export interface PartitionSeries {
  hs: Float64Array;
  tp: Float64Array | null;
  dir: Float64Array | null;
}

/** What a point read gives. */
export interface CfPointResult {
  records: SeaRecords;
  partitions: Partial<Record<Partition, PartitionSeries>>;
  /** Water level above chart datum, m (only with a stated offset). */
  waterLevel: Float64Array | null;
  /** Current at the point: speed m/s and the direction it flows towards (degrees), NaN = missing. */
  current: { speed: Float64Array; dir: Float64Array | null } | null;
  /** Model depth at the point, m, when the file gives it. */
  depthM: number | null;
  /** forecast_reference_time, UTC ms, when the file gives it. */
  forecastReferenceMs: number | null;
  /** Plain-words decisions (what was read from where, conversions), for the import report. */
  notes: string[];
}

/** Reads the raw series of `v` at the point, the time axis whole. */
function readSeriesAt(file: NcFile, plan: CfPlan, v: NcVar, index: number[]): Float64Array {
  const tDim = plan.time.dims[0];
  const start = v.dims.map((d) => {
    const j = plan.pointDims.indexOf(d);
    return d === tDim || j === -1 ? 0 : index[j];
  });
  const count = v.dims.map((d, k) => (d === tDim ? v.shape[k] : 1));
  return file.readRaw(v.name, start, count);
}

/**
 * Speed and direction, degrees clockwise from north in [0, 360), from eastward and northward
 * components: the direction the vector points to (atan2(east, north)), or for 'from' the one it
 * comes from (atan2(-east, -north), the meteorological convention for wind).
 */
function fromComponents(east: Float64Array, north: Float64Array, sense: 'from' | 'to'): [Float64Array, Float64Array] {
  const n = east.length;
  const speed = new Float64Array(n);
  const dir = new Float64Array(n);
  const k = sense === 'from' ? -1 : 1;
  for (let i = 0; i < n; i++) {
    speed[i] = Math.hypot(east[i], north[i]);
    const d = (Math.atan2(k * east[i], k * north[i]) * 180) / Math.PI;
    dir[i] = d < 0 ? d + 360 : d >= 360 ? d - 360 : d;
  }
  return [speed, dir];
}

/**
 * Speed and direction from the east and north component series when both were read (see
 * fromComponents), set under the roles `speedRole` and `dirRole`.
 *
 * @returns true when both components were there and the two series are set.
 */
function setFromComponents(
  series: Map<CfRole, Float64Array>,
  eastRole: CfRole,
  northRole: CfRole,
  sense: 'from' | 'to',
  speedRole: CfRole,
  dirRole: CfRole,
): boolean {
  const east = series.get(eastRole);
  const north = series.get(northRole);
  if (!east || !north) return false;
  const [speed, dir] = fromComponents(east, north, sense);
  series.set(speedRole, speed);
  series.set(dirRole, dir);
  return true;
}

const toFrom = (dir: Float64Array) => {
  for (let i = 0; i < dir.length; i++) if (dir[i] === dir[i]) dir[i] = (dir[i] + 180) % 360;
};

/**
 * Reads the chosen point: every chosen variable's series, unpacked, directions turned to coming
 * from, wind from u/v, the total Hs from the partitions when the file has no total, then checks
 * plausibility per variable.
 * @throws ImportError naming the variable, the count and the first time index (all-or-nothing).
 */
export function readCfPoint(file: NcFile, plan: CfPlan, options: CfPointOptions): CfPointResult {
  const notes: string[] = [];
  const vars = new Map(file.variables.map((v) => [v.name, v]));
  const tRaw = file.readRaw(plan.time.name, [0], plan.time.shape);
  const timeMs = decodeTimes(plan.time, tRaw);
  const n = timeMs.length;
  const series = new Map<CfRole, Float64Array>();
  const readers = plan.choices.filter((c) => c.role !== 'depth' && c.role !== 'forecastReferenceTime');
  let done = 0;
  const issues: ImportIssue[] = [];
  let issueCount = 0;
  for (const c of readers) {
    const v = vars.get(c.variable)!;
    const values = unpack(v, readSeriesAt(file, plan, v, options.index));
    if (values.length !== n) throw fail(v.name, `has ${fmt(values.length)} values where time has ${fmt(n)}`);
    if (c.goingTo) toFrom(values);
    series.set(c.role, values);
    if (c.goingTo) notes.push(`${v.name}: going-to direction (${c.via}) turned to coming-from (+180°)`);
    options.onVariable?.(++done, readers.length, n);
  }

  // Wind from components: speed and the direction it comes from (meteorological convention).
  if (setFromComponents(series, 'u', 'v', 'from', 'wind', 'windDir')) {
    notes.push('wind speed and coming-from direction computed from eastward_wind and northward_wind');
  }

  // Current from components: speed and the direction the water flows towards.
  if (setFromComponents(series, 'currentU', 'currentV', 'to', 'currentSpeed', 'currentDir')) {
    notes.push(
      `current speed and going-to direction computed from ${CURRENT_NAMES.u} and ${CURRENT_NAMES.v} (stored going-to, the oceanographic convention)`,
    );
  } else if (series.has('currentDir')) {
    notes.push(`current direction kept going-to as ${CURRENT_NAMES.dirTo} gives it (the oceanographic convention)`);
  }

  // Partitions (docs/domain.md#partitions).
  const partitions: Partial<Record<Partition, PartitionSeries>> = {};
  for (const p of PARTITIONS) {
    const hs = series.get(`${p}.hs`);
    if (hs) partitions[p] = { hs, tp: series.get(`${p}.tp`) ?? null, dir: series.get(`${p}.dir`) ?? null };
  }
  // The swell as a whole stands for primary and secondary when they are absent; never both.
  const parts = (Object.keys(partitions) as Partition[]).filter((p) => p !== 'swell' || (!partitions.swell1 && !partitions.swell2));
  if (partitions.swell && parts.length !== Object.keys(partitions).length) {
    notes.push('the swell as a whole is not added to the total: the file also gives primary or secondary swell');
  }
  if (!series.has('hs') && parts.length > 0) {
    const hs = new Float64Array(n);
    const tp = new Float64Array(n).fill(NaN);
    const dir = new Float64Array(n).fill(NaN);
    for (let i = 0; i < n; i++) {
      let sum = 0;
      let top = -1;
      let topPart: Partition | null = null;
      for (const p of parts) {
        const h = partitions[p]!.hs[i];
        if (h !== h) {
          sum = NaN;
          break;
        }
        sum += h * h;
        if (h > top) {
          top = h;
          topPart = p;
        }
      }
      hs[i] = Math.sqrt(sum);
      if (topPart && top > 0) {
        tp[i] = partitions[topPart]!.tp?.[i] ?? NaN;
        dir[i] = partitions[topPart]!.dir?.[i] ?? NaN;
      }
    }
    series.set('hs', hs);
    if (!series.has('tp')) series.set('tp', tp);
    if (!series.has('dir')) series.set('dir', dir);
    notes.push(
      `total Hs computed as the root of the sum of squares of ${parts.map((p) => PARTITION_LABELS[p]).join(', ')} (docs/domain.md#partitions); Tp and direction of the most energetic partition`,
    );
  } else if (series.has('hs') && parts.length > 0) {
    const hs = series.get('hs')!;
    let differ = 0;
    let first = -1;
    for (let i = 0; i < n; i++) {
      let sum = 0;
      for (const p of parts) sum += partitions[p]!.hs[i] ** 2;
      const rss = Math.sqrt(sum);
      if (hs[i] === hs[i] && rss === rss && Math.abs(rss - hs[i]) > 0.05 * hs[i]) {
        differ++;
        if (first < 0) first = i;
        // docs/domain.md#partitions: the partitions are scaled to the given total, keeping their
        // ratios, so total and partitions agree (all partitions 0 = none present: nothing to scale).
        if (rss > 0) for (const p of parts) partitions[p]!.hs[i] *= hs[i] / rss;
      }
    }
    if (differ > 0) {
      notes.push(
        `total Hs and the partitions differ by more than 5% in ${fmt(differ)} records (first at time index ${fmt(first)}, ${new Date(timeMs[first]).toISOString()}): the total is stored as given and the partitions' Hs scaled to it, keeping their ratios (docs/domain.md#partitions)`,
      );
    }
  }

  // Plausibility per variable (the same bounds as the CSV import).
  const check = (label: string, key: SeaVariable, values: Float64Array) => {
    const byReason = new Map<string, { count: number; first: number; value: number }>();
    for (let i = 0; i < values.length; i++) {
      const x = values[i];
      if (x !== x) continue;
      if (x === 360 && (key === 'dir' || key === 'windDir')) {
        values[i] = 0;
        continue;
      }
      const reason = implausibleReason(key, x);
      if (reason === null) continue;
      const e = byReason.get(reason);
      if (e) e.count++;
      else byReason.set(reason, { count: 1, first: i, value: x });
    }
    for (const [reason, e] of byReason) {
      issueCount++;
      if (issues.length < 200) {
        issues.push({
          line: 0,
          column: label,
          value: String(e.value),
          reason: `variable ${label}: ${fmt(e.count)} value${e.count > 1 ? 's' : ''} with ${reason}, first at time index ${fmt(e.first)} (${new Date(timeMs[e.first]).toISOString()})`,
        });
      }
    }
  };
  const nameOf = (role: CfRole, fallback: string) => plan.choices.find((c) => c.role === role)?.variable ?? fallback;
  for (const key of SEA_VARIABLES) {
    const values = series.get(key);
    if (values)
      check(
        key === 'wind' || key === 'windDir'
          ? nameOf(key, key === 'wind' ? 'wind (from u, v)' : 'wind direction (from u, v)')
          : nameOf(key, `${key} (from partitions)`),
        key,
        values,
      );
  }
  for (const p of PARTITIONS) {
    const s = partitions[p];
    if (!s) continue;
    check(nameOf(`${p}.hs`, p), 'hs', s.hs);
    if (s.tp) check(nameOf(`${p}.tp`, p), 'tp', s.tp);
    if (s.dir) check(nameOf(`${p}.dir`, p), 'dir', s.dir);
  }
  const currentSpeed = series.get('currentSpeed');
  const currentDir = series.get('currentDir') ?? null;
  if (currentSpeed) {
    // Speed: 0 to CURRENT_MAX_MS (the wind's check has the same shape: negative, or above a bound).
    const label = nameOf('currentSpeed', 'current speed (from components)');
    let bad = 0;
    let first = -1;
    for (let i = 0; i < n; i++) {
      const x = currentSpeed[i];
      if (x === x && !(x >= 0 && x <= CURRENT_MAX_MS)) {
        if (bad++ === 0) first = i;
      }
    }
    if (bad > 0) {
      issueCount++;
      issues.push({
        line: 0,
        column: label,
        value: String(currentSpeed[first]),
        reason: `variable ${label}: ${fmt(bad)} value${bad > 1 ? 's' : ''} with current speed outside 0-${CURRENT_MAX_MS} m/s, first at time index ${fmt(first)} (${new Date(timeMs[first]).toISOString()})`,
      });
    }
    if (currentDir) check(nameOf('currentDir', 'current direction (from components)'), 'dir', currentDir);
  }
  if (issueCount > 0) {
    throw new ImportError(
      issues,
      issueCount,
      `The file cannot be imported: ${issues[0].reason}${issueCount > 1 ? ` (and ${issueCount - 1} more)` : ''}.`,
    );
  }

  // Water level: never guess a datum.
  let waterLevel: Float64Array | null = null;
  const wl = plan.choices.find((c) => c.role === 'waterLevel');
  if (wl) {
    if (options.waterLevelOffsetM === undefined) {
      throw fail(
        wl.variable,
        `water level is given above ${wl.datum} (${wl.via}); state the height of that datum above the worksite's chart datum (water level offset, m) to read it, or remove the variable: a guessed datum can cost metres of under-keel clearance`,
      );
    }
    waterLevel = series.get('waterLevel')!;
    for (let i = 0; i < n; i++) waterLevel[i] += options.waterLevelOffsetM;
    notes.push(
      `water level ${wl.variable} above ${wl.datum} brought to chart datum with the stated offset of ${options.waterLevelOffsetM} m`,
    );
  }

  let depthM: number | null = null;
  const dc = plan.choices.find((c) => c.role === 'depth');
  if (dc) {
    const v = vars.get(dc.variable)!;
    const raw = v.dims.length === 0 ? file.readRaw(v.name, [], []) : readDepthAt(file, plan, v, options.index);
    const d = unpack(v, raw)[0];
    if (d === d && d > 0) {
      depthM = d;
      notes.push(`model depth ${d} m from ${v.name} (${dc.via})`);
    }
  }
  let forecastReferenceMs: number | null = null;
  const fc = plan.choices.find((c) => c.role === 'forecastReferenceTime');
  if (fc) {
    const v = vars.get(fc.variable)!;
    const raw = file.readRaw(
      v.name,
      v.shape.map(() => 0),
      v.shape.map(() => 1),
    );
    const units = attrText(v, 'units') ?? attrText(plan.time, 'units') ?? '';
    const { unitMs, originMs } = parseTimeUnits(units, attrText(v, 'calendar') ?? attrText(plan.time, 'calendar'), v.name);
    if (raw[0] === raw[0]) forecastReferenceMs = Math.round(originMs + raw[0] * unitMs);
  }

  const nan = () => new Float64Array(n).fill(NaN);
  const records: SeaRecords = {
    timeMs,
    hs: series.get('hs') ?? nan(),
    tp: series.get('tp') ?? nan(),
    tz: series.get('tz') ?? nan(),
    te: series.get('te') ?? nan(),
    dir: series.get('dir') ?? nan(),
    wind: series.get('wind') ?? nan(),
    windDir: series.get('windDir') ?? nan(),
  };
  const current = currentSpeed ? { speed: currentSpeed, dir: currentDir } : null;
  return { records, partitions, waterLevel, current, depthM, forecastReferenceMs, notes };
}

function readDepthAt(file: NcFile, plan: CfPlan, v: NcVar, index: number[]): Float64Array {
  const start = v.dims.map((d) => {
    const j = plan.pointDims.indexOf(d);
    return j === -1 ? 0 : index[j];
  });
  return file.readRaw(
    v.name,
    start,
    v.dims.map(() => 1),
  );
}
