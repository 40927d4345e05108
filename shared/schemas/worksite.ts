/**
 * A worksite: position, depth, shore normal, breaker index, time zone, hindcast and transfer
 * table (docs/domain.md#transformation).
 */
import { z } from 'zod';
import { patchSchema, storableText } from './common';
import { canonicalTimeZone, finite, itemName } from './site-fields';
import { TransferTableInput } from './transfer-table';
import { WorksiteTideInput } from './tide';

/** Depth range of a worksite, m (0.5 m: a wading-depth floor; 11000 m: the deepest ocean trench). */
export const SITE_DEPTH_RANGE_M = { min: 0.5, max: 11000 } as const;
/** Breaker index gamma_b range (Hs/d; 0.6 is the common-practice default for Hs, docs/domain.md). */
export const BREAKER_INDEX_RANGE = { min: 0.3, max: 1.2, default: 0.6 } as const;

export const timeZoneField = z
  .string({ error: 'Time zone must be text' })
  .trim()
  .refine((s) => canonicalTimeZone(s) !== null, 'Time zone must be an IANA zone name such as Europe/Oslo or UTC')
  .transform((s) => canonicalTimeZone(s)!);

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
  /** a current station of the tide database, for predicted tidal current (docs/domain.md#tide); null = none */
  currentStationId: storableText(z.string().trim().min(1, 'A current station id is needed').max(200)).nullable(),
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
  currentStationId: worksiteFields.currentStationId.default(null),
});
export type WorksiteInput = z.infer<typeof WorksiteInput>;
/** What a form may send (defaults not yet applied). */
export type WorksiteFormValues = z.input<typeof WorksiteInput>;

/** PATCH body: any subset of the fields; null clears a nullable field. */
export const WorksitePatchInput = patchSchema(worksiteFields);
export type WorksitePatchInput = z.infer<typeof WorksitePatchInput>;
