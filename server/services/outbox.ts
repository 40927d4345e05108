import { and, asc, desc, eq, lte } from 'drizzle-orm';
import type { Db } from '../db/client';
import { outbox } from '../db/schema';
import type { Mailer } from '../mail/mailer';
import type { Logger } from '../deps';
import { UNSUBSCRIBE_LINK_MARK, unsubscribeUrl } from './alert-mail';

/** Where delivery finds the app's address and the link secret for unsubscribe links. */
export interface LinkConfig {
  baseUrl: string;
  linkSecret: string;
}

/**
 * A stored message as sent: the recipient's signed one-click unsubscribe link put in place of its
 * mark, with the RFC 8058 headers (List-Unsubscribe with the https link, List-Unsubscribe-Post:
 * List-Unsubscribe=One-Click) so mail programs can offer their own unsubscribe button.
 */
function withUnsubscribeLink(
  m: { userId: string | null; projectId: string | null; text: string; html: string; createdAt: Date },
  links: LinkConfig | undefined,
) {
  if (!m.text.includes(UNSUBSCRIBE_LINK_MARK) && !m.html.includes(UNSUBSCRIBE_LINK_MARK)) return { text: m.text, html: m.html };
  if (!links || !m.userId || !m.projectId) {
    const none = '(change your alerts on the Alerts page)';
    return { text: m.text.replaceAll(UNSUBSCRIBE_LINK_MARK, none), html: m.html.replaceAll(UNSUBSCRIBE_LINK_MARK, '#') };
  }
  // Dated from when the message was written, not sent: a resend after a crash is the same message, link included.
  const url = unsubscribeUrl(links.baseUrl, links.linkSecret, m.userId, m.projectId, m.createdAt.getTime());
  const htmlUrl = url.replaceAll('&', '&amp;');
  return {
    text: m.text.replaceAll(UNSUBSCRIBE_LINK_MARK, url),
    html: m.html.replaceAll(UNSUBSCRIBE_LINK_MARK, htmlUrl),
    headers: { 'List-Unsubscribe': `<${url}>`, 'List-Unsubscribe-Post': 'List-Unsubscribe=One-Click' },
  };
}

export interface OutboxMessage {
  idempotencyKey: string;
  projectId: string | null;
  userId: string | null;
  toEmail: string;
  subject: string;
  text: string;
  html: string;
}

/** Writes messages to the outbox; a key already there is skipped (re-runs never duplicate). Returns how many were new. */
export async function enqueueMail(db: Db, messages: OutboxMessage[], now: Date): Promise<number> {
  if (messages.length === 0) return 0;
  const inserted = await db
    .insert(outbox)
    .values(messages.map((m) => ({ ...m, nextAttemptAt: now })))
    .onConflictDoNothing({ target: outbox.idempotencyKey })
    .returning({ id: outbox.id });
  return inserted.length;
}

/** Backoff after failed attempt n (1-based): 1, 2, 4, 8 ... minutes, at most an hour. */
export const retryDelayMs = (attempt: number) => Math.min(60, 2 ** (attempt - 1)) * 60_000;

/**
 * Sends what is due in the outbox. A failure is retried later with backoff and marked failed
 * after `maxAttempts`. Each message is claimed (attempts + 1, next attempt pushed back) before it
 * is sent, so a crash mid-send does not send it again at once, and two delivery loops do not
 * pick the same message. Delivery is at least once: after a crash between the SMTP server's
 * acceptance and the 'sent' update, the retry sends the message again, with the same Message-ID.
 */
export async function deliverDueMail(
  db: Db,
  mailer: Mailer,
  now: Date,
  options: { maxAttempts: number; log: Logger; limit?: number; links?: LinkConfig },
) {
  const due = await db
    .select()
    .from(outbox)
    .where(and(eq(outbox.status, 'pending'), lte(outbox.nextAttemptAt, now)))
    .orderBy(asc(outbox.createdAt))
    .limit(options.limit ?? 200);
  let sent = 0;
  let failed = 0;
  for (const m of due) {
    const attempt = m.attempts + 1;
    const claimed = await db
      .update(outbox)
      .set({ attempts: attempt, nextAttemptAt: new Date(now.getTime() + retryDelayMs(attempt)) })
      .where(and(eq(outbox.id, m.id), eq(outbox.attempts, m.attempts), eq(outbox.status, 'pending')))
      .returning({ id: outbox.id });
    if (claimed.length === 0) continue;
    try {
      // The same Message-ID on every attempt: a resend after a crash between the SMTP server's
      // acceptance and the 'sent' update below is recognisable as the same message.
      await mailer.send({ to: m.toEmail, subject: m.subject, ...withUnsubscribeLink(m, options.links), messageId: `outbox.${m.id}` });
      await db.update(outbox).set({ status: 'sent', sentAt: new Date(), lastError: null }).where(eq(outbox.id, m.id));
      sent++;
    } catch (err) {
      const message = err instanceof Error ? err.message : String(err);
      const final = attempt >= options.maxAttempts;
      await db
        .update(outbox)
        .set({ lastError: message.slice(0, 500), status: final ? 'failed' : 'pending' })
        .where(eq(outbox.id, m.id));
      failed++;
      options.log.warn(`E-mail to ${m.toEmail} not sent (attempt ${attempt}${final ? ', giving up' : ''})`, { error: message });
    }
  }
  return { due: due.length, sent, failed };
}

/** What coordinators see of a message: never a recipient's unsubscribe link (older messages held one). */
const HIDDEN_LINK = '(the recipient’s own unsubscribe link)';
const hideLinks = (s: string) =>
  s.replaceAll(UNSUBSCRIBE_LINK_MARK, HIDDEN_LINK).replace(/https?:\/\/[^\s"'<>]*\/api\/unsubscribe\?[^\s"'<>]*/g, HIDDEN_LINK);

export async function listOutbox(db: Db, projectId: string, limit = 100) {
  const rows = await db.select().from(outbox).where(eq(outbox.projectId, projectId)).orderBy(desc(outbox.createdAt)).limit(limit);
  return rows.map((r) => ({ ...r, text: hideLinks(r.text), html: hideLinks(r.html) }));
}
