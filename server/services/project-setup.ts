/**
 * Export and import of a whole project setup (worksites, operations with limits, alpha table) as
 * one JSON document ({@link ProjectSetupDocument}), so a coordinator can start a new contract from
 * an old one.
 *
 * Decisions:
 * - The document's `project` block is for the reader; an import never changes the target
 *   project's name or description, and takes its data point only when asked to.
 * - Hindcast dataset ids and skippers belong to one project and are not exported.
 * - Import is all-or-nothing: the route validates the whole document first; the service then
 *   writes everything in one transaction, so any refusal leaves the project as it was.
 */
import { asc, count, eq, max, min } from 'drizzle-orm';
import type { ImportClashDetails, ImportPreviewResponse, ImportResultResponse } from '../../shared/api-types-sites';
import { DEFAULT_ALPHA_TABLE } from '../../shared/engine/default-alpha-table';
import {
  nameKey,
  SETUP_FORMAT,
  SETUP_VERSION,
  type ImportChoice,
  type ImportMode,
  type ProjectSetupDocument,
  type SetupOperation,
  type SetupWorksite,
} from '../../shared/schemas/sites';
import type { Db } from '../db/client';
import { campaign, ledgerDay, operation, project, subscription, worksite } from '../db/schema';
import type { SessionUser } from '../http/context';
import { HttpError, notFound } from '../http/errors';
import { getAlpha, writeAlpha } from './alpha';
import { recordAudit } from './audit';
import { auditedOperation, OPERATIONS, operationColumns, toOperationResponse } from './operations';
import { auditedSite, siteColumns, toSiteResponse, WORKSITES } from './sites';

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
    tide: s.tide,
    currentStationId: s.currentStationId,
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

/** What an import does with the alpha table and the data point (see {@link ImportQuery}). */
export interface ImportChoices {
  alphaTable: ImportChoice;
  dataPoint: ImportChoice;
}
const DEFAULT_CHOICES: Record<ImportMode, ImportChoices> = {
  merge: { alphaTable: 'keep', dataPoint: 'keep' },
  replace: { alphaTable: 'take', dataPoint: 'keep' },
};

type DocProject = ProjectSetupDocument['project'];
type ProjectRow = typeof project.$inferSelect;

const hasDataPoint = (p: Pick<DocProject, 'dataPointName' | 'dataPointLatitude' | 'dataPointLongitude'>) =>
  p.dataPointName.trim() !== '' || (p.dataPointLatitude != null && p.dataPointLongitude != null);

/** A data point in words: “Name” (52.41° N, 5.48° W, 40 m deep) or (deep water). */
function dataPointWords(p: Pick<DocProject, 'dataPointName' | 'dataPointLatitude' | 'dataPointLongitude' | 'dataPointDepthM'>): string {
  const name = p.dataPointName.trim() ? `“${p.dataPointName.trim()}”` : 'an unnamed point';
  const where =
    p.dataPointLatitude != null && p.dataPointLongitude != null
      ? `${Math.abs(p.dataPointLatitude)}° ${p.dataPointLatitude >= 0 ? 'N' : 'S'}, ${Math.abs(p.dataPointLongitude)}° ${p.dataPointLongitude >= 0 ? 'E' : 'W'}, `
      : '';
  const depth = p.dataPointDepthM != null ? `${p.dataPointDepthM} m deep` : 'deep water';
  return `${name} (${where}${depth})`;
}

interface ImportPlan {
  preview: ImportPreviewResponse;
  existingSites: (typeof worksite.$inferSelect)[];
  existingOps: (typeof operation.$inferSelect)[];
  clashes: ImportClashDetails | null;
  /** the table to write (null = the default), or undefined to leave the project's as it is */
  alphaWrite: ProjectSetupDocument['alphaTable'] | undefined;
  takeDataPoint: boolean;
  projectRow: ProjectRow;
}

/**
 * Everything an import would change, worked out before anything is written; the preview route
 * answers it as is and {@link importSetup} refuses when `preview.refusal` is set.
 */
async function planImport(
  db: Db,
  projectId: string,
  doc: ProjectSetupDocument,
  mode: ImportMode,
  choices: ImportChoices,
): Promise<ImportPlan> {
  const [p] = await db.select().from(project).where(eq(project.id, projectId));
  if (!p) throw notFound('Project');
  const existingSites = await db.select().from(worksite).where(eq(worksite.projectId, projectId)).orderBy(asc(worksite.name));
  const existingOps = await db.select().from(operation).where(eq(operation.projectId, projectId)).orderBy(asc(operation.name));
  const existingCampaigns = await db
    .select({ name: campaign.name })
    .from(campaign)
    .where(eq(campaign.projectId, projectId))
    .orderBy(asc(campaign.name));
  const ledger = await db
    .select({ status: ledgerDay.status, n: count(), first: min(ledgerDay.day), last: max(ledgerDay.day) })
    .from(ledgerDay)
    .where(eq(ledgerDay.projectId, projectId))
    .groupBy(ledgerDay.status);
  const confirmed = ledger.find((r) => r.status === 'confirmed');
  const proposed = ledger.find((r) => r.status === 'proposed');
  const subs = await db
    .select({ operationIds: subscription.operationIds, siteIds: subscription.siteIds })
    .from(subscription)
    .where(eq(subscription.projectId, projectId));

  const replace = mode === 'replace';
  let refusal: string | null = null;
  let clashes: ImportClashDetails | null = null;
  if (replace && confirmed && confirmed.n > 0) {
    refusal =
      `This project’s downtime ledger has ${confirmed.n} confirmed day${confirmed.n === 1 ? '' : 's'} (${confirmed.first} to ${confirmed.last}). ` +
      'Replacing the setup would delete them with their operations and worksites, and the ledger is not in the setup file, so replace is refused. ' +
      'Add the file’s items next to these instead (merge), or change the operations and worksites here one by one.';
  }
  if (!replace) {
    const siteKeys = new Set(existingSites.map((s) => nameKey(s.name)));
    const opKeys = new Set(existingOps.map((o) => nameKey(o.name)));
    const found: ImportClashDetails = {
      worksites: doc.worksites.filter((w) => siteKeys.has(nameKey(w.name))).map((w) => w.name),
      operations: doc.operations.filter((o) => opKeys.has(nameKey(o.name))).map((o) => o.name),
    };
    if (found.worksites.length + found.operations.length > 0) {
      clashes = found;
      const names = [...found.worksites.map((n) => `worksite "${n}"`), ...found.operations.map((n) => `operation "${n}"`)];
      refusal = `Names already used in this project: ${names.join(', ')}`;
    }
  }

  // Alpha table.
  const current = await getAlpha(db, projectId);
  let alphaWrite: ProjectSetupDocument['alphaTable'] | undefined;
  let alpha: ImportPreviewResponse['alphaTable'];
  const here = current.isDefault ? 'the default table' : 'its own table';
  if (doc.alphaTable === undefined) {
    alpha = { outcome: 'kept', message: `The file has no alpha table: this project keeps ${here}.` };
  } else if (choices.alphaTable === 'keep') {
    const fileTable = doc.alphaTable === null || isDefaultTable(doc.alphaTable) ? 'the default table' : 'a table of its own';
    alpha = { outcome: 'kept', message: `The file has ${fileTable}; it is left out and this project keeps ${here}.` };
  } else {
    alphaWrite = doc.alphaTable === null || isDefaultTable(doc.alphaTable) ? null : doc.alphaTable;
    alpha =
      alphaWrite === null
        ? {
            outcome: 'default',
            message: `The file has the default table: this project ${current.isDefault ? 'keeps' : 'goes back to'} the default table.`,
          }
        : {
            outcome: 'set',
            message: `The file’s own alpha table replaces ${current.isDefault ? 'the default table' : 'this project’s table'}.`,
          };
  }

  // Data point.
  let dataPoint: ImportPreviewResponse['dataPoint'];
  const takeDataPoint = choices.dataPoint === 'take' && hasDataPoint(doc.project);
  const mine = hasDataPoint(p) ? `its own data point ${dataPointWords(p)}` : 'no data point';
  if (!hasDataPoint(doc.project)) dataPoint = { outcome: 'kept', message: `The file has no data point: this project keeps ${mine}.` };
  else if (takeDataPoint) dataPoint = { outcome: 'set', message: `The file’s data point ${dataPointWords(doc.project)} replaces ${mine}.` };
  else
    dataPoint = {
      outcome: 'kept',
      message: `The file’s data point ${dataPointWords(doc.project)} is left out: this project keeps ${mine}.`,
    };

  const preview: ImportPreviewResponse = {
    mode,
    refusal,
    adds: {
      worksites: doc.worksites.map((w) => w.name),
      operations: doc.operations.map((o) => o.name),
      campaigns: (doc.campaigns ?? []).map((c) => c.name),
    },
    removes: {
      worksites: replace ? existingSites.map((s) => s.name) : [],
      operations: replace ? existingOps.map((o) => o.name) : [],
      campaigns: replace ? existingCampaigns.map((c) => c.name) : [],
      recurrences: replace ? existingOps.filter((o) => o.recurrence != null).map((o) => o.name) : [],
      skipperAssignments: replace ? existingOps.reduce((n, o) => n + o.skipperIds.length, 0) : 0,
      hindcastChoices: replace ? existingSites.filter((s) => s.hindcastDatasetId !== null).map((s) => s.name) : [],
      proposedLedgerDays: replace ? (proposed?.n ?? 0) : 0,
      confirmedLedgerDays: replace ? (confirmed?.n ?? 0) : 0,
      narrowedSubscriptions: replace ? subs.filter((x) => x.operationIds.length + x.siteIds.length > 0).length : 0,
    },
    alphaTable: alpha,
    dataPoint,
  };
  return { preview, existingSites, existingOps, clashes, alphaWrite, takeDataPoint, projectRow: p };
}

/** What an import with these choices would change (nothing is written). */
export async function previewImport(
  db: Db,
  projectId: string,
  doc: ProjectSetupDocument,
  mode: ImportMode,
  choices: ImportChoices = DEFAULT_CHOICES[mode],
): Promise<ImportPreviewResponse> {
  return (await planImport(db, projectId, doc, mode, choices)).preview;
}

/**
 * Imports a validated document into a project in one transaction.
 *
 * - `merge`: adds the document's worksites and operations; refuses with 409 (details
 *   {@link ImportClashDetails}) when any name is already used in the project.
 * - `replace`: deletes the project's worksites and operations first (each deletion audited), with
 *   their campaigns and proposed ledger days; refused (409) while the project has confirmed ledger
 *   days, which would go with them and are not in the document.
 * Worksites and operations get new ids; operations' `siteNames` become the new worksites' ids.
 * The alpha table is taken from the document only with `choices.alphaTable = 'take'` (null: back
 * to the default; a table equal to the default also counts as the default; key absent: kept).
 * The data point is taken only with `choices.dataPoint = 'take'`. Each created item gets an
 * 'import' entry, plus one 'project' entry summing the import up.
 */
export async function importSetup(
  db: Db,
  projectId: string,
  user: SessionUser,
  doc: ProjectSetupDocument,
  mode: ImportMode,
  choices: ImportChoices = DEFAULT_CHOICES[mode],
): Promise<ImportResultResponse> {
  return db.transaction(async (tx) => {
    const plan = await planImport(tx, projectId, doc, mode, choices);
    const { existingSites, existingOps, preview } = plan;
    if (plan.clashes) throw new HttpError('conflict', preview.refusal!, plan.clashes);
    if (preview.refusal) throw new HttpError('conflict', preview.refusal, { confirmedLedgerDays: preview.removes.confirmedLedgerDays });

    let deletedSites = 0;
    let deletedOps = 0;
    if (mode === 'replace') {
      for (const o of existingOps) await OPERATIONS.remove(tx, projectId, user, o);
      for (const s of existingSites) await WORKSITES.remove(tx, projectId, user, s);
      deletedOps = existingOps.length;
      deletedSites = existingSites.length;
    }

    const siteIdByKey = new Map<string, string>();
    /** One audit entry for a worksite or an operation the document brought in. */
    const auditImport = (entity: 'worksite' | 'operation', item: { id: string; name: string }, after: unknown) =>
      recordAudit(tx, { projectId, user, entity, entityId: item.id, entityName: item.name, action: 'import', before: null, after });
    for (const w of doc.worksites) {
      const [row] = await tx
        .insert(worksite)
        .values({ projectId, ...siteColumns({ ...w, hindcastDatasetId: null }) })
        .returning();
      const site = toSiteResponse(row);
      siteIdByKey.set(nameKey(w.name), site.id);
      await auditImport('worksite', site, auditedSite(site));
    }

    const opIdByKey = new Map<string, string>();
    for (const o of doc.operations) {
      const siteIds = o.siteNames.map((n) => siteIdByKey.get(nameKey(n))!);
      const [row] = await tx
        .insert(operation)
        .values({ projectId, ...operationColumns({ ...o, siteIds, skipperIds: [], vesselId: null, heading: null }) })
        .returning();
      const op = toOperationResponse(row);
      opIdByKey.set(nameKey(o.name), op.id);
      await auditImport('operation', op, auditedOperation(op));
    }

    // Campaigns follow their operations and worksites: replace mode drops the old ones (their steps
    // pointed at deleted rows); merge mode adds the document's, which only name imported rows.
    if (mode === 'replace') await tx.delete(campaign).where(eq(campaign.projectId, projectId));
    for (const c of doc.campaigns ?? []) {
      await tx.insert(campaign).values({
        projectId,
        name: c.name,
        steps: c.steps.map((st) => ({
          operationId: opIdByKey.get(nameKey(st.operationName))!,
          siteId: siteIdByKey.get(nameKey(st.siteName))!,
        })),
        plannedStart: c.plannedStart ? new Date(c.plannedStart) : null,
        timeZone: c.timeZone,
      });
    }

    if (plan.alphaWrite !== undefined) await writeAlpha(tx, projectId, user, plan.alphaWrite, 'import');

    if (plan.takeDataPoint) {
      const before = plan.projectRow;
      const next = {
        dataPointName: doc.project.dataPointName,
        dataPointLatitude: doc.project.dataPointLatitude ?? null,
        dataPointLongitude: doc.project.dataPointLongitude ?? null,
        dataPointDepthM: doc.project.dataPointDepthM ?? null,
      };
      await tx
        .update(project)
        .set({ ...next, updatedAt: new Date() })
        .where(eq(project.id, projectId));
      await recordAudit(tx, {
        projectId,
        user,
        entity: 'project',
        entityId: projectId,
        entityName: before.name,
        action: 'update',
        before: {
          dataPointName: before.dataPointName,
          dataPointLatitude: before.dataPointLatitude,
          dataPointLongitude: before.dataPointLongitude,
          dataPointDepthM: before.dataPointDepthM,
        },
        after: next,
      });
    }

    const result: ImportResultResponse = {
      mode,
      worksites: { created: doc.worksites.length, deleted: deletedSites },
      operations: { created: doc.operations.length, deleted: deletedOps },
      alphaTable: preview.alphaTable.outcome,
      dataPoint: preview.dataPoint.outcome,
      messages: [preview.alphaTable.message, preview.dataPoint.message],
    };
    await recordAudit(tx, {
      projectId,
      user,
      entity: 'project',
      entityId: projectId,
      entityName: plan.projectRow.name,
      action: 'import',
      before: null,
      after: { ...result, sourceProject: doc.project.name, exportedAt: doc.exportedAt },
    });
    return result;
  });
}
