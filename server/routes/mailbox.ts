import { Router } from 'express';
import type { AppDeps } from '../deps';
import { requireAdmin } from '../http/context';
import { HttpError } from '../http/errors';

/** The local mailbox's inbox (development and demo: only while no SMTP server is set). */
export function mailboxRoutes(deps: AppDeps): Router {
  const { mailer } = deps;
  const router = Router();

  /** GET /api/dev/mailbox (admins): what the local mailbox received; exists only while it is in use. */
  router.get('/dev/mailbox', (req, res) => {
    if (!mailer.fake) throw new HttpError('not_found', 'No API route GET /api/dev/mailbox');
    requireAdmin(req);
    res.json(
      [...mailer.fake.messages]
        .reverse()
        .map((m) => ({ id: m.id, to: m.to, subject: m.subject, text: m.text, html: m.html, receivedAt: m.receivedAt })),
    );
  });

  return router;
}
