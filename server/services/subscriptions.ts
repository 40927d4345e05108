import { and, eq } from 'drizzle-orm';
import type { SubscriptionInput } from '../../shared/schemas/alerts';
import type { Db } from '../db/client';
import { operation, projectMember, subscription, user } from '../db/schema';

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
        userId: m.userId, email: m.email, name: m.name, stored: true,
        operationIds: row.operationIds, siteIds: row.siteIds, immediate: row.immediate, digest: row.digest,
        digestTime: row.digestTime, digestTimeZone: row.digestTimeZone, active: row.active,
      });
    } else if (m.role === 'skipper') {
      const assigned = ops.filter((o) => o.skipperIds.includes(m.userId)).map((o) => o.id);
      if (assigned.length === 0) continue;
      out.push({
        userId: m.userId, email: m.email, name: m.name, stored: false,
        operationIds: assigned, siteIds: [], immediate: true, digest: false, digestTime: '06:00', digestTimeZone: 'UTC', active: true,
      });
    }
  }
  return out;
}

export const covers = (s: SubscriptionInput, operationId: string, siteId: string) =>
  s.active && (s.operationIds.length === 0 || s.operationIds.includes(operationId)) && (s.siteIds.length === 0 || s.siteIds.includes(siteId));

export async function mySubscription(db: Db, userId: string, projectId: string): Promise<EffectiveSubscription | null> {
  const all = await effectiveSubscriptions(db, projectId);
  return all.find((s) => s.userId === userId) ?? null;
}

export async function saveSubscription(db: Db, userId: string, projectId: string, input: SubscriptionInput): Promise<void> {
  await db
    .insert(subscription)
    .values({ userId, projectId, ...input })
    .onConflictDoUpdate({ target: [subscription.userId, subscription.projectId], set: { ...input, updatedAt: new Date() } });
}

/** One-click unsubscribe: stores an inactive subscription (keeping any choices made before). */
export async function unsubscribe(db: Db, userId: string, projectId: string): Promise<void> {
  const current = await mySubscription(db, userId, projectId);
  const base: SubscriptionInput = current ?? { operationIds: [], siteIds: [], immediate: true, digest: false, digestTime: '06:00', digestTimeZone: 'UTC', active: true };
  const { operationIds, siteIds, immediate, digest, digestTime, digestTimeZone } = base;
  await saveSubscription(db, userId, projectId, { operationIds, siteIds, immediate, digest, digestTime, digestTimeZone, active: false });
}

export async function markDigestSent(db: Db, userId: string, projectId: string, at: Date): Promise<void> {
  await db.update(subscription).set({ lastDigestAt: at }).where(and(eq(subscription.userId, userId), eq(subscription.projectId, projectId)));
}
