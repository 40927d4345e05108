import { Router } from 'express';
import { PlanJobInput } from '../../shared/schemas/alerts';
import type { AppDeps } from '../deps';
import { requireAdmin } from '../http/context';
import { HttpError, parseInput } from '../http/errors';
import { sameSecret } from '../http/same-secret';
import { requireCoordinator } from '../services/project-access';
import { runPlanningJob } from '../services/planning';

/** Triggers of the planning job: an administrator, `npm run plan:once`, a coordinator's "Re-plan now". */
export function planJobRoutes(deps: AppDeps): Router {
  const { db, config } = deps;
  const router = Router();

  /** POST /api/admin/jobs/plan `{ projectId? }` (admins): runs the planning job now; answers what it planned and queued. */
  router.post('/admin/jobs/plan', async (req, res) => {
    requireAdmin(req);
    const input = parseInput(PlanJobInput, req.body ?? {});
    res.json(await runPlanningJob(deps, { projectId: input.projectId, trigger: 'manual' }));
  });

  /**
   * POST /api/internal/jobs/plan with header x-lullwatch-job-token: how `npm run plan:once` asks
   * the running server to plan, since only one process may open the embedded database.
   */
  router.post('/internal/jobs/plan', async (req, res) => {
    if (!sameSecret(req.headers['x-lullwatch-job-token'], config.jobToken)) {
      throw new HttpError('not_found', 'No API route POST /api/internal/jobs/plan');
    }
    const input = parseInput(PlanJobInput, req.body ?? {});
    res.json(await runPlanningJob(deps, { projectId: input.projectId, trigger: 'cli' }));
  });

  /** POST /api/projects/:projectId/replan (coordinators): "Re-plan now" for one project. */
  router.post('/projects/:projectId/replan', async (req, res) => {
    const access = await requireCoordinator(db, req, req.params.projectId);
    res.json(await runPlanningJob(deps, { projectId: access.projectId, trigger: 'manual' }));
  });

  return router;
}
