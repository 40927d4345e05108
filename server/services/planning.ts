import crypto from 'node:crypto';
import { and, desc, eq, gte, ne } from 'drizzle-orm';
import { chanceDrops, comparePlans, type PlanSummary } from '../../shared/alerts/compare-plans';
import type { OperationSitePlan } from '../../shared/api-types-plan';
import type { AppDeps } from '../deps';
import { alert, planRun, project } from '../db/schema';
import { fetchLatestForecast } from './forecasts';
import { latestDataset } from './datasets';
import { dominantLimit, projectPlan } from './plans';
import { recordCampaignOutlooks } from './campaign-outlook';
import { covers, effectiveSubscriptions } from './subscriptions';
import { alertEmail, type ChangeWithReason, UNSUBSCRIBE_LINK_MARK } from './alert-mail';
import { deliverDueMail, enqueueMail, type OutboxMessage } from './outbox';
import { advisoryLockKey, type Db } from '../db/client';

/**
 * What started a planning run: the schedule, a person (an administrator or "Re-plan now"),
 * `npm run plan:once`, or a new latest forecast stored outside the job (planned at once).
 */
export type JobTrigger = 'schedule' | 'manual' | 'cli' | 'forecast';

export interface ProjectJobResult {
  projectId: string;
  status: 'planned' | 'skipped' | 'failed';
  reason?: string;
  planRunId?: string;
  datasetId?: string | null;
  forecast?: { issuedAt: string; isNew: boolean } | null;
  plans?: number;
  alerts?: { kind: string; operationId: string; siteId: string; start: string | null }[];
  queued?: number;
}

export interface JobResult {
  startedAt: string;
  projects: ProjectJobResult[];
  mail: { due: number; sent: number; failed: number };
}

/** A stable 31-bit advisory-lock key per project. */
export function projectLockKey(projectId: string): number {
  return advisoryLockKey('plan', projectId);
}

function summarise(p: OperationSitePlan): PlanSummary {
  return {
    operationId: p.operationId,
    siteId: p.siteId,
    operationName: p.operationName,
    siteName: p.siteName,
    timeZone: p.timeZone,
    tr: p.tr,
    tpop: p.tpop,
    windows: p.windows.map(({ start, end, hours, chance }) => ({ start, end, hours, chance })),
    earliestStart: p.earliestStart,
    startNow: p.startNow,
    occurrences: p.occurrences,
  };
}

/** Why a window was lost: the limit that decides most often over [start, end) of the plan (TR from start without an end). */
function lossReason(p: OperationSitePlan, start: string, end: string | null): string | null {
  const t0 = Date.parse(start);
  return dominantLimit(p, t0, end ? Date.parse(end) : t0 + p.tr * 3_600_000);
}

async function previousPlans(db: Db, projectId: string): Promise<PlanSummary[] | null> {
  const [row] = await db
    .select({ plans: planRun.plans })
    .from(planRun)
    .where(and(eq(planRun.projectId, projectId), eq(planRun.status, 'ok')))
    .orderBy(desc(planRun.startedAt))
    .limit(1);
  return (row?.plans as PlanSummary[] | undefined) ?? null;
}

/**
 * Plans one project: fetches the latest forecast (when the project uses the service, and the run
 * is not for a forecast just stored), plans every operation at every worksite, compares with the
 * last good plan, and writes the run, its alerts and the alert e-mails (outbox) in one
 * transaction. A forecast-service failure fails the run and leaves the last plan and its forecast
 * in place. A run for a new forecast holds that forecast's id from its start, so that a failed one
 * is not tried again on every tick ({@link planNewForecasts}).
 */
async function planProject(deps: AppDeps, projectId: string, trigger: JobTrigger, forecastId?: string): Promise<ProjectJobResult> {
  const { db, log } = deps;
  const [p] = await db.select().from(project).where(eq(project.id, projectId));
  if (!p) return { projectId, status: 'skipped', reason: 'project not found' };
  const now = deps.clock();
  const [run] = await db
    .insert(planRun)
    .values({ projectId, trigger, status: 'running', startedAt: now, datasetId: forecastId ?? null })
    .returning({ id: planRun.id });
  let forecast: ProjectJobResult['forecast'] = null;
  try {
    if (p.forecastSource === 'service' && trigger !== 'forecast') {
      const fetched = await fetchLatestForecast(db, deps.forecast, projectId, null);
      forecast = { issuedAt: fetched.issuedAt, isNew: fetched.isNew };
    }
    const plan = await projectPlan(db, projectId, { alpha: true, now });
    if (!plan.dataset) {
      await db
        .update(planRun)
        .set({ status: 'failed', error: 'No forecast to plan on', finishedAt: new Date() })
        .where(eq(planRun.id, run.id));
      return { projectId, status: 'failed', reason: 'No forecast to plan on', planRunId: run.id };
    }
    const summaries = plan.plans.map(summarise);
    const previous = await previousPlans(db, projectId);
    const changes: ChangeWithReason[] = comparePlans(previous, summaries, {
      nowMs: now.getTime(),
      earliestMoveHours: deps.config.earliestMoveAlertHours,
    }).map((c) => {
      const full = plan.plans.find((x) => x.operationId === c.operationId && x.siteId === c.siteId)!;
      const needsReason = c.kind === 'window_lost' || c.kind === 'occurrence_no_go' || (c.kind === 'start_now_changed' && !c.startNow);
      return { ...c, reason: needsReason ? lossReason(full, c.start ?? now.toISOString(), c.end) : null };
    });

    const subs = (await effectiveSubscriptions(db, projectId)).filter((s) => s.immediate);
    const messages: OutboxMessage[] = [];
    const bySite = new Map<string, ChangeWithReason[]>();
    for (const c of changes) {
      const k = `${c.operationId}|${c.siteId}`;
      bySite.set(k, [...(bySite.get(k) ?? []), c]);
    }
    const previousByKey = new Map((previous ?? []).map((x) => [`${x.operationId}|${x.siteId}`, x]));
    for (const summary of summaries) {
      const k = `${summary.operationId}|${summary.siteId}`;
      for (const s of subs.filter((s) => covers(s, summary.operationId, summary.siteId))) {
        // The plan's changes, and this subscriber's own "window chance fell below" (docs/domain.md#forecast-uncertainty).
        const own =
          s.windowChanceBelow === null || s.windowChanceBelow === undefined
            ? []
            : chanceDrops(previousByKey.get(k), summary, s.windowChanceBelow / 100, now.getTime());
        const list: ChangeWithReason[] = [...(bySite.get(k) ?? []), ...own];
        if (list.length === 0) continue;
        const changeKeys = list
          .map((c) => c.key)
          .sort()
          .join(',');
        const mail = await alertEmail({
          plan: summary,
          changes: list,
          projectName: p.name,
          boardUrl: `${deps.config.baseUrl}/projects/${projectId}/board`,
          // The signed link goes in when the e-mail is sent (server/services/outbox.ts).
          unsubscribeUrl: UNSUBSCRIBE_LINK_MARK,
        });
        messages.push({
          // (plan, recipient, change): the forecast planned on, the person, what changed.
          idempotencyKey: `alert:${plan.dataset.id}:${s.userId}:${k}:${crypto.createHash('sha256').update(changeKeys).digest('hex').slice(0, 24)}`,
          projectId,
          userId: s.userId,
          toEmail: s.email,
          ...mail,
        });
      }
    }

    const queued = await db.transaction(async (tx) => {
      if (changes.length > 0) {
        await tx.insert(alert).values(
          changes.map((c) => ({
            projectId,
            planRunId: run.id,
            operationId: c.operationId,
            siteId: c.siteId,
            kind: c.kind,
            changeKey: c.key,
            message: summaries.find((s) => s.operationId === c.operationId && s.siteId === c.siteId)!.operationName,
            details: c,
          })),
        );
      }
      const n = await enqueueMail(tx as unknown as Db, messages, now);
      await tx
        .update(planRun)
        .set({ status: 'ok', datasetId: plan.dataset!.id, plans: summaries, finishedAt: new Date() })
        .where(eq(planRun.id, run.id));
      return n;
    });
    await recordCampaignOutlooks(deps, projectId, run.id, now); // campaign outlook history and its alerts (never fails the run)
    log.info(`Planned ${p.name}: ${summaries.length} plans, ${changes.length} changes, ${queued} e-mails queued`);
    return {
      projectId,
      status: 'planned',
      planRunId: run.id,
      datasetId: plan.dataset.id,
      forecast,
      plans: summaries.length,
      alerts: changes.map((c) => ({ kind: c.kind, operationId: c.operationId, siteId: c.siteId, start: c.start })),
      queued,
    };
  } catch (err) {
    const message = err instanceof Error ? err.message : String(err);
    log.warn(`Planning ${p.name} failed; the last plan is kept and the next tick retries`, { error: message });
    await db
      .update(planRun)
      .set({ status: 'failed', error: message.slice(0, 1000), finishedAt: new Date() })
      .where(eq(planRun.id, run.id));
    return { projectId, status: 'failed', reason: message, planRunId: run.id, forecast };
  }
}

/**
 * The planning job: every project with a forecast service (or the one given), one run at a time
 * per project across app instances (database advisory lock), then delivery of due e-mails. With
 * `tickAt` (the cron tick's scheduled time) a project already planned on that tick is skipped, so
 * each tick plans each project once however many instances run the schedule.
 */
export async function runPlanningJob(
  deps: AppDeps,
  options: { projectId?: string; trigger: JobTrigger; tickAt?: Date; forecastId?: string },
): Promise<JobResult> {
  const startedAt = deps.clock().toISOString();
  const ids = options.projectId
    ? [options.projectId]
    : (await deps.db.select({ id: project.id }).from(project).where(eq(project.forecastSource, 'service'))).map((r) => r.id);
  const projects: ProjectJobResult[] = [];
  for (const projectId of ids) {
    const locked = await deps.database.withAdvisoryLock(projectLockKey(projectId), async (): Promise<ProjectJobResult> => {
      // Under the lock: a scheduled run of this tick that another instance finished means this
      // instance came late to the tick (a run left 'running' was cut short by a crash: plan again).
      if (options.tickAt) {
        const [done] = await deps.db
          .select({ id: planRun.id })
          .from(planRun)
          .where(
            and(
              eq(planRun.projectId, projectId),
              eq(planRun.trigger, 'schedule'),
              gte(planRun.startedAt, options.tickAt),
              ne(planRun.status, 'running'),
            ),
          )
          .limit(1);
        if (done) return { projectId, status: 'skipped', reason: 'planned on this tick by another instance', planRunId: done.id };
      }
      // Under the lock: a new forecast that another run (or instance) took up meanwhile.
      if (options.forecastId) {
        const taken = await runOnDataset(deps.db, projectId, options.forecastId);
        if (taken) return { projectId, status: 'skipped', reason: 'this forecast is planned already', planRunId: taken };
      }
      return planProject(deps, projectId, options.trigger, options.forecastId);
    });
    projects.push(locked.acquired ? locked.value : { projectId, status: 'skipped', reason: 'another planning run holds this project' });
  }
  const mail = await deliverDueMail(deps.db, deps.mailer, deps.clock(), {
    maxAttempts: deps.config.mailMaxAttempts,
    log: deps.log,
    links: deps.config,
  });
  return { startedAt, projects, mail };
}

/** A planning run of the project that planned (or, started for it, tried) this dataset; null when none. */
async function runOnDataset(db: Db, projectId: string, datasetId: string): Promise<string | null> {
  const [row] = await db
    .select({ id: planRun.id })
    .from(planRun)
    .where(and(eq(planRun.projectId, projectId), eq(planRun.datasetId, datasetId)))
    .limit(1);
  return row?.id ?? null;
}

/**
 * Plans at once every project whose latest forecast (the one the board shows) no planning run has
 * planned or tried yet: a forecast a coordinator fetched, an imported forecast file, the demo's
 * first forecast. So every new forecast is planned, and its alerts e-mailed, within the schedule's
 * minute rather than at the next planning tick. Such a run plans the stored forecast without asking
 * the forecast service again. Returns the runs made (none when every latest forecast is planned).
 */
export async function planNewForecasts(deps: AppDeps): Promise<ProjectJobResult[]> {
  const ids = (await deps.db.select({ id: project.id }).from(project)).map((r) => r.id);
  const results: ProjectJobResult[] = [];
  for (const projectId of ids) {
    const latest = await latestDataset(deps.db, projectId, 'forecast');
    if (!latest || (await runOnDataset(deps.db, projectId, latest.id))) continue;
    const job = await runPlanningJob(deps, { projectId, trigger: 'forecast', forecastId: latest.id });
    results.push(...job.projects);
  }
  return results;
}
