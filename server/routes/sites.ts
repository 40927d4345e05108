import { Router } from 'express';
import {
  TIDE_PREVIEW_DAYS,
  TidePreviewInput,
  TideQuery,
  TideStationsQuery,
  WorksiteInput,
  WorksitePatchInput,
} from '../../shared/schemas/sites';
import type { AppDeps } from '../deps';
import { addProjectCollection } from './project-collection';
import { HttpError, parseInput } from '../http/errors';
import { requireCoordinator, requireProjectMember } from '../services/project-access';
import { createSite, deleteSite, getSite, listSites, updateSite } from '../services/sites';
import { nearbyCurrentStations, nearbyTideStations, tideAnswer } from '../services/tide';

/** Worksites: any member reads, coordinators (and administrators) write. */
export function sitesRoutes({ db, clock }: AppDeps): Router {
  const router = Router();

  /**
   * /api/projects/:projectId/sites: the project's worksites by name; POST a new one (201 with it);
   * GET, PATCH (any subset of the fields) and DELETE `/:siteId` (204; its id leaves every
   * operation's siteIds).
   */
  addProjectCollection(router, db, {
    name: 'sites',
    idParam: 'siteId',
    list: (a) => listSites(db, a.projectId),
    get: (a, id) => getSite(db, a.projectId, id),
    create: { body: WorksiteInput, run: (a, input) => createSite(db, a.projectId, a.user, input) },
    update: { body: WorksitePatchInput, run: (a, id, patch) => updateSite(db, a.projectId, a.user, id, patch) },
    remove: (a, id) => deleteSite(db, a.projectId, a.user, id),
  });

  /**
   * GET /api/projects/:projectId/sites/:siteId/tide?from=&to=: the predicted tide at the worksite
   * (levels m above chart datum, high and low waters, the station when one is used); from now to
   * 3 days on by default, at most 31 days. 404 when the worksite has no tide.
   */
  router.get('/projects/:projectId/sites/:siteId/tide', async (req, res) => {
    const access = await requireProjectMember(db, req, req.params.projectId);
    const q = parseInput(TideQuery, req.query, 'query');
    const site = await getSite(db, access.projectId, req.params.siteId);
    const fromMs = q.from ? Date.parse(q.from) : clock().getTime();
    const toMs = q.to ? Date.parse(q.to) : fromMs + 3 * 86_400_000;
    if (!(toMs > fromMs) || toMs - fromMs > 31 * 86_400_000)
      throw new HttpError('validation', 'Invalid query: to: at most 31 days after from, and after it', [
        { field: 'to', message: 'At most 31 days after from, and after it' },
      ]);
    const answer = tideAnswer(site.tide, site, fromMs, toMs);
    if (!answer) throw new HttpError('not_found', 'This worksite has no tide');
    res.json(answer);
  });

  /**
   * POST /api/projects/:projectId/tide-preview: the tide the worksite form is editing, predicted
   * for the next 3 days from `from` (default now), before it is saved; 400 naming the field for an
   * unknown constituent or station. Changes nothing.
   */
  router.post('/projects/:projectId/tide-preview', async (req, res) => {
    await requireCoordinator(db, req, req.params.projectId);
    const input = parseInput(TidePreviewInput, req.body);
    const fromMs = input.from ? Date.parse(input.from) : Math.floor(clock().getTime() / 3_600_000) * 3_600_000;
    const answer = tideAnswer(input.tide, input, fromMs, fromMs + TIDE_PREVIEW_DAYS * 86_400_000);
    if (!answer)
      throw new HttpError('validation', 'Invalid body: tide.source: choose constants or a station to preview', [
        { field: 'tide.source', message: 'Choose constants or a station to preview' },
      ]);
    res.json(answer);
  });

  /**
   * Stations of the public tide database nearest a worksite or a typed position (at most 5 within
   * 200 km), with distance, source, attribution and warnings; any member:
   * - GET /api/projects/:projectId/sites/:siteId/tide-stations and …/current-stations: near the worksite;
   * - GET /api/projects/:projectId/tide-stations?latitude=&longitude= and …/current-stations?…: near
   *   a position, for a worksite not yet saved.
   * Current stations are the reference current stations with harmonic constituents, with their
   * flood and ebb directions (docs/domain.md#tide).
   */
  for (const [path, nearby] of [
    ['tide-stations', nearbyTideStations],
    ['current-stations', nearbyCurrentStations],
  ] as const) {
    router.get(`/projects/:projectId/sites/:siteId/${path}`, async (req, res) => {
      const access = await requireProjectMember(db, req, req.params.projectId);
      const site = await getSite(db, access.projectId, req.params.siteId);
      if (site.latitude === null || site.longitude === null)
        throw new HttpError('validation', `The worksite needs a position to find ${path.replace('-', ' ')}`, [
          { field: 'latitude', message: 'Set the worksite position first' },
        ]);
      res.json({ stations: nearby(site.latitude, site.longitude) });
    });
    router.get(`/projects/:projectId/${path}`, async (req, res) => {
      await requireProjectMember(db, req, req.params.projectId);
      const q = parseInput(TideStationsQuery, req.query, 'query');
      res.json({ stations: nearby(q.latitude, q.longitude) });
    });
  }

  return router;
}
