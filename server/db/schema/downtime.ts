import { doublePrecision, index, integer, jsonb, pgTable, text, unique } from 'drizzle-orm/pg-core';
import { idColumn, instantColumn, ownerColumn, optionalRefColumn, stampColumn, stampColumns } from './columns';
import { user } from './auth';
import { projectIdColumn } from './projects';
import { operation, worksite } from './sites';
import { dataset } from './datasets';
import { planRun } from './alerts';

/** Progress of one campaign step (set by a coordinator, audited). */
export interface CampaignStepProgress {
  status: 'planned' | 'started' | 'done';
  startedAt: string | null;
  doneAt: string | null;
  /** Where the done time came from: given by hand, or the confirmed ledger days. */
  source?: 'hand' | 'ledger';
}

/** An ordered list of steps (operation at worksite) with a planned start. */
export const campaign = pgTable(
  'campaign',
  {
    id: idColumn(),
    projectId: projectIdColumn(),
    name: text().notNull(),
    steps: jsonb().$type<{ operationId: string; siteId: string }[]>().notNull(),
    plannedStart: instantColumn(),
    /** Zone of the simulated start dates (the 1st at 00:00); UTC by default (docs/domain.md#convention-15). */
    timeZone: text().notNull().default('UTC'),
    /** The finish date promised in the plan (drawn on the outlook chart); null = none. */
    plannedFinish: instantColumn(),
    /** Progress per step, by index: status and actual times (ISO); missing entries are planned. */
    progress: jsonb().$type<CampaignStepProgress[]>().notNull().default([]),
    ...stampColumns(),
  },
  (t) => [index().on(t.projectId)],
);

/** One day of one operation at one worksite: hours planned and lost to weather. */
export const ledgerDay = pgTable(
  'ledger_day',
  {
    id: idColumn(),
    projectId: projectIdColumn(),
    operationId: ownerColumn(() => operation.id),
    siteId: ownerColumn(() => worksite.id),
    /** Calendar day in the worksite's time zone, YYYY-MM-DD. */
    day: text().notNull(),
    plannedHours: doublePrecision().notNull(),
    /** Proposed by the system from the statuses. */
    proposedLostHours: doublePrecision().notNull(),
    proposedLimiting: text(),
    /** As confirmed or corrected by the coordinator (null until then). */
    lostHours: doublePrecision(),
    limiting: text(),
    note: text().notNull().default(''),
    source: text({ enum: ['observation', 'forecast'] }).notNull(),
    datasetId: optionalRefColumn(() => dataset.id),
    status: text({ enum: ['proposed', 'confirmed'] })
      .notNull()
      .default('proposed'),
    confirmedBy: text().references(() => user.id, { onDelete: 'set null' }),
    confirmedAt: instantColumn(),
    ...stampColumns(),
  },
  (t) => [unique().on(t.projectId, t.operationId, t.siteId, t.day), index().on(t.projectId, t.day)],
);

/** Cached hindcast statistics, keyed by dataset, a version of the limits and the alpha switch. */
export const statsCache = pgTable('stats_cache', {
  key: text().primaryKey(),
  projectId: projectIdColumn(),
  value: jsonb().notNull(),
  createdAt: stampColumn(),
});

/** The campaign outlook stored by each planning job run (its history is the drift chart). */
export const campaignOutlook = pgTable(
  'campaign_outlook',
  {
    id: idColumn(),
    projectId: projectIdColumn(),
    campaignId: ownerColumn(() => campaign.id),
    /** The planning run that computed it; null for outlooks written otherwise (the demo's history). */
    planRunId: optionalRefColumn(() => planRun.id),
    at: instantColumn().notNull(),
    p50: instantColumn(),
    p90: instantColumn(),
    forecastIssuedAt: instantColumn(),
    samples: integer().notNull(),
    censored: integer().notNull(),
  },
  (t) => [index().on(t.campaignId, t.at)],
);
