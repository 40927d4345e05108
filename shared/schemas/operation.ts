/** An operation: TPOP, TC, weather-restricted or not, its limits OPLIM, worksites and skippers. */
import { z } from 'zod';
import { WEATHER_RESTRICTED_MAX_TPOP_H, WEATHER_RESTRICTED_MAX_TR_H } from '../engine/alpha-factor';
import { LIMIT_RANGES, operationLimitsSchema } from '../engine/schemas';
import { patchSchema, storableText } from './common';
import { finite, itemDescription, itemName } from './site-fields';

const hours = (what: string, r: { min: number; max: number }) =>
  finite(what).min(r.min, `${what} must be at least ${r.min} h`).max(r.max, `${what} must be at most ${r.max} h`);

/** Fields of an operation, without defaults (the PATCH schema makes each optional). */
export const operationFields = {
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
  /** the vessel of the project the operation is done from (response limits need one); null = none */
  vesselId: z.uuid('Must be a vessel id').nullable(),
  /** the vessel's fixed heading, deg true (0-360); null = none */
  heading: finite('Heading')
    .min(0, 'Heading must be between 0 and 360 degrees')
    .max(360, 'Heading must be between 0 and 360 degrees')
    .nullable(),
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
export function checkOperation(
  v: {
    tpop?: number;
    tc?: number;
    weatherRestricted?: boolean;
    siteIds?: string[];
    skipperIds?: string[];
    limits?: { responses?: unknown[] | null };
    vesselId?: string | null;
    heading?: number | null;
  },
  ctx: z.RefinementCtx,
): void {
  // Response limits are the vessel's motions at a heading (docs/domain.md#vessel-response).
  if ((v.limits?.responses ?? []).length > 0) {
    if (v.vesselId == null) ctx.addIssue({ code: 'custom', path: ['vesselId'], message: 'Response limits need a vessel' });
    if (v.heading == null) ctx.addIssue({ code: 'custom', path: ['heading'], message: 'Response limits need the vessel heading' });
  }
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
    vesselId: operationFields.vesselId.default(null),
    heading: operationFields.heading.default(null),
  })
  .superRefine(checkOperation);
export type OperationInput = z.infer<typeof OperationInput>;
export type OperationFormValues = z.input<typeof OperationInput>;

/** PATCH body: any subset of the fields; `limits` and the id lists are replaced as a whole. */
export const OperationPatchInput = patchSchema(operationFields);
export type OperationPatchInput = z.infer<typeof OperationPatchInput>;
