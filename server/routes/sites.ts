import { Router } from 'express';
import { WorksiteInput, WorksitePatchInput } from '../../shared/schemas/sites';
import type { AppDeps } from '../deps';
import { parseInput } from '../http/errors';
import { requireCoordinator, requireProjectMember } from '../services/project-access';
import { createSite, deleteSite, getSite, listSites, updateSite } from '../services/sites';

/** Worksites: any member reads, coordinators (and administrators) write. */
export function sitesRoutes({ db }: AppDeps): Router {
  const router = Router();

  /** GET /api/projects/:projectId/sites: the project's worksites by name. */
  router.get('/projects/:projectId/sites', async (req, res) => {
    const access = await requireProjectMember(db, req, req.params.projectId);
    res.json(await listSites(db, access.projectId));
  });

  /** POST /api/projects/:projectId/sites: a new worksite (201 with it). */
  router.post('/projects/:projectId/sites', async (req, res) => {
    const access = await requireCoordinator(db, req, req.params.projectId);
    const input = parseInput(WorksiteInput, req.body);
    res.status(201).json(await createSite(db, access.projectId, access.user, input));
  });

  /** GET /api/projects/:projectId/sites/:siteId */
  router.get('/projects/:projectId/sites/:siteId', async (req, res) => {
    const access = await requireProjectMember(db, req, req.params.projectId);
    res.json(await getSite(db, access.projectId, req.params.siteId));
  });

  /** PATCH /api/projects/:projectId/sites/:siteId: any subset of the fields. */
  router.patch('/projects/:projectId/sites/:siteId', async (req, res) => {
    const access = await requireCoordinator(db, req, req.params.projectId);
    const patch = parseInput(WorksitePatchInput, req.body);
    res.json(await updateSite(db, access.projectId, access.user, req.params.siteId, patch));
  });

  /** DELETE /api/projects/:projectId/sites/:siteId (204); its id leaves every operation's siteIds. */
  router.delete('/projects/:projectId/sites/:siteId', async (req, res) => {
    const access = await requireCoordinator(db, req, req.params.projectId);
    await deleteSite(db, access.projectId, access.user, req.params.siteId);
    res.status(204).end();
  });

  return router;
}
