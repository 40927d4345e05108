import { boolean, index, integer, jsonb, pgTable, text, unique, uuid } from 'drizzle-orm/pg-core';
import { idColumn, instantColumn, ownerColumn, optionalRefColumn, stampColumn, stampColumns } from './columns';
import { user } from './auth';
import { project, projectIdColumn } from './projects';
import { dataset } from './datasets';

/** One run of the planning job for one project. */
export const planRun = pgTable(
  'plan_run',
  {
    id: idColumn(),
    projectId: projectIdColumn(),
    datasetId: optionalRefColumn(() => dataset.id),
    trigger: text({ enum: ['schedule', 'manual', 'cli', 'forecast'] }).notNull(),
    status: text({ enum: ['running', 'ok', 'failed'] }).notNull(),
    startedAt: stampColumn(),
    finishedAt: instantColumn(),
    /** Per operation and worksite: windows, earliest start, may-start-now, occurrences. */
    plans: jsonb().$type<unknown[]>(),
    error: text(),
  },
  // The second: "has a run planned (or tried) this forecast?", asked every minute per project.
  (t) => [index().on(t.projectId, t.startedAt), index().on(t.projectId, t.datasetId)],
);

/** A change between two plans that people hear about. */
export const alert = pgTable(
  'alert',
  {
    id: idColumn(),
    projectId: projectIdColumn(),
    planRunId: ownerColumn(() => planRun.id),
    operationId: uuid().notNull(),
    siteId: uuid().notNull(),
    kind: text().notNull(),
    /** Stable key of the change within the run (for idempotency). */
    changeKey: text().notNull(),
    message: text().notNull(),
    details: jsonb().notNull(),
    createdAt: stampColumn(),
  },
  (t) => [index().on(t.projectId, t.createdAt)],
);

/** Every e-mail is written here first, then sent; the key makes re-runs send nothing twice. */
export const outbox = pgTable(
  'outbox',
  {
    id: idColumn(),
    idempotencyKey: text().notNull().unique(),
    projectId: uuid().references(() => project.id, { onDelete: 'cascade' }),
    userId: text().references(() => user.id, { onDelete: 'set null' }),
    toEmail: text().notNull(),
    subject: text().notNull(),
    text: text().notNull(),
    html: text().notNull(),
    status: text({ enum: ['pending', 'sent', 'failed'] })
      .notNull()
      .default('pending'),
    attempts: integer().notNull().default(0),
    nextAttemptAt: stampColumn(),
    lastError: text(),
    createdAt: stampColumn(),
    sentAt: instantColumn(),
  },
  (t) => [index().on(t.status, t.nextAttemptAt)],
);

/** What a user hears about: operations and worksites of a project (null = all), how and when. */
export const subscription = pgTable(
  'subscription',
  {
    id: idColumn(),
    userId: text()
      .notNull()
      .references(() => user.id, { onDelete: 'cascade' }),
    projectId: projectIdColumn(),
    operationIds: jsonb().$type<string[]>().notNull().default([]),
    siteIds: jsonb().$type<string[]>().notNull().default([]),
    immediate: boolean().notNull().default(true),
    digest: boolean().notNull().default(false),
    /** Local time of the daily digest, HH:MM, in digestTimeZone. */
    digestTime: text().notNull().default('06:00'),
    digestTimeZone: text().notNull().default('UTC'),
    /** E-mail when a campaign's P50 finish moves by more than this many days between runs; null = off. */
    outlookMoveDays: integer(),
    /**
     * E-mail when a usable window's ensemble chance to hold TR falls below this percentage between
     * planning runs (docs/domain.md#forecast-uncertainty); null = off.
     */
    windowChanceBelow: integer(),
    lastDigestAt: instantColumn(),
    active: boolean().notNull().default(true),
    ...stampColumns(),
  },
  (t) => [unique().on(t.userId, t.projectId)],
);

/** Per-user secret token of the calendar feed (revocable). */
export const calendarToken = pgTable('calendar_token', {
  userId: text()
    .primaryKey()
    .references(() => user.id, { onDelete: 'cascade' }),
  token: text().notNull().unique(),
  createdAt: stampColumn(),
});
