import { Router } from 'express';
import { AdoptCalibratedInput, CalibratedAlphaQuery, ForecastSkillQuery } from '../../shared/schemas/forecast-skill';
import type { AppDeps } from '../deps';
import { parseInput } from '../http/errors';
import { adoptCalibratedAlpha, calibratedAlpha, forecastSkill } from '../services/forecast-skill';
import { requireCoordinator, requireProjectMember } from '../services/project-access';

/**
 * Forecast skill from the project's archive and the calibrated alpha table
 * (docs/domain.md#forecast-uncertainty): every member reads, coordinators adopt.
 */
export function forecastSkillRoutes({ db }: AppDeps): Router {
  const router = Router();

  /**
   * GET /api/projects/:projectId/forecast-skill?observation=: the stored forecast issues against an
   * observation (or hindcast) dataset: `{ bins, byLead, points, pairs, issuesPaired, ... }`.
   */
  router.get('/projects/:projectId/forecast-skill', async (req, res) => {
    const access = await requireProjectMember(db, req, req.params.projectId);
    const q = parseInput(ForecastSkillQuery, req.query, 'query');
    res.json(await forecastSkill(db, access.projectId, q.observation));
  });

  /**
   * GET /api/projects/:projectId/alpha/calibrated?p=&observation=: the calibrated alpha table and its
   * inputs (p defaults to the project's, the observation to the newest observation dataset).
   */
  router.get('/projects/:projectId/alpha/calibrated', async (req, res) => {
    const access = await requireProjectMember(db, req, req.params.projectId);
    const q = parseInput(CalibratedAlphaQuery, req.query, 'query');
    res.json(await calibratedAlpha(db, access.projectId, q));
  });

  /**
   * POST /api/projects/:projectId/alpha/adopt-calibrated: body `{ p?, observation? }`; recomputes the
   * calibrated table and makes it the project's alpha table (audited with the data behind it).
   */
  router.post('/projects/:projectId/alpha/adopt-calibrated', async (req, res) => {
    const access = await requireCoordinator(db, req, req.params.projectId);
    const input = parseInput(AdoptCalibratedInput, req.body ?? {});
    res.json(await adoptCalibratedAlpha(db, access.projectId, access.user, input));
  });

  return router;
}
