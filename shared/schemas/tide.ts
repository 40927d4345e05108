/**
 * A worksite's tide: harmonic constants, a database station or none, and the tide query
 * (docs/domain.md#tide).
 */
import { z } from 'zod';
import { storableText } from './common';
import { finite } from './site-fields';

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
  amplitude: finite('Amplitude')
    .min(0, 'Amplitude must be at least 0 m')
    .max(TIDE_AMPLITUDE_MAX_M, `Amplitude must be at most ${TIDE_AMPLITUDE_MAX_M} m`),
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
    z0: finite('Z0')
      .min(TIDE_Z0_RANGE_M.min, `Z0 must be at least ${TIDE_Z0_RANGE_M.min} m`)
      .max(TIDE_Z0_RANGE_M.max, `Z0 must be at most ${TIDE_Z0_RANGE_M.max} m`)
      .optional(),
    datum: storableText(z.string().trim().max(40, 'A datum name has at most 40 characters')).default('LAT'),
  })
  .superRefine((t, ctx) => {
    if (t.source === 'constants') {
      if (!t.constituents || t.constituents.length === 0) {
        ctx.addIssue({ code: 'custom', path: ['constituents'], message: 'Enter at least one constituent' });
      }
      if (t.z0 === undefined)
        ctx.addIssue({ code: 'custom', path: ['z0'], message: 'Z0 (mean sea level above chart datum) is needed with constants' });
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
      else if (span > TIDE_QUERY_MAX_DAYS * 86_400_000)
        ctx.addIssue({ code: 'custom', path: ['to'], message: `At most ${TIDE_QUERY_MAX_DAYS} days from from` });
    }
  });
export type TideQuery = z.infer<typeof TideQuery>;

/** Days of the tide form's preview chart (POST …/tide-preview). */
export const TIDE_PREVIEW_DAYS = 3;

const position = (what: string, limit: number) =>
  finite(what).min(-limit, `${what} must be at least -${limit}°`).max(limit, `${what} must be at most ${limit}°`);

/**
 * `POST /api/projects/:projectId/tide-preview`: the tide the worksite form is editing (not yet
 * saved) and the worksite's position (for a station's distance); answers the next
 * {@link TIDE_PREVIEW_DAYS} days from `from` (default now).
 */
export const TidePreviewInput = z.object({
  tide: WorksiteTideInput,
  latitude: position('Latitude', 90).nullable().default(null),
  longitude: position('Longitude', 180).nullable().default(null),
  from: z.iso.datetime({ offset: true, error: 'from must be an ISO 8601 date-time' }).optional(),
});
export type TidePreviewInput = z.infer<typeof TidePreviewInput>;

/** `GET /api/projects/:projectId/tide-stations?latitude=&longitude=`: database stations near a position. */
export const TideStationsQuery = z.object({
  latitude: z.coerce.number({ error: 'latitude must be a number' }).pipe(position('Latitude', 90)),
  longitude: z.coerce.number({ error: 'longitude must be a number' }).pipe(position('Longitude', 180)),
});
export type TideStationsQuery = z.infer<typeof TideStationsQuery>;
