import { Router } from 'express';
import { sql } from 'drizzle-orm';
import type { AppDeps } from '../deps';

export function healthRoutes({ db, startup }: AppDeps): Router {
  const router = Router();
  /**
   * GET /api/health: `{ ok: true }` when the database answers; `{ ok: true, demo: 'loading' }` while
   * a first start's demo sea data still load (the demo accounts already sign in).
   */
  router.get('/health', async (_req, res) => {
    try {
      await db.execute(sql`select 1`);
      res.json(startup?.demoLoading ? { ok: true, demo: 'loading' } : { ok: true });
    } catch {
      res.status(503).json({ ok: false, error: { code: 'unavailable', message: 'Database unreachable', details: null } });
    }
  });
  return router;
}
