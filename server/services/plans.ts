import { LIMIT_NAMES, STATUS, alphaFactor, planOperation } from '../../shared/engine';
import { explainHour, type HourStatus } from '../../shared/engine/explain-hour';
import { transformOne } from '../../shared/waves';
import { expandRecurrence, RecurrenceInput } from '../../shared/recurrence';
import type { ConditionsAnswer, HourChainAnswer, OperationSitePlan, PlanAnswer } from '../../shared/api-types-plan';
import type { Db } from '../db/client';
import { HttpError } from '../http/errors';
import { getDatasetRow, latestDataset } from './datasets';
import { createHash } from 'node:crypto';
import { Lru } from './lru';
import { encodedAnswer } from './encoded-answers';
import { loadProjectSetup, operationSpec, sitesOf, transformForSite, type ProjectSetup } from './site-context';
import { readSeries } from './series-store';
import { STATS_FORMAT } from './workability';

const STATUS_NAMES: HourStatus[] = [];
STATUS_NAMES[STATUS.NO_DATA] = 'no_data';
STATUS_NAMES[STATUS.NOT_WORKABLE] = 'not_workable';
STATUS_NAMES[STATUS.MARGINAL] = 'marginal';
STATUS_NAMES[STATUS.WORKABLE] = 'workable';

const iso = (ms: number) => new Date(ms).toISOString();

/** The dataset to plan on: the one asked for (of this project), else the newest forecast. */
async function planDataset(db: Db, projectId: string, datasetId?: string) {
  if (datasetId) return getDatasetRow(db, projectId, datasetId);
  return latestDataset(db, projectId, 'forecast');
}

/**
 * Recent plans by (dataset, whole project setup, alpha, clock minute), per database handle: the
 * watch board of every member asks for the same plan, and "now" only moves the answer at the
 * minute (the data are hourly), so a minute's repeat reuses it. A stored dataset never changes and
 * any change to the setup (limits, names, skippers, recurrences) changes the key.
 */
const planMemos = new WeakMap<Db, Lru<Promise<Omit<PlanAnswer, 'generatedAt'>>>>();
const MS_PER_MINUTE = 60_000;

function setupKey(setup: ProjectSetup): string {
  return createHash('sha256').update(JSON.stringify([STATS_FORMAT, setup])).digest('hex').slice(0, 32);
}

/**
 * Plans every operation at each of its worksites on a dataset (by default the latest forecast):
 * hourly status, limiting factor, usable windows, earliest go-start and "may start now", as at the
 * start of the current clock minute.
 */
export async function projectPlan(db: Db, projectId: string, options: { datasetId?: string; alpha: boolean; now: Date }): Promise<PlanAnswer> {
  const generatedAt = options.now.toISOString();
  const found = await recentPlan(db, projectId, options);
  if (!found) return { dataset: null, generatedAt, alpha: options.alpha, stepMinutes: 60, plans: [] };
  return { ...(await found.answer), generatedAt };
}

/** The same answer as JSON bytes: the plan is kept encoded with its memo entry; only `generatedAt` is new. */
export async function projectPlanJson(db: Db, projectId: string, options: { datasetId?: string; alpha: boolean; now: Date }): Promise<Buffer> {
  const generatedAt = options.now.toISOString();
  const found = await recentPlan(db, projectId, options);
  if (!found) return Buffer.from(JSON.stringify({ dataset: null, generatedAt, alpha: options.alpha, stepMinutes: 60, plans: [] }));
  const rest = await encodedAnswer(db, `plan:${found.key}`, () => found.answer);
  // `{"generatedAt":"…",` + the kept answer without its opening brace (it is never empty).
  return Buffer.concat([Buffer.from(`{"generatedAt":${JSON.stringify(generatedAt)},`), rest.subarray(1)]);
}

async function recentPlan(db: Db, projectId: string, options: { datasetId?: string; alpha: boolean; now: Date }) {
  const row = await planDataset(db, projectId, options.datasetId);
  if (!row) return null;
  const setup = await loadProjectSetup(db, projectId);
  const minuteMs = Math.floor(options.now.getTime() / MS_PER_MINUTE) * MS_PER_MINUTE;
  const key = `${row.id}:${setupKey(setup)}:${options.alpha}:${minuteMs}`;
  let memo = planMemos.get(db);
  if (!memo) planMemos.set(db, (memo = new Lru(16)));
  let answer = memo.get(key);
  if (!answer) {
    answer = computePlan(db, row, setup, options.alpha, new Date(minuteMs));
    memo.set(key, answer);
    const m = memo;
    answer.catch(() => m.delete(key));
  }
  return { key, answer };
}

async function computePlan(
  db: Db,
  row: NonNullable<Awaited<ReturnType<typeof planDataset>>>,
  setup: ProjectSetup,
  alpha: boolean,
  now: Date,
): Promise<Omit<PlanAnswer, 'generatedAt'>> {
  const options = { alpha, now };
  const series = await readSeries(db, row.id);
  const times = Array.from(series.timeMs, iso);
  const stepMs = row.stepMinutes * 60_000;
  const perSite = new Map(setup.sites.map((s) => [s.id, transformForSite(series, row.dataPointDepthM, s)]));
  const plans: OperationSitePlan[] = [];
  for (const op of setup.operations) {
    const spec = operationSpec(op);
    for (const site of sitesOf(op, setup.sites)) {
      const t = perSite.get(site.id)!;
      const plan = planOperation(t.engine, spec, setup.alphaTable, options.now.getTime(), { alpha: options.alpha, stepMs });
      const statusNames = Array.from(plan.status, (s) => STATUS_NAMES[s]);
      plans.push({
        operationId: op.id,
        operationName: op.name,
        siteId: site.id,
        siteName: site.name,
        timeZone: site.timeZone,
        tpop: op.tpopH,
        tc: op.tcH,
        tr: op.tpopH + op.tcH,
        weatherRestricted: op.weatherRestricted,
        skipperIds: op.skipperIds,
        windows: plan.windows.map((w) => ({
          start: iso(w.startMs),
          end: iso(w.endMs),
          hours: w.hours,
          minMargin: { perLimit: w.minMargin.perLimit as Record<string, number>, relative: w.minMargin.relative },
        })),
        earliestStart: plan.earliestStartMs === null ? null : iso(plan.earliestStartMs),
        startNow: plan.startNow,
        times,
        status: statusNames,
        occurrences: occurrencesOf(op.recurrence, series.timeMs, stepMs, statusNames, op.tpopH + op.tcH, options.now.getTime()),
        limiting: Array.from(plan.limiting, (c) => LIMIT_NAMES[c] ?? null),
        marginRel: Array.from(plan.marginRel, (m) => (Number.isFinite(m) ? Math.round(m * 1000) / 1000 : null)),
      });
    }
  }
  return {
    dataset: { id: row.id, name: row.name, kind: row.kind, issuedAt: row.issuedAt?.toISOString() ?? null, start: row.startAt.toISOString(), end: row.endAt.toISOString() },
    alpha: options.alpha,
    stepMinutes: row.stepMinutes,
    plans,
  };
}

/**
 * Occurrences of a recurring operation inside the plan's horizon, each judged on its window
 * [start, start + TR): go when every hour is workable, marginal when every hour is workable or
 * marginal, no-go when any hour is not workable, no data otherwise (docs/domain.md#convention-7).
 */
export function occurrencesOf(
  recurrence: unknown,
  timeMs: Float64Array,
  stepMs: number,
  status: HourStatus[],
  trH: number,
  nowMs: number,
): { start: string; status: 'go' | 'marginal' | 'no_go' | 'no_data' }[] {
  const r = RecurrenceInput.safeParse(recurrence);
  if (!r.success || timeMs.length === 0) return [];
  const first = Math.max(timeMs[0], nowMs - stepMs);
  const last = timeMs[timeMs.length - 1];
  const out: { start: string; status: 'go' | 'marginal' | 'no_go' | 'no_data' }[] = [];
  for (const t0 of expandRecurrence(r.data, first, last)) {
    const t1 = t0 + trH * 3_600_000;
    let i = 0;
    while (i < timeMs.length && timeMs[i] + stepMs <= t0) i++;
    let go = true;
    let marginal = false;
    let noData = false;
    let covered = i < timeMs.length ? timeMs[i] : t0;
    for (; i < timeMs.length && timeMs[i] < t1; i++) {
      if (timeMs[i] - covered > 1.5 * stepMs) noData = true;
      covered = timeMs[i] + stepMs;
      const s = status[i];
      if (s === 'not_workable') go = false;
      else if (s === 'marginal') marginal = true;
      else if (s === 'no_data') noData = true;
    }
    if (covered < t1) noData = true;
    out.push({ start: iso(t0), status: !go ? 'no_go' : noData ? 'no_data' : marginal ? 'marginal' : 'go' });
  }
  return out;
}

const v = (x: number) => (Number.isNaN(x) ? null : x);

/** The chain behind one hour: data point values → Ks, Kr, flags → worksite values → each limit → margin. */
export async function hourChain(
  db: Db,
  projectId: string,
  q: { datasetId?: string; operationId: string; siteId: string; time: string; alpha: boolean },
): Promise<HourChainAnswer> {
  const row = await planDataset(db, projectId, q.datasetId);
  if (!row) throw new HttpError('not_found', 'No forecast to explain yet');
  const setup = await loadProjectSetup(db, projectId);
  const op = setup.operations.find((o) => o.id === q.operationId);
  if (!op) throw new HttpError('not_found', 'Operation not found');
  const site = setup.sites.find((s) => s.id === q.siteId);
  if (!site) throw new HttpError('not_found', 'Worksite not found');
  const tMs = Date.parse(q.time);
  const stepMs = row.stepMinutes * 60_000;
  const series = await readSeries(db, row.id, { fromMs: tMs - stepMs, toMs: tMs + stepMs });
  // The record covering the time: [t, t + dt).
  let i = -1;
  for (let k = 0; k < series.timeMs.length; k++) if (series.timeMs[k] <= tMs && tMs < series.timeMs[k] + stepMs) i = k;
  if (i < 0) throw new HttpError('not_found', 'No record at that time');
  const chain = transformOne(
    { hsM: series.hs[i], tpS: series.tp[i], tzS: series.tz[i], dirDeg: series.dir[i] },
    { depthM: row.dataPointDepthM ?? Infinity },
    { depthM: site.depthM, shoreNormalDeg: site.shoreNormalDeg, breakerIndex: site.breakerIndex, transferTable: site.transferTable },
  );
  const explained = explainHour(
    { hsM: chain.hsM, tpS: series.tp[i], bedVelocityLinearMps: chain.bedVelocityLinearMps, bedVelocitySoulsbyMps: chain.bedVelocitySoulsbyMps, windMps: series.wind[i] },
    operationSpec(op),
    setup.alphaTable,
    { alpha: q.alpha },
  );
  return {
    time: iso(series.timeMs[i]),
    operationId: op.id,
    siteId: site.id,
    dataPoint: { depthM: row.dataPointDepthM, hs: v(series.hs[i]), tp: v(series.tp[i]), tz: v(series.tz[i]), dir: v(series.dir[i]), wind: v(series.wind[i]) },
    transform: chain,
    site: { depthM: site.depthM, hs: v(chain.hsM), bedVelocityLinear: v(chain.bedVelocityLinearMps), bedVelocitySoulsby: v(chain.bedVelocitySoulsbyMps), wind: v(series.wind[i]) },
    status: explained.status,
    checks: explained.checks,
  };
}

/** Worksite conditions over a dataset with each operation's limit and forecast limit. */
export async function siteConditions(db: Db, projectId: string, q: { datasetId?: string; siteId: string }): Promise<ConditionsAnswer> {
  const setup = await loadProjectSetup(db, projectId);
  const site = setup.sites.find((s) => s.id === q.siteId);
  if (!site) throw new HttpError('not_found', 'Worksite not found');
  const row = await planDataset(db, projectId, q.datasetId);
  const empty: ConditionsAnswer = { siteId: site.id, timeZone: site.timeZone, times: [], hs: [], tp: [], dir: [], wind: [], bedVelocityLinear: [], bedVelocitySoulsby: [], flags: [], operations: [] };
  if (!row) return empty;
  const series = await readSeries(db, row.id);
  const t = transformForSite(series, row.dataPointDepthM, site);
  const col = (a: Float64Array) => Array.from(a, (x) => (Number.isNaN(x) ? null : Math.round(x * 1000) / 1000));
  return {
    ...empty,
    times: Array.from(series.timeMs, iso),
    hs: col(t.transformed.hsM),
    tp: col(series.tp),
    dir: col(t.transformed.dirDeg),
    wind: col(series.wind),
    bedVelocityLinear: col(t.transformed.bedVelocityLinearMps),
    bedVelocitySoulsby: col(t.transformed.bedVelocitySoulsbyMps),
    flags: Array.from(t.transformed.flags),
    operations: setup.operations
      .filter((o) => sitesOf(o, setup.sites).some((s) => s.id === site.id))
      .map((o) => {
        const spec = operationSpec(o);
        const hsMax = spec.limits.hsMax ?? null;
        return {
          id: o.id,
          name: o.name,
          hsMax,
          hsMaxForecast: hsMax === null ? null : hsMax * alphaFactor(setup.alphaTable, spec),
          windMax: spec.limits.windMax ?? null,
          bedVelocityMax: spec.limits.bedVelocityMax ?? null,
          bedVelocityMethod: spec.limits.bedVelocityMax != null ? (spec.limits.bedVelocityMethod ?? 'linear') : null,
        };
      }),
  };
}
