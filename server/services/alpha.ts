/**
 * The project's alpha table (OPWF = alpha * OPLIM for weather-restricted operations,
 * docs/domain.md#weather-restricted). A project without a stored table uses the default; every save and
 * reset is written to the audit trail with the table before and after.
 */
import { eq } from 'drizzle-orm';
import { ALPHA_NOTE, type AlphaResponse } from '../../shared/api-types-sites';
import { defaultAlphaTable } from '../../shared/engine/default-alpha-table';
import type { AlphaTable } from '../../shared/engine/types';
import type { AuditAction } from '../../shared/schemas/sites';
import type { Db } from '../db/client';
import { projectAlpha } from '../db/schema';
import type { SessionUser } from '../http/context';
import { recordAudit } from './audit';

function copyTable(t: AlphaTable): AlphaTable {
  return { tpopBoundsH: [...t.tpopBoundsH], hsColumnsM: [...t.hsColumnsM], values: t.values.map((r) => [...r]) };
}

/** The table in force: the project's own, or a copy of the default. */
export async function getAlpha(db: Db, projectId: string): Promise<AlphaResponse> {
  const [row] = await db.select().from(projectAlpha).where(eq(projectAlpha.projectId, projectId));
  if (!row) return { table: defaultAlphaTable(), isDefault: true, note: ALPHA_NOTE, updatedAt: null };
  return { table: copyTable(row.table), isDefault: false, note: ALPHA_NOTE, updatedAt: row.updatedAt.toISOString() };
}

const snapshot = (a: AlphaResponse) => ({ table: a.table, isDefault: a.isDefault });

/**
 * Sets (a table) or resets (null) the project's alpha table inside a transaction and writes the
 * audit entry; nothing is written when nothing changes. Used by the routes and the setup import.
 * `recordedWithAfter` is kept in the entry's "after" beside the table (the adopted calibration's
 * data, for instance); with it, an adoption is recorded even when the table is unchanged.
 */
export async function writeAlpha(
  tx: Db,
  projectId: string,
  user: SessionUser,
  table: AlphaTable | null,
  action: AuditAction,
  recordedWithAfter?: Record<string, unknown>,
): Promise<AlphaResponse> {
  const before = await getAlpha(tx, projectId);
  if (table === null) {
    if (before.isDefault) return before;
    await tx.delete(projectAlpha).where(eq(projectAlpha.projectId, projectId));
  } else {
    if (!recordedWithAfter && !before.isDefault && JSON.stringify(before.table) === JSON.stringify(table)) return before;
    const value = copyTable(table);
    const now = new Date();
    await tx
      .insert(projectAlpha)
      .values({ projectId, table: value, updatedAt: now })
      .onConflictDoUpdate({ target: projectAlpha.projectId, set: { table: value, updatedAt: now } });
  }
  const after = await getAlpha(tx, projectId);
  await recordAudit(tx, {
    projectId,
    user,
    entity: 'alpha',
    entityId: projectId,
    entityName: 'Alpha table',
    action,
    before: snapshot(before),
    after: { ...snapshot(after), ...recordedWithAfter },
  });
  return after;
}

/** Saves the project's own table (PUT). */
export function setAlpha(db: Db, projectId: string, user: SessionUser, table: AlphaTable): Promise<AlphaResponse> {
  return db.transaction((tx) => writeAlpha(tx, projectId, user, table, 'update'));
}

/** Deletes the project's own table so the default applies again (DELETE, "reset to default"). */
export function resetAlpha(db: Db, projectId: string, user: SessionUser): Promise<AlphaResponse> {
  return db.transaction((tx) => writeAlpha(tx, projectId, user, null, 'delete'));
}
