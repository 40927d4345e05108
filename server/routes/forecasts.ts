import { Router } from 'express';
import type { AppDeps } from '../deps';
import { requireCoordinator } from '../services/project-access';
import { fetchLatestForecast } from '../services/forecasts';

export function forecastsRoutes({ db, forecast }: AppDeps): Router {
  const router = Router();

  /**
   * POST /api/projects/:projectId/forecasts/fetch (coordinators): fetches the latest forecast for
   * the project's data point and stores it as a new forecast issue. 503 when the service fails;
   * the previous forecast stays.
   */
  router.post('/projects/:projectId/forecasts/fetch', async (req, res) => {
    const access = await requireCoordinator(db, req, req.params.projectId);
    const result = await fetchLatestForecast(db, forecast, access.projectId, access.user.id);
    res.status(result.isNew ? 201 : 200).json(result);
  });

  return router;
}
