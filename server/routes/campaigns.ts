import { Router } from 'express';
import { z } from 'zod';
import { CampaignInput, CampaignPatchInput, OutlookQuery, StepProgressInput } from '../../shared/schemas/downtime';
import type { AppDeps } from '../deps';
import { addProjectCollection, projectRoutes } from './project-collection';
import { parseInput } from '../http/errors';
import { createCampaign, deleteCampaign, getCampaign, listCampaigns, simulateProjectCampaign, updateCampaign } from '../services/campaigns';
import { campaignOutlookAnswer, outlookHistory, setStepProgress } from '../services/campaign-outlook';

const alphaFlag = z
  .enum(['true', 'false'])
  .default('true')
  .transform((v) => v === 'true');
const SimulateQuery = z.object({ dataset: z.string().uuid('must be a dataset id').optional(), alpha: alphaFlag });

/** Campaigns (ordered operation-at-worksite steps): every member reads and simulates, coordinators edit. */
export function campaignsRoutes({ db, clock }: AppDeps): Router {
  const router = Router();
  const project = projectRoutes(router, db);

  /**
   * /api/projects/:projectId/campaigns: the project's campaigns by name; POST `{ name, steps:
   * [{ operationId, siteId }], plannedStart?, timeZone? }` → 201 with the campaign (its `id`); GET,
   * PATCH (any subset; `steps` replaced whole: add, reorder, remove) and DELETE (204) `/:campaignId`.
   */
  addProjectCollection(router, db, 'campaigns/:campaignId', {
    list: (a) => listCampaigns(db, a.projectId),
    get: (a, id) => getCampaign(db, a.projectId, id),
    body: { create: CampaignInput, update: CampaignPatchInput },
    create: (a, input) => createCampaign(db, a.projectId, input),
    update: (a, id, patch) => updateCampaign(db, a.projectId, id, patch),
    remove: (a, id) => deleteCampaign(db, a.projectId, id),
  });

  /**
   * POST /api/projects/:projectId/campaigns/:campaignId/simulate?dataset=&alpha=: for each start
   * month 1-12 (the 1st at 00:00 in the campaign's zone, every hindcast year) P50/P90 of duration
   * and waiting on weather (h), censored years, and P50/P90 finish dates from the next start date.
   */
  project.post('campaigns/:campaignId/simulate', 'member', (a, req) => {
    const q = parseInput(SimulateQuery, req.query, 'query');
    return simulateProjectCampaign(db, a.projectId, req.params.campaignId, { datasetId: q.dataset, alpha: q.alpha, now: clock() });
  });

  /**
   * PATCH /api/projects/:projectId/campaigns/:campaignId/steps/:index (coordinators, audited):
   * `{ status: 'planned' | 'started' | 'done', startedAt?, doneAt? }` for the 0-based step; 'done'
   * without `doneAt` takes the end from the confirmed ledger days when they show the step worked.
   */
  project.patch('campaigns/:campaignId/steps/:index', 'coordinator', (a, req) => {
    const input = parseInput(StepProgressInput, req.body);
    return setStepProgress(db, a.projectId, req.params.campaignId, req.params.index, input, a.user, clock());
  });

  /**
   * GET /api/projects/:projectId/campaigns/:campaignId/outlook?alpha=: from now, the remaining
   * steps on the latest forecast then each hindcast year: P10/P50/P90 finish, remaining waiting on
   * weather, each step's start, the forecast and hindcast-only parts apart.
   */
  project.get('campaigns/:campaignId/outlook', 'member', (a, req) => {
    const q = parseInput(OutlookQuery, req.query, 'query');
    return campaignOutlookAnswer(db, a.projectId, req.params.campaignId, { alpha: q.alpha, now: clock() });
  });

  /** GET /api/projects/:projectId/campaigns/:campaignId/outlook/history: `[{ at, p50, p90, forecastIssuedAt }]`, oldest first. */
  project.get('campaigns/:campaignId/outlook/history', 'member', (a, req) => outlookHistory(db, a.projectId, req.params.campaignId));

  return router;
}
