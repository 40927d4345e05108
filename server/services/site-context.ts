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
import type { Db } from '../db/client';
import { operation, projectAlpha, worksite } from '../db/schema';
import type { SeaSeries } from './series-store';
import { predictExtremes, predictLevels, tidePredictor, type TideStationInfo } from './tide';
import type { TideExtremes } from '../../shared/engine';

export type WorksiteRow = typeof worksite.$inferSelect;
export type OperationRow = typeof operation.$inferSelect;

/** What planning needs of a project: its worksites, operations and alpha table. */
export interface ProjectSetup {
  sites: WorksiteRow[];
  operations: OperationRow[];
  alphaTable: AlphaTable;
  alphaIsDefault: boolean;
}

export async function loadProjectSetup(db: Db, projectId: string): Promise<ProjectSetup> {
  const [sites, operations, alphaRows] = await Promise.all([
    db.select().from(worksite).where(eq(worksite.projectId, projectId)).orderBy(asc(worksite.name)),
    db.select().from(operation).where(eq(operation.projectId, projectId)).orderBy(asc(operation.name)),
    db.select().from(projectAlpha).where(eq(projectAlpha.projectId, projectId)),
  ]);
  return {
    sites,
    operations,
    alphaTable: alphaRows[0]?.table ?? DEFAULT_ALPHA_TABLE,
    alphaIsDefault: !alphaRows[0],
  };
}

/** The operation as the engine takes it (limits validated again on the way out of storage). */
export function operationSpec(row: OperationRow): OperationSpec {
  return {
    tpopH: row.tpopH,
    tcH: row.tcH,
    weatherRestricted: row.weatherRestricted,
    limits: operationLimitsSchema.parse(row.limits),
  };
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
}

/** A worksite's water level over a series and the predicted extremes around it (docs/domain.md#tide). */
export interface SiteTide {
  /** m above the worksite's chart datum, one per record. */
  waterLevelM: Float64Array;
  tide: TideExtremes;
  /** 'predicted': the harmonic prediction (the dataset has no water level). */
  source: 'predicted';
  station: TideStationInfo | null;
}

/** Extremes are predicted this far beyond the series, so a tide window (at most 12 h either side) finds its high or low water. */
const EXTREME_PAD_MS = 13 * 3_600_000;
const tideCache = new WeakMap<Float64Array, Map<string, SiteTide>>();

/**
 * The worksite's water level at every record time and the predicted high and low waters around
 * them, or null when the worksite has no tide. Cached per time array and tide constants.
 */
export function siteTide(site: Pick<WorksiteRow, 'tide' | 'latitude' | 'longitude'>, timeMs: Float64Array): SiteTide | null {
  const p = tidePredictor(site.tide, site);
  if (!p || timeMs.length === 0) return null;
  let perSeries = tideCache.get(timeMs);
  if (!perSeries) {
    perSeries = new Map();
    tideCache.set(timeMs, perSeries);
  }
  const hit = perSeries.get(p.key);
  if (hit) return hit;
  const value: SiteTide = {
    waterLevelM: predictLevels(p, timeMs),
    tide: predictExtremes(p, timeMs[0] - EXTREME_PAD_MS, timeMs[timeMs.length - 1] + EXTREME_PAD_MS),
    source: 'predicted',
    station: p.station,
  };
  perSeries.set(p.key, value);
  return value;
}

/**
 * What the engine needs of a transformed worksite series: with a tide, the still-water depth
 * h(t) and the predicted extremes; without, the chart depth (so depth limits still apply) and no
 * extremes (a tide window then finds no data).
 */
export function engineSeries(
  series: SeaSeries,
  transformed: PlainTransformedSeries | TransformedSeries,
  site: Pick<WorksiteRow, 'depthM'>,
  tide: SiteTide | null,
): EngineSeries {
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
    ...(tide ? { tide: tide.tide } : {}),
    ...(partitioned ? { partitions: (transformed as TransformedSeries).partitions } : {}),
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
  const tide = siteTide(site, series.timeMs);
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
    engine: engineSeries(series, transformed, site, tide),
  };
}

/**
 * One series (an ensemble member) at several worksites, only what the engine reads: the same chain
 * as {@link transformForSite} (docs/domain.md#transformation), the series' distinct periods and
 * directions found once and only Hs and the bed velocities written (the same values bit for bit).
 * @returns the engine series per worksite id
 */
export function engineSeriesAtSites(
  series: SeaSeries,
  dataPointDepthM: number | null,
  sites: readonly WorksiteRow[],
): Map<string, EngineSeries> {
  const input = { hsM: series.hs, tpS: series.tp, tzS: series.tz, dirDeg: series.dir };
  let prepared: ReturnType<typeof prepareSeaInput> | undefined;
  const out = new Map<string, EngineSeries>();
  for (const site of sites) {
    const tide = siteTide(site, series.timeMs);
    const geometry = {
      depthM: site.depthM,
      shoreNormalDeg: site.shoreNormalDeg,
      breakerIndex: site.breakerIndex,
      transferTable: site.transferTable,
    };
    const source = { depthM: dataPointDepthM ?? Infinity };
    const transformed = tide
      ? transformToSite({ ...input, waterLevelM: tide.waterLevelM }, source, geometry)
      : transformToSite(input, source, geometry, { prepared: (prepared ??= prepareSeaInput(input)), fields: 'engine' });
    out.set(site.id, engineSeries(series, transformed, site, tide));
  }
  return out;
}
