import { asc, eq } from 'drizzle-orm';
import {
  DEFAULT_ALPHA_TABLE,
  operationLimitsSchema,
  type AlphaTable,
  type OperationSpec,
  type SiteSeries as EngineSeries,
} from '../../shared/engine';
import {
  PARTITION_NAMES,
  prepareSeaInput,
  transformPartitionedToSite,
  transformToSite,
  type PartitionInput,
  type PartitionedSiteSeries as TransformedSeries,
  type SiteSeries as PlainTransformedSeries,
} from '../../shared/waves';
import type { ExtraSeries } from '../../shared/seadata/extra-columns';
import { writeGenerationOf, type Db } from '../db/client';
import { operation, projectAlpha, vessel, worksite } from '../db/schema';
import type { SeaPartitionSeries } from '../../shared/response';
import type { SeaSeries } from './series-store';
import { currentPredictor, predictExtremes, predictLevels, tidePredictor, type CurrentStationInfo, type TideStationInfo } from './tide';
import type { TideExtremes } from '../../shared/engine';
import {
  combineCurrent,
  combineWaterLevel,
  WATER_LEVEL_SOURCES,
  type CombinedCurrent,
  type WaterLevelSource,
} from '../../shared/seadata/water-level';

export type WorksiteRow = typeof worksite.$inferSelect;
export type OperationRow = typeof operation.$inferSelect;
export type VesselRow = typeof vessel.$inferSelect;

/** What planning needs of a project: its worksites, operations and alpha table. */
export interface ProjectSetup {
  sites: WorksiteRow[];
  operations: OperationRow[];
  /** The project's vessels with their RAO tables (for response limits). */
  vessels: VesselRow[];
  alphaTable: AlphaTable;
  alphaIsDefault: boolean;
}

/** Setups read per embedded database handle, by project, with the write generation they were read at. */
const setupMemos = new WeakMap<Db, Map<string, { generation: number; setup: Promise<ProjectSetup> }>>();

/**
 * The project's setup. On the embedded database it is read once per write generation and shared
 * (server/db/client.ts writeGenerationOf): the plan, workability, ledger and simulation answers each
 * need it, and reading and parsing it (the vessels' RAO tables) was a large part of a page visit's
 * work. What it returns is frozen: callers read it and never change it.
 */
export function loadProjectSetup(db: Db, projectId: string): Promise<ProjectSetup> {
  const generation = writeGenerationOf(db)?.();
  if (generation === undefined) return readProjectSetup(db, projectId);
  let memo = setupMemos.get(db);
  if (!memo) setupMemos.set(db, (memo = new Map()));
  const kept = memo.get(projectId);
  if (kept && kept.generation === generation) return kept.setup;
  const setup = readProjectSetup(db, projectId).then(deepFreeze);
  const entry = { generation, setup };
  memo.set(projectId, entry);
  setup.catch(() => memo.get(projectId) === entry && memo.delete(projectId));
  return setup;
}

/** Freezes a plain value and everything in it (Dates and typed arrays, which cannot be frozen, are left as they are). */
function deepFreeze<T>(value: T): T {
  if (value && typeof value === 'object' && !(value instanceof Date) && !ArrayBuffer.isView(value) && !Object.isFrozen(value)) {
    Object.freeze(value);
    for (const v of Object.values(value)) deepFreeze(v);
  }
  return value;
}

async function readProjectSetup(db: Db, projectId: string): Promise<ProjectSetup> {
  const [sites, operations, alphaRows, vessels] = await Promise.all([
    db.select().from(worksite).where(eq(worksite.projectId, projectId)).orderBy(asc(worksite.name)),
    db.select().from(operation).where(eq(operation.projectId, projectId)).orderBy(asc(operation.name)),
    db.select().from(projectAlpha).where(eq(projectAlpha.projectId, projectId)),
    db.select().from(vessel).where(eq(vessel.projectId, projectId)).orderBy(asc(vessel.name)),
  ]);
  return {
    sites,
    operations,
    vessels,
    alphaTable: alphaRows[0]?.table ?? DEFAULT_ALPHA_TABLE,
    alphaIsDefault: !alphaRows[0],
  };
}

/**
 * The operation as the engine takes it (limits validated again on the way out of storage), with
 * its vessel's RAOs and heading when it names a vessel that has a table (else response limits
 * find no data).
 */
export function operationSpec(row: OperationRow, vessels: readonly VesselRow[] = []): OperationSpec {
  const v = row.vesselId ? vessels.find((x) => x.id === row.vesselId) : undefined;
  return {
    tpopH: row.tpopH,
    tcH: row.tcH,
    weatherRestricted: row.weatherRestricted,
    limits: operationLimitsSchema.parse(row.limits),
    ...(v?.raos && row.headingDeg != null ? { vessel: { raos: v.raos, headingDeg: row.headingDeg } } : {}),
  };
}

/**
 * The sea partitions at the worksite that response limits read (docs/domain.md#vessel-response,
 * docs/domain.md#partitions). With partition columns in the series: the worksite partitions of the
 * partitioned transformation, the wind sea as kind 'windSea' and both swells as kind 'swell' (Hs 0:
 * absent that hour, NaN: unknown, so no data). A record the transformation could not combine from its partitions (all three
 * unknown there) and a series without partitions stand on the worksite's total sea (transformed Hs,
 * the record's Tp at the worksite and the direction at the worksite) as one unpartitioned sea,
 * treated as wind sea (the DNV gamma rule and cos^2 spreading apply to it).
 */
export function worksitePartitions(series: SeaSeries, transformed: PlainTransformedSeries | TransformedSeries): SeaPartitionSeries[] {
  const tpS = 'partitions' in transformed ? transformed.tpS : series.tp;
  if (!('partitions' in transformed) || !hasPartitionColumns(series.extra)) {
    return [{ kind: 'windSea', hsM: transformed.hsM, tpS, dirDeg: transformed.dirDeg }];
  }
  const n = series.timeMs.length;
  const { windSea, swell1, swell2 } = transformed.partitions;
  // A record the transformation did not combine from its partitions has all three unknown.
  const uncombined = (i: number) => windSea.hsM[i] !== windSea.hsM[i] && swell1.hsM[i] !== swell1.hsM[i] && swell2.hsM[i] !== swell2.hsM[i];
  let anyUncombined = false;
  for (let i = 0; i < n && !anyUncombined; i++) anyUncombined = uncombined(i);
  const take = (p: { hsM: Float64Array; tpS: Float64Array; dirDeg: Float64Array }) =>
    anyUncombined ? { hsM: Float64Array.from(p.hsM), tpS: Float64Array.from(p.tpS), dirDeg: Float64Array.from(p.dirDeg) } : p;
  const parts: SeaPartitionSeries[] = [
    { kind: 'windSea', ...take(windSea) },
    { kind: 'swell', ...take(swell1) },
    { kind: 'swell', ...take(swell2) },
  ];
  if (!anyUncombined) return parts;
  for (let i = 0; i < n; i++) {
    if (!uncombined(i)) continue;
    // The total sea as one wind sea (a NaN total stays no data).
    parts[0].hsM[i] = transformed.hsM[i];
    parts[0].tpS[i] = tpS[i];
    parts[0].dirDeg[i] = transformed.dirDeg[i];
    parts[1].hsM[i] = 0;
    parts[2].hsM[i] = 0;
  }
  return parts;
}

/** The worksites an operation happens at (empty list = all). */
export function sitesOf(op: OperationRow, sites: WorksiteRow[]): WorksiteRow[] {
  return op.siteIds.length === 0 ? sites : sites.filter((s) => op.siteIds.includes(s.id));
}

export interface TransformedSite {
  site: WorksiteRow;
  transformed: TransformedSeries;
  engine: EngineSeries;
  /** The water level used per record, m above chart datum, or null for a fixed depth (no tide). */
  waterLevelM: Float64Array | null;
  /** Where the water level came from. */
  tideSource: SiteTide['source'] | null;
  /** Each record's water-level source (index into WATER_LEVEL_SOURCES), or null without a water level. */
  recordSource: Uint8Array | null;
  /** The current per record (dataset or predicted), or null without either. */
  current: SiteCurrent | null;
}

/** A worksite's water level over a series and the predicted extremes around it (docs/domain.md#tide). */
export interface SiteTide {
  /** m above the worksite's chart datum, one per record (NaN: unknown, the record is missing). */
  waterLevelM: Float64Array;
  /** Predicted high and low waters around the series; null without a tide set (tide windows find no data). */
  tide: TideExtremes | null;
  /**
   * Where the water level came from (docs/domain.md#tide): 'predicted' (the harmonic prediction),
   * 'dataset' (the dataset's level referred to chart datum, where it has values) or
   * 'predicted+residual' (the prediction plus the dataset's surge).
   */
  source: Exclude<WaterLevelSource, 'none'>;
  /** Each record's source, an index into WATER_LEVEL_SOURCES. */
  recordSource: Uint8Array;
  station: TideStationInfo | null;
  /** Changes whenever the levels would (tide constants and the dataset's water level), for cache keys. */
  key: string;
}

/** Extremes are predicted this far beyond the series, so a tide window (at most 12 h either side) finds its high or low water. */
const EXTREME_PAD_MS = 13 * 3_600_000;
const tideCache = new WeakMap<Float64Array, Map<string, SiteTide>>();

/** The series a worksite's water level is read from: its times, and its water-level column when it has one. */
export type LevelSeries = Pick<SeaSeries, 'timeMs' | 'extra' | 'waterLevelReference'>;

/**
 * The worksite's water level at every record time and the predicted high and low waters around
 * them (docs/domain.md#tide), or null when neither the worksite has a tide nor the dataset a water
 * level referred to chart datum. A dataset level (chart datum) wins over the prediction; a residual
 * is added to it (`combineWaterLevel`). Cached per time array (or water-level column) and tide constants.
 */
export function siteTide(site: Pick<WorksiteRow, 'tide' | 'latitude' | 'longitude'>, series: LevelSeries): SiteTide | null {
  const timeMs = series.timeMs;
  if (timeMs.length === 0) return null;
  const p = tidePredictor(site.tide, site);
  const column = series.extra.waterLevel && series.waterLevelReference ? series.extra.waterLevel : null;
  if (!p && (!column || series.waterLevelReference !== 'chart-datum')) return null;
  const cacheOn = column ?? timeMs;
  let perSeries = tideCache.get(cacheOn);
  if (!perSeries) {
    perSeries = new Map();
    tideCache.set(cacheOn, perSeries);
  }
  const key = `${p?.key ?? 'none'}|${column ? series.waterLevelReference : 'no-level'}`;
  const hit = perSeries.get(key);
  if (hit && hit.waterLevelM.length === timeMs.length) return hit;
  const predicted = p ? predictLevels(p, timeMs) : null;
  const combined = combineWaterLevel(predicted, column ? { values: column, reference: series.waterLevelReference! } : null)!;
  const counts = new Uint32Array(WATER_LEVEL_SOURCES.length);
  for (let i = 0; i < combined.source.length; i++) counts[combined.source[i]]++;
  const source: SiteTide['source'] =
    counts[WATER_LEVEL_SOURCES.indexOf('dataset')] > 0
      ? 'dataset'
      : counts[WATER_LEVEL_SOURCES.indexOf('predicted+residual')] > 0
        ? 'predicted+residual'
        : 'predicted';
  const value: SiteTide = {
    waterLevelM: combined.levelM,
    tide: p ? predictExtremes(p, timeMs[0] - EXTREME_PAD_MS, timeMs[timeMs.length - 1] + EXTREME_PAD_MS) : null,
    source,
    recordSource: combined.source,
    station: p?.station ?? null,
    key,
  };
  perSeries.set(key, value);
  return value;
}

/** A worksite's current over a series (docs/domain.md#tide): per record the dataset's where it has a speed, else the predicted tidal current. */
export interface SiteCurrent extends CombinedCurrent {
  /** The chosen current station, or null (dataset current only). */
  station: CurrentStationInfo | null;
  /** Changes whenever the current would (the station), for cache keys. */
  key: string;
}

const currentCache = new WeakMap<Float64Array, Map<string, CombinedCurrent>>();

/**
 * The worksite's current at every record time (docs/domain.md#tide), or null when neither the
 * dataset has a current speed column nor the worksite a current station: the dataset's speed (and
 * direction) wins where it has a value, the predicted tidal current of the station fills the rest.
 * Cached per time array (or speed column) and station.
 */
export function siteCurrent(
  site: Pick<WorksiteRow, 'currentStationId' | 'latitude' | 'longitude'>,
  series: Pick<SeaSeries, 'timeMs' | 'extra'>,
): SiteCurrent | null {
  const timeMs = series.timeMs;
  const column = series.extra.currentSpeed ?? null;
  if (timeMs.length === 0 || (!column && !site.currentStationId)) return null;
  const p = currentPredictor(site.currentStationId, site);
  const cacheOn = column ?? timeMs;
  let perSeries = currentCache.get(cacheOn);
  if (!perSeries) {
    perSeries = new Map();
    currentCache.set(cacheOn, perSeries);
  }
  const key = `${p?.key ?? 'none'}|${column ? 'dataset' : 'no-current'}`;
  let combined = perSeries.get(key);
  if (!combined || combined.speedMps.length !== timeMs.length) {
    combined = combineCurrent(p ? p.predict(timeMs) : null, column ? { speedMps: column, dirDeg: series.extra.currentDir ?? null } : null)!;
    perSeries.set(key, combined);
  }
  return { ...combined, station: p?.station ?? null, key };
}

/**
 * What the engine needs of a transformed worksite series: with a tide, the still-water depth
 * h(t) and the predicted extremes; without, the chart depth (so depth limits still apply) and no
 * extremes (a tide window then finds no data).
 */
export function engineSeries(
  series: SeaSeries,
  transformed: PlainTransformedSeries | TransformedSeries,
  site: Pick<WorksiteRow, 'depthM' | 'currentStationId' | 'latitude' | 'longitude'>,
  tide: SiteTide | null,
): EngineSeries {
  const current = siteCurrent(site, series);
  const partitioned = 'partitions' in transformed && hasPartitionColumns(series.extra);
  return {
    timeMs: series.timeMs,
    hsM: transformed.hsM,
    // The most energetic partition's Tp where a record is combined from partitions (docs/domain.md#partitions).
    tpS: partitioned ? (transformed as TransformedSeries).tpS : series.tp,
    bedVelocityLinearMps: transformed.bedVelocityLinearMps,
    bedVelocitySoulsbyMps: transformed.bedVelocitySoulsbyMps,
    windMps: series.wind,
    // With a tide the transformation wrote h(t); a reused `out` may hold an earlier worksite's, so only then.
    depthM: tide && transformed.depthM ? transformed.depthM : new Float64Array(series.timeMs.length).fill(site.depthM),
    ...(tide?.tide ? { tide: tide.tide } : {}),
    ...(partitioned ? { partitions: (transformed as TransformedSeries).partitions } : {}),
    // The dataset's current speed, m/s, as given, else the predicted tidal current (docs/domain.md#tide); neither: a current limit finds no data.
    ...(current ? { currentMps: current.speedMps } : {}),
    responsePartitions: worksitePartitions(series, transformed),
  };
}

/** True when a series has any partition column (docs/domain.md#partitions). */
export function hasPartitionColumns(extra: ExtraSeries): boolean {
  return PARTITION_NAMES.some((k) => extra[`${k}.hs`] !== undefined);
}

/**
 * The partitions of a series' optional columns, for the transformation (docs/domain.md#partitions):
 * a partition is in the dataset when its Hs column is; a missing Tp or direction column reads as
 * missing values. Null when the series has none.
 */
export function partitionInputOf(extra: ExtraSeries, length: number): PartitionInput | null {
  if (!hasPartitionColumns(extra)) return null;
  const out: PartitionInput = {};
  const nan = () => new Float64Array(length).fill(NaN);
  for (const k of PARTITION_NAMES) {
    const hs = extra[`${k}.hs`];
    if (!hs) continue;
    out[k] = { hsM: hs, tpS: extra[`${k}.tp`] ?? nan(), dirDeg: extra[`${k}.dir`] ?? nan() };
  }
  return out;
}

/**
 * Transforms a data-point series to a worksite (docs/domain.md#transformation), each partition
 * with its own period and direction where the dataset gives them (docs/domain.md#partitions),
 * and packs what the engine needs; `transformed.partitions` holds the worksite partitions. `dataPointDepthM` null means deep water.
 */
export function transformForSite(series: SeaSeries, dataPointDepthM: number | null, site: WorksiteRow): TransformedSite {
  const tide = siteTide(site, series);
  const transformed = transformPartitionedToSite(
    { hsM: series.hs, tpS: series.tp, tzS: series.tz, dirDeg: series.dir, waterLevelM: tide?.waterLevelM ?? null },
    partitionInputOf(series.extra, series.timeMs.length),
    { depthM: dataPointDepthM ?? Infinity },
    { depthM: site.depthM, shoreNormalDeg: site.shoreNormalDeg, breakerIndex: site.breakerIndex, transferTable: site.transferTable },
  );
  return {
    site,
    transformed,
    waterLevelM: tide?.waterLevelM ?? null,
    tideSource: tide?.source ?? null,
    recordSource: tide?.recordSource ?? null,
    current: siteCurrent(site, series),
    engine: engineSeries(series, transformed, site, tide),
  };
}

/**
 * One series (an ensemble member) at several worksites, only what the engine reads: the same chain
 * as {@link transformForSite} (docs/domain.md#transformation), the series' distinct periods and
 * directions found once and only Hs and the bed velocities written (the same values bit for bit),
 * and the direction at the worksite too when `withDirections` (response limits read it).
 * @returns the engine series per worksite id
 */
export function engineSeriesAtSites(
  series: SeaSeries,
  dataPointDepthM: number | null,
  sites: readonly WorksiteRow[],
  withDirections = false,
): Map<string, EngineSeries> {
  const input = { hsM: series.hs, tpS: series.tp, tzS: series.tz, dirDeg: series.dir };
  let prepared: ReturnType<typeof prepareSeaInput> | undefined;
  const out = new Map<string, EngineSeries>();
  for (const site of sites) {
    const tide = siteTide(site, series);
    const geometry = {
      depthM: site.depthM,
      shoreNormalDeg: site.shoreNormalDeg,
      breakerIndex: site.breakerIndex,
      transferTable: site.transferTable,
    };
    const source = { depthM: dataPointDepthM ?? Infinity };
    const transformed = tide
      ? transformToSite({ ...input, waterLevelM: tide.waterLevelM }, source, geometry)
      : transformToSite(input, source, geometry, {
          prepared: (prepared ??= prepareSeaInput(input)),
          // Response limits read the direction at the worksite, which 'engine' leaves out.
          fields: withDirections ? 'all' : 'engine',
        });
    out.set(site.id, engineSeries(series, transformed, site, tide));
  }
  return out;
}
