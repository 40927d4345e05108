/** A worksite's transfer table from a wave study (docs/domain.md#transformation). */
import { z } from 'zod';
import { finite } from './site-fields';

/** Largest Hs_site/Hs_src factor accepted in a transfer table (sanity bound, common practice, no source). */
export const TRANSFER_FACTOR_MAX = 3;
/** Largest Tp band edge accepted, s (a last band such as 20-99 s stands for "20 s and longer"). */
export const TRANSFER_TP_EDGE_MAX_S = 100;
/** Most direction sectors (5-degree sectors) and Tp bands a table may have. */
export const TRANSFER_MAX_SECTORS = 72;
export const TRANSFER_MAX_BANDS = 60;

const sectorEdge = finite('A sector edge').min(0, 'A sector edge must be at least 0°').max(360, 'A sector edge must be at most 360°');
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
