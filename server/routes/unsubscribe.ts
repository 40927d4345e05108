import { Router, type Response } from 'express';
import { idParam } from '../../shared/schemas/common';
import type { AppDeps } from '../deps';
import { verifyUnsubscribe } from '../services/alert-mail';
import { unsubscribe } from '../services/subscriptions';
import { unsubscribePage as page } from './unsubscribe-page';

/**
 * One-click unsubscribe (RFC 8058) behind the signed link of every alert and digest e-mail.
 * The link (and its List-Unsubscribe header) is /api/unsubscribe?u=&p=&e=&sig=: HMAC over the user,
 * the project and the expiry `e` (Unix seconds, 60 days after sending).
 * - POST (what mail programs send, body "List-Unsubscribe=One-Click", and what the page's button
 *   sends) unsubscribes.
 * - GET (and HEAD: a link scanner or a preview that fetches the link) only shows a page with that
 *   button, so following or prefetching the link changes nothing.
 */
export function unsubscribeRoutes(deps: AppDeps): Router {
  const { db, config } = deps;
  const router = Router();

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
    res
      .status(400)
      .type('html')
      .send(page(verdict === 'expired' ? 'Link expired' : 'Link not valid', body));
  }

  /** GET /api/unsubscribe?u=&p=&e=&sig=: a confirmation page (no sign-in); nothing changes until its button is pressed. */
  router.get('/unsubscribe', (req, res) => {
    const link = unsubscribeLink(req.query);
    if (typeof link === 'string') return refuseLink(res, link);
    const action = `/api/unsubscribe?${new URLSearchParams({ u: link.u, p: link.p, e: String(req.query.e), sig: String(req.query.sig) })}`;
    res
      .type('html')
      .send(
        page(
          'Stop alert e-mails?',
          'Press the button to stop alert e-mails and digests for this project. You can turn them on again on the Alerts page.',
          action,
        ),
      );
  });

  /** POST /api/unsubscribe?u=&p=&e=&sig=: RFC 8058 one-click unsubscribe (no sign-in). */
  router.post('/unsubscribe', async (req, res) => {
    const link = unsubscribeLink(req.query);
    if (typeof link === 'string') return refuseLink(res, link);
    await unsubscribe(db, link.u, link.p);
    res
      .type('html')
      .send(page('Unsubscribed', 'You will get no more alert e-mails for this project. You can turn them on again on the Alerts page.'));
  });

  return router;
}
