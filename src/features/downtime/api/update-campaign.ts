import type { CampaignResponse } from '../../../../shared/api-types-downtime';
import type { CampaignPatchInput } from '../../../../shared/schemas/downtime';
import { api } from '../../../lib/api';
import { useMutationThen } from '../../../lib/use-mutation-then';
import { campaignsQueryOptions } from './get-campaigns';

/** `PATCH /api/projects/:projectId/campaigns/:campaignId` (coordinators); `steps` replaces the list. */
export const updateCampaign = (projectId: string, campaignId: string, patch: CampaignPatchInput) =>
  api<CampaignResponse>(`/api/projects/${projectId}/campaigns/${campaignId}`, { method: 'PATCH', json: patch });

/** Saves a change; refreshes the list and the campaign's simulations (they live under the same key). */
export const useUpdateCampaign = (projectId: string) =>
  useMutationThen(
    (v: { id: string; patch: CampaignPatchInput }) => updateCampaign(projectId, v.id, v.patch),
    (qc) => qc.invalidateQueries({ queryKey: campaignsQueryOptions(projectId).queryKey }),
  );
