import { Router } from 'express';
import { ImportQuery, ProjectSetupDocument } from '../../shared/schemas/sites';
import type { AppDeps } from '../deps';
import { parseInput } from '../http/errors';
import { requireCoordinator, requireProjectMember } from '../services/project-access';
import { exportSetup, importSetup, previewImport, setupFileName } from '../services/project-setup';

/** Export (any member) and import (coordinators) of the whole project setup as one JSON document. */
export function projectSetupRoutes({ db, clock }: AppDeps): Router {
  const router = Router();

  /** GET /api/projects/:projectId/export: the setup document as a JSON attachment. */
  router.get('/projects/:projectId/export', async (req, res) => {
    const access = await requireProjectMember(db, req, req.params.projectId);
    const doc = await exportSetup(db, access.projectId, clock());
    res.setHeader('Content-Disposition', `attachment; filename="${setupFileName(doc.project.name)}"`);
    res.setHeader('Cache-Control', 'no-store');
    res.json(doc);
  });

  /**
   * POST /api/projects/:projectId/import/preview?mode=&alphaTable=&dataPoint=: body = the setup
   * document. Everything the same import would add and remove, what happens to the alpha table
   * and the data point, and why it would be refused; writes nothing.
   */
  router.post('/projects/:projectId/import/preview', async (req, res) => {
    const access = await requireCoordinator(db, req, req.params.projectId);
    const q = parseInput(ImportQuery, req.query, 'query');
    const doc = parseInput(ProjectSetupDocument, req.body);
    res.json(await previewImport(db, access.projectId, doc, q.mode, q));
  });

  /**
   * POST /api/projects/:projectId/import?mode=merge|replace&alphaTable=keep|take&dataPoint=keep|take:
   * body = the setup document. 400 naming each bad field path; 409 in merge mode when names clash,
   * and in replace mode while the project has confirmed ledger days; nothing changes on error.
   */
  router.post('/projects/:projectId/import', async (req, res) => {
    const access = await requireCoordinator(db, req, req.params.projectId);
    const q = parseInput(ImportQuery, req.query, 'query');
    const doc = parseInput(ProjectSetupDocument, req.body);
    res.json(await importSetup(db, access.projectId, access.user, doc, q.mode, q));
  });

  return router;
}
