import { Router } from 'express';
import { AuditQuery } from '../../shared/schemas/sites';
import type { AppDeps } from '../deps';
import { parseInput } from '../http/errors';
import { listAudit } from '../services/audit';
import { requireProjectMember } from '../services/project-access';

/**
 * The audit trail, read-only: there is no route that changes or deletes an entry.
 * Readers: every member of the project (coordinators, clients and also skippers, who work under
 * the limits and may see why they changed) and administrators.
 */
export function auditRoutes({ db }: AppDeps): Router {
  const router = Router();

  /** GET /api/projects/:projectId/audit?entity=&limit=: newest first. */
  router.get('/projects/:projectId/audit', async (req, res) => {
    const access = await requireProjectMember(db, req, req.params.projectId);
    const query = parseInput(AuditQuery, req.query, 'query');
    res.json(await listAudit(db, access.projectId, query));
  });

  return router;
}
