/**
 * The audit trail: who changed an operation's limits, a worksite's depth and geometry, or the
 * alpha table, when, and the audited fields before and after.
 *
 * Append-only by design: this module has no update or delete, and no route changes an entry.
 * Entries go away only with their project (foreign-key cascade).
 */
import { and, desc, eq, sql } from 'drizzle-orm';
import type { AuditEntryResponse } from '../../shared/api-types-sites';
import type { AuditEntity } from '../../shared/schemas/sites';
import type { Db } from '../db/client';
import { auditEntry, user } from '../db/schema';
import type { SessionUser } from '../http/context';

/** One change to write: what changed and how, as an entry answers it (before: null on create/import; after: null on delete). */
export interface AuditRecord extends Pick<AuditEntryResponse, 'entity' | 'entityId' | 'entityName' | 'action' | 'before' | 'after'> {
  projectId: string;
  /** who made the change (id and display name are both kept: the name stays if the user goes) */
  user: Pick<SessionUser, 'id' | 'name'>;
}

/**
 * Appends one entry. Call it with the transaction that makes the change, so the change and its
 * entry are written together or not at all.
 */
export async function recordAudit(tx: Db, { user, before, after, ...change }: AuditRecord): Promise<void> {
  await tx.insert(auditEntry).values({
    ...change,
    // The statement's own clock (now() is the transaction's start): entries written by one
    // transaction keep their order.
    at: sql`clock_timestamp()`,
    userId: user.id,
    userName: user.name,
    before: before ?? null,
    after: after ?? null,
  });
}

/** A project's entries, newest first. */
export async function listAudit(
  db: Db,
  projectId: string,
  options: { limit: number; entity?: AuditEntity },
): Promise<AuditEntryResponse[]> {
  const where = options.entity
    ? and(eq(auditEntry.projectId, projectId), eq(auditEntry.entity, options.entity))
    : eq(auditEntry.projectId, projectId);
  const rows = await db
    .select({ entry: auditEntry, userEmail: user.email })
    .from(auditEntry)
    .leftJoin(user, eq(user.id, auditEntry.userId))
    .where(where)
    .orderBy(desc(auditEntry.at), desc(auditEntry.id))
    .limit(options.limit);
  return rows.map(({ entry: r, userEmail }) => ({
    id: r.id,
    at: r.at.toISOString(),
    userId: r.userId,
    userName: r.userName,
    userEmail: userEmail ?? null,
    entity: r.entity,
    entityId: r.entityId,
    entityName: r.entityName,
    action: r.action,
    before: r.before,
    after: r.after,
  }));
}
