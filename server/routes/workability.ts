import { Router } from 'express';
import { z } from 'zod';
import type { AppDeps } from '../deps';
import { parseInput } from '../http/errors';
import { requireProjectMember } from '../services/project-access';
import { projectWorkability, projectWorkabilityJson, workabilityCsv } from '../services/workability';

const alphaFlag = z
  .enum(['true', 'false'])
  .default('true')
  .transform((v) => v === 'true');
const WorkabilityQuery = z.object({ dataset: z.string().uuid('must be a dataset id').optional(), alpha: alphaFlag });

/** Hindcast workability statistics: every member reads. */
export function workabilityRoutes({ db }: AppDeps): Router {
  const router = Router();

  /**
   * GET /api/projects/:projectId/workability?dataset=&alpha=true|false: per operation at each of its
   * worksites, per calendar month (worksite time zone) and per year-month: workability, go-start
   * share, waiting on weather (mean, P90, censored), usable windows per month and their mean length.
   * Shares 0-1, hours in h. Default dataset: the project's newest hindcast ([] without one).
   * Cached by dataset and limits version; the dataset used is in the `X-Dataset-Id` header.
   */
  router.get('/projects/:projectId/workability', async (req, res) => {
    const access = await requireProjectMember(db, req, req.params.projectId);
    const q = parseInput(WorkabilityQuery, req.query, 'query');
    const result = await projectWorkabilityJson(db, access.projectId, { datasetId: q.dataset, alpha: q.alpha });
    if (result.datasetId) res.setHeader('x-dataset-id', result.datasetId);
    res.type('application/json').send(result.body);
  });

  /** GET /api/projects/:projectId/workability.csv?dataset=&alpha=: the same statistics as one flat CSV table. */
  router.get('/projects/:projectId/workability.csv', async (req, res) => {
    const access = await requireProjectMember(db, req, req.params.projectId);
    const q = parseInput(WorkabilityQuery, req.query, 'query');
    const result = await projectWorkability(db, access.projectId, { datasetId: q.dataset, alpha: q.alpha });
    res.setHeader('content-type', 'text/csv; charset=utf-8');
    res.setHeader('content-disposition', `attachment; filename="workability-${q.alpha ? 'alpha' : 'oplim'}.csv"`);
    res.send(workabilityCsv(result, q.alpha));
  });

  return router;
}
