import { CURRENT_SOURCES, WATER_LEVEL_SOURCES } from '../../shared/seadata/water-level';
import {
  LIMIT_NAMES,
  STATUS,
  alphaFactor,
  ensembleChancesMany,
  isWeatherRestricted,
  planOperation,
  quantileR7Sorted,
  recordSteps,
  type EnsembleChances,
} from '../../shared/engine';
import { explainHour, type HourStatus } from '../../shared/engine/explain-hour';
import type { SeaPartition, SeaPartitionSeries } from '../../shared/response';
import { targetHsSeries } from '../../shared/engine/hs-targets';
import { compileLimits } from '../../shared/engine/compiled-limits';
import { DEFAULT_MPM_DURATION_H, governingResponseSeries } from '../../shared/engine/response-limits';
import { responseLabel, responseUnit } from '../../shared/response/rao';
import { PARTITION_NAMES, transformOne, transformPartitionedOne } from '../../shared/waves';
import { expandRecurrence, RecurrenceInput } from '../../shared/recurrence';
import type { ConditionsAnswer, HourChainAnswer, OccurrenceStatus, OperationSitePlan, PlanAnswer } from '../../shared/api-types-plan';
import type { Db } from '../db/client';
import { HttpError } from '../http/errors';
import { getDatasetRow, latestDataset } from './datasets';
import { createHash } from 'node:crypto';
import { encodedAnswer } from './encoded-answers';
import {
  engineSeriesAtSites,
  loadProjectSetup,
  operationSpec,
  siteCurrent,
  siteTide,
  sitesOf,
  transformForSite,
  type ProjectSetup,
} from './site-context';
import { readSeries, type SeaSeries } from './series-store';
import { readMembers } from './ensemble-store';
import { STATS_FORMAT } from './workability';
import { CURRENT_CAUTIONS, currentPredictor } from './tide';

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

type PlanRow = NonNullable<Awaited<ReturnType<typeof planDataset>>>;

/** The limit that decides most not-workable hours in [fromMs, toMs) of a plan. */
export function dominantLimit(p: OperationSitePlan, fromMs: number, toMs: number): string | null {
  const counts = new Map<string, number>();
  p.times.forEach((t, i) => {
    const ms = Date.parse(t);
    const name = p.limiting[i];
    if (ms >= fromMs && ms < toMs && name && p.status[i] !== 'workable') counts.set(name, (counts.get(name) ?? 0) + 1);
  });
  let best: string | null = null;
  for (const [k, v] of counts) if (!best || v > counts.get(best)!) best = k;
  return best;
}

/** Longest span a plan covers: a forecast's horizon, or a chosen stretch of a hindcast. */
export const MAX_PLAN_DAYS = 31;
const DAY_MS = 86_400_000;
const MS_PER_MINUTE = 60_000;

export interface PlanOptions {
  datasetId?: string;
  alpha: boolean;
  now: Date;
  /** Non-forecast datasets: the stretch to plan (ISO), at most MAX_PLAN_DAYS days; default its last MAX_PLAN_DAYS days. */
  from?: string;
  to?: string;
}

/**
 * The stretch of a dataset a plan covers and the "now" it is planned as at. A forecast is planned
 * from its start for at most MAX_PLAN_DAYS days, as at the current clock minute. Any other
 * dataset (a hindcast or observations, looked at as if it were a forecast) is planned on a chosen
 * stretch of at most MAX_PLAN_DAYS days, by default its last ones, as at the stretch's start, so
 * the answer does not change with the clock.
 */
export function planSpan(
  row: Pick<PlanRow, 'kind' | 'startAt' | 'endAt'>,
  options: Pick<PlanOptions, 'from' | 'to' | 'now'>,
): { fromMs: number; toMs: number; nowMs: number; keyed: string } {
  const startMs = row.startAt.getTime();
  const endMs = row.endAt.getTime();
  const maxMs = MAX_PLAN_DAYS * DAY_MS;
  if (row.kind === 'forecast' && options.from === undefined && options.to === undefined) {
    const nowMs = Math.floor(options.now.getTime() / MS_PER_MINUTE) * MS_PER_MINUTE;
    const toMs = Math.min(endMs, startMs + maxMs);
    return { fromMs: startMs, toMs, nowMs, keyed: `${startMs}-${toMs}@${nowMs}` };
  }
  const fromAsked = options.from !== undefined ? Date.parse(options.from) : undefined;
  const toAsked = options.to !== undefined ? Date.parse(options.to) : undefined;
  let fromMs: number;
  let toMs: number;
  if (fromAsked !== undefined && toAsked !== undefined) {
    [fromMs, toMs] = [fromAsked, toAsked];
  } else if (fromAsked !== undefined) {
    [fromMs, toMs] = [fromAsked, Math.min(endMs, fromAsked + maxMs)];
  } else if (toAsked !== undefined) {
    [fromMs, toMs] = [Math.max(startMs, toAsked - maxMs), toAsked];
  } else {
    [fromMs, toMs] = [Math.max(startMs, endMs - maxMs), endMs];
  }
  if (!(toMs > fromMs))
    throw new HttpError('validation', 'Invalid query: to: must be after from', [{ field: 'to', message: 'must be after from' }]);
  if (toMs - fromMs > maxMs) {
    throw new HttpError('validation', `Invalid query: to: a plan covers at most ${MAX_PLAN_DAYS} days`, [
      { field: 'to', message: `at most ${MAX_PLAN_DAYS} days after from` },
    ]);
  }
  return { fromMs, toMs, nowMs: fromMs, keyed: `${fromMs}-${toMs}` };
}

function setupKey(setup: ProjectSetup): string {
  return createHash('sha256')
    .update(JSON.stringify([STATS_FORMAT, setup]))
    .digest('hex')
    .slice(0, 32);
}

/**
 * Plans every operation at each of its worksites on a dataset (by default the latest forecast):
 * hourly status, limiting factor, usable windows, earliest go-start and "may start now".
 */
export async function projectPlan(db: Db, projectId: string, options: PlanOptions): Promise<PlanAnswer> {
  return JSON.parse((await projectPlanJson(db, projectId, options)).toString('utf8')) as PlanAnswer;
}

/**
 * The same answer as JSON bytes. Plans are kept encoded (bounded by bytes, server/services/
 * encoded-answers.ts) under a key of the dataset, the whole project setup, alpha and the span; a
 * forecast's key also holds the clock minute ("now" moves its answer), other datasets' do not.
 * Only `generatedAt` is new per request.
 */
export async function projectPlanJson(db: Db, projectId: string, options: PlanOptions): Promise<Buffer> {
  const generatedAt = options.now.toISOString();
  const row = await planDataset(db, projectId, options.datasetId);
  if (!row) return Buffer.from(JSON.stringify({ dataset: null, generatedAt, alpha: options.alpha, stepMinutes: 60, plans: [] }));
  const span = planSpan(row, options);
  const setup = await loadProjectSetup(db, projectId);
  const key = `plan:${row.id}:${setupKey(setup)}:${options.alpha}:${span.keyed}`;
  const rest = await encodedAnswer(db, key, () => computePlan(db, row, setup, options.alpha, span));
  // `{"generatedAt":"…",` + the kept answer without its opening brace (it is never empty).
  return Buffer.concat([Buffer.from(`{"generatedAt":${JSON.stringify(generatedAt)},`), rest.subarray(1)]);
}

async function computePlan(
  db: Db,
  row: PlanRow,
  setup: ProjectSetup,
  alpha: boolean,
  span: { fromMs: number; toMs: number; nowMs: number },
): Promise<Omit<PlanAnswer, 'generatedAt'>> {
  const options = { alpha, now: new Date(span.nowMs) };
  const series = await readSeries(db, row.id, { fromMs: span.fromMs, toMs: span.toMs });
  const times = Array.from(series.timeMs, iso);
  const stepMs = row.stepMinutes * 60_000;
  const perSite = new Map(setup.sites.map((s) => [s.id, transformForSite(series, row.dataPointDepthM, s)]));
  const members = row.ensembleMembers > 0 ? await readMembers(db, row.id, series) : [];
  const chances = ensembleChancesPerPair(series, members, row.dataPointDepthM, setup, perSite, stepMs);
  const chance3 = (a: Float64Array) => Array.from(a, (x) => Math.round(x * 1000) / 1000);
  const plans: OperationSitePlan[] = [];
  for (const op of setup.operations) {
    const spec = operationSpec(op, setup.vessels);
    // The occurrences of a recurring operation are the same at each of its worksites: expanded once.
    const starts = recurrenceStarts(op.recurrence, series.timeMs, stepMs, options.now.getTime());
    for (const site of sitesOf(op, setup.sites)) {
      const t = perSite.get(site.id)!;
      const plan = planOperation(t.engine, spec, setup.alphaTable, options.now.getTime(), { alpha: options.alpha, stepMs });
      const statusNames = Array.from(plan.status, (s) => STATUS_NAMES[s]);
      const ch = chances.get(`${op.id}:${site.id}`);
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
        informationOnly: plan.informationOnly,
        skipperIds: op.skipperIds,
        windows: plan.windows.map((w) => ({
          start: iso(w.startMs),
          end: iso(w.endMs),
          hours: w.hours,
          minMargin: { perLimit: w.minMargin.perLimit as Record<string, number>, relative: w.minMargin.relative },
          chance: ch ? Math.round(ch.start[w.startIndex] * 1000) / 1000 : null,
        })),
        earliestStart: plan.earliestStartMs === null ? null : iso(plan.earliestStartMs),
        startNow: plan.startNow,
        times,
        status: statusNames,
        occurrences: occurrencesOf(
          op.recurrence,
          series.timeMs,
          plan.durationMs,
          statusNames,
          op.tpopH + op.tcH,
          options.now.getTime(),
          plan.informationOnly,
          starts,
        ),
        limiting: Array.from(plan.limiting, (c) => LIMIT_NAMES[c] ?? null),
        marginRel: Array.from(plan.marginRel, (m) => (Number.isFinite(m) ? Math.round(m * 1000) / 1000 : null)),
        chance: ch ? chance3(ch.hour) : null,
        startChance: ch && !plan.informationOnly ? chance3(ch.start) : null,
      });
    }
  }
  return {
    dataset: {
      id: row.id,
      name: row.name,
      kind: row.kind,
      issuedAt: row.issuedAt?.toISOString() ?? null,
      start: row.startAt.toISOString(),
      end: row.endAt.toISOString(),
    },
    span: { from: iso(span.fromMs), to: iso(span.toMs), asAt: iso(span.nowMs) },
    alpha: options.alpha,
    stepMinutes: row.stepMinutes,
    ensemble: members.length > 0 ? { runs: members.length + 1 } : null,
    plans,
  };
}

/**
 * Ensemble chances per (operation, worksite) (docs/domain.md#forecast-uncertainty): every run
 * (the control and each member) transformed to the worksite like the control, all operations at
 * the worksite evaluated together on OPLIM. Empty without members.
 */
export function ensembleChancesPerPair(
  control: SeaSeries,
  members: readonly SeaSeries[],
  dataPointDepthM: number | null,
  setup: ProjectSetup,
  perSite: Map<string, ReturnType<typeof transformForSite>>,
  stepMs: number,
): Map<string, EnsembleChances> {
  const out = new Map<string, EnsembleChances>();
  if (members.length === 0 || control.timeMs.length === 0) return out;
  const specs = new Map(setup.operations.map((op) => [op.id, operationSpec(op, setup.vessels)]));
  const withDirections = [...specs.values()].some((s) => (s.limits.responses ?? []).length > 0);
  const memberSites = members.map((m) => engineSeriesAtSites(m, dataPointDepthM, setup.sites, withDirections));
  for (const site of setup.sites) {
    const ops = setup.operations.filter((op) => sitesOf(op, setup.sites).some((s) => s.id === site.id));
    if (ops.length === 0) continue;
    const runs = [perSite.get(site.id)!.engine, ...memberSites.map((m) => m.get(site.id)!)];
    const result = ensembleChancesMany(
      runs,
      ops.map((op) => specs.get(op.id)!),
      setup.alphaTable,
      stepMs,
    );
    ops.forEach((op, k) => out.set(`${op.id}:${site.id}`, result[k]));
  }
  return out;
}

/** Occurrence starts of a stored recurrence inside the plan's horizon (none when it is not a valid rule). */
function recurrenceStarts(recurrence: unknown, timeMs: Float64Array, stepMs: number, nowMs: number): number[] {
  const r = RecurrenceInput.safeParse(recurrence);
  if (!r.success || timeMs.length === 0) return [];
  return expandRecurrence(r.data, Math.max(timeMs[0], nowMs - stepMs), timeMs[timeMs.length - 1]);
}

/**
 * Occurrences of a recurring operation inside the plan's horizon, each judged on its window
 * [start, start + TR): go when every hour is workable, marginal when every hour is workable or
 * marginal, no-go when any hour is not workable, no data otherwise (docs/domain.md#convention-7). Records cover
 * [t_i, t_i + dt_i) with their local step; a hole between one record's end and the next start
 * longer than half a step is no data. An operation that is not weather-restricted
 * (`informationOnly`, docs/domain.md#convention-5) never gets "go" or "marginal": those become "information".
 */
export function occurrencesOf(
  recurrence: unknown,
  timeMs: Float64Array,
  durationMs: Float64Array,
  status: HourStatus[],
  trH: number,
  nowMs: number,
  informationOnly = false,
  starts = recurrenceStarts(recurrence, timeMs, durationMs.length > 0 ? durationMs[0] : 0, nowMs),
): OccurrenceJudgement[] {
  const out: OccurrenceJudgement[] = [];
  for (const t0 of starts) {
    const t1 = t0 + trH * 3_600_000;
    let i = 0;
    while (i < timeMs.length && timeMs[i] + durationMs[i] <= t0) i++;
    let go = true;
    let marginal = false;
    let noData = false;
    let covered = i < timeMs.length ? timeMs[i] : t0;
    for (; i < timeMs.length && timeMs[i] < t1; i++) {
      if (timeMs[i] - covered > 0.5 * durationMs[i]) noData = true;
      covered = timeMs[i] + durationMs[i];
      const s = status[i];
      if (s === 'not_workable') go = false;
      else if (s === 'marginal') marginal = true;
      else if (s === 'no_data') noData = true;
    }
    if (covered < t1) noData = true;
    const judged = !go ? 'no_go' : noData ? 'no_data' : marginal ? 'marginal' : 'go';
    out.push({ start: iso(t0), status: informationOnly && (judged === 'go' || judged === 'marginal') ? 'information' : judged });
  }
  return out;
}

const v = (x: number) => (Number.isNaN(x) ? null : x);

/** One record of partition series, as explainHour takes it. */
function responsePartitionsAt(parts: SeaPartitionSeries[] | undefined, i: number): SeaPartition[] {
  return (parts ?? []).map((p) => ({ kind: p.kind, hsM: p.hsM[i], tpS: p.tpS[i], dirDeg: p.dirDeg[i] }));
}

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
  // Two days either side: enough records to find the local step (record-steps.ts) around the time.
  const margin = Math.max(48 * 3_600_000, 8 * stepMs);
  const series = await readSeries(db, row.id, { fromMs: tMs - margin, toMs: tMs + margin });
  const dur = recordSteps(series.timeMs, stepMs).durationMs;
  // The record covering the time: [t, t + dt_i).
  let i = -1;
  for (let k = 0; k < series.timeMs.length; k++) if (series.timeMs[k] <= tMs && tMs < series.timeMs[k] + dur[k]) i = k;
  if (i < 0) throw new HttpError('not_found', 'No record at that time');
  // The water level of the hour (a dataset level, the predicted tide, or both; docs/domain.md#tide) and the extremes for a tide window.
  const tide = siteTide(site, series);
  const waterLevel = tide ? tide.waterLevelM[i] : null;
  // The hour's current: the dataset's where it has a speed, else the station's predicted tidal current (docs/domain.md#tide).
  const current = siteCurrent(site, series);
  const chain = transformOne(
    { hsM: series.hs[i], tpS: series.tp[i], tzS: series.tz[i], dirDeg: series.dir[i], waterLevelM: waterLevel },
    { depthM: row.dataPointDepthM ?? Infinity },
    { depthM: site.depthM, shoreNormalDeg: site.shoreNormalDeg, breakerIndex: site.breakerIndex, transferTable: site.transferTable },
  );
  // Partitions, each through the chain with its own Tp and direction (docs/domain.md#partitions).
  const parts: Parameters<typeof transformPartitionedOne>[1] = {};
  for (const k of PARTITION_NAMES) {
    const hs = series.extra[`${k}.hs`];
    if (hs) parts[k] = { hsM: hs[i], tpS: series.extra[`${k}.tp`]?.[i] ?? NaN, dirDeg: series.extra[`${k}.dir`]?.[i] ?? NaN };
  }
  const combined = transformPartitionedOne(
    { hsM: series.hs[i], tpS: series.tp[i], tzS: series.tz[i], dirDeg: series.dir[i], waterLevelM: waterLevel },
    parts,
    { depthM: row.dataPointDepthM ?? Infinity },
    { depthM: site.depthM, shoreNormalDeg: site.shoreNormalDeg, breakerIndex: site.breakerIndex, transferTable: site.transferTable },
  );
  const hasPartitionColumns = Object.keys(parts).length > 0;
  const hourPartitions = hasPartitionColumns
    ? Object.fromEntries(
        PARTITION_NAMES.map((k) => {
          const p = combined?.partitions.find((c) => c.name === k);
          return [k, { hsM: combined ? (p ? p.hsM : 0) : NaN, tpS: p ? p.tpS : NaN }];
        }),
      )
    : undefined;
  const siteHs = combined ? combined.hsM : chain.hsM;
  const siteTp = combined ? combined.tpS : series.tp[i];
  const siteBedLinear = combined ? combined.bedVelocityLinearMps : chain.bedVelocityLinearMps;
  const siteBedSoulsby = combined ? combined.bedVelocitySoulsbyMps : chain.bedVelocitySoulsbyMps;
  const spec = operationSpec(op, setup.vessels);
  // The hour's sea partitions at the worksite as response limits read them (site-context's adapter).
  const responsePartitions =
    (spec.limits.responses ?? []).length > 0
      ? responsePartitionsAt(transformForSite(series, row.dataPointDepthM, site).engine.responsePartitions, i)
      : undefined;
  // The ensemble's Hs at the worksite in this hour: every run (control and members) through the same chain.
  const members = row.ensembleMembers > 0 ? await readMembers(db, row.id, series) : [];
  let ensemble: HourChainAnswer['ensemble'] = null;
  if (members.length > 0) {
    const hs = [chain.hsM, ...members.map((m) => siteHsOf(m, i, waterLevel, row.dataPointDepthM, site))].filter((x) => !Number.isNaN(x));
    hs.sort((a, b) => a - b);
    const q = (p: number) => (hs.length ? Math.round(quantileR7Sorted(hs, p) * 1000) / 1000 : null);
    ensemble = { runs: members.length + 1, withData: hs.length, hs: { min: q(0), p10: q(0.1), p50: q(0.5), p90: q(0.9), max: q(1) } };
  }
  const explained = explainHour(
    {
      hsM: siteHs,
      tpS: siteTp,
      bedVelocityLinearMps: siteBedLinear,
      bedVelocitySoulsbyMps: siteBedSoulsby,
      windMps: series.wind[i],
      depthM: chain.depthM,
      timeMs: series.timeMs[i],
      ...(tide?.tide ? { tide: tide.tide } : {}),
      ...(hourPartitions ? { partitions: hourPartitions as NonNullable<Parameters<typeof explainHour>[0]['partitions']> } : {}),
      ...(responsePartitions ? { responsePartitions } : {}),
      ...(current ? { currentMps: current.speedMps[i] } : {}),
    },
    spec,
    setup.alphaTable,
    { alpha: q.alpha },
  );
  return {
    time: iso(series.timeMs[i]),
    operationId: op.id,
    siteId: site.id,
    dataPoint: {
      depthM: row.dataPointDepthM,
      hs: v(series.hs[i]),
      tp: v(series.tp[i]),
      tz: v(series.tz[i]),
      dir: v(series.dir[i]),
      wind: v(series.wind[i]),
    },
    transform: chain,
    site: {
      depthM: site.depthM,
      waterLevel: waterLevel === null ? null : v(waterLevel),
      waterLevelSource: tide ? WATER_LEVEL_SOURCES[tide.recordSource[i]] : 'none',
      depth: chain.depthM,
      current: current ? v(current.speedMps[i]) : null,
      currentDir: current ? v(current.dirDeg[i]) : null,
      currentSource: current ? CURRENT_SOURCES[current.source[i]] : 'none',
      currentStation: current && CURRENT_SOURCES[current.source[i]] === 'predicted' ? (current.station?.name ?? null) : null,
      hs: v(siteHs),
      bedVelocityLinear: v(siteBedLinear),
      bedVelocitySoulsby: v(siteBedSoulsby),
      wind: v(series.wind[i]),
      tp: v(siteTp),
      dir: v(combined ? combined.dirDeg : chain.dirDeg),
    },
    ...(combined
      ? {
          partitions: combined.partitions.map((p) => ({
            name: p.name,
            dataPoint: { hs: v(p.hsSrcM), tp: p.hsSrcM > 0 ? v(p.tpS) : null, dir: p.hsSrcM > 0 ? v(p.dirSrcDeg) : null },
            site: { hs: v(p.hsM), tp: p.hsSrcM > 0 ? v(p.tpS) : null, dir: p.hsSrcM > 0 ? v(p.dirDeg) : null },
          })),
        }
      : {}),
    status: explained.status,
    checks: explained.checks,
    informationOnly: !isWeatherRestricted(spec),
    ensemble,
  };
}

/** One run's Hs at the worksite at record i, through the control's chain (docs/domain.md#transformation). */
function siteHsOf(
  run: SeaSeries,
  i: number,
  waterLevel: number | null,
  dataPointDepthM: number | null,
  site: ProjectSetup['sites'][number],
): number {
  return transformOne(
    { hsM: run.hs[i], tpS: run.tp[i], tzS: run.tz[i], dirDeg: run.dir[i], waterLevelM: waterLevel },
    { depthM: dataPointDepthM ?? Infinity },
    { depthM: site.depthM, shoreNormalDeg: site.shoreNormalDeg, breakerIndex: site.breakerIndex, transferTable: site.transferTable },
  ).hsM;
}

/** Worksite conditions over a dataset with each operation's limit and forecast limit. */
export async function siteConditions(
  db: Db,
  projectId: string,
  q: { datasetId?: string; siteId: string; from?: string; to?: string; now: Date },
): Promise<ConditionsAnswer> {
  const setup = await loadProjectSetup(db, projectId);
  const site = setup.sites.find((s) => s.id === q.siteId);
  if (!site) throw new HttpError('not_found', 'Worksite not found');
  const row = await planDataset(db, projectId, q.datasetId);
  const empty: ConditionsAnswer = {
    siteId: site.id,
    timeZone: site.timeZone,
    times: [],
    hs: [],
    tp: [],
    dir: [],
    wind: [],
    bedVelocityLinear: [],
    bedVelocitySoulsby: [],
    flags: [],
    waterLevel: [],
    waterLevelSource: [],
    depth: [],
    current: [],
    currentDir: [],
    currentSource: [],
    currentStation: currentPredictor(site.currentStationId, site)?.station ?? null,
    currentCautions: CURRENT_CAUTIONS,
    operations: [],
  };
  if (!row) return empty;
  // The same bounded stretch as a plan (at most MAX_PLAN_DAYS days).
  const span = planSpan(row, q);
  const series = await readSeries(db, row.id, { fromMs: span.fromMs, toMs: span.toMs });
  const t = transformForSite(series, row.dataPointDepthM, site);
  const col = (a: Float64Array) => Array.from(a, (x) => (Number.isNaN(x) ? null : Math.round(x * 1000) / 1000));
  return {
    ...empty,
    times: Array.from(series.timeMs, iso),
    hs: col(t.transformed.hsM),
    tp: col(t.engine.tpS),
    dir: col(t.transformed.dirDeg),
    ...(t.engine.partitions
      ? {
          swellHs: col(targetHsSeries(t.engine, 'swell', NaN)),
          windSeaHs: col(targetHsSeries(t.engine, 'windSea', NaN)),
        }
      : {}),
    wind: col(series.wind),
    bedVelocityLinear: col(t.transformed.bedVelocityLinearMps),
    bedVelocitySoulsby: col(t.transformed.bedVelocitySoulsbyMps),
    flags: Array.from(t.transformed.flags),
    waterLevel: t.waterLevelM ? col(t.waterLevelM) : Array.from(series.timeMs, () => null),
    depth: col(t.engine.depthM ?? new Float64Array(series.timeMs.length).fill(site.depthM)),
    waterLevelSource: t.recordSource
      ? Array.from(t.recordSource, (k) => WATER_LEVEL_SOURCES[k])
      : Array.from(series.timeMs, () => 'none' as const),
    current: t.current ? col(t.current.speedMps) : Array.from(series.timeMs, () => null),
    currentDir: t.current ? col(t.current.dirDeg) : Array.from(series.timeMs, () => null),
    currentSource: t.current ? Array.from(t.current.source, (k) => CURRENT_SOURCES[k]) : Array.from(series.timeMs, () => 'none' as const),
    operations: setup.operations
      .filter((o) => sitesOf(o, setup.sites).some((s) => s.id === site.id))
      .map((o) => {
        const spec = operationSpec(o, setup.vessels);
        const hsMax = spec.limits.hsMax ?? null;
        return {
          id: o.id,
          name: o.name,
          hsMax,
          hsMaxForecast: hsMax === null ? null : hsMax * alphaFactor(setup.alphaTable, spec),
          windMax: spec.limits.windMax ?? null,
          bedVelocityMax: spec.limits.bedVelocityMax ?? null,
          bedVelocityMethod: spec.limits.bedVelocityMax != null ? (spec.limits.bedVelocityMethod ?? 'linear') : null,
          minDepth: spec.limits.minDepth ?? null,
          maxDepth: spec.limits.maxDepth ?? null,
          currentMax: spec.limits.currentMax ?? null,
          ...(spec.limits.responses && spec.limits.responses.length > 0
            ? { responses: conditionsResponses(t.engine, spec, setup.alphaTable, col) }
            : {}),
        };
      }),
  };
}

/** The governing response per hour of an operation with response limits (docs/domain.md#vessel-response). */
function conditionsResponses(
  series: Parameters<typeof governingResponseSeries>[0],
  spec: ReturnType<typeof operationSpec>,
  alphaTable: ProjectSetup['alphaTable'],
  col: (a: Float64Array) => (number | null)[],
): NonNullable<ConditionsAnswer['operations'][number]['responses']> {
  const g = governingResponseSeries(series, spec, compileLimits(spec, alphaTable, true));
  return {
    limits: (spec.limits.responses ?? []).map((r) => ({
      response: r.response,
      label: responseLabel(r.response),
      unit: responseUnit(r.response),
      statistic: r.statistic,
      durationH: r.durationH ?? DEFAULT_MPM_DURATION_H,
      max: r.max,
    })),
    governing: Array.from(g.governing, (k) => (k < 0 ? null : k)),
    ratio: col(g.ratio),
    value: col(g.value),
    forecastRatio: col(g.forecastRatio),
  };
}

/** How a recurring occurrence is judged; "information" for an operation that is not weather-restricted. */
export type OccurrenceJudgement = { start: string; status: OccurrenceStatus };
