/**
 * The project Overview: today's picture for the person looking at it, composed from the services
 * behind the plan, the ledger, the outbox and the datasets (no numbers of its own).
 */
import { and, asc, count, desc, eq, gt } from 'drizzle-orm';
import { format } from 'date-fns';
import { tz } from '@date-fns/tz';
import type { ProjectAccessRole } from '../../shared/api-types';
import type { OperationSitePlan } from '../../shared/api-types-plan';
import type { OverviewAnswer, OverviewChange, OverviewLine, OverviewMonthRow } from '../../shared/api-types-overview';
import type { Db } from '../db/client';
import { alert, ledgerDay, outbox, planRun, project } from '../db/schema';
import { listDatasets } from './datasets';
import { ledgerDaysWhere } from './ledger-entries';
import { ledgerExpectations } from './ledger-monthly';
import { dominantLimit, projectPlan } from './plans';
import { readSeries } from './series-store';
import { loadProjectSetup, sitesOf } from './site-context';

const MS_PER_HOUR = 3_600_000;
/** Hours of the small strip on each line. */
export const NEXT_HOURS = 48;
/** A dataset whose Hs steps are missing above this share is listed with a warning (common practice, no source). */
export const GAP_WARNING_SHARE = 0.05;

/**
 * The ensemble chance that the go-start holds TR (docs/domain.md#forecast-uncertainty): the share of
 * runs with a go-start at the earliest start (which is the current record when it may start now).
 */
function goChance(p: OperationSitePlan): number | null {
  if (!p.startChance || !p.earliestStart) return null;
  const i = p.times.indexOf(p.earliestStart);
  return i < 0 ? null : p.startChance[i];
}

/** One line of the Overview from one plan row. */
export function overviewLine(p: OperationSitePlan, nowMs: number, userId: string): OverviewLine {
  const goMs = p.startNow ? nowMs : p.earliestStart ? Date.parse(p.earliestStart) : null;
  const window = goMs === null ? undefined : p.windows.find((w) => Date.parse(w.start) <= goMs && goMs < Date.parse(w.end));
  const hourMs = Math.floor(nowMs / MS_PER_HOUR) * MS_PER_HOUR;
  const first = p.times.findIndex((t) => Date.parse(t) >= hourMs);
  const idx =
    first < 0 ? [] : p.times.map((_, i) => i).filter((i) => i >= first && Date.parse(p.times[i]) < hourMs + NEXT_HOURS * MS_PER_HOUR);
  const endMs = p.times.length ? Date.parse(p.times[p.times.length - 1]) + MS_PER_HOUR : nowMs;
  return {
    operationId: p.operationId,
    operationName: p.operationName,
    siteId: p.siteId,
    siteName: p.siteName,
    timeZone: p.timeZone,
    tr: p.tr,
    tpop: p.tpop,
    informationOnly: p.informationOnly,
    mine: p.skipperIds.includes(userId),
    startNow: p.startNow,
    earliestStart: p.earliestStart,
    windowHours: window ? window.hours : null,
    limiting: p.startNow ? null : dominantLimit(p, nowMs, goMs ?? endMs),
    chance: goChance(p),
    next: { times: idx.map((i) => p.times[i]), status: idx.map((i) => p.status[i]) },
  };
}

/** The calendar day of an instant in a zone, 'YYYY-MM-DD' (date-fns with @date-fns/tz). */
const dayOf = (ms: number, zone: string) => format(ms, 'yyyy-MM-dd', { in: tz(zone) });

/** This month per operation and worksite: confirmed ledger days and lost hours against P50/P90. */
async function monthPicture(db: Db, projectId: string, nowMs: number): Promise<OverviewAnswer['month']> {
  const setup = await loadProjectSetup(db, projectId);
  const { hindcast, expectations } = await ledgerExpectations(db, projectId);
  const expected = new Map(expectations.map((e) => [`${e.operationId}|${e.siteId}`, e]));
  const confirmed = await db
    .select({ operationId: ledgerDay.operationId, siteId: ledgerDay.siteId, day: ledgerDay.day, lostHours: ledgerDay.lostHours })
    .from(ledgerDay)
    .where(ledgerDaysWhere(projectId, 'confirmed'));
  const rows: OverviewMonthRow[] = [];
  for (const op of setup.operations)
    for (const site of sitesOf(op, setup.sites)) {
      const today = dayOf(nowMs, site.timeZone);
      const month = today.slice(0, 7);
      const days = confirmed.filter((c) => c.operationId === op.id && c.siteId === site.id && c.day.startsWith(month));
      const m = expected.get(`${op.id}|${site.id}`)?.months[Number(month.slice(5, 7)) - 1];
      rows.push({
        operationId: op.id,
        operationName: op.name,
        siteId: site.id,
        siteName: site.name,
        month,
        daysOver: Number(today.slice(8, 10)) - 1,
        confirmedDays: days.length,
        confirmedLostHours: Math.round(days.reduce((s, d) => s + (d.lostHours ?? 0), 0) * 100) / 100,
        expectedP50Hours: m?.p50Hours ?? null,
        expectedP90Hours: m?.p90Hours ?? null,
        hindcastYears: m?.years ?? 0,
      });
    }
  rows.sort((a, b) => a.operationName.localeCompare(b.operationName) || a.siteName.localeCompare(b.siteName));
  return { hindcast: hindcast ? { id: hindcast.id, name: hindcast.name } : null, rows };
}

async function coordinatorPicture(db: Db, projectId: string): Promise<NonNullable<OverviewAnswer['coordinator']>> {
  const [[waiting], [oldest], [failed], datasets, setup, [place]] = await Promise.all([
    db.select({ n: count() }).from(ledgerDay).where(ledgerDaysWhere(projectId, 'proposed')),
    db.select({ day: ledgerDay.day }).from(ledgerDay).where(ledgerDaysWhere(projectId, 'proposed')).orderBy(asc(ledgerDay.day)).limit(1),
    db
      .select({ n: count() })
      .from(outbox)
      .where(and(eq(outbox.projectId, projectId), eq(outbox.status, 'failed'))),
    listDatasets(db, projectId),
    loadProjectSetup(db, projectId),
    db
      .select({ latitude: project.dataPointLatitude, longitude: project.dataPointLongitude, forecastSource: project.forecastSource })
      .from(project)
      .where(eq(project.id, projectId)),
  ]);
  const withWarnings = datasets
    .map((d) => {
      const warnings: string[] = [];
      // A forecast changes its step (hourly, then 3-hourly): only its missing values count, not the longer steps.
      const gap = d.kind === 'forecast' ? d.missingShare : d.hsGapShare;
      if (gap > GAP_WARNING_SHARE)
        warnings.push(`${Math.round(gap * 1000) / 10} % of the Hs ${d.kind === 'forecast' ? 'values' : 'steps'} missing`);
      if (d.statisticsDefault && Date.parse(d.end) - Date.parse(d.start) < 365 * 86_400_000)
        warnings.push('the default for statistics spans less than a year');
      return { id: d.id, name: d.name, warnings };
    })
    .filter((d) => d.warnings.length > 0);
  return {
    ledgerDaysWaiting: waiting?.n ?? 0,
    oldestWaitingDay: oldest?.day ?? null,
    failedEmails: failed?.n ?? 0,
    datasetsWithWarnings: withWarnings,
    setup: {
      worksites: setup.sites.length,
      operations: setup.operations.length,
      dataPointPlaced: place?.latitude != null && place.longitude != null,
      statisticsDatasets: datasets.filter((d) => d.kind === 'hindcast' || d.kind === 'observation').length,
      forecasts: datasets.filter((d) => d.kind === 'forecast').length,
      forecastSource: place?.forecastSource ?? 'service',
    },
  };
}

/** The Overview of a project for one caller (their role decides the parts beyond the lines). */
export async function projectOverview(
  db: Db,
  projectId: string,
  caller: { userId: string; role: ProjectAccessRole },
  options: { now: Date; alpha: boolean },
): Promise<OverviewAnswer> {
  const nowMs = options.now.getTime();
  const plan = await projectPlan(db, projectId, { alpha: options.alpha, now: options.now });
  const lines = plan.plans.map((p) => overviewLine(p, nowMs, caller.userId));

  let dataPointNow: OverviewAnswer['dataPointNow'] = null;
  if (plan.dataset) {
    const stepMs = plan.stepMinutes * 60_000;
    const s = await readSeries(db, plan.dataset.id, { fromMs: nowMs - stepMs, toMs: nowMs + stepMs });
    let at = -1;
    for (let i = 0; i < s.timeMs.length; i++) if (s.timeMs[i] <= nowMs) at = i;
    if (at < 0 && s.timeMs.length) at = 0;
    if (at >= 0) {
      const v = (x: number) => (Number.isNaN(x) ? null : Math.round(x * 100) / 100);
      dataPointNow = { time: new Date(s.timeMs[at]).toISOString(), hs: v(s.hs[at]), tp: v(s.tp[at]), dir: v(s.dir[at]) };
    }
  }

  const [run] = await db
    .select({ id: planRun.id, at: planRun.startedAt })
    .from(planRun)
    .where(and(eq(planRun.projectId, projectId), eq(planRun.status, 'ok')))
    .orderBy(desc(planRun.startedAt))
    .limit(1);
  const changes = run ? await changesOfRun(db, run.id, plan.plans) : [];
  const coordinating = caller.role === 'coordinator' || caller.role === 'admin';
  const [failed] = await db
    .select({ at: planRun.startedAt, error: planRun.error })
    .from(planRun)
    .where(and(eq(planRun.projectId, projectId), eq(planRun.status, 'failed'), run ? gt(planRun.startedAt, run.at) : undefined))
    .orderBy(desc(planRun.startedAt))
    .limit(1);

  const coordinator = coordinating ? await coordinatorPicture(db, projectId) : null;
  const month = caller.role === 'skipper' ? null : await monthPicture(db, projectId, nowMs);
  return {
    generatedAt: options.now.toISOString(),
    role: caller.role,
    forecast: plan.dataset
      ? { id: plan.dataset.id, name: plan.dataset.name, issuedAt: plan.dataset.issuedAt, start: plan.dataset.start, end: plan.dataset.end }
      : null,
    dataPointNow,
    lastPlan: run ? { at: run.at.toISOString(), changes } : null,
    failedPlan: failed ? { at: failed.at.toISOString(), error: coordinating ? (failed.error ?? null) : null } : null,
    lines,
    coordinator,
    month,
  };
}

/**
 * A planning run's changes counted by kind per operation and worksite, in the plan's order of
 * operations and worksites (names from the plan, else the alert's own operation name).
 */
async function changesOfRun(db: Db, planRunId: string, plans: readonly OperationSitePlan[]): Promise<OverviewChange[]> {
  const rows = await db
    .select({ operationId: alert.operationId, siteId: alert.siteId, kind: alert.kind, operationName: alert.message, n: count() })
    .from(alert)
    .where(eq(alert.planRunId, planRunId))
    .groupBy(alert.operationId, alert.siteId, alert.kind, alert.message);
  const order = (r: { operationId: string; siteId: string }) => {
    const i = plans.findIndex((p) => p.operationId === r.operationId && p.siteId === r.siteId);
    return i < 0 ? plans.length : i;
  };
  const groups = new Map<string, OverviewChange>();
  for (const r of [...rows].sort((a, b) => order(a) - order(b))) {
    const key = `${r.operationId}|${r.siteId}`;
    let g = groups.get(key);
    if (!g) {
      const p = plans.find((x) => x.operationId === r.operationId && x.siteId === r.siteId);
      g = {
        operationId: r.operationId,
        operationName: p?.operationName ?? r.operationName,
        siteId: r.siteId,
        siteName: p?.siteName ?? '',
        counts: {},
      };
      groups.set(key, g);
    }
    g.counts[r.kind] = (g.counts[r.kind] ?? 0) + r.n;
  }
  return [...groups.values()];
}
