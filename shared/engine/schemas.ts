import { z } from 'zod';
// installs the plain-words error map (validation messages in words, server and browser alike)
import '../schemas/words';
import type { AlphaTable, OperationLimits, OperationSpec } from './types';
import { alphaTableCoverageProblem } from './alpha-factor';

/**
 * Zod schemas for operation limits, operations and alpha tables, shared by the server (request
 * bodies, import) and the client forms. Ranges are sanity bounds for marine operations (common
 * practice, no source): Hs 0.1-20 m, Tp 0.5-40 s, bed velocity 0.01-10 m/s, wind 0.5-60 m/s,
 * TPOP 0.25-2000 h, TC 0-2000 h; depth 0.1-11000 m, draught and under-keel clearance 0-50 m,
 * current 0.05-10 m/s, tide window 0-12 h either side of high or low water.
 */

/** Sanity bounds of the schemas, per quantity and unit. */
export const LIMIT_RANGES = {
  hsM: { min: 0.1, max: 20 },
  tpS: { min: 0.5, max: 40 },
  bedVelocityMps: { min: 0.01, max: 10 },
  windMps: { min: 0.5, max: 60 },
  tpopH: { min: 0.25, max: 2000 },
  tcH: { min: 0, max: 2000 },
  depthM: { min: 0.1, max: 11000 },
  draughtM: { min: 0, max: 50 },
  clearanceM: { min: 0, max: 50 },
  currentMps: { min: 0.05, max: 10 },
  tideWindowH: { min: 0, max: 12 },
} as const;

const R = LIMIT_RANGES;

const ranged = (r: { min: number; max: number }, what: string, unit: string) =>
  z
    .number({ error: `${what} must be a number` })
    .min(r.min, `${what} must be at least ${r.min} ${unit}`)
    .max(r.max, `${what} must be at most ${r.max} ${unit}`);

const hsM = (what: string) => ranged(R.hsM, what, 'm');
const tpS = (what: string) => ranged(R.tpS, what, 's');

/** Allowed bed velocity methods (feeds the zod enum and UI selects). */
export const BED_VELOCITY_METHODS = ['linear', 'soulsby'] as const;

/** What an Hs limit may target (docs/domain.md#partitions); 'total' is the default. */
export const HS_TARGETS = ['total', 'swell', 'windSea', 'longPeriod'] as const;

/** High or low water, the reference of a tide window. */
export const TIDE_REFERENCES = ['high', 'low'] as const;

/**
 * Limits of an operation: each optional (absent or null), at least one set (an empty band list
 * does not count); curve with at least two points and strictly ascending Tp; bands with from < to;
 * Tp min not above Tp max. Hs max and a curve may both be set; both then apply. Min depth not above
 * max depth; min depth equal to draught plus under-keel clearance when both are given (the form
 * sends both); a tide window at least some time long (before + after > 0). The depth, current and
 * tide-window limits are exact: alpha never applies (docs/domain.md#tide).
 */
export const operationLimitsSchema = z
  .object({
    hsMax: hsM('Hs max').nullish(),
    hsTpCurve: z
      .array(z.tuple([tpS('Curve Tp'), hsM('Curve Hs')]))
      .min(2, 'An Hs-Tp curve needs at least two points')
      .nullish(),
    tpMin: tpS('Tp min').nullish(),
    tpMax: tpS('Tp max').nullish(),
    tpExcluded: z.array(z.tuple([tpS('Band from'), tpS('Band to')])).nullish(),
    bedVelocityMax: ranged(R.bedVelocityMps, 'Bed velocity max', 'm/s').nullish(),
    bedVelocityMethod: z.enum(BED_VELOCITY_METHODS).optional(),
    windMax: ranged(R.windMps, 'Wind max', 'm/s').nullish(),
    minDepth: ranged(R.depthM, 'Min depth', 'm').nullish(),
    minDepthParts: z
      .object({ draught: ranged(R.draughtM, 'Draught', 'm'), clearance: ranged(R.clearanceM, 'Under-keel clearance', 'm') })
      .nullish(),
    maxDepth: ranged(R.depthM, 'Max depth', 'm').nullish(),
    currentMax: ranged(R.currentMps, 'Current max', 'm/s').nullish(),
    tideWindow: z
      .object({
        reference: z.enum(TIDE_REFERENCES),
        before: ranged(R.tideWindowH, 'Hours before', 'h'),
        after: ranged(R.tideWindowH, 'Hours after', 'h'),
      })
      .nullish(),
    hsTargets: z
      .array(
        z.object({
          target: z.enum(HS_TARGETS),
          minPeriodS: tpS('Long-period T*').nullish(),
          max: hsM('Hs max'),
        }),
      )
      .max(8, 'At most 8 Hs limits on targets')
      .nullish(),
    tpExcludedMinHs: ranged({ min: 0, max: R.hsM.max }, 'Band Hs threshold', 'm').nullish(),
  })
  .superRefine((v, ctx) => {
    (v.hsTargets ?? []).forEach((t, i) => {
      if (t.target === 'longPeriod' && t.minPeriodS == null)
        ctx.addIssue({ code: 'custom', path: ['hsTargets', i, 'minPeriodS'], message: 'A long-period Hs limit needs its T*' });
      if (t.target !== 'longPeriod' && t.minPeriodS != null)
        ctx.addIssue({ code: 'custom', path: ['hsTargets', i, 'minPeriodS'], message: 'T* belongs to a long-period Hs limit only' });
    });
    const curve = v.hsTpCurve ?? [];
    for (let i = 1; i < curve.length; i++) {
      if (!(curve[i][0] > curve[i - 1][0])) {
        ctx.addIssue({ code: 'custom', path: ['hsTpCurve', i, 0], message: 'Curve Tp must be strictly ascending' });
      }
    }
    (v.tpExcluded ?? []).forEach(([from, to], i) => {
      if (!(from < to)) ctx.addIssue({ code: 'custom', path: ['tpExcluded', i], message: 'A band needs from < to' });
    });
    if (v.tpMin != null && v.tpMax != null && v.tpMin > v.tpMax) {
      ctx.addIssue({ code: 'custom', path: ['tpMax'], message: 'Tp max must not be below Tp min' });
    }
    if (v.minDepth != null && v.maxDepth != null && v.minDepth > v.maxDepth) {
      ctx.addIssue({ code: 'custom', path: ['maxDepth'], message: 'Max depth must not be below min depth' });
    }
    if (v.minDepthParts != null) {
      const sum = v.minDepthParts.draught + v.minDepthParts.clearance;
      if (v.minDepth == null || Math.abs(sum - v.minDepth) > 1e-9 * Math.max(1, sum)) {
        ctx.addIssue({ code: 'custom', path: ['minDepth'], message: `Min depth must be draught plus under-keel clearance (${sum} m)` });
      }
    }
    if (v.tideWindow != null && !(v.tideWindow.before + v.tideWindow.after > 0)) {
      ctx.addIssue({ code: 'custom', path: ['tideWindow', 'after'], message: 'A tide window needs some hours before or after' });
    }
    const any =
      v.hsMax != null ||
      curve.length > 0 ||
      v.tpMin != null ||
      v.tpMax != null ||
      (v.tpExcluded ?? []).length > 0 ||
      v.bedVelocityMax != null ||
      v.windMax != null ||
      v.minDepth != null ||
      v.maxDepth != null ||
      v.currentMax != null ||
      v.tideWindow != null ||
      (v.hsTargets ?? []).length > 0;
    if (!any) ctx.addIssue({ code: 'custom', path: [], message: 'Set at least one limit' });
  });

/** An operation as the engine needs it: TPOP, TC (h), weather-restricted flag and limits. */
export const operationSpecSchema = z.object({
  tpopH: ranged(R.tpopH, 'TPOP', 'h'),
  tcH: ranged(R.tcH, 'TC', 'h'),
  weatherRestricted: z.boolean(),
  limits: operationLimitsSchema,
});

/**
 * Alpha table (the last TPOP bound at least 72 h, see alphaTableCoverageProblem): TPOP bounds (h) and Hs columns (m), each strictly ascending and within range; one
 * row per bound with one value per column, every value in (0, 1].
 */
export const alphaTableSchema = z
  .object({
    tpopBoundsH: z.array(ranged(R.tpopH, 'TPOP bound', 'h')).min(1, 'At least one TPOP row'),
    hsColumnsM: z.array(hsM('Hs column')).min(1, 'At least one Hs column'),
    values: z.array(z.array(z.number().gt(0, 'Alpha must be above 0').max(1, 'Alpha must not exceed 1'))),
  })
  .superRefine((t, ctx) => {
    for (let i = 1; i < t.tpopBoundsH.length; i++) {
      if (!(t.tpopBoundsH[i] > t.tpopBoundsH[i - 1]))
        ctx.addIssue({ code: 'custom', path: ['tpopBoundsH', i], message: 'TPOP bounds must be strictly ascending' });
    }
    for (let i = 1; i < t.hsColumnsM.length; i++) {
      if (!(t.hsColumnsM[i] > t.hsColumnsM[i - 1]))
        ctx.addIssue({ code: 'custom', path: ['hsColumnsM', i], message: 'Hs columns must be strictly ascending' });
    }
    if (t.values.length !== t.tpopBoundsH.length)
      ctx.addIssue({ code: 'custom', path: ['values'], message: 'One row of values per TPOP bound' });
    t.values.forEach((row, r) => {
      if (row.length !== t.hsColumnsM.length) ctx.addIssue({ code: 'custom', path: ['values', r], message: 'One value per Hs column' });
    });
    // docs/domain.md#convention-5: the table must reach TPOP 72 h, so no weather-restricted operation falls back to alpha = 1.
    const coverage = t.tpopBoundsH.length > 0 ? alphaTableCoverageProblem(t) : null;
    if (coverage) ctx.addIssue({ code: 'custom', path: ['tpopBoundsH', t.tpopBoundsH.length - 1], message: coverage });
  });

// Compile-time checks that parsed values fit the engine's types.
type Assignable<T extends U, U> = T;
export type OperationLimitsParsed = Assignable<z.infer<typeof operationLimitsSchema>, OperationLimits>;
export type OperationSpecParsed = Assignable<z.infer<typeof operationSpecSchema>, OperationSpec>;
export type AlphaTableParsed = Assignable<z.infer<typeof alphaTableSchema>, AlphaTable>;
