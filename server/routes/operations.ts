import { Router } from 'express';
import { AlphaTableInput, OperationInput, OperationPatchInput } from '../../shared/schemas/sites';
import type { AppDeps } from '../deps';
import { addProjectCollection } from './project-collection';
import { parseInput } from '../http/errors';
import { getAlpha, resetAlpha, setAlpha } from '../services/alpha';
import { createOperation, deleteOperation, getOperation, listOperations, updateOperation } from '../services/operations';
import { requireCoordinator, requireProjectMember } from '../services/project-access';

/** Operations with their limits, and the project's alpha table: any member reads, coordinators write. */
export function operationsRoutes({ db }: AppDeps): Router {
  const router = Router();

  /**
   * /api/projects/:projectId/operations: the project's operations by name; POST a new one (201
   * with it); GET, PATCH (any subset; `limits` replaced whole) and DELETE (204) `/:operationId`.
   */
  addProjectCollection(router, db, {
    name: 'operations',
    idParam: 'operationId',
    list: (a) => listOperations(db, a.projectId),
    get: (a, id) => getOperation(db, a.projectId, id),
    create: { body: OperationInput, run: (a, input) => createOperation(db, a.projectId, a.user, input) },
    update: { body: OperationPatchInput, run: (a, id, patch) => updateOperation(db, a.projectId, a.user, id, patch) },
    remove: (a, id) => deleteOperation(db, a.projectId, a.user, id),
  });

  /** GET /api/projects/:projectId/alpha: `{ table, isDefault, note, updatedAt }`. */
  router.get('/projects/:projectId/alpha', async (req, res) => {
    const access = await requireProjectMember(db, req, req.params.projectId);
    res.json(await getAlpha(db, access.projectId));
  });

  /** PUT /api/projects/:projectId/alpha: body = the table; saves the project's own table. */
  router.put('/projects/:projectId/alpha', async (req, res) => {
    const access = await requireCoordinator(db, req, req.params.projectId);
    const table = parseInput(AlphaTableInput, req.body);
    res.json(await setAlpha(db, access.projectId, access.user, table));
  });

  /** DELETE /api/projects/:projectId/alpha: back to the default table (200 with it). */
  router.delete('/projects/:projectId/alpha', async (req, res) => {
    const access = await requireCoordinator(db, req, req.params.projectId);
    res.json(await resetAlpha(db, access.projectId, access.user));
  });

  return router;
}
