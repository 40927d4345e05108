/**
 * Writes to a project's audited rows (worksites, operations): each insert, update and delete with
 * its audit entry, in the caller's transaction, so the change and its entry are written together.
 */
import { and, eq } from 'drizzle-orm';
import type { PgColumn, PgTable } from 'drizzle-orm/pg-core';
import type { AuditAction, AuditEntity } from '../../shared/schemas/sites';
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

/** The audit entry of one change to the row `subject` (its id, and its name after the change). */
function writeEntry<T extends AuditedTable, R extends { id: string; name: string }>(
  tx: Db,
  kind: AuditedKind<T, R>,
  projectId: string,
  user: SessionUser,
  action: AuditAction,
  subject: R,
  before: unknown,
  after: unknown,
): Promise<void> {
  return recordAudit(tx, { projectId, user, entity: kind.entity, entityId: subject.id, entityName: subject.name, action, before, after });
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
  await writeEntry(tx, kind, projectId, user, 'create', created, null, kind.audited(created));
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
    await writeEntry(tx, kind, projectId, user, 'update', after, kind.audited(before), kind.audited(after));
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
  await writeEntry(tx, kind, projectId, user, 'delete', gone, kind.audited(gone), null);
}
