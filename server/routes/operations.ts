import { Router } from 'express';
import { AlphaTableInput, OperationInput, OperationPatchInput } from '../../shared/schemas/sites';
import type { AppDeps } from '../deps';
import { parseInput } from '../http/errors';
import { getAlpha, resetAlpha, setAlpha } from '../services/alpha';
import { createOperation, deleteOperation, getOperation, listOperations, updateOperation } from '../services/operations';
import { requireCoordinator, requireProjectMember } from '../services/project-access';

/** Operations with their limits, and the project's alpha table: any member reads, coordinators write. */
export function operationsRoutes({ db }: AppDeps): Router {
  const router = Router();

  /** GET /api/projects/:projectId/operations: the project's operations by name. */
  router.get('/projects/:projectId/operations', async (req, res) => {
    const access = await requireProjectMember(db, req, req.params.projectId);
    res.json(await listOperations(db, access.projectId));
  });

  /** POST /api/projects/:projectId/operations: a new operation (201 with it). */
  router.post('/projects/:projectId/operations', async (req, res) => {
    const access = await requireCoordinator(db, req, req.params.projectId);
    const input = parseInput(OperationInput, req.body);
    res.status(201).json(await createOperation(db, access.projectId, access.user, input));
  });

  /** GET /api/projects/:projectId/operations/:operationId */
  router.get('/projects/:projectId/operations/:operationId', async (req, res) => {
    const access = await requireProjectMember(db, req, req.params.projectId);
    res.json(await getOperation(db, access.projectId, req.params.operationId));
  });

  /** PATCH /api/projects/:projectId/operations/:operationId: any subset; `limits` replaced whole. */
  router.patch('/projects/:projectId/operations/:operationId', async (req, res) => {
    const access = await requireCoordinator(db, req, req.params.projectId);
    const patch = parseInput(OperationPatchInput, req.body);
    res.json(await updateOperation(db, access.projectId, access.user, req.params.operationId, patch));
  });

  /** DELETE /api/projects/:projectId/operations/:operationId (204). */
  router.delete('/projects/:projectId/operations/:operationId', async (req, res) => {
    const access = await requireCoordinator(db, req, req.params.projectId);
    await deleteOperation(db, access.projectId, access.user, req.params.operationId);
    res.status(204).end();
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
