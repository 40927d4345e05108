import { and, eq, inArray, ne } from 'drizzle-orm';
import type { SubscriptionInput } from '../../shared/schemas/alerts';
import type { Db } from '../db/client';
import { operation, projectMember, subscription, user, worksite } from '../db/schema';
import { HttpError } from '../http/errors';

export interface EffectiveSubscription extends SubscriptionInput {
  userId: string;
  email: string;
  name: string;
  /** false when no row is stored and this is the default (skippers: their assigned operations). */
  stored: boolean;
}

/**
 * Who hears about what in a project: stored subscriptions of members, and for skippers without
 * one, the default: immediate alerts for the operations they are assigned to. Deactivated users
 * hear nothing.
 */
export async function effectiveSubscriptions(db: Db, projectId: string): Promise<EffectiveSubscription[]> {
  const [members, rows, ops] = await Promise.all([
    db
      .select({ userId: user.id, email: user.email, name: user.name, banned: user.banned, role: projectMember.role })
      .from(projectMember)
      .innerJoin(user, eq(user.id, projectMember.userId))
      .where(eq(projectMember.projectId, projectId)),
    db.select().from(subscription).where(eq(subscription.projectId, projectId)),
    db.select({ id: operation.id, skipperIds: operation.skipperIds }).from(operation).where(eq(operation.projectId, projectId)),
  ]);
  const out: EffectiveSubscription[] = [];
  for (const m of members) {
    if (m.banned) continue;
    const row = rows.find((r) => r.userId === m.userId);
    if (row) {
      out.push({
        userId: m.userId,
        email: m.email,
        name: m.name,
        stored: true,
        operationIds: row.operationIds,
        siteIds: row.siteIds,
        immediate: row.immediate,
        digest: row.digest,
        digestTime: row.digestTime,
        digestTimeZone: row.digestTimeZone,
        active: row.active,
        outlookMoveDays: row.outlookMoveDays,
        windowChanceBelow: row.windowChanceBelow,
      });
    } else if (m.role === 'skipper') {
      const assigned = ops.filter((o) => o.skipperIds.includes(m.userId)).map((o) => o.id);
      if (assigned.length === 0) continue;
      out.push({
        userId: m.userId,
        email: m.email,
        name: m.name,
        stored: false,
        ...NOTHING_CHOSEN,
        operationIds: assigned,
        immediate: true,
        active: true,
      });
    }
  }
  return out;
}

/**
 * A subscription with nothing chosen: every operation and worksite, no immediate e-mail, no
 * digest (06:00 UTC when one is turned on), inactive, no outlook or chance alerts.
 */
export const NOTHING_CHOSEN: SubscriptionInput = {
  operationIds: [],
  siteIds: [],
  immediate: false,
  digest: false,
  digestTime: '06:00',
  digestTimeZone: 'UTC',
  active: false,
  outlookMoveDays: null,
  windowChanceBelow: null,
};

export const covers = (s: SubscriptionInput, operationId: string, siteId: string) =>
  s.active &&
  (s.operationIds.length === 0 || s.operationIds.includes(operationId)) &&
  (s.siteIds.length === 0 || s.siteIds.includes(siteId));

export async function mySubscription(db: Db, userId: string, projectId: string): Promise<EffectiveSubscription | null> {
  const all = await effectiveSubscriptions(db, projectId);
  return all.find((s) => s.userId === userId) ?? null;
}

export async function saveSubscription(db: Db, userId: string, projectId: string, input: SubscriptionInput): Promise<void> {
  await refuseForeignIds(db, projectId, input);
  await db
    .insert(subscription)
    .values({ userId, projectId, ...input })
    .onConflictDoUpdate({ target: [subscription.userId, subscription.projectId], set: { ...input, updatedAt: new Date() } });
}

/**
 * Refuses operation or worksite ids of another project (400 naming the field), so none is stored.
 * Ids that exist nowhere are kept: they are operations or worksites deleted since the choice was
 * made, and the form sends the stored choice back as it was.
 */
async function refuseForeignIds(db: Db, projectId: string, input: SubscriptionInput): Promise<void> {
  const checks = [
    { field: 'operationIds', ids: input.operationIds, table: operation },
    { field: 'siteIds', ids: input.siteIds, table: worksite },
  ] as const;
  for (const { field, ids, table } of checks) {
    if (ids.length === 0) continue;
    const foreign = await db
      .select({ id: table.id })
      .from(table)
      .where(and(ne(table.projectId, projectId), inArray(table.id, [...ids])));
    if (foreign.length === 0) continue;
    const index = ids.indexOf(foreign[0].id);
    throw new HttpError('validation', `Invalid body: ${field}.${index}: not in this project`, [
      { field: `${field}.${index}`, message: 'not in this project' },
    ]);
  }
}

/** One-click unsubscribe: stores an inactive subscription (keeping any choices made before). */
export async function unsubscribe(db: Db, userId: string, projectId: string): Promise<void> {
  const current = await mySubscription(db, userId, projectId);
  const base: SubscriptionInput = current ?? { ...NOTHING_CHOSEN, immediate: true, active: true };
  const { operationIds, siteIds, immediate, digest, digestTime, digestTimeZone, outlookMoveDays, windowChanceBelow } = base;
  await saveSubscription(db, userId, projectId, {
    operationIds,
    siteIds,
    immediate,
    digest,
    digestTime,
    digestTimeZone,
    active: false,
    outlookMoveDays,
    windowChanceBelow,
  });
}

export async function markDigestSent(db: Db, userId: string, projectId: string, at: Date): Promise<void> {
  await db
    .update(subscription)
    .set({ lastDigestAt: at })
    .where(and(eq(subscription.userId, userId), eq(subscription.projectId, projectId)));
}
