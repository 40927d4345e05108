/**
 * Operations of a project with their limits (OPLIM): CRUD in transactions, each change written to
 * the audit trail with the operation's fields (limits, durations, worksites) before and after.
 */
import { and, eq, inArray } from 'drizzle-orm';
import type { OperationResponse } from '../../shared/api-types-sites';
import type { OperationLimits } from '../../shared/engine/types';
import { recurrenceText, type RecurrenceInput } from '../../shared/recurrence';
import { OperationInput, type OperationPatchInput } from '../../shared/schemas/sites';
import type { Db } from '../db/client';
import { operation, projectMember, vessel, worksite } from '../db/schema';
import type { SessionUser } from '../http/context';
import { recordAudit } from './audit';
import { auditedRows } from './audited-rows';
import { fieldError } from './project-rows';

type OperationRow = typeof operation.$inferSelect;

/**
 * Limits as stored and answered: unset limits (null, undefined, an empty band list) left out, keys
 * in a fixed order, and `bedVelocityMethod` kept only beside a bed-velocity limit, 'linear' when
 * not given (the engine's default, docs/domain.md#sea-states).
 */
export function normalizeLimits(limits: OperationLimits): OperationLimits {
  const out: OperationLimits = {};
  if (limits.hsMax != null) out.hsMax = limits.hsMax;
  if (limits.hsTpCurve != null && limits.hsTpCurve.length > 0) out.hsTpCurve = limits.hsTpCurve.map(([tp, hs]) => [tp, hs]);
  if (limits.tpMin != null) out.tpMin = limits.tpMin;
  if (limits.tpMax != null) out.tpMax = limits.tpMax;
  if (limits.tpExcluded != null && limits.tpExcluded.length > 0) out.tpExcluded = limits.tpExcluded.map(([a, b]) => [a, b]);
  if (limits.bedVelocityMax != null) {
    out.bedVelocityMax = limits.bedVelocityMax;
    out.bedVelocityMethod = limits.bedVelocityMethod ?? 'linear';
  }
  if (limits.windMax != null) out.windMax = limits.windMax;
  if (limits.responses != null && limits.responses.length > 0)
    out.responses = limits.responses.map((r) => ({
      response: r.response,
      statistic: r.statistic,
      ...(r.statistic === 'mpm' ? { durationH: r.durationH ?? 3 } : {}),
      max: r.max,
    }));
  if (limits.responseSea != null) {
    const sea = Object.fromEntries(Object.entries(limits.responseSea).filter(([, x]) => x != null));
    if (Object.keys(sea).length > 0) out.responseSea = sea;
  }
  // Hs limits on partition targets (docs/domain.md#partitions), T* only on the long-period target.
  if (limits.hsTargets != null && limits.hsTargets.length > 0)
    out.hsTargets = limits.hsTargets.map((t) =>
      t.target === 'longPeriod' ? { target: t.target, minPeriodS: t.minPeriodS, max: t.max } : { target: t.target, max: t.max },
    );
  if (limits.tpExcludedMinHs != null) out.tpExcludedMinHs = limits.tpExcludedMinHs;
  // The depth, current and tide-window limits (docs/domain.md#tide).
  if (limits.minDepth != null) out.minDepth = limits.minDepth;
  if (limits.minDepthParts != null)
    out.minDepthParts = { draught: limits.minDepthParts.draught, clearance: limits.minDepthParts.clearance };
  if (limits.maxDepth != null) out.maxDepth = limits.maxDepth;
  if (limits.currentMax != null) out.currentMax = limits.currentMax;
  if (limits.tideWindow != null)
    out.tideWindow = { reference: limits.tideWindow.reference, before: limits.tideWindow.before, after: limits.tideWindow.after };
  return out;
}

export function toOperationResponse(row: OperationRow): OperationResponse {
  return {
    id: row.id,
    name: row.name,
    description: row.description,
    tpop: row.tpopH,
    tc: row.tcH,
    tr: row.tpopH + row.tcH,
    weatherRestricted: row.weatherRestricted,
    limits: normalizeLimits(row.limits as OperationLimits),
    vesselId: row.vesselId,
    heading: row.headingDeg,
    siteIds: [...row.siteIds],
    skipperIds: [...row.skipperIds],
    recurrence: row.recurrence ?? null,
    updatedAt: row.updatedAt.toISOString(),
  };
}

/** The audited fields of an operation (everything but id, recurrence and timestamps). */
export function auditedOperation(op: OperationResponse): Omit<OperationResponse, 'id' | 'updatedAt' | 'recurrence'> {
  const { id: _id, updatedAt: _updatedAt, recurrence: _recurrence, ...rest } = op;
  return rest;
}

/** Operations in the audit trail: every field but id, recurrence and timestamps. */
export const OPERATIONS = auditedRows(operation, 'operation', {
  toResponse: toOperationResponse,
  audited: auditedOperation,
  names: ['Operation', 'An operation'],
});

/** Column values of a parsed operation. */
export function operationColumns(input: OperationInput) {
  return {
    name: input.name,
    description: input.description,
    tpopH: input.tpop,
    tcH: input.tc,
    weatherRestricted: input.weatherRestricted,
    limits: normalizeLimits(input.limits) as Record<string, unknown>,
    vesselId: input.vesselId,
    headingDeg: input.heading,
    siteIds: input.siteIds,
    skipperIds: input.skipperIds,
  };
}

export const listOperations = OPERATIONS.list;
export const getOperation = OPERATIONS.get;

/**
 * 400 naming the first id that is not a worksite of the project, or not a skipper of the project.
 * Only ids in `fresh` are checked: ids kept from before stay even when the skipper has since left
 * the project, so an unrelated change does not fail on them.
 */
async function assertReferences(
  db: Db,
  projectId: string,
  input: Pick<OperationInput, 'siteIds' | 'skipperIds' | 'vesselId'>,
  previous?: Pick<OperationInput, 'siteIds' | 'skipperIds' | 'vesselId'>,
): Promise<void> {
  if (input.vesselId != null && input.vesselId !== previous?.vesselId) {
    const [v] = await db
      .select({ id: vessel.id })
      .from(vessel)
      .where(and(eq(vessel.projectId, projectId), eq(vessel.id, input.vesselId)));
    if (!v) throw fieldError('vesselId', 'No vessel with this id in the project');
  }
  const newSites = input.siteIds.filter((id) => !previous?.siteIds.includes(id));
  if (newSites.length > 0) {
    const rows = await db
      .select({ id: worksite.id })
      .from(worksite)
      .where(and(eq(worksite.projectId, projectId), inArray(worksite.id, newSites)));
    const known = new Set(rows.map((r) => r.id));
    const i = input.siteIds.findIndex((id) => newSites.includes(id) && !known.has(id));
    if (i >= 0) throw fieldError(`siteIds.${i}`, 'No worksite with this id in the project');
  }
  const newSkippers = input.skipperIds.filter((id) => !previous?.skipperIds.includes(id));
  if (newSkippers.length > 0) {
    const rows = await db
      .select({ userId: projectMember.userId })
      .from(projectMember)
      .where(and(eq(projectMember.projectId, projectId), eq(projectMember.role, 'skipper'), inArray(projectMember.userId, newSkippers)));
    const known = new Set(rows.map((r) => r.userId));
    const i = input.skipperIds.findIndex((id) => newSkippers.includes(id) && !known.has(id));
    if (i >= 0) throw fieldError(`skipperIds.${i}`, 'Not a skipper of this project');
  }
}

export async function createOperation(db: Db, projectId: string, user: SessionUser, input: OperationInput): Promise<OperationResponse> {
  return db.transaction(async (tx) => {
    await OPERATIONS.assertNameFree(tx, projectId, input.name);
    await assertReferences(tx, projectId, input);
    return OPERATIONS.insert(tx, projectId, user, operationColumns(input));
  });
}

/**
 * Changes some fields of an operation (`limits`, `siteIds`, `skipperIds` are replaced as a whole).
 * The merged record is checked again with the full {@link OperationInput} schema, so e.g. raising
 * TPOP of a weather-restricted operation past TR = 96 h (or TPOP past 72 h) is refused; an entry is written when an
 * audited field changed.
 */
export async function updateOperation(
  db: Db,
  projectId: string,
  user: SessionUser,
  operationId: string,
  patch: OperationPatchInput,
): Promise<OperationResponse> {
  return db.transaction(async (tx) => {
    const { before, merged } = await OPERATIONS.patched(tx, projectId, operationId, patch, OperationInput, (op) => {
      const { tr: _tr, ...current } = auditedOperation(op);
      return current;
    });
    await assertReferences(tx, projectId, merged, before);
    return OPERATIONS.update(tx, projectId, user, before, operationColumns(merged));
  });
}

export async function deleteOperation(db: Db, projectId: string, user: SessionUser, operationId: string): Promise<void> {
  await db.transaction(async (tx) => {
    const row = await OPERATIONS.row(tx, projectId, operationId);
    await OPERATIONS.remove(tx, projectId, user, row);
  });
}

/**
 * Sets (or with `null` removes) an operation's recurrence, with its wording, and writes the change
 * to the audit trail in the same transaction. Answers the stored value.
 */
export async function setOperationRecurrence(
  db: Db,
  projectId: string,
  user: SessionUser,
  operationId: string,
  input: RecurrenceInput | null,
): Promise<(RecurrenceInput & { text: string }) | null> {
  const value = input ? { ...input, text: recurrenceText(input) } : null;
  await db.transaction(async (tx) => {
    const row = await OPERATIONS.row(tx, projectId, operationId);
    await tx.update(operation).set({ recurrence: value, updatedAt: new Date() }).where(eq(operation.id, row.id));
    await recordAudit(tx, {
      projectId,
      user,
      entity: 'operation',
      entityId: row.id,
      entityName: row.name,
      action: 'update',
      before: { recurrence: row.recurrence },
      after: { recurrence: value },
    });
  });
  return value;
}
