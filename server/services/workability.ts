/**
 * Hindcast workability statistics of every operation at each of its worksites (docs/domain.md#hindcast-statistics,
 * docs/domain.md#convention-9 to #convention-14), cached by dataset and by a version of the limits.
 *
 * Work per request, cold: read the series once (kept in a small in-process memo: stored datasets
 * never change), then per worksite one transformation into reused buffers and one calendar, and
 * per operation at that worksite one `operationStatistics` pass in a shared engine workspace. The
 * answer is cached in `stats_cache` under `${datasetId}:${limitsVersion}:${alpha}` and in an
 * in-process memo, so a repeat view is instant; any change of a limit, TPOP/TC, worksite geometry,
 * time zone, the alpha table or the data point depth gives another version and a fresh answer.
 */
import { createHash } from 'node:crypto';
import { and, eq, like, ne } from 'drizzle-orm';
import {
  calendarIndex,
  createEngineWorkspace,
  operationStatistics,
  type CalendarIndex,
  type EngineWorkspace,
  type MonthStatisticsBase,
  type OperationSpec,
  type SiteSeries as EngineSeries,
} from '../../shared/engine';
import {
  createSiteSeries,
  prepareSeaInput,
  transformPartitionedToSite,
  transformToSite,
  type SiteSeries as TransformedSeries,
} from '../../shared/waves';
import { csvField } from '../../shared/csv-field';
import type { WorkabilityCalendarMonth, WorkabilityEntry, WorkabilityMonth, WorkabilityYearMonth } from '../../shared/api-types-downtime';
import type { Db } from '../db/client';
import { statsCache } from '../db/schema';
import { HttpError } from '../http/errors';
import { defaultHindcast, getDatasetRow, latestDataset } from './datasets';
import { readSeries, type SeaSeries } from './series-store';
import {
  engineSeries,
  loadProjectSetup,
  partitionInputOf,
  operationSpec,
  siteTide,
  sitesOf,
  type OperationRow,
  type ProjectSetup,
  type WorksiteRow,
} from './site-context';
import { ByteBoundedMemo, jsonBytes, seriesBytes } from './byte-cache';
import { encodedAnswer, forgetEncodedAnswers } from './encoded-answers';
import { runEngineTask, sharedSeries } from './engine-pool';

export type DatasetRow = NonNullable<Awaited<ReturnType<typeof latestDataset>>>;

/**
 * Bump when the way the statistics are computed changes, so cached answers are not reused.
 * 2: Soulsby bed velocity U_s = 2*U_rms (was 1.414*U_rms), weather-restricted range TR <= 96 h,
 * local time step (durations) for series that change step. 5: the response limits' moment tables
 * step theta every 2 deg (was 1 deg; figures move by at most about 0.1 %).
 */
export const STATS_FORMAT = 5;

// ---------------------------------------------------------------------------------------------
// In-process memos (per database handle, so test databases never share entries)
// ---------------------------------------------------------------------------------------------

/** Bytes of stored series kept per database handle (30 years hourly is about 17 MB). */
export const SERIES_MEMO_BYTES = 48 * 1024 * 1024;
/** Bytes of computed statistics kept per database handle (measured as their JSON text). */
export const ANSWER_MEMO_BYTES = 32 * 1024 * 1024;

interface Memos {
  /** Stored series by dataset id. */
  series: ByteBoundedMemo<SeaSeries>;
  /** Computed answers by cache key (concurrent requests compute once). */
  answers: ByteBoundedMemo<{ value: unknown }>;
}
const memos = new WeakMap<Db, Memos>();
function memoOf(db: Db): Memos {
  let m = memos.get(db);
  if (!m) {
    m = {
      series: new ByteBoundedMemo<SeaSeries>(SERIES_MEMO_BYTES, (s) => seriesBytes(s as unknown as Record<string, unknown>)),
      answers: new ByteBoundedMemo<{ value: unknown }>(ANSWER_MEMO_BYTES, (a) => jsonBytes(a.value)),
    };
    memos.set(db, m);
  }
  return m;
}

/** Forgets a database's in-process memos (tests; the `stats_cache` table stays). */
export function clearStatsMemo(db: Db): void {
  memos.delete(db);
  forgetEncodedAnswers(db);
}

/** A dataset's series, read once and kept in memory (stored datasets are never changed). */
export function datasetSeries(db: Db, datasetId: string): Promise<SeaSeries> {
  // In shared memory, so engine worker threads read it without a copy.
  return memoOf(db).series.get(datasetId, () => readSeries(db, datasetId).then(sharedSeries));
}

/** The `stats_cache` key of one dataset, limits version and variant. */
function statsKey(datasetId: string, version: string, variant: string): string {
  return `${datasetId}:${version}:${variant}`;
}

/** True when the `stats_cache` table holds the entry of one dataset, version and variant. */
export async function statsStored(db: Db, datasetId: string, version: string, variant: string): Promise<boolean> {
  const [row] = await db
    .select({ key: statsCache.key })
    .from(statsCache)
    .where(eq(statsCache.key, statsKey(datasetId, version, variant)));
  return row !== undefined;
}

/** Cache writes not finished yet. */
const pendingWrites = new Set<Promise<void>>();

/** Resolves when every cache write started so far has finished (tests, orderly shutdown). */
export async function settleStatsCache(): Promise<void> {
  await Promise.all([...pendingWrites]);
}

/**
 * A value from the in-process memo, else the `stats_cache` table, else computed and stored in
 * both (the table after the answer, see {@link settleStatsCache}). Older versions for the same
 * dataset and variant (`${datasetId}:*:${variant}`) are deleted when a new one is written, so the
 * table holds one entry per dataset and variant.
 */
export async function cachedStats<T>(
  db: Db,
  projectId: string,
  datasetId: string,
  version: string,
  variant: string,
  compute: () => Promise<T>,
): Promise<T> {
  const key = statsKey(datasetId, version, variant);
  const m = memoOf(db);
  const p = async () => {
    const [row] = await db.select({ value: statsCache.value }).from(statsCache).where(eq(statsCache.key, key));
    if (row) return row.value as T;
    const value = await compute();
    // Stored after the answer goes out (a few hundred ms for a large project); the in-process memo
    // answers meanwhile. A failed write only costs a recomputation later.
    const write = (async () => {
      await db
        .insert(statsCache)
        .values({ key, projectId, value: value as object })
        .onConflictDoUpdate({ target: statsCache.key, set: { value: value as object, createdAt: new Date() } });
      await db
        .delete(statsCache)
        .where(and(eq(statsCache.projectId, projectId), like(statsCache.key, `${datasetId}:%:${variant}`), ne(statsCache.key, key)));
      // The memo forgets those versions too, so going back to one recomputes and stores it again.
      for (const k of m.answers.keys()) if (k !== key && k.startsWith(`${datasetId}:`) && k.endsWith(`:${variant}`)) m.answers.delete(k);
    })().catch(() => undefined);
    pendingWrites.add(write);
    void write.finally(() => pendingWrites.delete(write));
    return value;
  };
  const wrapped = m.answers.get(key, async () => ({ value: await p() }));
  return wrapped.then((a) => a.value as T);
}

// ---------------------------------------------------------------------------------------------
// Limits version
// ---------------------------------------------------------------------------------------------

/**
 * Version of everything the statistics depend on besides the data: a SHA-256 (hex, first 32
 * characters) of every operation's TPOP, TC, weather-restricted flag, limits and worksites, every
 * worksite's depth, shore-normal bearing, breaker index, time zone and transfer table, the alpha
 * table, the data point depth and the dataset's water-level source (docs/domain.md#tide). Names are left out: a rename keeps the cached numbers.
 */
export function limitsVersion(
  setup: ProjectSetup,
  dataPointDepthM: number | null,
  waterLevelReference: 'chart-datum' | 'residual' | null = null,
): string {
  const byId = <T extends { id: string }>(rows: T[]) => [...rows].sort((a, b) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
  const doc = {
    format: STATS_FORMAT,
    operations: byId(setup.operations).map((o) => [o.id, o.tpopH, o.tcH, o.weatherRestricted, canonical(o.limits), [...o.siteIds].sort()]),
    // The tide constants (or station) change the depth of every record, the current station the current (docs/domain.md#tide).
    sites: byId(setup.sites).map((s) => [
      s.id,
      s.depthM,
      s.shoreNormalDeg,
      s.breakerIndex,
      s.timeZone,
      canonical(s.transferTable),
      canonical(s.tide),
      // The current station gives the predicted current a current limit reads where the dataset has none.
      s.currentStationId,
    ]),
    alpha: setup.alphaTable,
    dataPointDepthM,
    // Which water level the records use: the dataset's own (chart datum or a residual), else the prediction.
    waterLevel: waterLevelReference ?? 'predicted',
  };
  return createHash('sha256').update(JSON.stringify(doc)).digest('hex').slice(0, 32);
}

/** JSON with object keys sorted, so stored key order never changes the version. */
function canonical(v: unknown): unknown {
  if (Array.isArray(v)) return v.map(canonical);
  if (v && typeof v === 'object') {
    return Object.fromEntries(
      Object.keys(v as Record<string, unknown>)
        .sort()
        .filter((k) => (v as Record<string, unknown>)[k] != null)
        .map((k) => [k, canonical((v as Record<string, unknown>)[k])]),
    );
  }
  return v;
}

// ---------------------------------------------------------------------------------------------
// Walking every operation at each of its worksites
// ---------------------------------------------------------------------------------------------

/** What {@link forEachOperationSite} hands to its callback. Buffers are reused: copy what you keep. */
export interface OperationSiteContext {
  op: OperationRow;
  spec: OperationSpec;
  site: WorksiteRow;
  /** Worksite series (views of reused buffers, valid during the callback only). */
  engine: EngineSeries;
  /** Calendar months of the records in the worksite's time zone. */
  calendar: CalendarIndex;
  /** dt, ms. */
  stepMs: number;
  workspace: EngineWorkspace;
}

/**
 * Calls `fn` for every operation at each of its worksites (or only the pairs `wanted` accepts),
 * worksite by worksite: each worksite's series is transformed once (docs/domain.md#transformation,
 * the same steps as site-context's `transformForSite`, but into buffers reused
 * from one worksite to the next) and its calendar built once (shared by worksites of one zone).
 * One engine workspace serves every call.
 */
export function forEachOperationSite(
  series: SeaSeries,
  row: DatasetRow,
  setup: ProjectSetup,
  fn: (ctx: OperationSiteContext) => void,
  wanted: (opId: string, siteId: string) => boolean = () => true,
): void {
  const n = series.timeMs.length;
  const stepMs = row.stepMinutes * 60_000;
  const pairsBySite = new Map<string, { op: OperationRow; spec: OperationSpec }[]>();
  for (const op of setup.operations) {
    let spec: OperationSpec | null = null;
    for (const site of sitesOf(op, setup.sites)) {
      if (!wanted(op.id, site.id)) continue;
      spec ??= operationSpec(op, setup.vessels);
      const list = pairsBySite.get(site.id) ?? [];
      list.push({ op, spec });
      pairsBySite.set(site.id, list);
    }
  }
  if (pairsBySite.size === 0) return;
  const out: TransformedSeries = createSiteSeries(n);
  const workspace = createEngineWorkspace(n);
  const calendars = new Map<string, CalendarIndex>();
  // The data point's distinct periods and directions once for every worksite; only the fields the engine reads.
  const sea = { hsM: series.hs, tpS: series.tp, tzS: series.tz, dirDeg: series.dir };
  const prepared = prepareSeaInput(sea);
  const partitions = partitionInputOf(series.extra, n);
  for (const site of setup.sites) {
    const pairs = pairsBySite.get(site.id);
    if (!pairs) continue;
    // The hindcast's own water level where it has one (chart datum wins, a residual adds), else the predicted tide at its times (docs/domain.md#tide).
    const tide = siteTide(site, series);
    const input = tide ? { ...sea, waterLevelM: tide.waterLevelM } : sea;
    const source = { depthM: row.dataPointDepthM ?? Infinity };
    const geometry = {
      depthM: site.depthM,
      shoreNormalDeg: site.shoreNormalDeg,
      breakerIndex: site.breakerIndex,
      transferTable: site.transferTable,
    };
    // Partitions go one by one through the chain (docs/domain.md#partitions); total-only data keeps the fast path.
    const t = partitions
      ? transformPartitionedToSite(input, partitions, source, geometry)
      : transformToSite(input, source, geometry, {
          out,
          // Response limits read the direction at the worksite, which 'engine' leaves out.
          fields: pairs.some((p) => (p.spec.limits.responses ?? []).length > 0) ? 'all' : 'engine',
          prepared,
        });
    const engine: EngineSeries = engineSeries(series, t, site, tide);
    let calendar = calendars.get(site.timeZone);
    if (!calendar) {
      calendar = calendarIndex(series.timeMs, site.timeZone);
      calendars.set(site.timeZone, calendar);
    }
    for (const { op, spec } of pairs) fn({ op, spec, site, engine, calendar, stepMs, workspace });
  }
}

/** The hindcast to compute statistics on: the one asked for (of this project), else the newest hindcast. */
export async function statisticsDataset(db: Db, projectId: string, datasetId?: string): Promise<DatasetRow | null> {
  if (!datasetId) return defaultHindcast(db, projectId);
  const row = await getDatasetRow(db, projectId, datasetId);
  if (row.kind === 'forecast') {
    throw new HttpError('validation', 'Statistics need a hindcast (or a long observation record), not a forecast', [
      { field: 'dataset', message: 'is a forecast' },
    ]);
  }
  return row;
}

// ---------------------------------------------------------------------------------------------
// Workability
// ---------------------------------------------------------------------------------------------

const share = (x: number | null) => (x === null ? null : Math.round(x * 1e6) / 1e6);
const hours = (x: number | null) => (x === null ? null : Math.round(x * 1e4) / 1e4);

function monthFields(m: MonthStatisticsBase): Omit<WorkabilityMonth, 'month'> {
  return {
    records: m.records,
    recordsWithData: m.recordsWithData,
    workability: share(m.workability),
    goStartShare: share(m.goStartShare),
    wowMeanHours: hours(m.wowMeanHours),
    wowP90Hours: hours(m.wowP90Hours),
    censored: m.censored,
    windows: m.windows,
    windowsPerMonth: share(m.windowsPerMonth),
    meanWindowHours: hours(m.meanWindowHours),
  };
}

type CachedEntry = Pick<WorkabilityEntry, 'operationId' | 'siteId' | 'months' | 'yearMonths'>;

/** The statistics of every operation at each of its worksites, numbers only (what is cached). */
export function computeWorkability(series: SeaSeries, row: DatasetRow, setup: ProjectSetup, alpha: boolean): CachedEntry[] {
  const entries: CachedEntry[] = [];
  forEachOperationSite(series, row, setup, ({ op, spec, site, engine, calendar, stepMs, workspace }) => {
    const { statistics } = operationStatistics(engine, spec, calendar, { alpha, alphaTable: setup.alphaTable, stepMs, workspace });
    entries.push({
      operationId: op.id,
      siteId: site.id,
      months: statistics.months.map((m): WorkabilityCalendarMonth => ({ month: m.month, years: m.years, ...monthFields(m) })),
      yearMonths: statistics.yearMonths.map((m): WorkabilityYearMonth => ({ year: m.year, month: m.month, ...monthFields(m) })),
    });
  });
  return entries;
}

/** Answer of {@link projectWorkability}: the dataset used (null without any hindcast) and the entries. */
export interface WorkabilityResult {
  dataset: DatasetRow | null;
  entries: WorkabilityEntry[];
}

/**
 * Workability statistics of every operation at each of its worksites on a hindcast (by default
 * the project's newest), with or without alpha (docs/domain.md#convention-14), in operation then worksite order.
 */
export async function projectWorkability(
  db: Db,
  projectId: string,
  options: { datasetId?: string; alpha: boolean },
): Promise<WorkabilityResult> {
  const row = await statisticsDataset(db, projectId, options.datasetId);
  if (!row) return { dataset: null, entries: [] };
  const setup = await loadProjectSetup(db, projectId);
  return { dataset: row, entries: await workabilityEntries(db, row, setup, options.alpha) };
}

/**
 * Works out and stores the workability statistics the Downtime page opens on (the project's
 * default hindcast, forecast limits on) when the `stats_cache` table does not hold them for the
 * present limits yet; true when it worked them out, false when they were stored. `row` is the
 * project's default hindcast. For the scheduled work (server/services/statistics-ahead.ts).
 */
export async function storeDefaultWorkability(db: Db, row: DatasetRow, setup: ProjectSetup): Promise<boolean> {
  if (await statsStored(db, row.id, limitsVersion(setup, row.dataPointDepthM, row.waterLevelReference), String(true))) return false;
  await workabilityEntries(db, row, setup, true);
  await settleStatsCache();
  return true;
}

/**
 * The same entries as JSON bytes, kept encoded under the dataset, the whole project setup (limits
 * and the names shown) and alpha; `datasetId` is the dataset used (null without any hindcast).
 */
export async function projectWorkabilityJson(
  db: Db,
  projectId: string,
  options: { datasetId?: string; alpha: boolean },
): Promise<{ datasetId: string | null; body: Buffer }> {
  const row = await statisticsDataset(db, projectId, options.datasetId);
  if (!row) return { datasetId: null, body: Buffer.from('[]') };
  const setup = await loadProjectSetup(db, projectId);
  const setupHash = createHash('sha256')
    .update(JSON.stringify([STATS_FORMAT, setup, row.dataPointDepthM]))
    .digest('hex')
    .slice(0, 32);
  const body = await encodedAnswer(db, `workability:${row.id}:${setupHash}:${options.alpha}`, () =>
    workabilityEntries(db, row, setup, options.alpha),
  );
  return { datasetId: row.id, body };
}

async function workabilityEntries(db: Db, row: DatasetRow, setup: ProjectSetup, alpha: boolean): Promise<WorkabilityEntry[]> {
  const version = limitsVersion(setup, row.dataPointDepthM, row.waterLevelReference);
  const cached = await cachedStats(db, row.projectId, row.id, version, String(alpha), async () =>
    // On an engine worker thread (engine-pool.ts): a cold 30-year table never holds up other requests.
    runEngineTask('workability', computeWorkability, await datasetSeries(db, row.id), row, setup, alpha),
  );
  const ops = new Map(setup.operations.map((o) => [o.id, o]));
  const sites = new Map(setup.sites.map((s) => [s.id, s]));
  const entries: WorkabilityEntry[] = [];
  for (const e of cached) {
    const op = ops.get(e.operationId);
    const site = sites.get(e.siteId);
    if (!op || !site) continue;
    entries.push({
      operationId: op.id,
      operationName: op.name,
      siteId: site.id,
      siteName: site.name,
      timeZone: site.timeZone,
      tpopHours: op.tpopH,
      tcHours: op.tcH,
      months: e.months,
      yearMonths: e.yearMonths,
    });
  }
  // Operation then worksite order (by name, as the project setup lists them), like the plan.
  const opIndex = new Map(setup.operations.map((o, i) => [o.id, i]));
  const siteIndex = new Map(setup.sites.map((s, i) => [s.id, i]));
  entries.sort((a, b) => opIndex.get(a.operationId)! - opIndex.get(b.operationId)! || siteIndex.get(a.siteId)! - siteIndex.get(b.siteId)!);
  return entries;
}

// ---------------------------------------------------------------------------------------------
// CSV
// ---------------------------------------------------------------------------------------------

/**
 * The statistics as one flat CSV table: a row per calendar month (`scope` = month, `year` empty)
 * and per year-month (`scope` = year-month) for every operation at each worksite. Shares 0-1,
 * hours in h.
 */
export function workabilityCsv(result: WorkabilityResult, alpha: boolean): string {
  const head = [
    'operation',
    'worksite',
    'time_zone',
    'alpha',
    'scope',
    'year',
    'month',
    'records',
    'records_with_data',
    'workability',
    'go_start_share',
    'wow_mean_h',
    'wow_p90_h',
    'censored',
    'windows',
    'windows_per_month',
    'mean_window_h',
  ];
  const lines = [head.join(',')];
  const row = (e: WorkabilityEntry, scope: string, year: number | null, m: WorkabilityMonth) =>
    [
      e.operationName,
      e.siteName,
      e.timeZone,
      alpha ? 'on' : 'off',
      scope,
      year,
      m.month,
      m.records,
      m.recordsWithData,
      m.workability,
      m.goStartShare,
      m.wowMeanHours,
      m.wowP90Hours,
      m.censored,
      m.windows,
      m.windowsPerMonth,
      m.meanWindowHours,
    ]
      .map(csvField)
      .join(',');
  for (const e of result.entries) for (const m of e.months) lines.push(row(e, 'month', null, m));
  for (const e of result.entries) for (const m of e.yearMonths) lines.push(row(e, 'year-month', m.year, m));
  return lines.join('\r\n') + '\r\n';
}
