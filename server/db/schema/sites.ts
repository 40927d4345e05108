import { boolean, doublePrecision, index, jsonb, pgTable, text, uuid } from 'drizzle-orm/pg-core';
import { idColumn, optionalRefColumn, stampColumn, stampColumns } from './columns';
import { user } from './auth';
import { project, projectIdColumn } from './projects';
import { dataset } from './datasets';
import { vessel } from './vessels';

/** A place where work happens, with the depth the sea states are transformed to. */
export const worksite = pgTable(
  'worksite',
  {
    id: idColumn(),
    projectId: projectIdColumn(),
    name: text().notNull(),
    latitude: doublePrecision(),
    longitude: doublePrecision(),
    depthM: doublePrecision().notNull(),
    /** Coming-from direction of waves that cross the depth contours head-on; null = no refraction. */
    shoreNormalDeg: doublePrecision(),
    breakerIndex: doublePrecision().notNull().default(0.6),
    timeZone: text().notNull().default('UTC'),
    /** A specific hindcast for statistics; null = the project's newest hindcast. */
    hindcastDatasetId: optionalRefColumn(() => dataset.id),
    /** Optional site-specific transfer table (direction sector × Tp band → Hs factor). */
    transferTable: jsonb().$type<{ directionSectorsDeg: [number, number][]; tpBandsS: [number, number][]; factors: number[][] } | null>(),
    /** Tide at the worksite (constants, a database station, or none); null = none (docs/domain.md#tide). */
    tide: jsonb().$type<{
      source: 'constants' | 'station' | 'none';
      stationId?: string;
      constituents?: { name: string; amplitude: number; phase: number }[];
      z0?: number;
      datum: string;
    } | null>(),
    /** Current station of the public tide database whose predicted current the worksite uses; null = none (docs/domain.md#tide). */
    currentStationId: text(),
    ...stampColumns(),
  },
  (t) => [index().on(t.projectId)],
);

/** A marine operation with its limits (OPLIM), durations and optional recurrence. */
export const operation = pgTable(
  'operation',
  {
    id: idColumn(),
    projectId: projectIdColumn(),
    name: text().notNull(),
    description: text().notNull().default(''),
    tpopH: doublePrecision().notNull(),
    tcH: doublePrecision().notNull().default(0),
    weatherRestricted: boolean().notNull().default(true),
    limits: jsonb().$type<Record<string, unknown>>().notNull(),
    /** Worksites the operation happens at; empty = every worksite of the project. */
    siteIds: jsonb().$type<string[]>().notNull().default([]),
    /** Skippers assigned to the operation (user ids). */
    skipperIds: jsonb().$type<string[]>().notNull().default([]),
    /** The vessel the operation is done from (response limits need it); null = none. */
    vesselId: optionalRefColumn(() => vessel.id),
    /** The vessel's fixed heading during the operation, deg true; null = none. */
    headingDeg: doublePrecision(),
    /** iCalendar RRULE (with DTSTART in the first worksite's zone) for recurring operations. */
    recurrence: jsonb().$type<Record<string, unknown> | null>(),
    ...stampColumns(),
  },
  (t) => [index().on(t.projectId)],
);

/** The project's alpha table (null rows = the default table). */
export const projectAlpha = pgTable('project_alpha', {
  projectId: uuid()
    .primaryKey()
    .references(() => project.id, { onDelete: 'cascade' }),
  table: jsonb().$type<{ tpopBoundsH: number[]; hsColumnsM: number[]; values: number[][] }>().notNull(),
  updatedAt: stampColumn(),
});

/** Who changed a limit, a worksite's depth or the alpha table, when, before and after. Append-only. */
export const auditEntry = pgTable(
  'audit_entry',
  {
    id: idColumn(),
    projectId: projectIdColumn(),
    userId: text().references(() => user.id, { onDelete: 'set null' }),
    userName: text().notNull(),
    at: stampColumn(),
    entity: text({ enum: ['operation', 'worksite', 'alpha', 'project', 'campaign', 'vessel'] }).notNull(),
    entityId: text(),
    entityName: text().notNull().default(''),
    action: text({ enum: ['create', 'update', 'delete', 'import'] }).notNull(),
    before: jsonb(),
    after: jsonb(),
  },
  (t) => [index().on(t.projectId, t.at)],
);
