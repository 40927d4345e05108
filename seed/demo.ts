import type { ExtraSeries } from '../shared/seadata/extra-columns';
import type { AppDeps } from '../server/deps';
import { campaign, ledgerDay, operation, project, projectMember, vessel, worksite } from '../server/db/schema';
import { createUser } from '../server/services/users';
import { createDataset } from '../server/services/datasets';
import { fetchLatestForecast } from '../server/services/forecasts';
import { toSeaSeries } from '../server/services/sea-series';
import { generateSyntheticSea, latestIssueTimeMs, truthSeedForPosition, climateForPosition } from '../server/forecast';
import { recurrenceText } from '../shared/recurrence';
import { and, asc, eq, lte } from 'drizzle-orm';
import { proposeLedger } from '../server/services/ledger-propose';
import { confirmLedger } from '../server/services/ledger-entries';
import { campaignOutlookAnswer, storeOutlook } from '../server/services/campaign-outlook';
import { seedSkillArchive, storeFakeIssue } from './skill-archive';
import { runEngineTask } from '../server/services/engine-pool';
import { DEMO_GENERATED_DATASET, DEMO_PASSWORD, DEMO_PROJECT, DEMO_SECOND_PROJECT, DEMO_USERS } from './scenario';
import { DEMO_OPERATIONS, DEMO_SITE_TIDES, DEMO_SITES, DEMO_TIME_ZONE } from './scenario-sites';
import { DEMO_VESSELS } from './demo-vessels';

/** Seed of the fake forecast service; the demo hindcast uses the same invented sea. */
export const DEMO_SEA_SEED = 20261201;

export interface DemoIds {
  users: Record<(typeof DEMO_USERS)[number]['key'], string>;
  projectId: string;
  secondProjectId: string;
  siteIds: Record<(typeof DEMO_SITES)[number]['key'], string>;
  operationIds: string[];
  hindcastId: string | null;
  forecastId: string | null;
  /** The invented observation at the data point (with the forecast archive), or null. */
  observationId: string | null;
}

export interface SeedOptions {
  /** Years of invented hourly hindcast (0 = none). */
  hindcastYears?: number;
  /** Fetch a current forecast from the (fake) forecast service. */
  forecast?: boolean;
  /**
   * Earlier forecast issues to store, one a day for this many days back (default 3), so the
   * downtime ledger has finished days to propose from forecast before any observation exists.
   */
  pastForecastDays?: number;
  /**
   * Days of forecast archive for the skill page (default 60): one past issue a day and an
   * observation at the data point (seed/skill-archive.ts). Needs `forecast`.
   */
  skillArchiveDays?: number;
  /**
   * The downtime ledger as a coordinator keeps it ({@link seedLedger}); off by default, so tests
   * start on an empty ledger (`npm start` turns it on). Needs the forecast archive's observation.
   */
  ledger?: boolean;
}

const DAY_MS = 86_400_000;

/**
 * A few weeks of outlook history for the demo campaign, so the drift chart shows at once: one
 * outlook a day at 06:15 UTC from the campaign's start to yesterday, each computed by the real
 * service as of that morning with the progress of that morning. No forecast of those days is
 * stored, so these are hindcast-only outlooks (their forecast issue is empty). The campaign's
 * planned finish is the P50 of the first of them (what the plan promised at the start).
 */
async function seedOutlookHistory(
  deps: Pick<AppDeps, 'db'>,
  projectId: string,
  campaignId: string,
  t: { fromMs: number; toMs: number; layStartedMs: number; layDoneMs: number },
): Promise<void> {
  const iso = (ms: number) => new Date(ms).toISOString();
  for (let day = t.fromMs; day < t.toMs; day += DAY_MS) {
    const at = day + 6 * 3_600_000 + 15 * 60_000;
    const progress =
      at >= t.layDoneMs
        ? [{ status: 'done' as const, startedAt: iso(t.layStartedMs), doneAt: iso(t.layDoneMs), source: 'hand' as const }]
        : at >= t.layStartedMs
          ? [{ status: 'started' as const, startedAt: iso(t.layStartedMs), doneAt: null }]
          : [];
    await deps.db.update(campaign).set({ progress }).where(eq(campaign.id, campaignId));
    const answer = await campaignOutlookAnswer(deps.db, projectId, campaignId, { alpha: true, now: new Date(at) });
    await storeOutlook(deps.db, projectId, answer, null);
    // The plan promised the P50 finish of the outlook on the campaign's first morning.
    if (day === t.fromMs && answer.finish.p50)
      await deps.db
        .update(campaign)
        .set({ plannedFinish: new Date(answer.finish.p50) })
        .where(eq(campaign.id, campaignId));
  }
}

/**
 * The ledger as a coordinator keeps it: every finished day since the campaign's start proposed from
 * the data (the invented buoy record), confirmed up to the day before yesterday, the crew transfer's
 * first day with hours lost corrected by 2 h with a note; yesterday is left waiting for
 * confirmation. Returns the days confirmed.
 */
async function seedLedger(
  deps: Pick<AppDeps, 'db' | 'clock'>,
  projectId: string,
  coordinatorId: string,
  fromMs: number,
  transferOperationId: string,
): Promise<number> {
  const now = deps.clock();
  const day = (ms: number) => new Date(ms).toISOString().slice(0, 10);
  await proposeLedger(deps.db, projectId, { from: day(fromMs), to: day(now.getTime()) }, now);
  const rows = await deps.db
    .select({ id: ledgerDay.id, operationId: ledgerDay.operationId, planned: ledgerDay.plannedHours, lost: ledgerDay.proposedLostHours })
    .from(ledgerDay)
    .where(and(eq(ledgerDay.projectId, projectId), eq(ledgerDay.status, 'proposed'), lte(ledgerDay.day, day(now.getTime() - 2 * DAY_MS))))
    .orderBy(asc(ledgerDay.day));
  const who = DEMO_USERS.find((u) => u.key === 'coordinator')!;
  const actor = { id: coordinatorId, name: who.name, email: who.email, role: 'user' as const };
  let corrected = false;
  for (const r of rows) {
    const correct: boolean = !corrected && r.operationId === transferOperationId && r.lost > 0 && r.lost + 2 <= r.planned;
    corrected ||= correct;
    await confirmLedger(
      deps.db,
      projectId,
      actor,
      r.id,
      correct ? { lostHours: r.lost + 2, note: 'Skipper’s log: transfers stood down 2 h longer while the swell eased.' } : { note: '' },
      now,
    );
  }
  return rows.length;
}

/** Seeds the invented demo scenario into an empty database: {@link seedDemoAccounts}, then {@link seedDemoData}. */
export async function seedDemo(
  deps: Pick<AppDeps, 'db' | 'auth' | 'log' | 'forecast' | 'clock'>,
  options: SeedOptions = {},
): Promise<DemoIds> {
  return seedDemoData(deps, await seedDemoAccounts(deps), options);
}

/** What {@link seedDemoAccounts} made, for {@link seedDemoData}. */
export interface DemoBase extends Omit<DemoIds, 'hindcastId' | 'forecastId' | 'observationId'> {
  campaignId: string;
  /** The campaign's timeline (UTC ms): today, its start, the lay's start and finish. */
  todayMs: number;
  campaignStartMs: number;
  layStartedMs: number;
  layDoneMs: number;
}

/**
 * The quick part of the demo: the accounts, both projects, the worksites, the operations and the
 * campaign (no sea data yet). The server seeds this before it listens, so the demo accounts sign in
 * at once, and the rest ({@link seedDemoData}) after.
 */
export async function seedDemoAccounts(deps: Pick<AppDeps, 'db' | 'auth' | 'clock'>): Promise<DemoBase> {
  const { db, auth } = deps;

  const users = {} as DemoIds['users'];
  for (const u of DEMO_USERS) {
    const created = await createUser(auth, { name: u.name, email: u.email, globalRole: u.globalRole }, DEMO_PASSWORD);
    users[u.key] = created.user.id;
  }
  const [main] = await db.insert(project).values(DEMO_PROJECT).returning({ id: project.id });
  const [second] = await db.insert(project).values(DEMO_SECOND_PROJECT).returning({ id: project.id });
  await db.insert(projectMember).values([
    { projectId: main.id, userId: users.coordinator, role: 'coordinator' },
    { projectId: main.id, userId: users.skipper, role: 'skipper' },
    { projectId: main.id, userId: users.client, role: 'client' },
    { projectId: second.id, userId: users.coordinator, role: 'coordinator' },
    { projectId: second.id, userId: users.skipper, role: 'client' },
  ]);

  const siteIds = {} as DemoIds['siteIds'];
  for (const { key, ...columns } of DEMO_SITES) {
    const [row] = await db
      .insert(worksite)
      .values({ projectId: main.id, ...columns, timeZone: DEMO_TIME_ZONE, tide: DEMO_SITE_TIDES[key] ?? null })
      .returning({ id: worksite.id });
    siteIds[key] = row.id;
  }
  const vesselIds = {} as Record<(typeof DEMO_VESSELS)[number]['key'], string>;
  for (const v of DEMO_VESSELS) {
    const [row] = await db
      .insert(vessel)
      .values({ projectId: main.id, name: v.name, raos: v.raos, raoFileName: 'invented-demo-raos.csv', raoImportedAt: deps.clock() })
      .returning({ id: vessel.id });
    vesselIds[v.key] = row.id;
  }
  const operationIds: string[] = [];
  for (const { sites, skipper, recurrence, vessel: from, ...columns } of DEMO_OPERATIONS) {
    const [row] = await db
      .insert(operation)
      .values({
        projectId: main.id,
        ...columns,
        siteIds: sites.map((k) => siteIds[k]),
        skipperIds: skipper ? [users.skipper] : [],
        recurrence: recurrence ? { ...recurrence, text: recurrenceText(recurrence) } : null,
        vesselId: from ? vesselIds[from.key] : null,
        headingDeg: from?.headingDeg ?? null,
      })
      .returning({ id: operation.id });
    operationIds.push(row.id);
  }

  // The campaign the client asks about: lay the nearshore section, place the rock berm, pull in.
  const opId = (name: string) => operationIds[DEMO_OPERATIONS.findIndex((o) => o.name === name)];
  // Part done: it started 17 days ago and its first step (the lay) finished last week.
  const todayMs = Date.UTC(deps.clock().getUTCFullYear(), deps.clock().getUTCMonth(), deps.clock().getUTCDate());
  const campaignStartMs = todayMs - 17 * DAY_MS;
  const [demoCampaign] = await db
    .insert(campaign)
    .values({
      projectId: main.id,
      name: 'Nearshore campaign: lay, berm, pull-in',
      steps: [
        { operationId: opId('Cable lay, nearshore section'), siteId: siteIds.route },
        { operationId: opId('Rock berm placement'), siteId: siteIds.route },
        { operationId: opId('Cable pull-in at landfall'), siteId: siteIds.cofferdam },
      ],
      plannedStart: new Date(campaignStartMs),
      plannedFinish: new Date(campaignStartMs + 35 * DAY_MS),
      timeZone: DEMO_TIME_ZONE,
    })
    .returning({ id: campaign.id });
  const layStartedMs = campaignStartMs + 6 * 3_600_000;
  const layDoneMs = todayMs - 7 * DAY_MS + 14 * 3_600_000;
  return {
    users,
    projectId: main.id,
    secondProjectId: second.id,
    siteIds,
    operationIds,
    campaignId: demoCampaign.id,
    todayMs,
    campaignStartMs,
    layStartedMs,
    layDoneMs,
  };
}

/**
 * The heavy part of the demo, after {@link seedDemoAccounts}: the invented hindcast, a few weeks
 * of campaign outlooks, the campaign's progress and the forecasts.
 */
export async function seedDemoData(
  deps: Pick<AppDeps, 'db' | 'log' | 'forecast' | 'clock'>,
  base: DemoBase,
  options: SeedOptions = {},
): Promise<DemoIds> {
  const { db } = deps;
  const hindcastYears = options.hindcastYears ?? 20;
  const { users, siteIds, operationIds, todayMs, campaignStartMs, layStartedMs, layDoneMs } = base;
  const main = { id: base.projectId };
  const demoCampaign = { id: base.campaignId };

  let hindcastId: string | null = null;
  if (hindcastYears > 0) {
    const endYear = deps.clock().getUTCFullYear() - 1;
    const startMs = Date.UTC(endYear - hindcastYears + 1, 0, 1);
    const hours = (Date.UTC(endYear + 1, 0, 1) - startMs) / 3_600_000;
    // On an engine worker: the server already answers while the demo's sea data load.
    const sea = await runEngineTask('syntheticSea', generateSyntheticSea, {
      startMs,
      hours,
      seed: truthSeedForPosition(DEMO_SEA_SEED, DEMO_PROJECT.dataPointLatitude, DEMO_PROJECT.dataPointLongitude),
      climate: climateForPosition(DEMO_PROJECT.dataPointLatitude),
      partitions: true,
    });
    // The same generator's partitions as the fake forecast's (docs/domain.md#partitions).
    const parts = sea.partitions!;
    const extra: ExtraSeries = {};
    for (const k of ['windSea', 'swell1', 'swell2'] as const) {
      extra[`${k}.hs`] = parts[k].hsM;
      extra[`${k}.tp`] = parts[k].tpS;
      extra[`${k}.dir`] = parts[k].dirDeg;
    }
    const series = toSeaSeries({
      timeMs: sea.timeMs,
      hs: sea.hsM,
      tp: sea.tpS,
      dir: sea.dirDeg,
      wind: sea.windMps,
      windDir: sea.windDirDeg,
      extra,
    });
    const row = await createDataset(
      db,
      {
        projectId: main.id,
        createdBy: users.coordinator,
        name: `Varrow offshore hindcast ${endYear - hindcastYears + 1}-${endYear} (invented)`,
        kind: 'hindcast',
        ...DEMO_GENERATED_DATASET,
      },
      series,
      { note: 'Invented demo hindcast from a deterministic generator (seasons and passing storms); not measured data.' },
    );
    hindcastId = row.id;
  }

  if (hindcastId)
    await seedOutlookHistory(deps, main.id, demoCampaign.id, { fromMs: campaignStartMs, toMs: todayMs, layStartedMs, layDoneMs });
  await db
    .update(campaign)
    .set({
      progress: [
        { status: 'done', startedAt: new Date(layStartedMs).toISOString(), doneAt: new Date(layDoneMs).toISOString(), source: 'hand' },
      ],
    })
    .where(eq(campaign.id, demoCampaign.id));

  // The forecast archive for the skill page (docs/domain.md#forecast-uncertainty): 60 days of
  // past 12:00 UTC issues and an invented buoy record at the data point.
  let observationId: string | null = null;
  const archiveDays = options.skillArchiveDays ?? 60;
  if ((options.forecast ?? true) && archiveDays > 0) {
    const started = performance.now();
    observationId = await seedSkillArchive(db, main.id, DEMO_SEA_SEED, deps.clock().getTime(), { days: archiveDays });
    deps.log.info('Demo forecast archive seeded', { days: archiveDays, ms: Math.round(performance.now() - started) });
  }

  // Earlier issues of the invented forecast (the 00:00 UTC issue of each of the last days, 48 h
  // long), as if the planning job had stored them: written first, so the current one stays newest.
  const pastDays = options.pastForecastDays ?? 3;
  if ((options.forecast ?? true) && pastDays > 0) {
    const latest = latestIssueTimeMs(deps.clock().getTime());
    for (let k = pastDays; k >= 1; k--) {
      await storeFakeIssue(db, main.id, DEMO_SEA_SEED, Math.floor(latest / 86_400_000) * 86_400_000 - k * 86_400_000, 2);
    }
  }

  let forecastId: string | null = null;
  if (options.forecast ?? true) {
    try {
      forecastId = (await fetchLatestForecast(db, deps.forecast, main.id, users.coordinator)).datasetId;
    } catch (err) {
      deps.log.warn('Demo forecast not fetched', { err: err instanceof Error ? err.message : String(err) });
    }
  }
  if (options.ledger && observationId) {
    const started = performance.now();
    const transferId = operationIds[DEMO_OPERATIONS.findIndex((o) => o.name === 'Crew transfer (CTV Sable Wren)')];
    const confirmed = await seedLedger(deps, main.id, users.coordinator, campaignStartMs, transferId);
    deps.log.info('Demo ledger seeded', { confirmedDays: confirmed, ms: Math.round(performance.now() - started) });
  }
  deps.log.info('Demo scenario seeded', { project: main.id });
  return { users, projectId: main.id, secondProjectId: base.secondProjectId, siteIds, operationIds, hindcastId, forecastId, observationId };
}
