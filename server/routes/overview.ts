import { Router } from 'express';
import type { AppDeps } from '../deps';
import { parseInput } from '../http/errors';
import { requireUser } from '../http/context';
import { requireProjectMember } from '../services/project-access';
import { projectOverview } from '../services/overview';
import { OverviewQuery } from '../../shared/schemas/overview';
import type { MapStyleAnswer } from '../../shared/api-types-overview';

/** The project Overview and the map's tile style. */
export function overviewRoutes({ db, clock, config }: AppDeps): Router {
  const router = Router();

  /**
   * GET /api/projects/:projectId/overview?alpha=: per operation and worksite one line (may start
   * now, next go-start and its window, limiting factor, the next 48 h), the forecast's age, the
   * latest plan run's changes; coordinators also the ledger days waiting, failed e-mails and
   * datasets with warnings; clients and coordinators this month's confirmed downtime against P50/P90.
   */
  router.get('/projects/:projectId/overview', async (req, res) => {
    const access = await requireProjectMember(db, req, req.params.projectId);
    const q = parseInput(OverviewQuery, req.query, 'query');
    res.json(await projectOverview(db, access.projectId, { userId: access.user.id, role: access.role }, { now: clock(), alpha: q.alpha }));
  });

  /** GET /api/map-style (signed in): the tile style set by MAP_STYLE_URL and its attribution; nulls = the built-in coastline. */
  router.get('/map-style', (req, res) => {
    requireUser(req);
    const answer: MapStyleAnswer = { styleUrl: config.mapStyleUrl ?? null, attribution: config.mapAttribution ?? null };
    res.json(answer);
  });

  return router;
}
