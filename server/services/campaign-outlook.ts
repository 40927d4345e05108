/**
 * The live campaign outlook: "as of today, with what is done and the forecast we have, when will
 * the campaign finish?" (docs/domain.md#campaigns, #hindcast-statistics, #forecast-uncertainty).
 *
 * - Progress: each step planned, started or done, with its actual times, set by a coordinator and
 *   audited. A done step's end comes from the confirmed ledger days when they already show its TPOP
 *   worked, or by hand.
 * - Outlook: the remaining steps from now (or from the end of a step under way), first on the
 *   latest forecast's go-starts (with alpha), then each hindcast year from the same calendar time
 *   (see shared/engine/campaign-outlook.ts). With an ensemble, the control and each member add
 *   their own samples, all with go-starts at OPLIM (`forecastMembers`).
 * - History: each planning job run stores the outlook (time, P50 and P90 finish, forecast issue),
 *   and e-mails clients and coordinators who asked when the P50 finish moved by more than their
 *   number of days (through the outbox).
 */
import { createHash } from 'node:crypto';
import { and, asc, desc, eq, gte, inArray, isNotNull } from 'drizzle-orm';
import { TZDate } from '@date-fns/tz';
import { format } from 'date-fns';
import {
  isWeatherRestricted,
  recordSteps,
  outlookPercentiles,
  outlookStart,
  simulateOutlook,
  type OutlookForecastMember,
  type OutlookSample,
  type StepProgress,
} from '../../shared/engine';
import type { CampaignOutlookAnswer, CampaignResponse, OutlookFinish, OutlookHistoryPoint } from '../../shared/api-types-downtime';
import type { StepProgressInput } from '../../shared/schemas/downtime';
import type { AppDeps } from '../deps';
import type { Db } from '../db/client';
import { campaign, campaignOutlook, ledgerDay, project, projectMember, subscription, user, type CampaignStepProgress } from '../db/schema';
import type { SessionUser } from '../http/context';
import { HttpError } from '../http/errors';
import { renderMail } from '../mail/message';
import { UNSUBSCRIBE_LINK_MARK } from './alert-mail';
import { ledgerDaysWhere } from './ledger-entries';
import { recordAudit } from './audit';
import { assertSteps, campaignRow, goStartsByPair, pairKey, toCampaignResponse, type Pair } from './campaigns';
import { latestDataset } from './datasets';
import { zonedDayMs } from '../../shared/ledger/days';
import { enqueueMail, type OutboxMessage } from './outbox';
import { ByteBoundedMemo } from './byte-cache';
import { runEngineTask } from './engine-pool';
import { readMembers } from './ensemble-store';
import type { SeaSeries } from './series-store';
import { loadProjectSetup, type ProjectSetup } from './site-context';
import { datasetSeries, limitsVersion, statisticsDataset, type DatasetRow } from './workability';

const MS_PER_HOUR = 3_600_000;
const MS_PER_DAY = 86_400_000;
const iso = (ms: number) => new Date(ms).toISOString();
const isoOrNull = (ms: number | null | undefined) => (ms === null || ms === undefined ? null : iso(ms));

// ---------------------------------------------------------------------------------------------
// Progress
// ---------------------------------------------------------------------------------------------

/**
 * The end of a step as the confirmed ledger days show it: from the step's start day (or the
 * first confirmed day), worked hours = planned - lost hours, day by day; the step is done at the
 * end of the day (worksite time zone) where they add up to its TPOP. Null when they do not yet.
 */
export async function ledgerDoneAt(
  db: Db,
  projectId: string,
  step: { operationId: string; siteId: string; tpopH: number; timeZone: string; startedMs: number | null },
): Promise<{ doneMs: number | null; workedHours: number; firstDayMs: number | null }> {
  const fromDay = step.startedMs === null ? null : format(new TZDate(step.startedMs, step.timeZone), 'yyyy-MM-dd');
  const rows = await db
    .select({ day: ledgerDay.day, plannedHours: ledgerDay.plannedHours, lostHours: ledgerDay.lostHours })
    .from(ledgerDay)
    .where(
      ledgerDaysWhere(
        projectId,
        'confirmed',
        eq(ledgerDay.operationId, step.operationId),
        eq(ledgerDay.siteId, step.siteId),
        fromDay ? gte(ledgerDay.day, fromDay) : undefined,
      ),
    )
    .orderBy(asc(ledgerDay.day));
  let worked = 0;
  for (const r of rows) {
    worked += Math.max(0, r.plannedHours - (r.lostHours ?? 0));
    if (worked >= step.tpopH - 1e-9) {
      return {
        doneMs: zonedDayMs(r.day, step.timeZone).endMs,
        workedHours: worked,
        firstDayMs: rows.length ? zonedDayMs(rows[0].day, step.timeZone).startMs : null,
      };
    }
  }
  return { doneMs: null, workedHours: worked, firstDayMs: rows.length ? zonedDayMs(rows[0].day, step.timeZone).startMs : null };
}

const progressOf = (row: typeof campaign.$inferSelect, i: number): CampaignStepProgress =>
  row.progress[i] ?? { status: 'planned', startedAt: null, doneAt: null };

/**
 * Sets one step's progress (coordinators; audited with the entry before and after, in the same
 * transaction). Steps are done in order: a step may start or be done only when every earlier step
 * is done, and may go back (to planned or started) only while every later step is planned.
 * Actual times may not lie in the future, and a step may not start before the previous one ended.
 *
 * @param indexParam the 0-based step index from the path
 * @throws HttpError 404 (campaign or step), 400 (times, naming the field), 409 (order).
 */
export async function setStepProgress(
  db: Db,
  projectId: string,
  campaignId: string,
  indexParam: string,
  input: StepProgressInput,
  actor: Pick<SessionUser, 'id' | 'name'>,
  now: Date,
): Promise<CampaignResponse> {
  const row = await campaignRow(db, projectId, campaignId);
  const index = /^\d{1,3}$/.test(indexParam) ? Number(indexParam) : -1;
  if (index < 0 || index >= row.steps.length)
    throw new HttpError('not_found', `Step ${indexParam} not found: this campaign has steps 0 to ${row.steps.length - 1}`);
  const nowMs = now.getTime();
  const bad = (field: string, message: string) => new HttpError('validation', `Invalid body: ${field}: ${message}`, [{ field, message }]);
  const conflict = (message: string) => new HttpError('conflict', message);

  for (let i = 0; i < index; i++) {
    if (input.status !== 'planned' && progressOf(row, i).status !== 'done')
      throw conflict(`Step ${i + 1} is not done yet: steps are done in order`);
  }
  if (input.status !== 'done') {
    for (let i = index + 1; i < row.steps.length; i++) {
      if (progressOf(row, i).status !== 'planned')
        throw conflict(`Step ${i + 1} is already ${progressOf(row, i).status}: set it back to planned first`);
    }
  }
  const before = progressOf(row, index);
  const previousEndMs = index > 0 && row.progress[index - 1]?.doneAt ? Date.parse(row.progress[index - 1].doneAt!) : null;
  const startedGiven = input.startedAt !== undefined ? Date.parse(input.startedAt) : null;
  const doneGiven = input.doneAt !== undefined ? Date.parse(input.doneAt) : null;
  if (startedGiven !== null && startedGiven > nowMs) throw bad('startedAt', 'must not be in the future (the actual start)');
  if (doneGiven !== null && doneGiven > nowMs) throw bad('doneAt', 'must not be in the future (the actual end)');
  if (startedGiven !== null && previousEndMs !== null && startedGiven < previousEndMs)
    throw bad('startedAt', `must not be before the end of step ${index} (${iso(previousEndMs)})`);

  let next: CampaignStepProgress;
  if (input.status === 'planned') {
    if (input.startedAt !== undefined) throw bad('startedAt', 'a planned step has no start');
    if (input.doneAt !== undefined) throw bad('doneAt', 'a planned step has no end');
    next = { status: 'planned', startedAt: null, doneAt: null };
  } else if (input.status === 'started') {
    if (input.doneAt !== undefined) throw bad('doneAt', "a started step has no end: set status 'done'");
    const startedMs = startedGiven ?? (before.startedAt ? Date.parse(before.startedAt) : Math.max(nowMs, previousEndMs ?? nowMs));
    next = { status: 'started', startedAt: iso(startedMs), doneAt: null };
  } else {
    let startedMs = startedGiven ?? (before.startedAt ? Date.parse(before.startedAt) : null);
    let doneMs = doneGiven;
    let source: 'hand' | 'ledger' = 'hand';
    if (doneMs === null) {
      const setup = await loadProjectSetup(db, projectId);
      const step = row.steps[index];
      const op = setup.operations.find((o) => o.id === step.operationId);
      const site = setup.sites.find((s) => s.id === step.siteId);
      if (!op || !site) throw conflict(`Step ${index + 1} no longer fits the project`);
      const fromLedger = await ledgerDoneAt(db, projectId, {
        operationId: op.id,
        siteId: site.id,
        tpopH: op.tpopH,
        timeZone: site.timeZone,
        startedMs,
      });
      if (fromLedger.doneMs === null || fromLedger.doneMs > nowMs) {
        throw bad(
          'doneAt',
          `is required: the confirmed ledger days do not show this step done yet (${Math.round(fromLedger.workedHours * 10) / 10} h worked of its TPOP ${op.tpopH} h)`,
        );
      }
      doneMs = fromLedger.doneMs;
      source = 'ledger';
      startedMs ??= fromLedger.firstDayMs;
    }
    if (startedMs !== null && startedMs > doneMs)
      throw bad(startedGiven !== null ? 'startedAt' : 'doneAt', 'the end must not be before the start');
    if (previousEndMs !== null && doneMs < previousEndMs)
      throw bad('doneAt', `must not be before the end of step ${index} (${iso(previousEndMs)})`);
    next = { status: 'done', startedAt: isoOrNull(startedMs), doneAt: iso(doneMs), source };
  }

  const progress = row.steps.map((_, i) => (i === index ? next : progressOf(row, i)));
  const updated = await db.transaction(async (tx) => {
    const [u] = await tx
      .update(campaign)
      .set({ progress, updatedAt: new Date() })
      .where(and(eq(campaign.projectId, projectId), eq(campaign.id, campaignId)))
      .returning();
    await recordAudit(tx as unknown as Db, {
      projectId,
      user: actor,
      entity: 'campaign',
      entityId: campaignId,
      entityName: `${row.name}, step ${index + 1}`,
      action: 'update',
      before: { step: index, ...before },
      after: { step: index, ...next },
    });
    return u;
  });
  return toCampaignResponse(updated);
}

// ---------------------------------------------------------------------------------------------
// Outlook
// ---------------------------------------------------------------------------------------------

/** Go-start flags per (operation, worksite) on a stored dataset, kept per database handle (stored datasets never change). */
const flagMemos = new WeakMap<Db, ByteBoundedMemo<Map<string, Uint8Array>>>();
/** Bytes of go-start flags kept per database handle (one byte per record and pair). */
const FLAG_MEMO_BYTES = 16 * 1024 * 1024;

/**
 * Go-start flags (TR = TPOP + TC wholly workable, with or without alpha) of each wanted pair on a
 * dataset's series transformed to its worksite. On a forecast, an operation that is not
 * weather-restricted never gets a go-start (docs/domain.md#convention-5): the forecast cannot
 * decide it, so its samples go on in the hindcast.
 */
async function goStartFlags(
  db: Db,
  row: DatasetRow,
  setup: ProjectSetup,
  pairs: Pair[],
  alpha: boolean,
  member?: SeaSeries & { member: number },
): Promise<Map<string, Uint8Array>> {
  const wanted = new Set(pairs.map(pairKey));
  const key = createHash('sha256')
    .update(
      JSON.stringify([
        row.id,
        member?.member ?? null,
        limitsVersion(setup, row.dataPointDepthM, row.waterLevelReference),
        alpha,
        [...wanted].sort(),
      ]),
    )
    .digest('hex');
  let memo = flagMemos.get(db);
  if (!memo)
    flagMemos.set(
      db,
      (memo = new ByteBoundedMemo<Map<string, Uint8Array>>(FLAG_MEMO_BYTES, (m) =>
        [...m.values()].reduce((sum, a) => sum + a.byteLength, 0),
      )),
    );
  return memo.get(key, async () => {
    // On an engine worker thread (engine-pool.ts): a cold transformation of a 30-year hindcast never holds up other requests.
    const series = member ?? (await datasetSeries(db, row.id));
    const list = await runEngineTask('outlookGoStarts', computeOutlookGoStarts, series, row, setup, pairs, alpha);
    return new Map(pairs.map((p, i) => [pairKey(p), list[i]]));
  });
}

/**
 * The go-start flags of each pair, in the order of `pairs` (see {@link goStartFlags}). Plain data
 * in and out, so it runs on an engine worker thread.
 */
export function computeOutlookGoStarts(
  series: SeaSeries,
  row: DatasetRow,
  setup: ProjectSetup,
  pairs: Pair[],
  alpha: boolean,
): Uint8Array[] {
  const flags = goStartsByPair(series, row, setup, pairs, alpha, (spec) => row.kind === 'forecast' && !isWeatherRestricted(spec));
  return pairs.map((p) => flags.get(pairKey(p))!);
}

/**
 * The forecast samples: today the latest deterministic forecast, one member with alpha. When
 * ensembles are stored, each member becomes one more entry here (its go-starts at OPLIM, no alpha).
 */
async function forecastMembers(
  db: Db,
  row: DatasetRow,
  setup: ProjectSetup,
  remaining: Pair[],
  alpha: boolean,
): Promise<OutlookForecastMember[]> {
  const series = await datasetSeries(db, row.id);
  const n = series.timeMs.length;
  if (n === 0) return [];
  // The forecast ends with its last record's own step (forecasts often go 3-hourly after a few days).
  const lastMs = recordSteps(series.timeMs, row.stepMinutes * 60_000).durationMs[n - 1];
  const endMs = series.timeMs[n - 1] + lastMs;
  const runs = row.ensembleMembers > 0 ? await readMembers(db, row.id, series) : [];
  // Without an ensemble: the deterministic forecast, with alpha as asked. With one: the control and
  // every member, each one sample per hindcast year, all at OPLIM, as the plan's chances are: the
  // spread of the runs stands for the forecast's uncertainty, so alpha is not laid on top
  // (docs/domain.md#forecast-uncertainty).
  const onOplim = runs.length > 0 ? false : alpha;
  const flagSets = await Promise.all([
    goStartFlags(db, row, setup, remaining, onOplim),
    ...runs.map((m) => goStartFlags(db, row, setup, remaining, false, m)),
  ]);
  const labels = ['forecast', ...runs.map((m) => `member ${m.member}`)];
  return flagSets.map((flags, i) => ({
    label: labels[i],
    timeMs: series.timeMs,
    endMs,
    goStart: remaining.map((p) => flags.get(pairKey(p))!),
  }));
}

function finishOf(x: { p10: number; p50: number; p90: number } | null): OutlookFinish {
  return { p10: isoOrNull(x?.p10), p50: isoOrNull(x?.p50), p90: isoOrNull(x?.p90) };
}
const hours2 = (x: number | null | undefined) => (x === null || x === undefined ? null : Math.round(x * 100) / 100);

/**
 * The outlook of a campaign as of `now` (see the module comment).
 *
 * @throws HttpError 404 for an unknown campaign or without a hindcast, 409 when a step no longer fits the project.
 */
export async function campaignOutlookAnswer(
  db: Db,
  projectId: string,
  campaignId: string,
  options: { alpha: boolean; now: Date },
): Promise<CampaignOutlookAnswer> {
  const c = await campaignRow(db, projectId, campaignId);
  const [hindRow, setup, fcRow] = await Promise.all([
    statisticsDataset(db, projectId),
    loadProjectSetup(db, projectId),
    latestDataset(db, projectId, 'forecast'),
  ]);
  if (!hindRow) throw new HttpError('not_found', 'No hindcast to continue the outlook on: import one under Sea data');
  assertSteps(setup, c.steps, 'conflict');
  const ops = new Map(setup.operations.map((o) => [o.id, o]));
  const tpopAll = c.steps.map((s) => ops.get(s.operationId)!.tpopH);
  const progress: StepProgress[] = c.steps.map((_, i) => {
    const p = progressOf(c, i);
    return { status: p.status, startedMs: p.startedAt ? Date.parse(p.startedAt) : null, doneMs: p.doneAt ? Date.parse(p.doneAt) : null };
  });
  const nowMs = options.now.getTime();
  const { firstIndex, startMs } = outlookStart(progress, tpopAll, nowMs);
  const remaining = c.steps.slice(firstIndex);
  const tpopH = tpopAll.slice(firstIndex);
  const base = {
    campaignId: c.id,
    asOf: options.now.toISOString(),
    forecastIssuedAt: fcRow?.issuedAt?.toISOString() ?? null,
    alpha: options.alpha,
    startFrom: iso(startMs),
    plannedFinish: c.plannedFinish?.toISOString() ?? null,
  };
  const hindcastInfo = { datasetId: hindRow.id, name: hindRow.name };

  if (remaining.length === 0) {
    // Every step is done: the finish is the actual end of the last one.
    const end = progress[progress.length - 1].doneMs ?? startMs;
    const finish = { p10: iso(end), p50: iso(end), p90: iso(end) };
    const zero = { p50: 0, p90: 0 };
    return {
      ...base,
      complete: true,
      samples: 0,
      censored: 0,
      finish,
      remainingWowHours: zero,
      steps: [],
      forecast: null,
      hindcast: { ...hindcastInfo, years: 0, samples: 0, censored: 0, finish, remainingWowHours: zero },
      forecastShiftHours: { p50: 0, p90: 0 },
    };
  }

  const hindFlags = await goStartFlags(db, hindRow, setup, remaining, options.alpha);
  const hindSeries = await datasetSeries(db, hindRow.id);
  const hindcast = {
    timeMs: hindSeries.timeMs,
    stepMs: hindRow.stepMinutes * 60_000,
    goStart: remaining.map((p) => hindFlags.get(pairKey(p))!),
  };
  const members = fcRow ? await forecastMembers(db, fcRow, setup, remaining, options.alpha) : [];

  const samples = simulateOutlook({ startMs, tpopH, members, hindcast });
  const stats = outlookPercentiles(samples, remaining.length);
  const hindOnly = members.length > 0 ? simulateOutlook({ startMs, tpopH, members: [], hindcast }) : samples;
  const hindStats = members.length > 0 ? outlookPercentiles(hindOnly, remaining.length) : stats;
  const shift = (a: number | undefined, b: number | undefined) =>
    a === undefined || b === undefined ? null : hours2((a - b) / MS_PER_HOUR);

  return {
    ...base,
    complete: false,
    samples: stats.samples,
    censored: stats.censored,
    finish: finishOf(stats.finishMs),
    remainingWowHours: { p50: hours2(stats.remainingWowHours?.p50), p90: hours2(stats.remainingWowHours?.p90) },
    steps: stats.stepStartMs.map((s, k) => ({ index: firstIndex + k, p50Start: isoOrNull(s?.p50), p90Start: isoOrNull(s?.p90) })),
    forecast:
      fcRow && members.length > 0
        ? {
            datasetId: fcRow.id,
            issuedAt: fcRow.issuedAt?.toISOString() ?? null,
            end: iso(Math.max(...members.map((m) => m.endMs))),
            members: members.length,
            ensemble: members.length > 1,
            stepsStartedInForecast: minStepsInForecast(samples),
            finishedInForecast: samples.length > 0 && samples.every((s) => s.stepsInForecast === remaining.length),
          }
        : null,
    hindcast: {
      ...hindcastInfo,
      years: new Set(hindOnly.map((s) => s.year)).size,
      samples: hindStats.samples,
      censored: hindStats.censored,
      finish: finishOf(hindStats.finishMs),
      remainingWowHours: { p50: hours2(hindStats.remainingWowHours?.p50), p90: hours2(hindStats.remainingWowHours?.p90) },
    },
    forecastShiftHours: {
      p50: shift(stats.finishMs?.p50, hindStats.finishMs?.p50),
      p90: shift(stats.finishMs?.p90, hindStats.finishMs?.p90),
    },
  };
}

function minStepsInForecast(samples: OutlookSample[]): number {
  return samples.length === 0 ? 0 : Math.min(...samples.map((s) => s.stepsInForecast));
}

// ---------------------------------------------------------------------------------------------
// History and alerts
// ---------------------------------------------------------------------------------------------

/** Most history entries answered (newest kept): four runs a day for well over a year. */
export const OUTLOOK_HISTORY_LIMIT = 2000;

export async function outlookHistory(db: Db, projectId: string, campaignId: string): Promise<OutlookHistoryPoint[]> {
  await campaignRow(db, projectId, campaignId);
  const rows = await db
    .select()
    .from(campaignOutlook)
    .where(and(eq(campaignOutlook.projectId, projectId), eq(campaignOutlook.campaignId, campaignId)))
    .orderBy(desc(campaignOutlook.at))
    .limit(OUTLOOK_HISTORY_LIMIT);
  return rows.reverse().map((r) => ({
    at: r.at.toISOString(),
    p50: isoOrNull(r.p50?.getTime()),
    p90: isoOrNull(r.p90?.getTime()),
    forecastIssuedAt: isoOrNull(r.forecastIssuedAt?.getTime()),
  }));
}

/** Stores one outlook in the history. */
export async function storeOutlook(db: Db, projectId: string, answer: CampaignOutlookAnswer, planRunId: string | null): Promise<void> {
  const d = (s: string | null) => (s ? new Date(s) : null);
  await db.insert(campaignOutlook).values({
    projectId,
    campaignId: answer.campaignId,
    planRunId,
    at: new Date(answer.asOf),
    p50: d(answer.finish.p50),
    p90: d(answer.finish.p90),
    forecastIssuedAt: d(answer.forecastIssuedAt),
    samples: answer.samples,
    censored: answer.censored,
  });
}

/** Clients and coordinators of a project who asked to hear when a campaign's P50 finish moves. */
async function outlookSubscribers(db: Db, projectId: string) {
  return db
    .select({ userId: user.id, email: user.email, banned: user.banned, days: subscription.outlookMoveDays })
    .from(subscription)
    .innerJoin(user, eq(user.id, subscription.userId))
    .innerJoin(projectMember, and(eq(projectMember.userId, subscription.userId), eq(projectMember.projectId, subscription.projectId)))
    .where(
      and(
        eq(subscription.projectId, projectId),
        eq(subscription.active, true),
        isNotNull(subscription.outlookMoveDays),
        inArray(projectMember.role, ['client', 'coordinator']),
      ),
    );
}

/** The e-mail "the P50 finish moved" for one campaign. */
export async function outlookMoveEmail(args: {
  projectName: string;
  campaignName: string;
  previousP50: string;
  answer: CampaignOutlookAnswer;
  timeZone: string;
  pageUrl: string;
  unsubscribeUrl: string;
}): Promise<{ subject: string; text: string; html: string }> {
  const { answer } = args;
  const day = (s: string | null) =>
    s ? format(new TZDate(Date.parse(s), args.timeZone), 'EEE d MMM yyyy') : 'not known (every sample censored)';
  const movedDays = answer.finish.p50 ? (Date.parse(answer.finish.p50) - Date.parse(args.previousP50)) / MS_PER_DAY : 0;
  const later = movedDays > 0;
  const moved = `${Math.abs(Math.round(movedDays * 10) / 10)} days ${later ? 'later' : 'earlier'}`;
  const subject = `${args.campaignName}: P50 finish moved ${moved}, now ${day(answer.finish.p50)}`;
  const lines = [
    `P50 finish: ${day(answer.finish.p50)} (was ${day(args.previousP50)}, ${moved}).`,
    `P90 finish: ${day(answer.finish.p90)}.`,
    answer.forecastIssuedAt
      ? `Forecast issued ${format(new TZDate(Date.parse(answer.forecastIssuedAt), args.timeZone), 'EEE d MMM HH:mm')}, then the hindcast years.`
      : 'No forecast: the hindcast years alone.',
    `${answer.samples} samples, ${answer.censored} censored. Dates are ${args.timeZone}.`,
  ];
  const parts = await renderMail({
    heading: args.campaignName,
    subheading: args.projectName,
    textHead: [`${args.campaignName} (${args.projectName})`],
    points: lines,
    action: { label: 'Open the outlook', textLabel: 'Outlook', url: args.pageUrl },
    unsubscribeUrl: args.unsubscribeUrl,
  });
  return { subject, ...parts };
}

/**
 * Called by the planning job after each run of a project: computes every campaign's outlook
 * (with alpha), stores it in the history with the run, and queues an e-mail to each client and
 * coordinator whose "P50 finish moved by more than N days" is exceeded against the previous stored
 * outlook. A campaign that cannot be computed (no hindcast, a step that no longer fits) is skipped
 * and logged; it never fails the planning run.
 *
 * @returns how many outlooks were stored and e-mails queued
 */
export async function recordCampaignOutlooks(
  deps: Pick<AppDeps, 'db' | 'log' | 'config'>,
  projectId: string,
  planRunId: string | null,
  now: Date,
): Promise<{ stored: number; queued: number }> {
  const { db, log } = deps;
  let stored = 0;
  let queued = 0;
  const campaigns = await db.select().from(campaign).where(eq(campaign.projectId, projectId)).orderBy(asc(campaign.name));
  if (campaigns.length === 0) return { stored, queued };
  const [p] = await db.select({ name: project.name }).from(project).where(eq(project.id, projectId));
  const subscribers = (await outlookSubscribers(db, projectId)).filter((s) => !s.banned);
  for (const c of campaigns) {
    try {
      const answer = await campaignOutlookAnswer(db, projectId, c.id, { alpha: true, now });
      const [previous] = await db
        .select({ p50: campaignOutlook.p50 })
        .from(campaignOutlook)
        .where(eq(campaignOutlook.campaignId, c.id))
        .orderBy(desc(campaignOutlook.at))
        .limit(1);
      const messages: OutboxMessage[] = [];
      if (previous?.p50 && answer.finish.p50) {
        const movedDays = Math.abs(Date.parse(answer.finish.p50) - previous.p50.getTime()) / MS_PER_DAY;
        for (const s of subscribers.filter((x) => x.days !== null && movedDays > x.days)) {
          const mail = await outlookMoveEmail({
            projectName: p?.name ?? '',
            campaignName: c.name,
            previousP50: previous.p50.toISOString(),
            answer,
            timeZone: c.timeZone,
            pageUrl: `${deps.config.baseUrl}/projects/${projectId}/downtime`,
            // The signed link goes in when the e-mail is sent (server/services/outbox.ts).
            unsubscribeUrl: UNSUBSCRIBE_LINK_MARK,
          });
          messages.push({
            // (campaign, forecast, recipient, new P50): a re-run on the same forecast and date sends nothing twice.
            idempotencyKey: `outlook:${c.id}:${answer.forecastIssuedAt ?? 'none'}:${s.userId}:${answer.finish.p50}`,
            projectId,
            userId: s.userId,
            toEmail: s.email,
            ...mail,
          });
        }
      }
      await db.transaction(async (tx) => {
        await storeOutlook(tx as unknown as Db, projectId, answer, planRunId);
        queued += await enqueueMail(tx as unknown as Db, messages, now);
      });
      stored++;
    } catch (err) {
      log.warn(`Campaign outlook of ${c.name} not stored`, { error: err instanceof Error ? err.message : String(err) });
    }
  }
  return { stored, queued };
}
