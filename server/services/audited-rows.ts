/**
 * Writes to a project's audited rows (worksites, operations): each insert, update and delete with
 * its audit entry, in the caller's transaction, so the change and its entry are written together.
 */
import { and, eq } from 'drizzle-orm';
import type { PgColumn, PgTable } from 'drizzle-orm/pg-core';
import type { AuditEntity } from '../../shared/schemas/sites';
import type { Db } from '../db/client';
import type { SessionUser } from '../http/context';
import { recordAudit } from './audit';

type AuditedTable = PgTable & { id: PgColumn; projectId: PgColumn; name: PgColumn; updatedAt: PgColumn };

/** One kind of audited row: its table, its entity in the trail, its answer and its audited fields. */
export interface AuditedKind<T extends AuditedTable, R extends { id: string; name: string }> {
  table: T;
  entity: AuditEntity;
  toResponse: (row: T['$inferSelect']) => R;
  audited: (response: R) => unknown;
}

/** Inserts a row of the project from its column `values` and writes the 'create' entry. */
export async function insertAudited<T extends AuditedTable, R extends { id: string; name: string }>(
  tx: Db,
  kind: AuditedKind<T, R>,
  projectId: string,
  user: SessionUser,
  values: Partial<T['$inferInsert']>,
): Promise<R> {
  const [row] = (await tx
    .insert(kind.table)
    .values({ projectId, ...values } as never)
    .returning()) as T['$inferSelect'][];
  const created = kind.toResponse(row);
  await recordAudit(tx, {
    projectId,
    user,
    entity: kind.entity,
    entityId: created.id,
    entityName: created.name,
    action: 'create',
    before: null,
    after: kind.audited(created),
  });
  return created;
}

/** Writes the column `values` to the row `before` and, when an audited field changed, the 'update' entry. */
export async function updateAudited<T extends AuditedTable, R extends { id: string; name: string }>(
  tx: Db,
  kind: AuditedKind<T, R>,
  projectId: string,
  user: SessionUser,
  before: R,
  values: Partial<T['$inferInsert']>,
): Promise<R> {
  const [updated] = (await tx
    .update(kind.table)
    .set({ ...values, updatedAt: new Date() } as never)
    .where(and(eq(kind.table.projectId, projectId), eq(kind.table.id, before.id)))
    .returning()) as T['$inferSelect'][];
  const after = kind.toResponse(updated);
  if (JSON.stringify(kind.audited(before)) !== JSON.stringify(kind.audited(after))) {
    await recordAudit(tx, {
      projectId,
      user,
      entity: kind.entity,
      entityId: before.id,
      entityName: after.name,
      action: 'update',
      before: kind.audited(before),
      after: kind.audited(after),
    });
  }
  return after;
}

/** Deletes the project's `row` and writes the 'delete' entry. */
export async function deleteAudited<T extends AuditedTable, R extends { id: string; name: string }>(
  tx: Db,
  kind: AuditedKind<T, R>,
  projectId: string,
  user: SessionUser,
  row: T['$inferSelect'],
): Promise<void> {
  const gone = kind.toResponse(row);
  await tx.delete(kind.table).where(and(eq(kind.table.projectId, projectId), eq(kind.table.id, gone.id)));
  await recordAudit(tx, {
    projectId,
    user,
    entity: kind.entity,
    entityId: gone.id,
    entityName: gone.name,
    action: 'delete',
    before: kind.audited(gone),
    after: null,
  });
}
