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
import { addProjectCollection, auditedService, projectRoutes } from './project-collection';
import { HttpError, parseInput } from '../http/errors';
import { createSite, deleteSite, getSite, listSites, updateSite } from '../services/sites';
import { nearbyCurrentStations, nearbyTideStations, tideAnswer } from '../services/tide';

/** Worksites: any member reads, coordinators (and administrators) write. */
export function sitesRoutes({ db, clock }: AppDeps): Router {
  const router = Router();
  const project = projectRoutes(router, db);

  /**
   * /api/projects/:projectId/sites: the project's worksites by name; POST a new one (201 with it);
   * GET, PATCH (any subset of the fields) and DELETE `/:siteId` (204; its id leaves every
   * operation's siteIds).
   */
  addProjectCollection(router, db, 'sites/:siteId', {
    body: { create: WorksiteInput, update: WorksitePatchInput },
    ...auditedService(db, { list: listSites, get: getSite, create: createSite, update: updateSite, remove: deleteSite }),
  });

  /**
   * GET /api/projects/:projectId/sites/:siteId/tide?from=&to=: the predicted tide at the worksite
   * (levels m above chart datum, high and low waters, the station when one is used); from now to
   * 3 days on by default, at most 31 days. 404 when the worksite has no tide.
   */
  project.get('sites/:siteId/tide', 'member', async (a, req) => {
    const q = parseInput(TideQuery, req.query, 'query');
    const site = await getSite(db, a.projectId, req.params.siteId);
    const fromMs = q.from ? Date.parse(q.from) : clock().getTime();
    const toMs = q.to ? Date.parse(q.to) : fromMs + 3 * 86_400_000;
    if (!(toMs > fromMs) || toMs - fromMs > 31 * 86_400_000)
      throw new HttpError('validation', 'Invalid query: to: at most 31 days after from, and after it', [
        { field: 'to', message: 'At most 31 days after from, and after it' },
      ]);
    const answer = tideAnswer(site.tide, site, fromMs, toMs);
    if (!answer) throw new HttpError('not_found', 'This worksite has no tide');
    return answer;
  });

  /**
   * POST /api/projects/:projectId/tide-preview: the tide the worksite form is editing, predicted
   * for the next 3 days from `from` (default now), before it is saved; 400 naming the field for an
   * unknown constituent or station. Changes nothing.
   */
  project.post('tide-preview', 'coordinator', async (_a, req) => {
    const input = parseInput(TidePreviewInput, req.body);
    const fromMs = input.from ? Date.parse(input.from) : Math.floor(clock().getTime() / 3_600_000) * 3_600_000;
    const answer = tideAnswer(input.tide, input, fromMs, fromMs + TIDE_PREVIEW_DAYS * 86_400_000);
    if (!answer)
      throw new HttpError('validation', 'Invalid body: tide.source: choose constants or a station to preview', [
        { field: 'tide.source', message: 'Choose constants or a station to preview' },
      ]);
    return answer;
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
    project.get(`sites/:siteId/${path}`, 'member', async (a, req) => {
      const site = await getSite(db, a.projectId, req.params.siteId);
      if (site.latitude === null || site.longitude === null)
        throw new HttpError('validation', `The worksite needs a position to find ${path.replace('-', ' ')}`, [
          { field: 'latitude', message: 'Set the worksite position first' },
        ]);
      return { stations: nearby(site.latitude, site.longitude) };
    });
    project.get(path, 'member', async (_a, req) => {
      const q = parseInput(TideStationsQuery, req.query, 'query');
      return { stations: nearby(q.latitude, q.longitude) };
    });
  }

  return router;
}
