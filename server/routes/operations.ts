import { Router } from 'express';
import { AlphaTableInput, OperationInput, OperationPatchInput } from '../../shared/schemas/sites';
import type { AppDeps } from '../deps';
import { addProjectCollection, auditedService, projectRoutes } from './project-collection';
import { parseInput } from '../http/errors';
import { getAlpha, resetAlpha, setAlpha } from '../services/alpha';
import { createOperation, deleteOperation, getOperation, listOperations, updateOperation } from '../services/operations';

/** Operations with their limits, and the project's alpha table: any member reads, coordinators write. */
export function operationsRoutes({ db }: AppDeps): Router {
  const router = Router();
  const project = projectRoutes(router, db);

  /**
   * /api/projects/:projectId/operations: the project's operations by name; POST a new one (201
   * with it); GET, PATCH (any subset; `limits` replaced whole) and DELETE (204) `/:operationId`.
   */
  addProjectCollection(router, db, 'operations/:operationId', {
    body: { create: OperationInput, update: OperationPatchInput },
    ...auditedService(db, {
      list: listOperations,
      get: getOperation,
      create: createOperation,
      update: updateOperation,
      remove: deleteOperation,
    }),
  });

  /** GET /api/projects/:projectId/alpha: `{ table, isDefault, note, updatedAt }`. */
  project.get('alpha', 'member', (a) => getAlpha(db, a.projectId));

  /** PUT /api/projects/:projectId/alpha: body = the table; saves the project's own table. */
  project.put('alpha', 'coordinator', (a, req) => setAlpha(db, a.projectId, a.user, parseInput(AlphaTableInput, req.body)));

  /** DELETE /api/projects/:projectId/alpha: back to the default table (200 with it). */
  project.delete('alpha', 'coordinator', (a) => resetAlpha(db, a.projectId, a.user));

  return router;
}
