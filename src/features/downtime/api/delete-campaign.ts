import { useDeleteRow } from '../../../lib/use-delete-row';
import { campaignsQueryOptions } from './get-campaigns';

/** `DELETE /api/projects/:projectId/campaigns/:campaignId` (coordinators). */
export function useDeleteCampaign(projectId: string) {
  const list = campaignsQueryOptions(projectId).queryKey;
  return useDeleteRow((campaignId) => `/api/projects/${projectId}/campaigns/${campaignId}`, {
    list,
    row: (campaignId) => [...list, campaignId],
  });
}
