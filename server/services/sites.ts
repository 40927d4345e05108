/**
 * Worksites of a project: CRUD in transactions, each change written to the audit trail with the
 * worksite's depth and geometry before and after.
 */
import { and, eq } from 'drizzle-orm';
import type { SiteResponse } from '../../shared/api-types-sites';
import { WorksiteInput, type WorksitePatchInput } from '../../shared/schemas/sites';
import type { Db } from '../db/client';
import { dataset, operation, worksite } from '../db/schema';
import type { SessionUser } from '../http/context';
import { HttpError } from '../http/errors';
import { auditedRows } from './audited-rows';
import { fieldError } from './project-rows';
import { checkCurrentStation, checkTideInput } from './tide';
import { OPERATIONS, toOperationResponse } from './operations';

type WorksiteRow = typeof worksite.$inferSelect;

export function toSiteResponse(row: WorksiteRow): SiteResponse {
  return {
    id: row.id,
    name: row.name,
    latitude: row.latitude,
    longitude: row.longitude,
    depth: row.depthM,
    shoreNormal: row.shoreNormalDeg,
    breakerIndex: row.breakerIndex,
    timeZone: row.timeZone,
    hindcastDatasetId: row.hindcastDatasetId,
    transferTable: row.transferTable ?? null,
    tide: row.tide ?? null,
    currentStationId: row.currentStationId ?? null,
    updatedAt: row.updatedAt.toISOString(),
  };
}

/** The audited fields of a worksite (everything but id and timestamps). */
export function auditedSite(site: SiteResponse): Omit<SiteResponse, 'id' | 'updatedAt'> {
  const { id: _id, updatedAt: _updatedAt, ...rest } = site;
  return rest;
}

/** Worksites in the audit trail: every field but id and timestamps. */
export const WORKSITES = auditedRows(worksite, 'worksite', {
  toResponse: toSiteResponse,
  audited: auditedSite,
  names: ['Worksite', 'A worksite'],
});

/**
 * Column values of a parsed worksite.
 * @throws HttpError 400 for a tide constituent or station the tide package does not know, or a
 * current station that is not a predictable current station of the database.
 */
export function siteColumns(input: Omit<WorksiteInput, 'hindcastDatasetId'> & { hindcastDatasetId?: string | null }) {
  checkTideInput(input.tide);
  checkCurrentStation(input.currentStationId);
  return {
    name: input.name,
    latitude: input.latitude ?? null,
    longitude: input.longitude ?? null,
    depthM: input.depth,
    shoreNormalDeg: input.shoreNormal ?? null,
    breakerIndex: input.breakerIndex,
    timeZone: input.timeZone,
    hindcastDatasetId: input.hindcastDatasetId ?? null,
    transferTable: input.transferTable ?? null,
    tide: input.tide ?? null,
    currentStationId: input.currentStationId ?? null,
  };
}

export const listSites = WORKSITES.list;
export const getSite = WORKSITES.get;

/** 400 unless the dataset is a hindcast of the same project. */
async function assertHindcast(db: Db, projectId: string, datasetId: string | null): Promise<void> {
  if (datasetId === null) return;
  const [row] = await db
    .select({ kind: dataset.kind })
    .from(dataset)
    .where(and(eq(dataset.projectId, projectId), eq(dataset.id, datasetId)));
  if (!row) throw fieldError('hindcastDatasetId', 'No dataset with this id in the project');
  if (row.kind !== 'hindcast') throw fieldError('hindcastDatasetId', `The dataset is a ${row.kind}, not a hindcast`);
}

export async function createSite(db: Db, projectId: string, user: SessionUser, input: WorksiteInput): Promise<SiteResponse> {
  return db.transaction(async (tx) => {
    await WORKSITES.assertNameFree(tx, projectId, input.name);
    await assertHindcast(tx, projectId, input.hindcastDatasetId);
    return WORKSITES.insert(tx, projectId, user, siteColumns(input));
  });
}

/**
 * Changes some fields of a worksite. The merged record is checked again with the full
 * {@link WorksiteInput} schema; an entry is written when an audited field changed.
 */
export async function updateSite(
  db: Db,
  projectId: string,
  user: SessionUser,
  siteId: string,
  patch: WorksitePatchInput,
): Promise<SiteResponse> {
  return db.transaction(async (tx) => {
    const { before, merged } = await WORKSITES.patched(tx, projectId, siteId, patch, WorksiteInput, auditedSite);
    if (patch.hindcastDatasetId !== undefined) await assertHindcast(tx, projectId, merged.hindcastDatasetId);
    return WORKSITES.update(tx, projectId, user, before, siteColumns(merged));
  });
}

/**
 * Deletes a worksite and takes its id out of every operation's `siteIds` (each such operation
 * change is audited too). Note: an operation left with no worksite then applies to every
 * worksite of the project (empty `siteIds` means all).
 */
export async function deleteSite(db: Db, projectId: string, user: SessionUser, siteId: string): Promise<void> {
  await db.transaction(async (tx) => {
    const row = await WORKSITES.row(tx, projectId, siteId);
    await removeSiteFromOperations(tx, projectId, user, siteId);
    await WORKSITES.remove(tx, projectId, user, row);
  });
}

async function removeSiteFromOperations(tx: Db, projectId: string, user: SessionUser, siteId: string): Promise<void> {
  const ops = await tx.select().from(operation).where(eq(operation.projectId, projectId));
  // An operation at this worksite only would be left with no worksite, which means "every
  // worksite": refuse rather than silently widen it.
  const stranded = ops.filter((op) => op.siteIds.length === 1 && op.siteIds[0] === siteId);
  if (stranded.length > 0) {
    throw new HttpError(
      'conflict',
      `Move or delete the operations that happen only at this worksite first: ${stranded.map((o) => o.name).join(', ')}`,
      stranded.map((o) => ({ field: 'operations', message: o.name })),
    );
  }
  for (const op of ops) {
    if (!op.siteIds.includes(siteId)) continue;
    await OPERATIONS.update(tx, projectId, user, toOperationResponse(op), { siteIds: op.siteIds.filter((id) => id !== siteId) });
  }
}
