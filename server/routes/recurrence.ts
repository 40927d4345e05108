import { Router } from 'express';
import { RecurrenceInput, recurrenceStartProblem } from '../../shared/recurrence';
import type { AppDeps } from '../deps';
import { HttpError, parseInput } from '../http/errors';
import { setOperationRecurrence } from '../services/operations';
import { requireCoordinator } from '../services/project-access';

/** An operation's recurrence rule (recurring operations are planned occurrence by occurrence). */
export function recurrenceRoutes(deps: AppDeps): Router {
  const { db } = deps;
  const router = Router();

  /** PUT /api/projects/:projectId/operations/:operationId/recurrence `{ start, timeZone, rule }` (coordinators). */
  router.put('/projects/:projectId/operations/:operationId/recurrence', async (req, res) => {
    const access = await requireCoordinator(db, req, req.params.projectId);
    const input = parseInput(RecurrenceInput, req.body);
    const startProblem = recurrenceStartProblem(input, deps.clock().getTime());
    if (startProblem)
      throw new HttpError('validation', `Invalid body: start: ${startProblem}`, [{ field: 'start', message: startProblem }]);
    res.json(await setOperationRecurrence(db, access.projectId, access.user, req.params.operationId, input));
  });

  /** DELETE /api/projects/:projectId/operations/:operationId/recurrence (coordinators): removes it. */
  router.delete('/projects/:projectId/operations/:operationId/recurrence', async (req, res) => {
    const access = await requireCoordinator(db, req, req.params.projectId);
    await setOperationRecurrence(db, access.projectId, access.user, req.params.operationId, null);
    res.status(204).end();
  });

  return router;
}
