/**
 * The dataset upload form (`POST /api/projects/:projectId/datasets`, multipart), one zod schema
 * for the browser form and the server route.
 *
 * Multipart fields arrive as strings: numbers are parsed strictly, structured fields (`columns`,
 * `units`, `missingCodes`) are JSON strings, and an empty string means "not given" for every
 * optional field. The schema also accepts the already-structured values (numbers, objects,
 * arrays), so the browser can validate its form state before serialising it.
 */
import { z } from 'zod';
import '../schemas/words';
import { nameText } from '../schemas/common';
import { ColumnMappingSchema } from './csv-columns';
import { CSV_DELIMITERS, type CsvTextParserOptions } from './csv-text-parser';
import type { NdbcParserOptions } from './ndbc';
import { parseDecimal } from './parse-decimal';
import { DATE_ORDERS } from './timestamp-parser';
import { isValidTimeZone } from './time-zone';
import { SeaUnitsSchema } from './units';
import { BAD_ROW_MODES } from './validate';
import { DIRECTION_CONVENTIONS } from './csv-reader';
import { CURRENT_DIR_CONVENTIONS, WATER_LEVEL_REFERENCES } from './water-level';
import { DEFAULT_WIND_EXPONENT, OVER_LAND_WIND_EXPONENT, WIND_REFERENCE_HEIGHT_M } from './wind-height';

/** Kinds of dataset. */
export const DATASET_KINDS = ['hindcast', 'forecast', 'observation'] as const;
export type DatasetKind = (typeof DATASET_KINDS)[number];

/** File formats of an upload; 'auto' looks at the first lines (`detectFormat`). */
export const IMPORT_FORMATS = ['auto', 'csv', 'ndbc', 'netcdf'] as const;
export type ImportFormat = (typeof IMPORT_FORMATS)[number];

/** Deepest accepted data-point depth, m (the deepest ocean trench is about 11 km). */
export const MAX_DEPTH_M = 11_000;

const emptyToUndefined = (v: unknown): unknown => (v === '' || v === null ? undefined : v);

/** An optional field sent as a JSON string (or as the value itself). */
function jsonField<T extends z.ZodType>(schema: T) {
  return z.preprocess((v, ctx) => {
    if (v === '' || v === null || v === undefined) return undefined;
    if (typeof v !== 'string') return v;
    try {
      return JSON.parse(v) as unknown;
    } catch {
      ctx.addIssue({ code: 'custom', message: 'must be valid JSON', input: v });
      return z.NEVER;
    }
  }, schema.optional());
}

/** A positive number of metres sent as text or number, parsed strictly ('12abc' is refused). */
const positiveMetres = (max: number) =>
  z.union([z.number(), z.string()]).transform((v, ctx) => {
    const x = typeof v === 'number' ? v : parseDecimal(v);
    if (!(x > 0) || x > max) {
      ctx.addIssue({ code: 'custom', message: `must be a number of metres above 0 and at most ${max}`, input: v });
      return z.NEVER;
    }
    return x;
  });

/** The upload form's fields (besides the file). */
export const ImportFormSchema = z.object({
  /** Dataset name (no control characters or lone surrogates: schemas/common.ts). */
  name: nameText(),
  /** Dataset kind. */
  kind: z.enum(DATASET_KINDS),
  /** File format; default 'auto'. */
  format: z.preprocess(emptyToUndefined, z.enum(IMPORT_FORMATS).default('auto')),
  /** Water depth at the data point: metres (> 0) or 'deep'. */
  dataPointDepth: z.preprocess(
    (v) => (typeof v === 'string' && v.trim().toLowerCase() === 'deep' ? 'deep' : v),
    z.union([z.literal('deep'), positiveMetres(MAX_DEPTH_M)]),
  ),
  /** IANA zone of timestamps without an offset (CSV); default UTC. */
  timeZone: z.preprocess(
    emptyToUndefined,
    z.string().refine(isValidTimeZone, 'unknown time zone (use an IANA name such as Europe/Oslo)').optional(),
  ),
  /** Bad rows: refuse the file (default) or skip them. */
  onBadRows: z.preprocess(emptyToUndefined, z.enum(BAD_ROW_MODES).default('refuse')),
  /** CSV column mapping, as JSON. */
  columns: jsonField(ColumnMappingSchema),
  /** CSV units, as JSON (`{"height":"ft","speed":"kn"}`); missing keys are SI. */
  units: jsonField(SeaUnitsSchema),
  /** CSV missing-value codes, as a JSON array of strings; replaces the defaults. */
  missingCodes: jsonField(z.array(z.string().max(32)).max(64)),
  /** CSV day order of DD/MM/YYYY-like dates. */
  dateOrder: z.preprocess(emptyToUndefined, z.enum(DATE_ORDERS).optional()),
  /** CSV delimiter; default detected. */
  delimiter: z.preprocess(emptyToUndefined, z.enum(CSV_DELIMITERS).optional()),
  /** CSV decimal comma ('true'/'false'); default: on for ';' files. */
  decimalComma: z.preprocess((v) => (v === 'true' ? true : v === 'false' ? false : emptyToUndefined(v)), z.boolean().optional()),
  /**
   * Anemometer height above the sea, m (10 when the wind is already at 10 m). Wind becomes
   * U10 = Uz (10/z)^a. Required for an NDBC file with wind (checked after reading it); CSV files
   * default to 10 (already at 10 m).
   */
  anemometerHeight: z.preprocess(emptyToUndefined, positiveMetres(1000).optional()),
  /** Earlier name of `anemometerHeight`, still accepted. */
  anemometerHeightM: z.preprocess(emptyToUndefined, positiveMetres(1000).optional()),
  /**
   * Power-law exponent a of the height correction: default 0.11 over the open sea (Hsu, Meindl &
   * Gilhousen 1994); 1/7 (an over-land value, sent as '1/7' or 0.142857...) may be chosen.
   */
  windExponent: z.preprocess(
    (v) => (typeof v === 'string' && v.trim() === '1/7' ? OVER_LAND_WIND_EXPONENT : emptyToUndefined(v)),
    z
      .union([z.number(), z.string()])
      .transform((v, ctx) => {
        const x = typeof v === 'number' ? v : parseDecimal(v);
        if (!(x > 0 && x < 1)) {
          ctx.addIssue({ code: 'custom', message: 'must be a number between 0 and 1 (0.11 over the open sea, or 1/7)', input: v });
          return z.NEVER;
        }
        return x;
      })
      .optional(),
  ),
  /**
   * NetCDF grid point to read, as its index along the grid's dimensions (JSON `[j, i]` or "j,i");
   * default: the sea point nearest the data point (docs/domain.md#netcdf).
   */
  gridPoint: z.preprocess(
    (v) => (typeof v === 'string' && /^\s*\d+(\s*,\s*\d+)*\s*$/.test(v) ? v.split(',').map((x) => Number(x)) : v),
    jsonField(z.array(z.number().int().min(0).max(100_000_000)).max(4)),
  ),
  /**
   * NetCDF water level: height of the file's datum (the one its standard name states) above the
   * worksite's chart datum, m; chart-datum level = file level + offset. Without it a file with a
   * water level is refused (a datum is never guessed).
   */
  waterLevelOffset: z.preprocess(
    emptyToUndefined,
    z
      .union([z.number(), z.string()])
      .transform((v, ctx) => {
        const x = typeof v === 'number' ? v : parseDecimal(v);
        if (!Number.isFinite(x) || Math.abs(x) > 100) {
          ctx.addIssue({ code: 'custom', message: 'must be a number of metres between -100 and 100', input: v });
          return z.NEVER;
        }
        return x;
      })
      .optional(),
  ),
  /** NetCDF variables by role when the file lacks standard names, as JSON (`{"hs":"Hm0","time":"t"}`). */
  variables: jsonField(
    z
      .object({
        time: z.string().min(1).max(256).optional(),
        hs: z.string().min(1).max(256).optional(),
        tp: z.string().min(1).max(256).optional(),
        tz: z.string().min(1).max(256).optional(),
        te: z.string().min(1).max(256).optional(),
        dir: z.string().min(1).max(256).optional(),
        wind: z.string().min(1).max(256).optional(),
        windDir: z.string().min(1).max(256).optional(),
      })
      .strict(),
  ),
  /** CSV direction columns: where the sea and wind come from (default) or go to (180° is added). */
  directionConvention: z.preprocess(emptyToUndefined, z.enum(DIRECTION_CONVENTIONS).default('coming-from')),
  /**
   * CSV water-level column (docs/domain.md#tide): 'chart-datum' (m above the worksite's chart datum,
   * wins over the predicted tide) or 'residual' (surge added to the predicted tide). Required when
   * the file has a water-level column; recorded on the dataset.
   */
  waterLevelReference: z.preprocess(emptyToUndefined, z.enum(WATER_LEVEL_REFERENCES).optional()),
  /** CSV current directions: flowing towards (default, oceanographic) or coming from (180° added). */
  currentDirConvention: z.preprocess(emptyToUndefined, z.enum(CURRENT_DIR_CONVENTIONS).default('going-to')),
});

/** The anemometer height given (either name), m, or undefined. */
export function anemometerHeightOf(form: ImportForm): number | undefined {
  return form.anemometerHeight ?? form.anemometerHeightM;
}

/** The form as sent (strings). */
export type ImportFormInput = z.input<typeof ImportFormSchema>;
/** The form after parsing. */
export type ImportForm = z.output<typeof ImportFormSchema>;

/** Reader options for a CSV upload from the parsed form. */
export function csvOptionsFromForm(form: ImportForm): CsvTextParserOptions {
  return {
    mapping: form.columns,
    units: form.units,
    timeZone: form.timeZone,
    dateOrder: form.dateOrder,
    missingCodes: form.missingCodes,
    delimiter: form.delimiter,
    decimalComma: form.decimalComma,
    onBadRows: form.onBadRows,
    anemometerHeightM: anemometerHeightOf(form) ?? WIND_REFERENCE_HEIGHT_M,
    windExponent: form.windExponent ?? DEFAULT_WIND_EXPONENT,
    directionConvention: form.directionConvention,
    waterLevelReference: form.waterLevelReference,
    currentDirConvention: form.currentDirConvention,
  };
}

/** Reader options for an NDBC upload from the parsed form. */
export function ndbcOptionsFromForm(form: ImportForm): NdbcParserOptions {
  return {
    onBadRows: form.onBadRows,
    anemometerHeightM: anemometerHeightOf(form),
    windExponent: form.windExponent ?? DEFAULT_WIND_EXPONENT,
  };
}
