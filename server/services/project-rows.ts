import { and, asc, eq, type SQL } from 'drizzle-orm';
import type { PgColumn, PgTable } from 'drizzle-orm/pg-core';
import { idParam } from '../../shared/schemas/common';
import { nameKey } from '../../shared/schemas/sites';
import type { Db } from '../db/client';
import { HttpError, notFound } from '../http/errors';

/** A table whose rows belong to one project and have their own id (worksites, operations, campaigns...). */
type ProjectTable = PgTable & { id: PgColumn; projectId: PgColumn };

const inProject = (table: ProjectTable, projectId: string, id: string): SQL | undefined =>
  and(eq(table.projectId, projectId), eq(table.id, id));

/**
 * The row `id` of the project's `table`, or 404 "<what> not found" for a malformed id, an unknown
 * id or another project's row.
 */
export async function projectRow<T extends ProjectTable>(
  db: Db,
  table: T,
  projectId: string,
  id: string,
  what: string,
): Promise<T['$inferSelect']> {
  if (!idParam.safeParse(id).success) throw notFound(what);
  const [row] = (await db
    .select()
    .from(table as PgTable)
    .where(inProject(table, projectId, id))) as T['$inferSelect'][];
  if (!row) throw notFound(what);
  return row;
}

/**
 * 409 when another row of the project's `table` (other than `exceptId`) has the same name,
 * compared by {@link nameKey}; `what` starts the message ("An operation", "A worksite").
 */
export async function assertNameFree(
  db: Db,
  table: ProjectTable & { name: PgColumn },
  projectId: string,
  name: string,
  what: string,
  exceptId?: string,
): Promise<void> {
  const key = nameKey(name);
  const rows = (await db
    .select({ id: table.id, name: table.name })
    .from(table as PgTable)
    .where(eq(table.projectId, projectId))) as {
    id: string;
    name: string;
  }[];
  if (rows.some((r) => r.id !== exceptId && nameKey(r.name) === key)) {
    throw new HttpError('conflict', `${what} named "${name}" already exists in this project`, [{ field: 'name', message: 'already used' }]);
  }
}

/** A 400 naming one field, shaped like `parseInput`'s. */
export function fieldError(field: string, message: string): HttpError {
  return new HttpError('validation', `Invalid body: ${field}: ${message}`, [{ field, message }]);
}

/** The project's rows of `table` by name (then id, so equal names keep one order). */
export async function listProjectRows<T extends ProjectTable & { name: PgColumn }>(
  db: Db,
  table: T,
  projectId: string,
): Promise<T['$inferSelect'][]> {
  return (await db
    .select()
    .from(table as PgTable)
    .where(eq(table.projectId, projectId))
    .orderBy(asc(table.name), asc(table.id))) as T['$inferSelect'][];
}
