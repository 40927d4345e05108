/**
 * Export and import of a whole project setup (worksites, operations with limits, alpha table) as
 * one JSON document ({@link ProjectSetupDocument}), so a coordinator can start a new contract from
 * an old one.
 *
 * Decisions:
 * - The document's `project` block (name, data point) is for the reader; an import does not change
 *   the target project's name, description or data point.
 * - Hindcast dataset ids and skippers belong to one project and are not exported.
 * - Import is all-or-nothing: the route validates the whole document first; the service then
 *   writes everything in one transaction, so any refusal leaves the project as it was.
 */
import { asc, eq } from 'drizzle-orm';
import type { ImportClashDetails, ImportResultResponse } from '../../shared/api-types-sites';
import { DEFAULT_ALPHA_TABLE } from '../../shared/engine/default-alpha-table';
import {
  nameKey,
  SETUP_FORMAT,
  SETUP_VERSION,
  type ImportMode,
  type ProjectSetupDocument,
  type SetupOperation,
  type SetupWorksite,
} from '../../shared/schemas/sites';
import type { Db } from '../db/client';
import { campaign, operation, project, worksite } from '../db/schema';
import type { SessionUser } from '../http/context';
import { HttpError, notFound } from '../http/errors';
import { getAlpha, writeAlpha } from './alpha';
import { recordAudit } from './audit';
import { auditedOperation, operationColumns, toOperationResponse } from './operations';
import { auditedSite, siteColumns, toSiteResponse } from './sites';

/** The project's setup as a document; `now` stamps `exportedAt`. */
export async function exportSetup(db: Db, projectId: string, now: Date): Promise<ProjectSetupDocument> {
  const [p] = await db.select().from(project).where(eq(project.id, projectId));
  if (!p) throw notFound('Project');
  const sites = (await db.select().from(worksite).where(eq(worksite.projectId, projectId)).orderBy(asc(worksite.name))).map(toSiteResponse);
  const ops = (await db.select().from(operation).where(eq(operation.projectId, projectId)).orderBy(asc(operation.name))).map(
    toOperationResponse,
  );
  const alpha = await getAlpha(db, projectId);
  const siteName = new Map(sites.map((s) => [s.id, s.name]));
  const campaigns = await db.select().from(campaign).where(eq(campaign.projectId, projectId)).orderBy(asc(campaign.name));

  const worksites: SetupWorksite[] = sites.map((s) => ({
    name: s.name,
    latitude: s.latitude,
    longitude: s.longitude,
    depth: s.depth,
    shoreNormal: s.shoreNormal,
    breakerIndex: s.breakerIndex,
    timeZone: s.timeZone,
    transferTable: s.transferTable,
  }));
  const operations: SetupOperation[] = ops.map((o) => ({
    name: o.name,
    description: o.description,
    tpop: o.tpop,
    tc: o.tc,
    weatherRestricted: o.weatherRestricted,
    limits: o.limits,
    siteNames: o.siteIds.map((id) => siteName.get(id)).filter((n): n is string => n !== undefined),
  }));
  return {
    format: SETUP_FORMAT,
    version: SETUP_VERSION,
    exportedAt: now.toISOString(),
    project: {
      name: p.name,
      description: p.description,
      dataPointName: p.dataPointName,
      dataPointLatitude: p.dataPointLatitude,
      dataPointLongitude: p.dataPointLongitude,
      dataPointDepthM: p.dataPointDepthM,
    },
    alphaTable: alpha.isDefault ? null : alpha.table,
    worksites,
    operations,
    campaigns: campaigns.map((c) => ({
      name: c.name,
      steps: c.steps
        .map((st) => ({ operationName: ops.find((o) => o.id === st.operationId)?.name, siteName: siteName.get(st.siteId) }))
        .filter((st): st is { operationName: string; siteName: string } => !!st.operationName && !!st.siteName),
      plannedStart: c.plannedStart?.toISOString() ?? null,
      timeZone: c.timeZone,
    })),
  };
}

/**
 * A safe download file name from a project name: ASCII letters, digits and '-', at most 60
 * characters, then `-setup.json`. Accents are dropped to their base letter; an empty result
 * becomes `project`.
 * @example setupFileName('Fjord Cable: Phase 2/3') // 'fjord-cable-phase-2-3-setup.json'
 */
export function setupFileName(projectName: string): string {
  const base = projectName
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 60)
    .replace(/-+$/g, '');
  return `${base || 'project'}-setup.json`;
}

const isDefaultTable = (t: NonNullable<ProjectSetupDocument['alphaTable']>) => JSON.stringify(t) === JSON.stringify(DEFAULT_ALPHA_TABLE);

/**
 * Imports a validated document into a project in one transaction.
 *
 * - `merge`: adds the document's worksites and operations; refuses with 409 (details
 *   {@link ImportClashDetails}) when any name is already used in the project.
 * - `replace`: deletes the project's worksites and operations first (each deletion audited).
 * Worksites and operations get new ids; operations' `siteNames` become the new worksites' ids.
 * The alpha table is set from the document (null: back to the default; a table equal to the
 * default also counts as the default; key absent: kept). Each created item gets an 'import'
 * entry, plus one 'project' entry summing the import up.
 */
export async function importSetup(
  db: Db,
  projectId: string,
  user: SessionUser,
  doc: ProjectSetupDocument,
  mode: ImportMode,
): Promise<ImportResultResponse> {
  return db.transaction(async (tx) => {
    const [p] = await tx.select({ name: project.name }).from(project).where(eq(project.id, projectId));
    if (!p) throw notFound('Project');
    const existingSites = await tx.select().from(worksite).where(eq(worksite.projectId, projectId));
    const existingOps = await tx.select().from(operation).where(eq(operation.projectId, projectId));

    let deletedSites = 0;
    let deletedOps = 0;
    if (mode === 'merge') {
      const siteKeys = new Set(existingSites.map((s) => nameKey(s.name)));
      const opKeys = new Set(existingOps.map((o) => nameKey(o.name)));
      const clashes: ImportClashDetails = {
        worksites: doc.worksites.filter((w) => siteKeys.has(nameKey(w.name))).map((w) => w.name),
        operations: doc.operations.filter((o) => opKeys.has(nameKey(o.name))).map((o) => o.name),
      };
      if (clashes.worksites.length + clashes.operations.length > 0) {
        const names = [...clashes.worksites.map((n) => `worksite "${n}"`), ...clashes.operations.map((n) => `operation "${n}"`)];
        throw new HttpError('conflict', `Names already used in this project: ${names.join(', ')}`, clashes);
      }
    } else {
      for (const o of existingOps) {
        await tx.delete(operation).where(eq(operation.id, o.id));
        await recordAudit(tx, {
          projectId,
          user,
          entity: 'operation',
          entityId: o.id,
          entityName: o.name,
          action: 'delete',
          before: auditedOperation(toOperationResponse(o)),
          after: null,
        });
      }
      for (const s of existingSites) {
        await tx.delete(worksite).where(eq(worksite.id, s.id));
        await recordAudit(tx, {
          projectId,
          user,
          entity: 'worksite',
          entityId: s.id,
          entityName: s.name,
          action: 'delete',
          before: auditedSite(toSiteResponse(s)),
          after: null,
        });
      }
      deletedOps = existingOps.length;
      deletedSites = existingSites.length;
    }

    const siteIdByKey = new Map<string, string>();
    for (const w of doc.worksites) {
      const [row] = await tx
        .insert(worksite)
        .values({ projectId, ...siteColumns({ ...w, hindcastDatasetId: null }) })
        .returning();
      const site = toSiteResponse(row);
      siteIdByKey.set(nameKey(w.name), site.id);
      await recordAudit(tx, {
        projectId,
        user,
        entity: 'worksite',
        entityId: site.id,
        entityName: site.name,
        action: 'import',
        before: null,
        after: auditedSite(site),
      });
    }

    const opIdByKey = new Map<string, string>();
    for (const o of doc.operations) {
      const siteIds = o.siteNames.map((n) => siteIdByKey.get(nameKey(n))!);
      const [row] = await tx
        .insert(operation)
        .values({ projectId, ...operationColumns({ ...o, siteIds, skipperIds: [] }) })
        .returning();
      const op = toOperationResponse(row);
      opIdByKey.set(nameKey(o.name), op.id);
      await recordAudit(tx, {
        projectId,
        user,
        entity: 'operation',
        entityId: op.id,
        entityName: op.name,
        action: 'import',
        before: null,
        after: auditedOperation(op),
      });
    }

    // Campaigns follow their operations and worksites: replace mode drops the old ones (their steps
    // pointed at deleted rows); merge mode adds the document's, which only name imported rows.
    if (mode === 'replace') await tx.delete(campaign).where(eq(campaign.projectId, projectId));
    for (const c of doc.campaigns ?? []) {
      await tx.insert(campaign).values({
        projectId,
        name: c.name,
        steps: c.steps.map((st) => ({ operationId: opIdByKey.get(nameKey(st.operationName))!, siteId: siteIdByKey.get(nameKey(st.siteName))! })),
        plannedStart: c.plannedStart ? new Date(c.plannedStart) : null,
        timeZone: c.timeZone,
      });
    }

    let alphaTable: ImportResultResponse['alphaTable'] = 'kept';
    if (doc.alphaTable !== undefined) {
      const table = doc.alphaTable === null || isDefaultTable(doc.alphaTable) ? null : doc.alphaTable;
      await writeAlpha(tx, projectId, user, table, 'import');
      alphaTable = table === null ? 'default' : 'set';
    }

    const result: ImportResultResponse = {
      mode,
      worksites: { created: doc.worksites.length, deleted: deletedSites },
      operations: { created: doc.operations.length, deleted: deletedOps },
      alphaTable,
    };
    await recordAudit(tx, {
      projectId,
      user,
      entity: 'project',
      entityId: projectId,
      entityName: p.name,
      action: 'import',
      before: null,
      after: { ...result, sourceProject: doc.project.name, exportedAt: doc.exportedAt },
    });
    return result;
  });
}
