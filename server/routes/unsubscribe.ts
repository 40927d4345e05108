import { Router } from 'express';
import { idParam } from '../../shared/schemas/common';
import type { AppDeps } from '../deps';
import { escapeHtml, verifyUnsubscribe } from '../services/alert-mail';
import { unsubscribe } from '../services/subscriptions';

// Title and body are escaped, so no caller can put markup (or a query parameter) into the page.
const page = (title: string, body: string) =>
  `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width,initial-scale=1"><title>${escapeHtml(title)}</title></head><body style="font-family:system-ui,sans-serif;max-width:520px;margin:48px auto;padding:0 16px;color:#10222c"><h1 style="font-size:22px">${escapeHtml(title)}</h1><p>${escapeHtml(body)}</p></body></html>`;

/** The one-click unsubscribe page behind the signed link of every alert and digest e-mail. */
export function unsubscribeRoutes(deps: AppDeps): Router {
  const { db, config } = deps;
  const router = Router();

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

  return router;
}
