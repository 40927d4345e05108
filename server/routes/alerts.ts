import crypto from 'node:crypto';
import { Router } from 'express';
import { and, desc, eq } from 'drizzle-orm';
import { PlanJobInput, SubscriptionInput } from '../../shared/schemas/alerts';
import { RecurrenceInput, recurrenceText } from '../../shared/recurrence';
import type { AppDeps } from '../deps';
import type { Db } from '../db/client';
import { alert, operation } from '../db/schema';
import { requireAdmin, requireUser } from '../http/context';
import { HttpError, parseInput } from '../http/errors';
import { requireCoordinator, requireProjectMember } from '../services/project-access';
import { listOutbox } from '../services/outbox';
import { mySubscription, saveSubscription, unsubscribe } from '../services/subscriptions';
import { escapeHtml, verifyUnsubscribe } from '../services/alert-mail';
import { calendarFeed, getCalendarToken, revokeCalendarToken, rotateCalendarToken } from '../services/calendar-feed';
import { recordAudit } from '../services/audit';
import { runPlanningJob } from '../../jobs/plan-job';
import { idParam } from '../../shared/schemas/common';

// Title and body are escaped, so no caller can put markup (or a query parameter) into the page.
const page = (title: string, body: string) =>
  `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width,initial-scale=1"><title>${escapeHtml(title)}</title></head><body style="font-family:system-ui,sans-serif;max-width:520px;margin:48px auto;padding:0 16px;color:#10222c"><h1 style="font-size:22px">${escapeHtml(title)}</h1><p>${escapeHtml(body)}</p></body></html>`;

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
    const token = req.headers['x-lullwatch-job-token'];
    if (!config.jobToken || typeof token !== 'string' || token.length !== config.jobToken.length || !crypto.timingSafeEqual(Buffer.from(token), Buffer.from(config.jobToken))) {
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

  /** GET /api/unsubscribe?u=&p=&sig=: one-click unsubscribe from a signed e-mail link (no sign-in). */
  router.get('/unsubscribe', async (req, res) => {
    const u = String(req.query.u ?? '');
    const p = String(req.query.p ?? '');
    const sig = String(req.query.sig ?? '');
    if (!idParam.safeParse(p).success || !verifyUnsubscribe(config.linkSecret, u, p, sig)) {
      res.status(400).type('html').send(page('Link not valid', 'This unsubscribe link is not valid. Change your alerts in Lullwatch instead.'));
      return;
    }
    await unsubscribe(db, u, p);
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
