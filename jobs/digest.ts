import { and, desc, eq } from 'drizzle-orm';
import { format } from 'date-fns';
import { TZDate } from '@date-fns/tz';
import type { PlanSummary } from '../shared/alerts/compare-plans';
import { CAUTION_LINE } from '../shared/caution';
import type { AppDeps } from '../server/deps';
import { planRun, project } from '../server/db/schema';
import { escapeHtml, localTime, UNSUBSCRIBE_LINK_MARK } from '../server/services/alert-mail';
import { enqueueMail } from '../server/services/outbox';
import { covers, effectiveSubscriptions, markDigestSent } from '../server/services/subscriptions';


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
      const lines = mine.map((pl) => {
        const next = pl.windows[0];
        return `${pl.operationName} at ${pl.siteName}: ${pl.startNow ? 'may start now' : next ? `next window ${localTime(next.start, pl.timeZone)} (${next.hours} h, ${pl.timeZone})` : 'no window in this forecast'}`;
      });
      const board = `${deps.config.baseUrl}/projects/${p.id}/board`;
      // The signed link goes in when the e-mail is sent (server/services/outbox.ts).
      const unsub = UNSUBSCRIBE_LINK_MARK;
      const n = await enqueueMail(
        deps.db,
        [
          {
            idempotencyKey: `digest:${s.userId}:${p.id}:${day}`,
            projectId: p.id,
            userId: s.userId,
            toEmail: s.email,
            subject: `${p.name}: windows for ${format(local, 'EEE d MMM')}`,
            text: [`${p.name}, daily summary`, '', ...lines.map((l) => `- ${l}`), '', `Board: ${board}`, '', CAUTION_LINE, `Stop these e-mails: ${unsub}`].join('\n'),
            html: `<!doctype html><html><body style="font-family:Manrope,Arial,sans-serif;max-width:560px"><p style="font-weight:700">${escapeHtml(p.name)}, daily summary</p><ul>${lines.map((l) => `<li>${escapeHtml(l)}</li>`).join('')}</ul><p><a href="${escapeHtml(board)}">Open the watch board</a></p><p style="font-size:12px;color:#4a5d66">${escapeHtml(CAUTION_LINE)}</p><p style="font-size:12px"><a href="${escapeHtml(unsub)}">Stop these e-mails</a></p></body></html>`,
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
