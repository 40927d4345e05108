/**
 * Input schemas for worksites, operations, the alpha table and the project setup document.
 * The server parses request bodies with them and the client forms reuse them, so both sides
 * refuse the same values with the same messages (docs/domain.md, "From the data point to the
 * worksite" and "Operations and limits").
 *
 * Units are fixed by the field: depth in m, bearings in degrees "coming from" clockwise from true
 * north, TPOP and TC in h, limits as in `shared/engine/schemas.ts`.
 */
import { z } from 'zod';
import { WEATHER_RESTRICTED_MAX_TPOP_H, WEATHER_RESTRICTED_MAX_TR_H } from '../engine/alpha-factor';
import { alphaTableSchema, LIMIT_RANGES, operationLimitsSchema } from '../engine/schemas';
import { longText, nameText, storableText } from './common';

// ---------------------------------------------------------------------------------------------
// Shared helpers
// ---------------------------------------------------------------------------------------------

/**
 * Key under which names are compared for uniqueness and for the setup document's site mapping:
 * trimmed, inner white space collapsed, lower case. "Berth A" and "berth  a" are the same name.
 */
export function nameKey(name: string): string {
  return name.trim().replace(/\s+/g, ' ').toLowerCase();
}

/**
 * Canonical IANA name of a time zone, or null when the runtime does not know it.
 *
 * Checked with `Intl.DateTimeFormat` (which throws RangeError for unknown zones), so the browser
 * and the server agree on what is valid; the name is returned as the runtime spells it
 * ('europe/oslo' -> 'Europe/Oslo', 'utc' -> 'UTC'). Fixed offsets such as '+01:00' are refused
 * even where the runtime accepts them: a worksite's clock follows its zone's daylight-saving rules,
 * never a hand-made offset.
 *
 * @example canonicalTimeZone('europe/oslo') // 'Europe/Oslo'; canonicalTimeZone('Mars/Olympus') // null
 */
export function canonicalTimeZone(zone: string): string | null {
  if (typeof zone !== 'string' || zone.length === 0 || zone.length > 64) return null;
  if (!/^[A-Za-z][A-Za-z0-9_+\-/]*$/.test(zone)) return null;
  try {
    return new Intl.DateTimeFormat('en-US', { timeZone: zone }).resolvedOptions().timeZone;
  } catch {
    return null;
  }
}

const finite = (what: string) => z.number({ error: `${what} must be a number` });

// Control characters (NUL above all, which PostgreSQL text cannot hold) and lone surrogates are
// refused by nameText and longText (common.ts); tab and line breaks stay allowed in descriptions.
const itemName = () => nameText();
const itemDescription = () => longText();

// ---------------------------------------------------------------------------------------------
// Transfer table
// ---------------------------------------------------------------------------------------------

/** Largest Hs_site/Hs_src factor accepted in a transfer table (sanity bound, common practice, no source). */
export const TRANSFER_FACTOR_MAX = 3;
/** Largest Tp band edge accepted, s (a last band such as 20-99 s stands for "20 s and longer"). */
export const TRANSFER_TP_EDGE_MAX_S = 100;
/** Most direction sectors (5-degree sectors) and Tp bands a table may have. */
export const TRANSFER_MAX_SECTORS = 72;
export const TRANSFER_MAX_BANDS = 60;

const sectorEdge = finite('A sector edge')
  .min(0, 'A sector edge must be at least 0°')
  .max(360, 'A sector edge must be at most 360°');
const bandEdge = finite('A Tp band edge')
  .min(0, 'A Tp band edge must be at least 0 s')
  .max(TRANSFER_TP_EDGE_MAX_S, `A Tp band edge must be at most ${TRANSFER_TP_EDGE_MAX_S} s`);

/**
 * A site-specific transfer table (docs/domain.md#transformation; docs/domain.md#convention-17):
 * `factors[sector][band]` = Hs_site/Hs_src for waves coming from the direction sector with a peak
 * period in the Tp band.
 *
 * - `directionSectorsDeg`: [from, to) in degrees "coming from", half-open, listed clockwise in
 *   ascending order without overlap (each `from` at least the previous `to`). Only the first
 *   sector may wrap through north (from > to, e.g. [345, 15)); the last sector must then end at or
 *   before the first one's `from`. [0, 360) is one sector covering every direction.
 * - `tpBandsS`: [from, to) in s, half-open, ascending without overlap.
 * - `factors`: one row per sector, one value per band, each in [0, 3].
 * Gaps between sectors or bands are allowed: the transformation then uses the nearest one.
 */
export const TransferTableInput = z
  .object({
    directionSectorsDeg: z
      .array(z.tuple([sectorEdge, sectorEdge]))
      .min(1, 'At least one direction sector')
      .max(TRANSFER_MAX_SECTORS, `At most ${TRANSFER_MAX_SECTORS} direction sectors`),
    tpBandsS: z
      .array(z.tuple([bandEdge, bandEdge]))
      .min(1, 'At least one Tp band')
      .max(TRANSFER_MAX_BANDS, `At most ${TRANSFER_MAX_BANDS} Tp bands`),
    factors: z.array(
      z.array(
        finite('A factor')
          .min(0, 'A factor must be at least 0')
          .max(TRANSFER_FACTOR_MAX, `A factor must be at most ${TRANSFER_FACTOR_MAX}`),
      ),
    ),
  })
  .superRefine((t, ctx) => {
    const sectors = t.directionSectorsDeg;
    sectors.forEach(([from, to], i) => {
      if (from === to) {
        ctx.addIssue({ code: 'custom', path: ['directionSectorsDeg', i, 1], message: 'A sector needs from and to to differ' });
      } else if (from > to && i > 0) {
        ctx.addIssue({
          code: 'custom',
          path: ['directionSectorsDeg', i, 0],
          message: 'Only the first sector may wrap through north (from > to); list the others in ascending order',
        });
      } else if (i > 0 && from < sectors[i - 1][1]) {
        ctx.addIssue({
          code: 'custom',
          path: ['directionSectorsDeg', i, 0],
          message: `Sectors must be ascending without overlap: from must be at least the previous sector's to (${sectors[i - 1][1]}°)`,
        });
      }
    });
    if (sectors.length > 1 && sectors[0][0] > sectors[0][1]) {
      const last = sectors.length - 1;
      if (sectors[last][1] > sectors[0][0]) {
        ctx.addIssue({
          code: 'custom',
          path: ['directionSectorsDeg', last, 1],
          message: `The last sector overlaps the first one, which wraps through north from ${sectors[0][0]}°`,
        });
      }
    }
    t.tpBandsS.forEach(([from, to], j) => {
      if (!(from < to)) {
        ctx.addIssue({ code: 'custom', path: ['tpBandsS', j, 1], message: 'A Tp band needs from < to' });
      } else if (j > 0 && from < t.tpBandsS[j - 1][1]) {
        ctx.addIssue({
          code: 'custom',
          path: ['tpBandsS', j, 0],
          message: `Tp bands must be ascending without overlap: from must be at least the previous band's to (${t.tpBandsS[j - 1][1]} s)`,
        });
      }
    });
    if (t.factors.length !== sectors.length) {
      ctx.addIssue({
        code: 'custom',
        path: ['factors'],
        message: `One row of factors per direction sector (${sectors.length} sectors, ${t.factors.length} rows)`,
      });
    }
    t.factors.forEach((row, i) => {
      if (row.length !== t.tpBandsS.length) {
        ctx.addIssue({
          code: 'custom',
          path: ['factors', i],
          message: `One factor per Tp band (${t.tpBandsS.length} bands, ${row.length} factors)`,
        });
      }
    });
  });
export type TransferTableInput = z.infer<typeof TransferTableInput>;

/** A problem in an uploaded transfer-table CSV, with its place in the file. */
export interface TransferTableCsvIssue {
  /** 1-based line number in the file; 0 for the file as a whole. */
  line: number;
  /** 1-based column number; 0 for the whole line or file. */
  column: number;
  /** The raw cell text ('' when there is none). */
  value: string;
  reason: string;
}

export interface TransferTableCsvResult {
  /** The table, or null when there is any issue. */
  table: TransferTableInput | null;
  issues: TransferTableCsvIssue[];
}

/** Largest transfer-table CSV accepted, characters. */
export const TRANSFER_CSV_MAX_CHARS = 256 * 1024;

const NUMBER_RE = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;
const BAND_RE = /^(\d+(?:[.,]\d+)?)\s*(?:-|–|—|to)\s*(\d+(?:[.,]\d+)?)\s*(?:s|sec|seconds)?$/i;

/**
 * Reads a transfer table from CSV text.
 *
 * Layout (one table per file):
 * ```
 * sector_from,sector_to,0-4,4-6,6-8,8-12,12-30
 * 345,15,0.55,0.62,0.70,0.78,0.80
 * 15,45,0.50,0.58,0.66,0.74,0.77
 * ...
 * ```
 * - The header row holds `sector_from`, `sector_to` (case-insensitive; a unit suffix such as
 *   `sector_from [deg]` is allowed), then one column per Tp band written `from-to` in seconds
 *   (`4-6`, `4.5-6 s`, `4 to 6`); bands are half-open [from, to).
 * - Each further row is one direction sector: its from and to in degrees "coming from", then the
 *   factor Hs_site/Hs_src for each band. Sector and band rules: {@link TransferTableInput}.
 * - Delimiter ',', ';' or tab, detected from the header line (most frequent; ties: tab, ';', ',').
 *   With ';' or tab a decimal comma is accepted. Cells may be wrapped in double quotes; quoted
 *   cells spanning lines are not supported. Blank lines and lines starting with `#` are skipped;
 *   empty cells at the end of a line (spreadsheet exports) are ignored.
 *
 * Never throws: every problem comes back as an issue with its 1-based line and column
 * (column 0 = the whole line; line 0 = the whole file), and `table` is then null.
 */
export function parseTransferTableCsv(text: string): TransferTableCsvResult {
  const issues: TransferTableCsvIssue[] = [];
  const fail = (line: number, column: number, value: string, reason: string) => {
    if (issues.length < 200) issues.push({ line, column, value, reason });
  };
  if (typeof text !== 'string' || text.length > TRANSFER_CSV_MAX_CHARS) {
    fail(0, 0, '', `The file must be text of at most ${TRANSFER_CSV_MAX_CHARS / 1024} kB`);
    return { table: null, issues };
  }
  const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\r|\n/);
  const content: { line: number; raw: string }[] = [];
  lines.forEach((raw, i) => {
    const trimmed = raw.trim();
    if (trimmed !== '' && !trimmed.startsWith('#')) content.push({ line: i + 1, raw });
  });
  if (content.length === 0) {
    fail(0, 0, '', 'The file is empty');
    return { table: null, issues };
  }

  const header = content[0];
  const delimiter = detectDelimiter(header.raw);
  const decimalComma = delimiter !== ',';
  const split = (raw: string) => {
    const cells = raw.split(delimiter).map(unquote);
    while (cells.length > 0 && cells[cells.length - 1] === '') cells.pop();
    return cells;
  };
  const toNumber = (cell: string): number | null => {
    const s = decimalComma ? cell.replace(',', '.') : cell;
    return NUMBER_RE.test(s) ? Number(s) : null;
  };

  const head = split(header.raw);
  if (!/^sector[\s_-]*from\b/i.test(head[0] ?? '')) fail(header.line, 1, head[0] ?? '', 'The first header must be sector_from');
  if (!/^sector[\s_-]*to\b/i.test(head[1] ?? '')) fail(header.line, 2, head[1] ?? '', 'The second header must be sector_to');
  const bands: [number, number][] = [];
  for (let c = 2; c < head.length; c++) {
    const m = BAND_RE.exec(head[c]);
    if (!m) {
      fail(header.line, c + 1, head[c], 'Expected a Tp band in seconds written from-to, such as 4-6');
      continue;
    }
    bands.push([Number(m[1].replace(',', '.')), Number(m[2].replace(',', '.'))]);
  }
  if (head.length <= 2) fail(header.line, 0, '', 'No Tp band columns after sector_from and sector_to');

  const sectors: [number, number][] = [];
  const factors: number[][] = [];
  const rowLines: number[] = [];
  for (const row of content.slice(1)) {
    const cells = split(row.raw);
    if (cells.length !== head.length) {
      fail(row.line, 0, '', `Expected ${head.length} cells as in the header, found ${cells.length}`);
      continue;
    }
    const nums = cells.map(toNumber);
    let ok = true;
    nums.forEach((n, c) => {
      if (n === null) {
        ok = false;
        fail(row.line, c + 1, cells[c], c < 2 ? 'Expected a direction in degrees' : 'Expected a factor (a number)');
      }
    });
    if (!ok) continue;
    sectors.push([nums[0]!, nums[1]!]);
    factors.push(nums.slice(2) as number[]);
    rowLines.push(row.line);
  }
  if (content.length === 1) fail(0, 0, '', 'No direction sector rows below the header');
  if (issues.length > 0) return { table: null, issues };

  const table = { directionSectorsDeg: sectors, tpBandsS: bands, factors };
  const parsed = TransferTableInput.safeParse(table);
  if (parsed.success) return { table: parsed.data, issues };
  for (const issue of parsed.error.issues) {
    const [key, a, b] = issue.path as (string | number)[];
    if (key === 'directionSectorsDeg' && typeof a === 'number') {
      const col = typeof b === 'number' ? b + 1 : 1;
      fail(rowLines[a] ?? 0, col, String(sectors[a]?.[col - 1] ?? ''), issue.message);
    } else if (key === 'tpBandsS' && typeof a === 'number') {
      fail(header.line, a + 3, head[a + 2] ?? '', issue.message);
    } else if (key === 'factors' && typeof a === 'number') {
      const col = typeof b === 'number' ? b + 3 : 0;
      fail(rowLines[a] ?? 0, col, typeof b === 'number' ? String(factors[a]?.[b] ?? '') : '', issue.message);
    } else {
      fail(0, 0, '', issue.message);
    }
  }
  issues.sort((a, b) => a.line - b.line || a.column - b.column);
  return { table: null, issues };
}

function detectDelimiter(line: string): ',' | ';' | '\t' {
  const count = (c: string) => line.split(c).length - 1;
  const tab = count('\t');
  const semicolon = count(';');
  const comma = count(',');
  if (tab > 0 && tab >= semicolon && tab >= comma) return '\t';
  if (semicolon > 0 && semicolon >= comma) return ';';
  return ',';
}

function unquote(cell: string): string {
  const s = cell.trim();
  return s.length >= 2 && s.startsWith('"') && s.endsWith('"') ? s.slice(1, -1).replace(/""/g, '"').trim() : s;
}

// ---------------------------------------------------------------------------------------------
// Worksite
// ---------------------------------------------------------------------------------------------

/** Depth range of a worksite, m (0.5 m: a wading-depth floor; 11000 m: the deepest ocean trench). */
export const SITE_DEPTH_RANGE_M = { min: 0.5, max: 11000 } as const;
/** Breaker index gamma_b range (Hs/d; 0.6 is the common-practice default for Hs, docs/domain.md). */
export const BREAKER_INDEX_RANGE = { min: 0.3, max: 1.2, default: 0.6 } as const;

const timeZoneField = z
  .string({ error: 'Time zone must be text' })
  .trim()
  .refine((s) => canonicalTimeZone(s) !== null, 'Time zone must be an IANA zone name such as Europe/Oslo or UTC')
  .transform((s) => canonicalTimeZone(s)!);

// ---------------------------------------------------------------------------------------------
// Tide at a worksite (docs/domain.md#tide)
// ---------------------------------------------------------------------------------------------

/** Where a worksite's tide comes from: constants entered by the coordinator, a database station, or none. */
export const TIDE_SOURCES = ['constants', 'station', 'none'] as const;
export type TideSource = (typeof TIDE_SOURCES)[number];
/** Most constituents in a worksite's table (a full station analysis has a few dozen to about a hundred). */
export const TIDE_MAX_CONSTITUENTS = 120;
/** Largest constituent amplitude accepted, m (sanity bound: the largest tides on record are under 9 m, common practice, no source). */
export const TIDE_AMPLITUDE_MAX_M = 10;
/** Range of Z0, mean sea level above the chart datum, m (sanity bound, common practice, no source). */
export const TIDE_Z0_RANGE_M = { min: -20, max: 20 } as const;

/**
 * One harmonic constituent as the coordinator enters it: its name (M2, S2, K1, ...; the server
 * checks it against the tide package's list), amplitude H in m and phase lag g in degrees
 * referred to UTC (docs/domain.md#tide).
 */
export const TideConstituentInput = z.object({
  name: z
    .string({ error: 'A constituent name must be text' })
    .trim()
    .min(1, 'A constituent needs a name')
    .max(16, 'A constituent name has at most 16 characters')
    .regex(/^[A-Za-z0-9()_.-]+$/, 'A constituent name is letters and digits, such as M2 or 2MK3'),
  amplitude: finite('Amplitude').min(0, 'Amplitude must be at least 0 m').max(TIDE_AMPLITUDE_MAX_M, `Amplitude must be at most ${TIDE_AMPLITUDE_MAX_M} m`),
  phase: finite('Phase').min(0, 'Phase must be at least 0°').max(360, 'Phase must be at most 360°'),
});
export type TideConstituentInput = z.infer<typeof TideConstituentInput>;

/**
 * A worksite's tide (docs/domain.md#tide):
 * - `source: 'constants'`: `constituents` (at least one, names unique) and `z0`, mean sea level
 *   above the chart datum of the worksite's depth, m;
 * - `source: 'station'`: `stationId` of the tide database, predicted in the station's chart datum;
 * - `source: 'none'`: no tide; the depth stays the chart depth.
 * `datum` names the chart datum the worksite depth is referred to (LAT, MLLW, the chart's own).
 */
export const WorksiteTideInput = z
  .object({
    source: z.enum(TIDE_SOURCES, { error: `Tide source must be one of ${TIDE_SOURCES.join(', ')}` }),
    stationId: storableText(z.string().trim().min(1, 'A station id is needed').max(200)).optional(),
    constituents: z.array(TideConstituentInput).max(TIDE_MAX_CONSTITUENTS, `At most ${TIDE_MAX_CONSTITUENTS} constituents`).optional(),
    z0: finite('Z0').min(TIDE_Z0_RANGE_M.min, `Z0 must be at least ${TIDE_Z0_RANGE_M.min} m`).max(TIDE_Z0_RANGE_M.max, `Z0 must be at most ${TIDE_Z0_RANGE_M.max} m`).optional(),
    datum: storableText(z.string().trim().max(40, 'A datum name has at most 40 characters')).default('LAT'),
  })
  .superRefine((t, ctx) => {
    if (t.source === 'constants') {
      if (!t.constituents || t.constituents.length === 0) {
        ctx.addIssue({ code: 'custom', path: ['constituents'], message: 'Enter at least one constituent' });
      }
      if (t.z0 === undefined) ctx.addIssue({ code: 'custom', path: ['z0'], message: 'Z0 (mean sea level above chart datum) is needed with constants' });
      const seen = new Set<string>();
      (t.constituents ?? []).forEach((c, i) => {
        const key = c.name.toUpperCase();
        if (seen.has(key)) ctx.addIssue({ code: 'custom', path: ['constituents', i, 'name'], message: `${c.name} is listed twice` });
        seen.add(key);
      });
    }
    if (t.source === 'station' && !t.stationId) {
      ctx.addIssue({ code: 'custom', path: ['stationId'], message: 'Choose a tide station' });
    }
  });
export type WorksiteTideInput = z.infer<typeof WorksiteTideInput>;

/** `GET .../tide?from=&to=`: an ISO time span of at most 31 days (default: now to 3 days on). */
export const TIDE_QUERY_MAX_DAYS = 31;
export const TideQuery = z
  .object({
    from: z.iso.datetime({ offset: true, error: 'from must be an ISO 8601 date-time' }).optional(),
    to: z.iso.datetime({ offset: true, error: 'to must be an ISO 8601 date-time' }).optional(),
  })
  .superRefine((q, ctx) => {
    if (q.from && q.to) {
      const span = Date.parse(q.to) - Date.parse(q.from);
      if (!(span > 0)) ctx.addIssue({ code: 'custom', path: ['to'], message: 'to must be after from' });
      else if (span > TIDE_QUERY_MAX_DAYS * 86_400_000) ctx.addIssue({ code: 'custom', path: ['to'], message: `At most ${TIDE_QUERY_MAX_DAYS} days from from` });
    }
  });
export type TideQuery = z.infer<typeof TideQuery>;

/** Fields of a worksite, without defaults (the PATCH schema makes each optional). */
const worksiteFields = {
  name: itemName(),
  /** degrees north, -90..90 */
  latitude: finite('Latitude').min(-90, 'Latitude must be at least -90°').max(90, 'Latitude must be at most 90°').nullable(),
  /** degrees east, -180..180 */
  longitude: finite('Longitude').min(-180, 'Longitude must be at least -180°').max(180, 'Longitude must be at most 180°').nullable(),
  /** water depth d_site, m */
  depth: finite('Depth')
    .min(SITE_DEPTH_RANGE_M.min, `Depth must be at least ${SITE_DEPTH_RANGE_M.min} m`)
    .max(SITE_DEPTH_RANGE_M.max, `Depth must be at most ${SITE_DEPTH_RANGE_M.max} m`),
  /**
   * Shore-normal bearing beta, degrees "coming from" in [0, 360] (360 is stored as 0);
   * null = no refraction (docs/domain.md step 1).
   */
  shoreNormal: finite('Shore normal')
    .min(0, 'Shore normal must be at least 0°')
    .max(360, 'Shore normal must be at most 360°')
    .transform((v) => (v === 360 ? 0 : v))
    .nullable(),
  /** breaker index gamma_b (Hs/d), dimensionless */
  breakerIndex: finite('Breaker index')
    .min(BREAKER_INDEX_RANGE.min, `Breaker index must be at least ${BREAKER_INDEX_RANGE.min}`)
    .max(BREAKER_INDEX_RANGE.max, `Breaker index must be at most ${BREAKER_INDEX_RANGE.max}`),
  timeZone: timeZoneField,
  /** a hindcast dataset of the same project for statistics; null = the project's newest */
  hindcastDatasetId: z.uuid('Hindcast dataset must be a dataset id').nullable(),
  transferTable: TransferTableInput.nullable(),
  /** tide at the worksite (docs/domain.md#tide); null = none */
  tide: WorksiteTideInput.nullable(),
};

/** A new worksite (POST), or a whole one (the PATCH service re-checks the merged record with it). */
export const WorksiteInput = z.object({
  ...worksiteFields,
  latitude: worksiteFields.latitude.default(null),
  longitude: worksiteFields.longitude.default(null),
  shoreNormal: worksiteFields.shoreNormal.default(null),
  breakerIndex: worksiteFields.breakerIndex.default(BREAKER_INDEX_RANGE.default),
  hindcastDatasetId: worksiteFields.hindcastDatasetId.default(null),
  transferTable: worksiteFields.transferTable.default(null),
  tide: worksiteFields.tide.default(null),
});
export type WorksiteInput = z.infer<typeof WorksiteInput>;
/** What a form may send (defaults not yet applied). */
export type WorksiteFormValues = z.input<typeof WorksiteInput>;

/** PATCH body: any subset of the fields; null clears a nullable field. */
export const WorksitePatchInput = z
  .object(worksiteFields)
  .partial()
  .refine((v) => Object.values(v).some((x) => x !== undefined), 'Nothing to change');
export type WorksitePatchInput = z.infer<typeof WorksitePatchInput>;

// ---------------------------------------------------------------------------------------------
// Operation
// ---------------------------------------------------------------------------------------------

const hours = (what: string, r: { min: number; max: number }) =>
  finite(what).min(r.min, `${what} must be at least ${r.min} h`).max(r.max, `${what} must be at most ${r.max} h`);

/** Fields of an operation, without defaults (the PATCH schema makes each optional). */
const operationFields = {
  name: itemName(),
  description: itemDescription(),
  /** planned operation duration TPOP, h */
  tpop: hours('TPOP', LIMIT_RANGES.tpopH),
  /** contingency time TC, h */
  tc: hours('TC', LIMIT_RANGES.tcH),
  /** planned on a forecast with OPWF = alpha * OPLIM (needs TPOP <= 72 h and TR <= 96 h) */
  weatherRestricted: z.boolean({ error: 'Weather-restricted must be true or false' }),
  /** OPLIM: at least one limit (shared/engine/schemas.ts) */
  limits: operationLimitsSchema,
  /** worksites of the project; empty = every worksite */
  siteIds: z.array(z.uuid('Must be a worksite id')).max(500, 'At most 500 worksites'),
  /** user ids of the project's skippers assigned to it */
  skipperIds: z.array(storableText(z.string().trim().min(1, 'Must be a user id').max(200))).max(200, 'At most 200 skippers'),
};

/**
 * Refuses an operation marked weather-restricted whose TPOP exceeds 72 h or whose reference period
 * TR = TPOP + TC exceeds 96 h (both bounds included; from memory of DNV-ST-N001 and DNV-OS-H101,
 * docs/domain.md#weather-restricted), and ids listed twice.
 */
function checkOperation(
  v: { tpop?: number; tc?: number; weatherRestricted?: boolean; siteIds?: string[]; skipperIds?: string[] },
  ctx: z.RefinementCtx,
): void {
  if (v.weatherRestricted && v.tpop !== undefined && v.tc !== undefined) {
    const tr = v.tpop + v.tc;
    if (v.tpop > WEATHER_RESTRICTED_MAX_TPOP_H) {
      ctx.addIssue({
        code: 'custom',
        path: ['weatherRestricted'],
        message: `A weather-restricted operation needs TPOP of at most ${WEATHER_RESTRICTED_MAX_TPOP_H} h (here ${v.tpop} h): split it at safe points or plan it as not weather-restricted`,
      });
    } else if (tr > WEATHER_RESTRICTED_MAX_TR_H) {
      ctx.addIssue({
        code: 'custom',
        path: ['weatherRestricted'],
        message: `A weather-restricted operation needs TR = TPOP + TC of at most ${WEATHER_RESTRICTED_MAX_TR_H} h (here ${tr} h): shorten it or plan it as not weather-restricted`,
      });
    }
  }
  for (const key of ['siteIds', 'skipperIds'] as const) {
    const seen = new Set<string>();
    (v[key] ?? []).forEach((id, i) => {
      if (seen.has(id)) ctx.addIssue({ code: 'custom', path: [key, i], message: 'Listed twice' });
      seen.add(id);
    });
  }
}

/** A new operation (POST), or a whole one (the PATCH service re-checks the merged record with it). */
export const OperationInput = z
  .object({
    ...operationFields,
    description: operationFields.description.default(''),
    siteIds: operationFields.siteIds.default([]),
    skipperIds: operationFields.skipperIds.default([]),
  })
  .superRefine(checkOperation);
export type OperationInput = z.infer<typeof OperationInput>;
export type OperationFormValues = z.input<typeof OperationInput>;

/** PATCH body: any subset of the fields; `limits` and the id lists are replaced as a whole. */
export const OperationPatchInput = z
  .object(operationFields)
  .partial()
  .refine((v) => Object.values(v).some((x) => x !== undefined), 'Nothing to change');
export type OperationPatchInput = z.infer<typeof OperationPatchInput>;

// ---------------------------------------------------------------------------------------------
// Alpha table
// ---------------------------------------------------------------------------------------------

/** The project's alpha table (PUT body): the engine's schema, reused as is. */
export const AlphaTableInput = alphaTableSchema;
export type AlphaTableInput = z.infer<typeof AlphaTableInput>;

// ---------------------------------------------------------------------------------------------
// Project setup document (export / import)
// ---------------------------------------------------------------------------------------------

export const SETUP_FORMAT = 'lullwatch-setup';
export const SETUP_VERSION = 1;
export const IMPORT_MODES = ['merge', 'replace'] as const;
export type ImportMode = (typeof IMPORT_MODES)[number];

export const IMPORT_CHOICES = ['keep', 'take'] as const;
export type ImportChoice = (typeof IMPORT_CHOICES)[number];

/**
 * `?mode=` of the import: merge (default) or replace; `alphaTable=keep|take`: keep this project's
 * alpha table or take the file's (default: keep in merge mode, take in replace mode);
 * `dataPoint=keep|take`: keep this project's data point or take the file's (default keep).
 */
export const ImportQuery = z
  .object({
    mode: z.enum(IMPORT_MODES, { error: 'mode must be merge or replace' }).default('merge'),
    alphaTable: z.enum(IMPORT_CHOICES, { error: 'alphaTable must be keep or take' }).optional(),
    dataPoint: z.enum(IMPORT_CHOICES, { error: 'dataPoint must be keep or take' }).default('keep'),
  })
  .transform((q) => ({ ...q, alphaTable: q.alphaTable ?? (q.mode === 'merge' ? 'keep' : 'take') }));
export type ImportQuery = z.output<typeof ImportQuery>;

/**
 * A worksite in the setup document: the worksite's fields without `hindcastDatasetId` (datasets
 * belong to one project and are not carried over).
 */
export const SetupWorksite = WorksiteInput.omit({ hindcastDatasetId: true });
export type SetupWorksite = z.infer<typeof SetupWorksite>;

/**
 * An operation in the setup document: worksites by name (`siteNames`, matched with
 * {@link nameKey} against the document's worksites) instead of ids; skippers are not carried
 * over (they are people of one project).
 */
export const SetupOperation = z
  .object({
    name: operationFields.name,
    description: operationFields.description.default(''),
    tpop: operationFields.tpop,
    tc: operationFields.tc,
    weatherRestricted: operationFields.weatherRestricted,
    limits: operationFields.limits,
    siteNames: z.array(itemName()).max(500).default([]),
  })
  .superRefine(checkOperation);
export type SetupOperation = z.infer<typeof SetupOperation>;

/** The exported project block: for the reader; an import does not change the target project. */
export const SetupProject = z.object({
  name: itemName(),
  description: itemDescription().default(''),
  dataPointName: storableText(z.string().trim().max(120)).default(''),
  dataPointLatitude: finite('Latitude').min(-90).max(90).nullish(),
  dataPointLongitude: finite('Longitude').min(-180).max(180).nullish(),
  dataPointDepthM: finite('Data point depth').min(0.5).max(11000).nullish(),
});

/**
 * A whole project setup as one JSON document: worksites, operations with their limits and the
 * alpha table, so a coordinator can start a new contract from an old one.
 *
 * - `alphaTable`: the project's table, or null for the default table; when the key is absent an
 *   import leaves the target's table as it is.
 * - `campaigns`: ordered steps by operation and worksite name; every step must name an operation
 *   and a worksite of the document.
 * - Names of worksites and of operations must be unique (by {@link nameKey}); every `siteNames`
 *   entry must name a worksite of the document.
 */
/** A campaign in a setup document: its steps by operation and worksite name. */
export const SetupCampaign = z.object({
  name: storableText(z.string().trim().min(1, 'A campaign needs a name').max(120)),
  steps: z.array(z.object({ operationName: z.string().trim().min(1), siteName: z.string().trim().min(1) })).min(1).max(50),
  plannedStart: z.iso.datetime({ offset: true }).nullish(),
  // Checked like a worksite's zone: the import stores it, and a campaign simulates in it.
  timeZone: timeZoneField.default('UTC'),
});
export type SetupCampaign = z.infer<typeof SetupCampaign>;

export const ProjectSetupDocument = z
  .object({
    format: z.literal(SETUP_FORMAT, { error: `format must be "${SETUP_FORMAT}"` }),
    version: z.literal(SETUP_VERSION, { error: `version must be ${SETUP_VERSION}` }),
    exportedAt: z.iso.datetime({ offset: true, error: 'exportedAt must be an ISO 8601 date-time' }),
    project: SetupProject,
    alphaTable: alphaTableSchema.nullish(),
    worksites: z.array(SetupWorksite).max(500, 'At most 500 worksites'),
    operations: z.array(SetupOperation).max(1000, 'At most 1000 operations'),
    campaigns: z.array(SetupCampaign).max(200, 'At most 200 campaigns').optional(),
  })
  .superRefine((doc, ctx) => {
    const sites = new Set<string>();
    doc.worksites.forEach((w, i) => {
      const key = nameKey(w.name);
      if (sites.has(key)) ctx.addIssue({ code: 'custom', path: ['worksites', i, 'name'], message: `Worksite name "${w.name}" is used twice` });
      sites.add(key);
    });
    const ops = new Set<string>();
    doc.operations.forEach((o, i) => {
      const key = nameKey(o.name);
      if (ops.has(key)) ctx.addIssue({ code: 'custom', path: ['operations', i, 'name'], message: `Operation name "${o.name}" is used twice` });
      ops.add(key);
      o.siteNames.forEach((s, j) => {
        if (!sites.has(nameKey(s))) {
          ctx.addIssue({ code: 'custom', path: ['operations', i, 'siteNames', j], message: `No worksite named "${s}" in the document` });
        }
      });
    });
    (doc.campaigns ?? []).forEach((c, i) =>
      c.steps.forEach((step, j) => {
        if (!ops.has(nameKey(step.operationName))) {
          ctx.addIssue({ code: 'custom', path: ['campaigns', i, 'steps', j, 'operationName'], message: `No operation named "${step.operationName}" in the document` });
        }
        if (!sites.has(nameKey(step.siteName))) {
          ctx.addIssue({ code: 'custom', path: ['campaigns', i, 'steps', j, 'siteName'], message: `No worksite named "${step.siteName}" in the document` });
        }
      }),
    );
  });
export type ProjectSetupDocument = z.infer<typeof ProjectSetupDocument>;

// ---------------------------------------------------------------------------------------------
// Audit trail query
// ---------------------------------------------------------------------------------------------

export const AUDIT_ENTITIES = ['operation', 'worksite', 'alpha', 'project', 'campaign'] as const;
export type AuditEntity = (typeof AUDIT_ENTITIES)[number];
export const AUDIT_ACTIONS = ['create', 'update', 'delete', 'import'] as const;
export type AuditAction = (typeof AUDIT_ACTIONS)[number];

/** `GET .../audit?entity=&limit=`: newest first, at most `limit` (1-500, default 100). */
const blankToUndefined = (v: unknown) => (v === '' ? undefined : v);
export const AuditQuery = z.object({
  entity: z.preprocess(blankToUndefined, z.enum(AUDIT_ENTITIES, { error: `entity must be one of ${AUDIT_ENTITIES.join(', ')}` }).optional()),
  limit: z.preprocess(
    blankToUndefined,
    z.coerce.number().int('limit must be a whole number').min(1, 'limit must be at least 1').max(500, 'limit must be at most 500').default(100),
  ),
});
export type AuditQuery = z.infer<typeof AuditQuery>;
