import { asc, eq } from 'drizzle-orm';
import { DEFAULT_ALPHA_TABLE, operationLimitsSchema, type AlphaTable, type OperationSpec, type SiteSeries as EngineSeries } from '../../shared/engine';
import { transformToSite, type SiteSeries as TransformedSeries } from '../../shared/waves';
import type { Db } from '../db/client';
import { operation, projectAlpha, worksite } from '../db/schema';
import type { SeaSeries } from './series-store';

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
}

/**
 * Transforms a data-point series to a worksite (docs/domain.md#transformation)
 * and packs what the engine needs. `dataPointDepthM` null means deep water.
 */
export function transformForSite(series: SeaSeries, dataPointDepthM: number | null, site: WorksiteRow): TransformedSite {
  const transformed = transformToSite(
    { hsM: series.hs, tpS: series.tp, tzS: series.tz, dirDeg: series.dir },
    { depthM: dataPointDepthM ?? Infinity },
    { depthM: site.depthM, shoreNormalDeg: site.shoreNormalDeg, breakerIndex: site.breakerIndex, transferTable: site.transferTable },
  );
  return {
    site,
    transformed,
    engine: {
      timeMs: series.timeMs,
      hsM: transformed.hsM,
      tpS: series.tp,
      bedVelocityLinearMps: transformed.bedVelocityLinearMps,
      bedVelocitySoulsbyMps: transformed.bedVelocitySoulsbyMps,
      windMps: series.wind,
    },
  };
}
