import { Router } from 'express';
import { desc, eq } from 'drizzle-orm';
import type { AppDeps } from '../deps';
import { alert } from '../db/schema';
import { requireProjectMember } from '../services/project-access';

/** The alerts the planning job wrote for a project. */
export function alertRoutes(deps: AppDeps): Router {
  const { db } = deps;
  const router = Router();

  /** GET /api/projects/:projectId/alerts?limit=: the latest alerts of the planning job (members). */
  router.get('/projects/:projectId/alerts', async (req, res) => {
    const access = await requireProjectMember(db, req, req.params.projectId);
    const limit = Math.min(500, Math.max(1, Number(req.query.limit) || 100));
    res.json(await db.select().from(alert).where(eq(alert.projectId, access.projectId)).orderBy(desc(alert.createdAt)).limit(limit));
  });

  return router;
}
