import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { campaignsQueryOptions } from './get-campaigns';

/** `DELETE /api/projects/:projectId/campaigns/:campaignId` (coordinators). */
export const deleteCampaign = (projectId: string, campaignId: string) =>
  api<void>(`/api/projects/${projectId}/campaigns/${campaignId}`, { method: 'DELETE' });

export function useDeleteCampaign(projectId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (campaignId: string) => deleteCampaign(projectId, campaignId),
    onSuccess: (_data, campaignId) => {
      qc.removeQueries({ queryKey: [...campaignsQueryOptions(projectId).queryKey, campaignId] });
      void qc.invalidateQueries({ queryKey: campaignsQueryOptions(projectId).queryKey });
    },
  });
}
