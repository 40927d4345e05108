import { Router } from 'express';
import type { AppDeps } from '../deps';
import { requireUser } from '../http/context';
import { HttpError } from '../http/errors';
import { calendarFeed, getCalendarToken, revokeCalendarToken, rotateCalendarToken } from '../services/calendar-feed';

/** The caller's calendar feed address and the token-protected feed itself. */
export function calendarRoutes(deps: AppDeps): Router {
  const { db, config } = deps;
  const router = Router();

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

  return router;
}
