import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CampaignResponse } from '../../../../shared/api-types-downtime';
import type { CampaignPatchInput } from '../../../../shared/schemas/downtime';
import { api } from '../../../lib/api';
import { campaignsQueryOptions } from './get-campaigns';

/** `PATCH /api/projects/:projectId/campaigns/:campaignId` (coordinators); `steps` replaces the list. */
export const updateCampaign = (projectId: string, campaignId: string, patch: CampaignPatchInput) =>
  api<CampaignResponse>(`/api/projects/${projectId}/campaigns/${campaignId}`, { method: 'PATCH', json: patch });

/** Saves a change; refreshes the list and the campaign's simulations (they live under the same key). */
export function useUpdateCampaign(projectId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (v: { id: string; patch: CampaignPatchInput }) => updateCampaign(projectId, v.id, v.patch),
    onSuccess: () => qc.invalidateQueries({ queryKey: campaignsQueryOptions(projectId).queryKey }),
  });
}
