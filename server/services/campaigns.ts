/**
 * Campaigns: an ordered list of steps (an operation at one of its worksites), and their simulated
 * duration through every hindcast year for each start month (docs/domain.md#hindcast-statistics,
 * docs/domain.md#convention-15).
 */
import { createHash } from 'node:crypto';
import { and, asc, eq } from 'drizzle-orm';
import {
  evaluateStatus,
  goStarts,
  simulateCampaign,
  zonedMonthStartMs,
  zoneOffsetMs,
  type CampaignMonthResult,
  type CampaignStep,
  type OperationSpec,
} from '../../shared/engine';
import type { CampaignMonthAnswer, CampaignResponse, CampaignSimulation } from '../../shared/api-types-downtime';
import type { CampaignInput, CampaignPatchInput, CampaignStepInput } from '../../shared/schemas/downtime';
import type { Db } from '../db/client';
import { campaign } from '../db/schema';
import { HttpError } from '../http/errors';
import { loadProjectSetup, sitesOf, type ProjectSetup } from './site-context';
import {
  cachedStats,
  datasetSeries,
  forEachOperationSite,
  limitsVersion,
  settleStatsCache,
  statisticsDataset,
  statsStored,
  type DatasetRow,
} from './workability';
import type { SeaSeries } from './series-store';
import { runEngineTask } from './engine-pool';
import { projectRow } from './project-rows';

type CampaignRow = typeof campaign.$inferSelect;

const MS_PER_HOUR = 3_600_000;

/**
 * Bump when the simulation or the fields kept of it change, so cached answers are not reused.
 * 3: the response limits' moment tables step theta every 2 deg (was 1 deg).
 */
const SIMULATION_FORMAT = 3;

/** What is cached of a start month's simulation (the per-year runs are not answered). */
export type SimulatedMonth = Omit<CampaignMonthResult, 'runs'>;
/** What is cached of a simulation: the start months, and each step's go-start hours over the whole hindcast. */
export interface Simulated {
  months: SimulatedMonth[];
  goStartHours: number[];
}

export function toCampaignResponse(row: CampaignRow): CampaignResponse {
  return {
    id: row.id,
    name: row.name,
    steps: row.steps.map((s) => ({ operationId: s.operationId, siteId: s.siteId })),
    plannedStart: row.plannedStart?.toISOString() ?? null,
    timeZone: row.timeZone,
    plannedFinish: row.plannedFinish?.toISOString() ?? null,
    progress: row.steps.map((_, index) => {
      const p = row.progress[index];
      return {
        index,
        status: p?.status ?? 'planned',
        startedAt: p?.startedAt ?? null,
        doneAt: p?.doneAt ?? null,
        source: p?.source ?? null,
      };
    }),
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  };
}

/**
 * Checks every step against the project: the operation is one of the project's, the worksite too,
 * and the operation happens at that worksite (its worksite list, empty = all).
 * @throws HttpError naming the first failing step field (`steps.i.operationId` / `steps.i.siteId`):
 *   400 for an input, 409 (`code` 'conflict') for a stored campaign the project has since changed under.
 */
export function assertSteps(setup: ProjectSetup, steps: CampaignStepInput[], code: 'validation' | 'conflict' = 'validation'): void {
  const ops = new Map(setup.operations.map((o) => [o.id, o]));
  const sites = new Map(setup.sites.map((s) => [s.id, s]));
  steps.forEach((step, i) => {
    const fail = (field: string, message: string) => {
      const where = code === 'validation' ? 'Invalid body: ' : `Step ${i + 1} no longer fits the project: `;
      return new HttpError(code, `${where}steps.${i}.${field}: ${message}`, [{ field: `steps.${i}.${field}`, message }]);
    };
    const op = ops.get(step.operationId);
    if (!op) throw fail('operationId', 'No operation with this id in the project');
    const site = sites.get(step.siteId);
    if (!site) throw fail('siteId', 'No worksite with this id in the project');
    if (!sitesOf(op, setup.sites).some((s) => s.id === site.id)) throw fail('siteId', `${op.name} does not happen at ${site.name}`);
  });
}

export async function listCampaigns(db: Db, projectId: string): Promise<CampaignResponse[]> {
  const rows = await db
    .select()
    .from(campaign)
    .where(eq(campaign.projectId, projectId))
    .orderBy(asc(campaign.name), asc(campaign.createdAt));
  return rows.map(toCampaignResponse);
}

/** The campaign row, or 404 for a malformed id, an unknown id or another project's campaign. */
export const campaignRow = (db: Db, projectId: string, campaignId: string): Promise<CampaignRow> =>
  projectRow(db, campaign, projectId, campaignId, 'Campaign');

export async function getCampaign(db: Db, projectId: string, campaignId: string): Promise<CampaignResponse> {
  return toCampaignResponse(await campaignRow(db, projectId, campaignId));
}

export async function createCampaign(db: Db, projectId: string, input: CampaignInput): Promise<CampaignResponse> {
  assertSteps(await loadProjectSetup(db, projectId), input.steps);
  const [row] = await db
    .insert(campaign)
    .values({
      projectId,
      name: input.name,
      steps: input.steps,
      plannedStart: input.plannedStart ? new Date(input.plannedStart) : null,
      timeZone: input.timeZone,
      plannedFinish: input.plannedFinish ? new Date(input.plannedFinish) : null,
    })
    .returning();
  return toCampaignResponse(row);
}

/**
 * Changes some fields; `steps` replaces the whole list (adding, reordering and removing steps). A
 * step's progress is kept while the same operation and worksite stay at its index, and dropped from
 * the first index that changes on (steps are done in order).
 */
export async function updateCampaign(db: Db, projectId: string, campaignId: string, patch: CampaignPatchInput): Promise<CampaignResponse> {
  const old = await campaignRow(db, projectId, campaignId);
  if (patch.steps) assertSteps(await loadProjectSetup(db, projectId), patch.steps);
  const [row] = await db
    .update(campaign)
    .set({
      ...(patch.name !== undefined ? { name: patch.name } : {}),
      ...(patch.steps !== undefined ? { steps: patch.steps, progress: keptProgress(old, patch.steps) } : {}),
      ...(patch.plannedFinish !== undefined ? { plannedFinish: patch.plannedFinish ? new Date(patch.plannedFinish) : null } : {}),
      ...(patch.plannedStart !== undefined ? { plannedStart: patch.plannedStart ? new Date(patch.plannedStart) : null } : {}),
      ...(patch.timeZone !== undefined ? { timeZone: patch.timeZone } : {}),
      updatedAt: new Date(),
    })
    .where(and(eq(campaign.projectId, projectId), eq(campaign.id, campaignId)))
    .returning();
  return toCampaignResponse(row);
}

function keptProgress(old: CampaignRow, steps: CampaignStepInput[]): CampaignRow['progress'] {
  const kept: CampaignRow['progress'] = [];
  for (let i = 0; i < Math.min(steps.length, old.progress.length); i++) {
    const a = old.steps[i];
    if (!a || a.operationId !== steps[i].operationId || a.siteId !== steps[i].siteId) break;
    kept.push(old.progress[i]);
  }
  return kept;
}

export async function deleteCampaign(db: Db, projectId: string, campaignId: string): Promise<void> {
  await campaignRow(db, projectId, campaignId);
  await db.delete(campaign).where(and(eq(campaign.projectId, projectId), eq(campaign.id, campaignId)));
}

/**
 * The next start date of a month: the 1st at 00:00 in `timeZone` of the first year in which it is
 * on or after `notBeforeMs`, UTC ms.
 */
export function nextMonthStartMs(month: number, notBeforeMs: number, timeZone: string): number {
  let year = new Date(notBeforeMs + zoneOffsetMs(timeZone, notBeforeMs)).getUTCFullYear();
  let t = zonedMonthStartMs(year, month, timeZone);
  while (t < notBeforeMs) t = zonedMonthStartMs(++year, month, timeZone);
  return t;
}

/** The version a campaign's cached simulation is stored under: the format, the limits version, the steps in order and the time zone. */
function simulationVersion(setup: ProjectSetup, row: DatasetRow, c: CampaignResponse): string {
  return createHash('sha256')
    .update(JSON.stringify([SIMULATION_FORMAT, limitsVersion(setup, row.dataPointDepthM, row.waterLevelReference), c.steps, c.timeZone]))
    .digest('hex')
    .slice(0, 32);
}

const simulationVariant = (c: CampaignResponse, alpha: boolean) => `campaign-${c.id}-${alpha}`;

/**
 * Works out and stores the simulation the Downtime page opens on (the project's first campaign in
 * the page's order, on the default hindcast, forecast limits on) when the `stats_cache` table does
 * not hold it for the present limits yet; true when it worked it out, false when it was stored,
 * or there is no campaign, or a step that no longer fits (the page says so). `row` is the
 * project's default hindcast. For the scheduled work (server/services/statistics-ahead.ts).
 */
export async function storeDefaultSimulation(db: Db, row: DatasetRow, setup: ProjectSetup, now: Date): Promise<boolean> {
  const [first] = await listCampaigns(db, row.projectId);
  if (!first) return false;
  try {
    assertSteps(setup, first.steps, 'conflict');
  } catch {
    return false;
  }
  if (await statsStored(db, row.id, simulationVersion(setup, row, first), simulationVariant(first, true))) return false;
  await simulateProjectCampaign(db, row.projectId, first.id, { alpha: true, now });
  await settleStatsCache();
  return true;
}

/**
 * Simulates a campaign through every hindcast year for each start month 1-12 (docs/domain.md#campaigns,
 * #convention-15): runs start on the 1st at 00:00 in the campaign's time
 * zone; each step waits for its first go-start (TR = TPOP + TC wholly workable, with or without
 * alpha) and then takes TPOP. P50/P90 (type 7) of duration and waiting on weather over the years
 * that finish; a year that reaches the data end first is censored and listed.
 *
 * Finish dates: each start month's next start date (on or after the 1st of the planned start's
 * month when the campaign has a planned start, else on or after `now`) plus the P50 / P90 duration.
 *
 * @throws HttpError 404 without a hindcast, 409 when a step no longer fits the project.
 */
export async function simulateProjectCampaign(
  db: Db,
  projectId: string,
  campaignId: string,
  options: { datasetId?: string; alpha: boolean; now: Date },
): Promise<CampaignSimulation> {
  const c = toCampaignResponse(await campaignRow(db, projectId, campaignId));
  const [row, setup] = await Promise.all([statisticsDataset(db, projectId, options.datasetId), loadProjectSetup(db, projectId)]);
  if (!row) throw new HttpError('not_found', 'No hindcast to simulate on: import one under Sea data');
  assertSteps(setup, c.steps, 'conflict');
  const ops = new Map(setup.operations.map((o) => [o.id, o]));

  // The simulation depends on the hindcast, the limits version (operations, worksites, alpha
  // table, data point depth), the steps in order, the time zone and alpha: cached under those like
  // the workability statistics (a repeat view, or another member's, costs no recomputation). The
  // finish dates below depend on the clock and are computed on every request.
  const version = simulationVersion(setup, row, c);
  const steps = c.steps.map((s) => ({ operationId: s.operationId, siteId: s.siteId, tpopH: ops.get(s.operationId)!.tpopH }));
  const simulated = await cachedStats<Simulated>(db, projectId, row.id, version, simulationVariant(c, options.alpha), async () =>
    // On an engine worker thread (engine-pool.ts): a cold 30-year simulation never holds up other requests.
    runEngineTask('campaign', computeCampaignMonths, await datasetSeries(db, row.id), row, setup, steps, c.timeZone, options.alpha),
  );
  const results = simulated.months;
  const siteNames = new Map(setup.sites.map((s) => [s.id, s.name]));
  const stepList = c.steps.map((st, k) => {
    const op = ops.get(st.operationId)!;
    return {
      operationName: op.name,
      siteName: siteNames.get(st.siteId) ?? '',
      trHours: op.tpopH + op.tcH,
      goStartHours: simulated.goStartHours[k],
    };
  });
  const never = stepList.findIndex((st) => st.goStartHours === 0);
  const neverStarts =
    never < 0
      ? null
      : `Step ${never + 1}, ${stepList[never].operationName} at ${stepList[never].siteName}, never finds a window in ${row.name}: no ${stepList[never].trHours} h (TR) in a row meet all its limits${options.alpha ? ' at the forecast limits' : ''}, so the campaign never finishes. Check that step's limits.`;

  const plannedMs = c.plannedStart ? Date.parse(c.plannedStart) : null;
  const notBeforeMs =
    plannedMs === null
      ? options.now.getTime()
      : (() => {
          const local = new Date(plannedMs + zoneOffsetMs(c.timeZone, plannedMs));
          return zonedMonthStartMs(local.getUTCFullYear(), local.getUTCMonth() + 1, c.timeZone);
        })();
  const iso = (ms: number) => new Date(ms).toISOString();
  const months: CampaignMonthAnswer[] = results.map((r) => {
    const startMs = nextMonthStartMs(r.startMonth, notBeforeMs, c.timeZone);
    return {
      startMonth: r.startMonth,
      years: r.years,
      censoredYears: r.censoredYears,
      stuckSteps: r.stuckSteps,
      p50Hours: r.p50Hours,
      p90Hours: r.p90Hours,
      wowP50Hours: r.wowP50Hours,
      wowP90Hours: r.wowP90Hours,
      startDate: iso(startMs),
      p50Finish: r.p50Hours === null ? null : iso(startMs + r.p50Hours * MS_PER_HOUR),
      p90Finish: r.p90Hours === null ? null : iso(startMs + r.p90Hours * MS_PER_HOUR),
    };
  });
  return {
    campaignId: c.id,
    dataset: { id: row.id, name: row.name, start: row.startAt.toISOString(), end: row.endAt.toISOString() },
    alpha: options.alpha,
    timeZone: c.timeZone,
    sumTpopHours: c.steps.reduce((a, s) => a + ops.get(s.operationId)!.tpopH, 0),
    steps: stepList,
    neverStarts,
    months,
  };
}

/** An (operation, worksite) pair of a campaign step, and its key in maps of go-start flags. */
export type Pair = { operationId: string; siteId: string };
export const pairKey = (p: Pair) => `${p.operationId}|${p.siteId}`;

/**
 * Go-start flags (TR = TPOP + TC wholly workable, with or without alpha) of each wanted pair on
 * the series transformed to its worksite, by {@link pairKey}; a pair whose spec `noGoStart` picks
 * gets none at all.
 */
export function goStartsByPair(
  series: SeaSeries,
  row: DatasetRow,
  setup: ProjectSetup,
  pairs: Pair[],
  alpha: boolean,
  noGoStart: (spec: OperationSpec) => boolean = () => false,
): Map<string, Uint8Array> {
  const wanted = new Set(pairs.map(pairKey));
  const stepMs = row.stepMinutes * 60_000;
  const flags = new Map<string, Uint8Array>();
  forEachOperationSite(
    series,
    row,
    setup,
    ({ op, spec, site, engine, workspace }) => {
      const key = pairKey({ operationId: op.id, siteId: site.id });
      if (noGoStart(spec)) {
        flags.set(key, new Uint8Array(engine.timeMs.length));
        return;
      }
      const status = evaluateStatus(engine, spec, { alpha, alphaTable: setup.alphaTable, out: workspace.status });
      flags.set(key, goStarts(engine.timeMs, status, stepMs, spec.tpopH + spec.tcH));
    },
    (operationId, siteId) => wanted.has(pairKey({ operationId, siteId })),
  );
  return flags;
}

/**
 * The simulated months of a campaign's steps on a hindcast (numbers only, what is cached): the
 * go-start flags of each distinct (operation, worksite) step on the transformed series, then
 * simulateCampaign. Plain data in and out, so it runs on an engine worker thread.
 */
export function computeCampaignMonths(
  series: SeaSeries,
  row: DatasetRow,
  setup: ProjectSetup,
  steps: { operationId: string; siteId: string; tpopH: number }[],
  timeZone: string,
  alpha: boolean,
): Simulated {
  const stepMs = row.stepMinutes * 60_000;
  const flags = goStartsByPair(series, row, setup, steps, alpha);
  const campaignSteps: CampaignStep[] = steps.map((s) => ({ goStart: flags.get(pairKey(s))!, tpopH: s.tpopH }));
  const dtH = stepMs / MS_PER_HOUR;
  return {
    months: simulateCampaign(series.timeMs, stepMs, campaignSteps, { timeZone }).map(({ runs: _runs, ...month }) => month),
    goStartHours: campaignSteps.map((st) => st.goStart.reduce((a, x) => a + x, 0) * dtH),
  };
}
