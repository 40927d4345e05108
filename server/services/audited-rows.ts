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

/**
 * The writes of one kind of audited row. `insert` writes the 'create' entry; `update` writes the
 * column values to the row `before` and an 'update' entry when an audited field changed; `remove`
 * deletes the row and writes the 'delete' entry.
 */
export function auditedRows<T extends AuditedTable, R extends { id: string; name: string }>(kind: AuditedKind<T, R>) {
  const { table } = kind;
  const inProject = (projectId: string, id: string) => and(eq(table.projectId, projectId), eq(table.id, id));
  /** The audit entry of one change to the row `subject` (its id, and its name after the change). */
  const entry = (tx: Db, projectId: string, user: SessionUser, action: AuditAction, subject: R, before: unknown, after: unknown) =>
    recordAudit(tx, { projectId, user, entity: kind.entity, entityId: subject.id, entityName: subject.name, action, before, after });

  return {
    async insert(tx: Db, projectId: string, user: SessionUser, values: Partial<T['$inferInsert']>): Promise<R> {
      const rows = (await tx
        .insert(table)
        .values({ projectId, ...values } as never)
        .returning()) as T['$inferSelect'][];
      const created = kind.toResponse(rows[0]);
      await entry(tx, projectId, user, 'create', created, null, kind.audited(created));
      return created;
    },
    async update(tx: Db, projectId: string, user: SessionUser, before: R, values: Partial<T['$inferInsert']>): Promise<R> {
      const rows = (await tx
        .update(table)
        .set({ ...values, updatedAt: new Date() } as never)
        .where(inProject(projectId, before.id))
        .returning()) as T['$inferSelect'][];
      const after = kind.toResponse(rows[0]);
      const [was, is] = [kind.audited(before), kind.audited(after)];
      if (JSON.stringify(was) !== JSON.stringify(is)) await entry(tx, projectId, user, 'update', after, was, is);
      return after;
    },
    async remove(tx: Db, projectId: string, user: SessionUser, row: T['$inferSelect']): Promise<void> {
      const gone = kind.toResponse(row);
      await tx.delete(table).where(inProject(projectId, gone.id));
      await entry(tx, projectId, user, 'delete', gone, kind.audited(gone), null);
    },
  };
}
