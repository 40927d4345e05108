import { Router } from 'express';
import { z } from 'zod';
import { CampaignInput, CampaignPatchInput } from '../../shared/schemas/downtime';
import type { AppDeps } from '../deps';
import { parseInput } from '../http/errors';
import { createCampaign, deleteCampaign, getCampaign, listCampaigns, simulateProjectCampaign, updateCampaign } from '../services/campaigns';
import { requireCoordinator, requireProjectMember } from '../services/project-access';

const alphaFlag = z.enum(['true', 'false']).default('true').transform((v) => v === 'true');
const SimulateQuery = z.object({ dataset: z.string().uuid('must be a dataset id').optional(), alpha: alphaFlag });

/** Campaigns (ordered operation-at-worksite steps): every member reads and simulates, coordinators edit. */
export function campaignsRoutes({ db, clock }: AppDeps): Router {
  const router = Router();

  /** GET /api/projects/:projectId/campaigns: the project's campaigns by name. */
  router.get('/projects/:projectId/campaigns', async (req, res) => {
    const access = await requireProjectMember(db, req, req.params.projectId);
    res.json(await listCampaigns(db, access.projectId));
  });

  /** POST /api/projects/:projectId/campaigns: `{ name, steps: [{ operationId, siteId }], plannedStart?, timeZone? }` → 201 with the campaign (its `id`). */
  router.post('/projects/:projectId/campaigns', async (req, res) => {
    const access = await requireCoordinator(db, req, req.params.projectId);
    const input = parseInput(CampaignInput, req.body);
    res.status(201).json(await createCampaign(db, access.projectId, input));
  });

  /** GET /api/projects/:projectId/campaigns/:campaignId */
  router.get('/projects/:projectId/campaigns/:campaignId', async (req, res) => {
    const access = await requireProjectMember(db, req, req.params.projectId);
    res.json(await getCampaign(db, access.projectId, req.params.campaignId));
  });

  /** PATCH /api/projects/:projectId/campaigns/:campaignId: any subset; `steps` replaced whole (add, reorder, remove). */
  router.patch('/projects/:projectId/campaigns/:campaignId', async (req, res) => {
    const access = await requireCoordinator(db, req, req.params.projectId);
    const patch = parseInput(CampaignPatchInput, req.body);
    res.json(await updateCampaign(db, access.projectId, req.params.campaignId, patch));
  });

  /** DELETE /api/projects/:projectId/campaigns/:campaignId (204). */
  router.delete('/projects/:projectId/campaigns/:campaignId', async (req, res) => {
    const access = await requireCoordinator(db, req, req.params.projectId);
    await deleteCampaign(db, access.projectId, req.params.campaignId);
    res.status(204).end();
  });

  /**
   * POST /api/projects/:projectId/campaigns/:campaignId/simulate?dataset=&alpha=: for each start
   * month 1-12 (the 1st at 00:00 in the campaign's zone, every hindcast year) P50/P90 of duration
   * and waiting on weather (h), censored years, and P50/P90 finish dates from the next start date.
   */
  router.post('/projects/:projectId/campaigns/:campaignId/simulate', async (req, res) => {
    const access = await requireProjectMember(db, req, req.params.projectId);
    const q = parseInput(SimulateQuery, req.query, 'query');
    res.json(await simulateProjectCampaign(db, access.projectId, req.params.campaignId, { datasetId: q.dataset, alpha: q.alpha, now: clock() }));
  });

  return router;
}
