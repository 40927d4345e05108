/**
 * A project's audited rows (worksites, operations): their reads (by name, one row or 404, the name
 * check), and each insert, update and delete with its audit entry, in the caller's transaction, so
 * the change and its entry are written together.
 */
import { and, eq } from 'drizzle-orm';
import type { PgColumn, PgTable } from 'drizzle-orm/pg-core';
import type { z } from 'zod';
import type { AuditAction, AuditEntity } from '../../shared/schemas/sites';
import type { Db } from '../db/client';
import type { SessionUser } from '../http/context';
import { parseInput } from '../http/errors';
import { recordAudit } from './audit';
import { assertNameFree, listProjectRows, projectRow } from './project-rows';

type AuditedTable = PgTable & { id: PgColumn; projectId: PgColumn; name: PgColumn; updatedAt: PgColumn };

/** One kind of audited row (beside its table and its entity in the trail): its answer and its audited fields. */
export interface AuditedKind<T extends AuditedTable, R extends { id: string; name: string }> {
  toResponse: (row: T['$inferSelect']) => R;
  audited: (response: R) => unknown;
  /** How messages name a row: `[one, aOne]` as in "Worksite not found" and "A worksite named … already exists". */
  names: [string, string];
}

/**
 * The reads and writes of one kind of audited row. `list` answers the project's rows by name; `row`
 * is the row, or 404 for a malformed id, an unknown id or another project's row; `get` its answer;
 * `assertNameFree` is 409 when another row of the project has the same name (compared by `nameKey`).
 * `insert` writes the 'create' entry; `update` writes the column values to the row `before` and an
 * 'update' entry when an audited field changed; `remove` deletes the row and writes the 'delete' entry.
 */
export function auditedRows<T extends AuditedTable, R extends { id: string; name: string }>(
  table: T,
  entity: AuditEntity,
  kind: AuditedKind<T, R>,
) {
  const [one, aOne] = kind.names;
  const row = (db: Db, projectId: string, id: string): Promise<T['$inferSelect']> => projectRow(db, table, projectId, id, one);
  const inProject = (projectId: string, id: string) => and(eq(table.projectId, projectId), eq(table.id, id));
  /** The audit entry of one change to the row `subject` (its id, and its name after the change). */
  const entry = (tx: Db, projectId: string, user: SessionUser, action: AuditAction, subject: R, before: unknown, after: unknown) =>
    recordAudit(tx, { projectId, user, entity, entityId: subject.id, entityName: subject.name, action, before, after });

  return {
    list: async (db: Db, projectId: string): Promise<R[]> => (await listProjectRows(db, table, projectId)).map(kind.toResponse),
    row,
    get: async (db: Db, projectId: string, id: string): Promise<R> => kind.toResponse(await row(db, projectId, id)),
    assertNameFree: (db: Db, projectId: string, name: string, exceptId?: string): Promise<void> =>
      assertNameFree(db, table, projectId, name, aOne, exceptId),
    /**
     * The row `id` (`before`) and the record it becomes (`merged`): `patch`'s defined fields over
     * `fields(before)`, checked again with the full `schema`; 409 when a new name is another row's.
     */
    async patched<S extends z.ZodType<{ name: string }>>(
      tx: Db,
      projectId: string,
      id: string,
      patch: { name?: string },
      schema: S,
      fields: (before: R) => object,
    ): Promise<{ before: R; merged: z.infer<S> }> {
      const before = kind.toResponse(await row(tx, projectId, id));
      const merged = parseInput(schema, { ...fields(before), ...definedOnly(patch) });
      if (patch.name !== undefined) await assertNameFree(tx, table, projectId, merged.name, aOne, id);
      return { before, merged };
    },
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

/** The keys of an object whose value is not undefined. */
export function definedOnly<T extends object>(o: T): Partial<T> {
  return Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined)) as Partial<T>;
}
