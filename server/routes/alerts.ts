import { Router, type Response } from 'express';
import { and, desc, eq } from 'drizzle-orm';
import { PlanJobInput, SubscriptionInput } from '../../shared/schemas/alerts';
import { RecurrenceInput, recurrenceStartProblem, recurrenceText } from '../../shared/recurrence';
import type { AppDeps } from '../deps';
import type { Db } from '../db/client';
import { alert, operation } from '../db/schema';
import { requireAdmin, requireUser } from '../http/context';
import { HttpError, parseInput } from '../http/errors';
import { sameSecret } from '../http/same-secret';
import { requireCoordinator, requireProjectMember } from '../services/project-access';
import { listOutbox } from '../services/outbox';
import { mySubscription, saveSubscription, unsubscribe } from '../services/subscriptions';
import { escapeHtml, verifyUnsubscribe } from '../services/alert-mail';
import { calendarFeed, getCalendarToken, revokeCalendarToken, rotateCalendarToken } from '../services/calendar-feed';
import { recordAudit } from '../services/audit';
import { runPlanningJob } from '../../jobs/plan-job';
import { idParam } from '../../shared/schemas/common';

// Title and body are escaped, so no caller can put markup (or a query parameter) into the page;
// `trusted` is markup built here with its own values escaped.
const page = (title: string, body: string, trusted = '') =>
  `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width,initial-scale=1"><title>${escapeHtml(title)}</title></head><body style="font-family:system-ui,sans-serif;max-width:520px;margin:48px auto;padding:0 16px;color:#10222c"><h1 style="font-size:22px">${escapeHtml(title)}</h1><p>${escapeHtml(body)}</p>${trusted}</body></html>`;

export function alertRoutes(deps: AppDeps): Router {
  const { db, config, mailer } = deps;
  const router = Router();

  /** POST /api/admin/jobs/plan `{ projectId? }` (admins): runs the planning job now; answers what it planned and queued. */
  router.post('/admin/jobs/plan', async (req, res) => {
    requireAdmin(req);
    const input = parseInput(PlanJobInput, req.body ?? {});
    res.json(await runPlanningJob(deps, { projectId: input.projectId, trigger: 'manual' }));
  });

  /**
   * POST /api/internal/jobs/plan with header x-lullwatch-job-token: how `npm run plan:once` asks
   * the running server to plan, since only one process may open the embedded database.
   */
  router.post('/internal/jobs/plan', async (req, res) => {
    if (!sameSecret(req.headers['x-lullwatch-job-token'], config.jobToken)) {
      throw new HttpError('not_found', 'No API route POST /api/internal/jobs/plan');
    }
    const input = parseInput(PlanJobInput, req.body ?? {});
    res.json(await runPlanningJob(deps, { projectId: input.projectId, trigger: 'cli' }));
  });

  /** POST /api/projects/:projectId/replan (coordinators): "Re-plan now" for one project. */
  router.post('/projects/:projectId/replan', async (req, res) => {
    const access = await requireCoordinator(db, req, req.params.projectId);
    res.json(await runPlanningJob(deps, { projectId: access.projectId, trigger: 'manual' }));
  });

  /** GET /api/projects/:projectId/alerts?limit=: the latest alerts of the planning job (members). */
  router.get('/projects/:projectId/alerts', async (req, res) => {
    const access = await requireProjectMember(db, req, req.params.projectId);
    const limit = Math.min(500, Math.max(1, Number(req.query.limit) || 100));
    res.json(await db.select().from(alert).where(eq(alert.projectId, access.projectId)).orderBy(desc(alert.createdAt)).limit(limit));
  });

  /** GET /api/projects/:projectId/outbox (coordinators): alert e-mails with their delivery status. */
  router.get('/projects/:projectId/outbox', async (req, res) => {
    const access = await requireCoordinator(db, req, req.params.projectId);
    res.json(await listOutbox(db, access.projectId));
  });

  /** GET /api/projects/:projectId/subscription: what the caller hears about in this project. */
  router.get('/projects/:projectId/subscription', async (req, res) => {
    const access = await requireProjectMember(db, req, req.params.projectId);
    const sub = await mySubscription(db, access.user.id, access.projectId);
    res.json(sub ?? { operationIds: [], siteIds: [], immediate: false, digest: false, digestTime: '06:00', digestTimeZone: 'UTC', active: false, outlookMoveDays: null, stored: false });
  });

  /** PUT /api/projects/:projectId/subscription: choose operations, worksites, immediate alerts and/or a daily digest. */
  router.put('/projects/:projectId/subscription', async (req, res) => {
    const access = await requireProjectMember(db, req, req.params.projectId);
    const input = parseInput(SubscriptionInput, req.body);
    await saveSubscription(db, access.user.id, access.projectId, input);
    res.json(await mySubscription(db, access.user.id, access.projectId));
  });

  // ------------------------------------------------------------------------------------------
  // One-click unsubscribe (RFC 8058), kept together so they can move with the alert routes.
  // The link in an e-mail (and its List-Unsubscribe header) is /api/unsubscribe?u=&p=&e=&sig=:
  // HMAC over the user, the project and the expiry `e` (Unix seconds, 60 days after sending).
  // - POST (what mail programs send, body "List-Unsubscribe=One-Click", and what the page's button
  //   sends) unsubscribes.
  // - GET (and HEAD: a link scanner or a preview that fetches the link) only shows a page with that
  //   button, so following or prefetching the link changes nothing.
  // ------------------------------------------------------------------------------------------

  /** The link's parameters checked: the user and project, or why the link is refused. */
  function unsubscribeLink(query: Record<string, unknown>): { u: string; p: string } | 'invalid' | 'expired' {
    const u = String(query.u ?? '');
    const p = String(query.p ?? '');
    if (!idParam.safeParse(p).success || u.length > 200) return 'invalid';
    const verdict = verifyUnsubscribe(config.linkSecret, u, p, String(query.e ?? ''), String(query.sig ?? ''), deps.clock().getTime());
    return verdict === 'ok' ? { u, p } : verdict;
  }

  function refuseLink(res: Response, verdict: 'invalid' | 'expired') {
    const body =
      verdict === 'expired'
        ? 'This unsubscribe link has expired. Change your alerts on the Alerts page in Lullwatch instead.'
        : 'This unsubscribe link is not valid. Change your alerts on the Alerts page in Lullwatch instead.';
    res.status(400).type('html').send(page(verdict === 'expired' ? 'Link expired' : 'Link not valid', body));
  }

  /** GET /api/unsubscribe?u=&p=&e=&sig=: a confirmation page (no sign-in); nothing changes until its button is pressed. */
  router.get('/unsubscribe', (req, res) => {
    const link = unsubscribeLink(req.query);
    if (typeof link === 'string') return refuseLink(res, link);
    const action = `/api/unsubscribe?${new URLSearchParams({ u: link.u, p: link.p, e: String(req.query.e), sig: String(req.query.sig) })}`;
    res.type('html').send(
      page(
        'Stop alert e-mails?',
        'Press the button to stop alert e-mails and digests for this project. You can turn them on again on the Alerts page.',
        `<form method="post" action="${escapeHtml(action)}"><input type="hidden" name="List-Unsubscribe" value="One-Click"><button type="submit" style="font-size:16px;padding:10px 16px;min-height:44px">Stop these e-mails</button></form>`,
      ),
    );
  });

  /** POST /api/unsubscribe?u=&p=&e=&sig=: RFC 8058 one-click unsubscribe (no sign-in). */
  router.post('/unsubscribe', async (req, res) => {
    const link = unsubscribeLink(req.query);
    if (typeof link === 'string') return refuseLink(res, link);
    await unsubscribe(db, link.u, link.p);
    res.type('html').send(page('Unsubscribed', 'You will get no more alert e-mails for this project. You can turn them on again on the Alerts page.'));
  });

  /** GET /api/dev/mailbox (admins): what the local mail catcher received; exists only while it is in use. */
  router.get('/dev/mailbox', (req, res) => {
    if (!mailer.fake) throw new HttpError('not_found', 'No API route GET /api/dev/mailbox');
    requireAdmin(req);
    res.json(
      [...mailer.fake.messages].reverse().map((m) => ({ id: m.id, to: m.to, subject: m.subject, text: m.text, html: m.html, receivedAt: m.receivedAt })),
    );
  });

  /** GET /api/me/calendar: the caller's calendar feed address, or null. */
  router.get('/me/calendar', async (req, res) => {
    const me = requireUser(req);
    const token = await getCalendarToken(db, me.id);
    res.json({ url: token ? `${config.baseUrl}/api/calendar/${token}.ics` : null });
  });

  /** POST /api/me/calendar: creates (or replaces) the feed address; the old one stops working. */
  router.post('/me/calendar', async (req, res) => {
    const me = requireUser(req);
    const token = await rotateCalendarToken(db, me.id);
    res.status(201).json({ url: `${config.baseUrl}/api/calendar/${token}.ics` });
  });

  /** DELETE /api/me/calendar: revokes the feed address. */
  router.delete('/me/calendar', async (req, res) => {
    await revokeCalendarToken(db, requireUser(req).id);
    res.status(204).end();
  });

  /** GET /api/calendar/:token.ics: the token-protected iCalendar feed (no sign-in; phones subscribe to it). */
  router.get('/calendar/:file', async (req, res) => {
    const token = req.params.file.replace(/\.ics$/, '');
    const ics = /^[A-Za-z0-9_-]{20,64}$/.test(token) ? await calendarFeed(db, token, deps.clock()) : null;
    if (!ics) throw new HttpError('not_found', 'Calendar feed not found');
    res.setHeader('content-type', 'text/calendar; charset=utf-8');
    res.send(ics);
  });

  /** PUT /api/projects/:projectId/operations/:operationId/recurrence `{ start, timeZone, rule }` (coordinators); DELETE removes it. */
  router.put('/projects/:projectId/operations/:operationId/recurrence', async (req, res) => {
    const access = await requireCoordinator(db, req, req.params.projectId);
    const input = parseInput(RecurrenceInput, req.body);
    const startProblem = recurrenceStartProblem(input, deps.clock().getTime());
    if (startProblem) throw new HttpError('validation', `Invalid body: start: ${startProblem}`, [{ field: 'start', message: startProblem }]);
    const op = await findOperation(access.projectId, req.params.operationId);
    const value = { ...input, text: recurrenceText(input) };
    await db.transaction(async (tx) => {
      await tx.update(operation).set({ recurrence: value, updatedAt: new Date() }).where(eq(operation.id, op.id));
      await recordAudit(tx as unknown as Db, { projectId: access.projectId, user: access.user, entity: 'operation', entityId: op.id, entityName: op.name, action: 'update', before: { recurrence: op.recurrence }, after: { recurrence: value } });
    });
    res.json(value);
  });

  router.delete('/projects/:projectId/operations/:operationId/recurrence', async (req, res) => {
    const access = await requireCoordinator(db, req, req.params.projectId);
    const op = await findOperation(access.projectId, req.params.operationId);
    await db.transaction(async (tx) => {
      await tx.update(operation).set({ recurrence: null, updatedAt: new Date() }).where(eq(operation.id, op.id));
      await recordAudit(tx as unknown as Db, { projectId: access.projectId, user: access.user, entity: 'operation', entityId: op.id, entityName: op.name, action: 'update', before: { recurrence: op.recurrence }, after: { recurrence: null } });
    });
    res.status(204).end();
  });

  async function findOperation(projectId: string, operationId: string) {
    if (!idParam.safeParse(operationId).success) throw new HttpError('not_found', 'Operation not found');
    const [op] = await db.select().from(operation).where(and(eq(operation.id, operationId), eq(operation.projectId, projectId)));
    if (!op) throw new HttpError('not_found', 'Operation not found');
    return op;
  }

  return router;
}
