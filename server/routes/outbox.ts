import { Router } from 'express';
import type { AppDeps } from '../deps';
import { listOutbox } from '../services/outbox';
import { requireCoordinator } from '../services/project-access';

/** The alert e-mails of a project with their delivery status. */
export function outboxRoutes(deps: AppDeps): Router {
  const { db } = deps;
  const router = Router();

  /** GET /api/projects/:projectId/outbox (coordinators): alert e-mails with their delivery status. */
  router.get('/projects/:projectId/outbox', async (req, res) => {
    const access = await requireCoordinator(db, req, req.params.projectId);
    res.json(await listOutbox(db, access.projectId));
  });

  return router;
}
