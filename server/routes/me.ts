import { Router } from 'express';
import type { AppDeps } from '../deps';
import { requireUser } from '../http/context';
import { describeMe } from '../services/users';

export function meRoutes({ db }: AppDeps): Router {
  const router = Router();
  /** GET /api/me: the signed-in user, their global role and project roles. */
  router.get('/me', async (req, res) => {
    res.json(await describeMe(db, requireUser(req)));
  });
  return router;
}
