import crypto from 'node:crypto';
import { eq } from 'drizzle-orm';
import type { Db } from '../db/client';
import { calendarToken, project, projectMember, user } from '../db/schema';
import { CAUTION_LINE } from '../../shared/caution';
import { occurrenceLabel } from '../../shared/status-words';
import { icsDocument, windowFinishSentence, type CalendarEvent } from './calendar';
import { projectPlan } from './plans';
import { covers, mySubscription } from './subscriptions';

export async function getCalendarToken(db: Db, userId: string): Promise<string | null> {
  const [row] = await db.select().from(calendarToken).where(eq(calendarToken.userId, userId));
  return row?.token ?? null;
}

/** Creates or replaces the user's feed token (the old address stops working). */
export async function rotateCalendarToken(db: Db, userId: string): Promise<string> {
  const token = crypto.randomBytes(24).toString('base64url');
  await db
    .insert(calendarToken)
    .values({ userId, token })
    .onConflictDoUpdate({ target: calendarToken.userId, set: { token, createdAt: new Date() } });
  return token;
}

export async function revokeCalendarToken(db: Db, userId: string): Promise<void> {
  await db.delete(calendarToken).where(eq(calendarToken.userId, userId));
}

/** The feed: usable windows and recurring-operation occurrences of everything the user subscribes to. */
export async function calendarFeed(db: Db, token: string, now: Date): Promise<string | null> {
  const [row] = await db
    .select({ userId: calendarToken.userId, banned: user.banned })
    .from(calendarToken)
    .innerJoin(user, eq(user.id, calendarToken.userId))
    .where(eq(calendarToken.token, token));
  if (!row || row.banned) return null;
  const projects = await db
    .select({ id: project.id, name: project.name })
    .from(projectMember)
    .innerJoin(project, eq(project.id, projectMember.projectId))
    .where(eq(projectMember.userId, row.userId));
  const events: CalendarEvent[] = [];
  for (const p of projects) {
    const sub = await mySubscription(db, row.userId, p.id);
    if (!sub || !sub.active) continue;
    const plan = await projectPlan(db, p.id, { alpha: true, now });
    for (const op of plan.plans.filter((x) => covers(sub, x.operationId, x.siteId))) {
      for (const w of op.windows) {
        events.push({
          uid: `window-${op.operationId}-${op.siteId}-${w.start}@lullwatch`,
          start: new Date(w.start),
          end: new Date(w.end),
          summary: `Window: ${op.operationName} at ${op.siteName}`,
          description: `${p.name}. Usable weather window of ${w.hours} h (TR ${op.tr} h). ${windowFinishSentence(w.start, op.tpop, op.tr, op.timeZone)} ${CAUTION_LINE}`,
        });
      }
      for (const o of op.occurrences) {
        events.push({
          uid: `occurrence-${op.operationId}-${op.siteId}-${o.start}@lullwatch`,
          start: new Date(o.start),
          end: new Date(Date.parse(o.start) + op.tr * 3_600_000),
          // The status as on the board and in the e-mails: "X Not workable: …" (shared/status-words.ts).
          summary: `${occurrenceLabel(o.status)}: ${op.operationName} at ${op.siteName}`,
          description: `${p.name}. Recurring operation, judged on its TR of ${op.tr} h. ${CAUTION_LINE}`,
        });
      }
    }
  }
  return icsDocument('Lullwatch weather windows', events);
}
