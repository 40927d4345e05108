/**
 * Vessels and their RAO tables (docs/domain.md#vessel-response): the input schema of a new
 * vessel, and the RAO CSV reader used by the server's import and the client's preview.
 */
import { z } from 'zod';
import { parseResponseColumn, type RaoTable } from '../response/rao';
import { nameText } from './common';

/** A new vessel (POST). */
export const VesselInput = z.object({ name: nameText() });
export type VesselInput = z.infer<typeof VesselInput>;

/** A problem in an RAO file: line (1-based), column (its header name) and what is wrong. */
export interface RaoCsvProblem {
  /** null: the problem is the table as a whole (a missing row). */
  line: number | null;
  column: string | null;
  message: string;
}

/** The heading convention, in words, shown beside the import (docs/domain.md#vessel-response). */
export const RAO_HEADING_CONVENTION =
  'heading_deg is the relative wave heading: the direction the waves come from minus the vessel heading. 0° = waves from ahead (head seas), 90° = from starboard, 180° = from astern (following seas), 270° = from port. A table of 0-180° only is mirrored to the port side.';

/** Limits of an RAO file (common practice, no source: real tables have a few hundred to a few thousand rows). */
export const RAO_MAX_ROWS = 20_000;
export const RAO_MAX_COLUMNS = 40;
const MAX_PROBLEMS = 50;

const NUMBER = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;

/** Outcome of reading an RAO CSV: the table, or every problem found (up to 50), never both. */
export type RaoCsvResult = { ok: true; table: RaoTable } | { ok: false; problems: RaoCsvProblem[] };

/**
 * Reads an RAO table from CSV text: a header with `period_s` or `frequency_rad_s`, `heading_deg`,
 * and one column per response (parseResponseColumn), then one row per (period, heading). Delimiter
 * ',', ';' or tab (the header's most frequent); blank lines skipped. All or nothing: a non-numeric
 * value, a negative amplitude, a period or frequency not above 0, a heading outside 0-360, a
 * duplicate row or a missing (period, heading) pair refuses the whole file, naming line and column.
 */
export function readRaoCsv(text: string): RaoCsvResult {
  const problems: RaoCsvProblem[] = [];
  const add = (line: number | null, column: string | null, message: string) => {
    if (problems.length < MAX_PROBLEMS) problems.push({ line, column, message });
  };
  const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\r|\n/);
  let h = 0;
  while (h < lines.length && lines[h].trim() === '') h++;
  if (h === lines.length) return { ok: false, problems: [{ line: 1, column: null, message: 'The file is empty' }] };
  const headerLine = lines[h];
  const delimiter = ([',', ';', '\t'] as const).reduce(
    (best, d) => (headerLine.split(d).length > headerLine.split(best).length ? d : best),
    ',',
  );
  const unquote = (s: string) =>
    s
      .trim()
      .replace(/^"(.*)"$/, '$1')
      .trim();
  const header = headerLine.split(delimiter).map(unquote);
  if (header.length > RAO_MAX_COLUMNS) add(h + 1, null, `At most ${RAO_MAX_COLUMNS} columns`);
  let periodCol = -1;
  let freqCol = -1;
  let headingCol = -1;
  const responseCols: number[] = [];
  const seen = new Set<string>();
  header.forEach((name, i) => {
    if (seen.has(name)) add(h + 1, name, 'Column named twice');
    seen.add(name);
    if (name === 'period_s') periodCol = i;
    else if (name === 'frequency_rad_s') freqCol = i;
    else if (name === 'heading_deg') headingCol = i;
    else if (parseResponseColumn(name)) responseCols.push(i);
    else
      add(
        h + 1,
        name || `column ${i + 1}`,
        'Unknown column: expected period_s or frequency_rad_s, heading_deg, and responses such as heave_m_per_m, roll_deg_per_m, pitch_deg_per_m, vel_z_m_s_per_m@point, acc_z_m_s2_per_m@point',
      );
  });
  if (periodCol < 0 === freqCol < 0) add(h + 1, null, 'Give exactly one of period_s and frequency_rad_s');
  if (headingCol < 0) add(h + 1, null, 'The column heading_deg is missing');
  if (responseCols.length === 0) add(h + 1, null, 'No response column (e.g. roll_deg_per_m)');
  if (problems.length > 0) return { ok: false, problems };

  const byKey = new Map<string, { line: number; period: number; heading: number; values: number[] }>();
  let rows = 0;
  for (let i = h + 1; i < lines.length; i++) {
    if (lines[i].trim() === '') continue;
    const lineNo = i + 1;
    if (++rows > RAO_MAX_ROWS) {
      add(lineNo, null, `At most ${RAO_MAX_ROWS} rows`);
      break;
    }
    const fields = lines[i].split(delimiter).map(unquote);
    if (fields.length !== header.length) {
      add(lineNo, null, `Expected ${header.length} values, found ${fields.length}`);
      continue;
    }
    const num = (col: number): number => {
      const f = fields[col];
      if (!NUMBER.test(f)) {
        add(lineNo, header[col], f === '' ? 'Empty value' : `Not a number: "${f.slice(0, 40)}"`);
        return NaN;
      }
      return Number(f);
    };
    const x = num(periodCol >= 0 ? periodCol : freqCol);
    const xCol = header[periodCol >= 0 ? periodCol : freqCol];
    if (x === x && !(x > 0 && Number.isFinite(x))) add(lineNo, xCol, 'Must be above 0');
    const heading = num(headingCol);
    if (heading === heading && !(heading >= 0 && heading <= 360)) add(lineNo, 'heading_deg', 'Heading must be between 0 and 360 degrees');
    const values = responseCols.map((c) => {
      const v = num(c);
      if (v === v && !(v >= 0 && Number.isFinite(v))) add(lineNo, header[c], 'An amplitude cannot be negative');
      return v;
    });
    if (!(x > 0) || !(heading >= 0 && heading <= 360) || values.some((v) => !(v >= 0))) continue;
    const period = periodCol >= 0 ? x : (2 * Math.PI) / x;
    const key = `${x}|${heading}`;
    const prev = byKey.get(key);
    if (prev) add(lineNo, null, `Duplicate row: ${xCol} ${x} and heading ${heading} already on line ${prev.line}`);
    else byKey.set(key, { line: lineNo, period, heading, values });
  }
  if (problems.length > 0) return { ok: false, problems };
  if (byKey.size === 0) return { ok: false, problems: [{ line: h + 2, column: null, message: 'No data rows' }] };

  const periods = [...new Set([...byKey.values()].map((r) => r.period))].sort((a, b) => a - b);
  const headings = [...new Set([...byKey.values()].map((r) => r.heading))].sort((a, b) => a - b);
  if (periods.length < 2) add(h + 2, null, 'At least two periods are needed');
  const pIndex = new Map(periods.map((p, i) => [p, i]));
  const hIndex = new Map(headings.map((x, i) => [x, i]));
  const responses: Record<string, number[][]> = {};
  const filled = headings.map(() => new Array<boolean>(periods.length).fill(false));
  responseCols.forEach((c) => (responses[header[c]] = headings.map(() => new Array<number>(periods.length).fill(NaN))));
  for (const r of byKey.values()) {
    const pi = pIndex.get(r.period)!;
    const hi = hIndex.get(r.heading)!;
    filled[hi][pi] = true;
    responseCols.forEach((c, k) => (responses[header[c]][hi][pi] = r.values[k]));
  }
  filled.forEach((row, hi) =>
    row.forEach((ok, pi) => {
      if (!ok) {
        const x = periodCol >= 0 ? periods[pi] : (2 * Math.PI) / periods[pi];
        add(
          null,
          null,
          `Missing row: ${periodCol >= 0 ? 'period_s' : 'frequency_rad_s'} ${Math.round(x * 1e6) / 1e6} at heading ${headings[hi]} (every period needs every heading)`,
        );
      }
    }),
  );
  if (problems.length > 0) return { ok: false, problems };
  return { ok: true, table: { periodsS: periods, headingsDeg: headings, responses } };
}

const partitionSchema = z.object({
  kind: z.enum(['windSea', 'swell']),
  hs: z.number().min(0, 'Hs must be at least 0 m').max(30, 'Hs must be at most 30 m'),
  tp: z.number().min(1, 'Tp must be at least 1 s').max(40, 'Tp must be at most 40 s'),
  dir: z.number().min(0, 'Direction must be between 0 and 360 degrees').max(360, 'Direction must be between 0 and 360 degrees'),
});

const num = (what: string, min: number, max: number) =>
  z.coerce
    .number({ error: `${what} must be a number` })
    .min(min, `${what} must be at least ${min}`)
    .max(max, `${what} must be at most ${max}`);

/**
 * GET /api/wave/response: a vessel, its heading (deg true) and one sea state: `hs`, `tp`, `dir`
 * (one unpartitioned sea, treated as wind sea) or `partitions` as JSON
 * `[{ kind: 'windSea' | 'swell', hs, tp, dir }]` (at most 3).
 */
export const ResponseQuery = z
  .object({
    vesselId: z.uuid('Must be a vessel id'),
    heading: num('Heading', 0, 360),
    hs: num('Hs', 0, 30).optional(),
    tp: num('Tp', 1, 40).optional(),
    dir: num('Direction', 0, 360).optional(),
    partitions: z
      .string()
      .max(2000)
      .transform((s, ctx) => {
        try {
          return JSON.parse(s) as unknown;
        } catch {
          ctx.addIssue({ code: 'custom', message: 'Partitions must be JSON' });
          return z.NEVER;
        }
      })
      .pipe(z.array(partitionSchema).min(1, 'At least one partition').max(3, 'At most 3 partitions'))
      .optional(),
  })
  .superRefine((q, ctx) => {
    const total = q.hs !== undefined || q.tp !== undefined || q.dir !== undefined;
    if (total && q.partitions)
      ctx.addIssue({ code: 'custom', path: ['partitions'], message: 'Give hs, tp and dir, or partitions, not both' });
    if (!q.partitions)
      for (const k of ['hs', 'tp', 'dir'] as const)
        if (q[k] === undefined) ctx.addIssue({ code: 'custom', path: [k], message: 'Required (or give partitions)' });
  });
export type ResponseQuery = z.infer<typeof ResponseQuery>;

/** The sea partitions the response calculator takes, in order (docs/domain.md#partitions). */
export const RESPONSE_FORM_PARTITIONS = [
  { key: 'windSea', kind: 'windSea', label: 'Wind sea' },
  { key: 'swell1', kind: 'swell', label: 'Swell 1' },
  { key: 'swell2', kind: 'swell', label: 'Swell 2' },
] as const;

type PartitionKey = (typeof RESPONSE_FORM_PARTITIONS)[number]['key'];
type ResponseFormKey =
  'projectId' | 'vesselId' | 'heading' | 'sea' | 'hs' | 'tp' | 'dir' | `${PartitionKey}Hs` | `${PartitionKey}Tp` | `${PartitionKey}Dir`;

/** The text of every field of the wave calculator's response form. */
export type ResponseFormFields = Record<ResponseFormKey, string>;

/** What the response form asks the API for: GET /api/wave/response with these (partitions as JSON). */
export interface ResponseRequest {
  vesselId: string;
  heading: number;
  hs?: number;
  tp?: number;
  dir?: number;
  partitions?: { kind: 'windSea' | 'swell'; hs: number; tp: number; dir: number }[];
}

/** The ranges of ResponseQuery, worded for the form. */
const FORM_RANGES = {
  heading: { what: 'Heading', min: 0, max: 360, unit: '°' },
  hs: { what: 'Hs', min: 0, max: 30, unit: 'm' },
  tp: { what: 'Tp', min: 1, max: 40, unit: 's' },
  dir: { what: 'Direction', min: 0, max: 360, unit: '°' },
} as const;

/**
 * The response form (the wave calculator's response mode) over the text of its fields: a vessel,
 * its heading (deg true), and one sea state, either total (Hs, Tp, direction) or partitions (wind
 * sea and up to two swells; a partition left blank is absent, one given in part names what is
 * missing). A decimal comma reads as a point. Ranges as ResponseQuery, which the server parses.
 */
export const ResponseForm = z.record(z.string(), z.string()).transform((raw, ctx): ResponseRequest => {
  const text = (k: string) => (raw[k] ?? '').trim();
  const read = (k: string, range: (typeof FORM_RANGES)[keyof typeof FORM_RANGES], missing: string | null): number | undefined => {
    const t = text(k);
    if (t === '') {
      if (missing) ctx.addIssue({ code: 'custom', path: [k], message: missing });
      return undefined;
    }
    const v = Number(t.replace(',', '.'));
    if (!Number.isFinite(v) || !/^[+-]?(\d+([.,]\d*)?|[.,]\d+)([eE][+-]?\d+)?$/.test(t)) {
      ctx.addIssue({ code: 'custom', path: [k], message: `${range.what} must be a number` });
      return undefined;
    }
    if (v < range.min || v > range.max) {
      ctx.addIssue({
        code: 'custom',
        path: [k],
        message: `${range.what} must be between ${range.min} and ${range.max}${range.unit === '°' ? '°' : ` ${range.unit}`}`,
      });
      return undefined;
    }
    return v;
  };
  const vesselId = text('vesselId');
  if (!z.uuid().safeParse(vesselId).success) ctx.addIssue({ code: 'custom', path: ['vesselId'], message: 'Choose a vessel' });
  const heading = read('heading', FORM_RANGES.heading, 'Enter the vessel heading');
  const out: ResponseRequest = { vesselId, heading: heading ?? NaN };
  if (text('sea') === 'partitions') {
    const parts: NonNullable<ResponseRequest['partitions']> = [];
    for (const p of RESPONSE_FORM_PARTITIONS) {
      const keys = [`${p.key}Hs`, `${p.key}Tp`, `${p.key}Dir`] as const;
      if (keys.every((k) => text(k) === '')) continue;
      const hs = read(keys[0], FORM_RANGES.hs, `Enter the ${p.label.toLowerCase()} Hs (or leave all three blank)`);
      const tp = read(keys[1], FORM_RANGES.tp, `Enter the ${p.label.toLowerCase()} Tp (or leave all three blank)`);
      const dir = read(keys[2], FORM_RANGES.dir, `Enter the ${p.label.toLowerCase()} direction (or leave all three blank)`);
      if (hs !== undefined && tp !== undefined && dir !== undefined) parts.push({ kind: p.kind, hs, tp, dir });
    }
    if (RESPONSE_FORM_PARTITIONS.every((p) => [`${p.key}Hs`, `${p.key}Tp`, `${p.key}Dir`].every((k) => text(k) === '')))
      ctx.addIssue({ code: 'custom', path: ['windSeaHs'], message: 'Give at least one partition' });
    out.partitions = parts;
  } else {
    out.hs = read('hs', FORM_RANGES.hs, 'Enter the significant wave height');
    out.tp = read('tp', FORM_RANGES.tp, 'Enter the peak period');
    out.dir = read('dir', FORM_RANGES.dir, 'Enter the direction the waves come from');
  }
  return out;
}) as unknown as z.ZodType<ResponseRequest, ResponseFormFields>;
