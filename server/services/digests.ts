import { and, desc, eq } from 'drizzle-orm';
import { format } from 'date-fns';
import { TZDate } from '@date-fns/tz';
import type { PlanSummary } from '../../shared/alerts/compare-plans';
import type { AppDeps } from '../deps';
import { planRun, project } from '../db/schema';
import { finishWords, occurrenceLabel, START_WORDS } from '../../shared/status-words';
import { renderMail } from '../mail/message';
import { localTime, UNSUBSCRIBE_LINK_MARK } from './alert-mail';
import { enqueueMail } from './outbox';
import { covers, effectiveSubscriptions, markDigestSent } from './subscriptions';

/**
 * One operation at one worksite in the digest: may it start now, or its next window; for a
 * recurring operation, its next occurrence with its status (the words of shared/status-words.ts).
 */
export function digestLine(pl: PlanSummary, nowMs: number): string {
  const next = pl.windows[0];
  const state = pl.startNow
    ? START_WORDS.startNow
    : next
      ? `${START_WORDS.nextWindow} ${localTime(next.start, pl.timeZone)} (${next.hours} h, ${pl.timeZone})${windowFinish(pl, next.start)}`
      : START_WORDS.noWindow;
  const occurrence = pl.occurrences.find((o) => Date.parse(o.start) >= nowMs);
  const occurrenceWords = occurrence
    ? `; ${START_WORDS.nextOccurrence} ${localTime(occurrence.start, pl.timeZone)}: ${occurrenceLabel(occurrence.status)}`
    : '';
  return `${pl.operationName} at ${pl.siteName}: ${state}${occurrenceWords}`;
}

/** ", planned finish …, contingency to …" for work begun at a window's start (a go-start); empty without TPOP. */
function windowFinish(pl: PlanSummary, start: string): string {
  if (pl.tpop === undefined) return '';
  return `, ${finishWords(Date.parse(start), pl.tpop, pl.tr, (ms) => localTime(ms, pl.timeZone))}`;
}

/**
 * Daily digests: for every subscription that asks for one, once per local day at or after its
 * local time, a summary of the latest plan (windows and earliest starts) of what it covers.
 */
export async function queueDigests(deps: AppDeps): Promise<number> {
  const now = deps.clock();
  const projects = await deps.db.select({ id: project.id, name: project.name }).from(project);
  let queued = 0;
  for (const p of projects) {
    const subs = (await effectiveSubscriptions(deps.db, p.id)).filter((s) => s.digest && s.active && s.stored);
    if (subs.length === 0) continue;
    const [run] = await deps.db
      .select({ plans: planRun.plans })
      .from(planRun)
      .where(and(eq(planRun.projectId, p.id), eq(planRun.status, 'ok')))
      .orderBy(desc(planRun.startedAt))
      .limit(1);
    if (!run) continue;
    const plans = (run.plans ?? []) as PlanSummary[];
    for (const s of subs) {
      const local = new TZDate(now.getTime(), s.digestTimeZone);
      if (format(local, 'HH:mm') < s.digestTime) continue;
      const day = format(local, 'yyyy-MM-dd');
      const mine = plans.filter((pl) => covers(s, pl.operationId, pl.siteId));
      if (mine.length === 0) continue;
      const board = `${deps.config.baseUrl}/projects/${p.id}/board`;
      const mail = await renderMail({
        heading: `${p.name}, daily summary`,
        textHead: [`${p.name}, daily summary`],
        points: mine.map((pl) => digestLine(pl, now.getTime())),
        action: { label: 'Open the watch board', textLabel: 'Board', url: board },
        // The signed link goes in when the e-mail is sent (server/services/outbox.ts).
        unsubscribeUrl: UNSUBSCRIBE_LINK_MARK,
      });
      const n = await enqueueMail(
        deps.db,
        [
          {
            idempotencyKey: `digest:${s.userId}:${p.id}:${day}`,
            projectId: p.id,
            userId: s.userId,
            toEmail: s.email,
            subject: `${p.name}: windows for ${format(local, 'EEE d MMM')}`,
            ...mail,
          },
        ],
        now,
      );
      if (n > 0) await markDigestSent(deps.db, s.userId, p.id, now);
      queued += n;
    }
  }
  return queued;
}
