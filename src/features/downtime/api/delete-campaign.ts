import { api } from '../../../lib/api';
import { useMutationThen } from '../../../lib/use-mutation-then';
import { campaignsQueryOptions } from './get-campaigns';

/** `DELETE /api/projects/:projectId/campaigns/:campaignId` (coordinators). */
export const deleteCampaign = (projectId: string, campaignId: string) =>
  api<void>(`/api/projects/${projectId}/campaigns/${campaignId}`, { method: 'DELETE' });

export const useDeleteCampaign = (projectId: string) =>
  useMutationThen(
    (campaignId: string) => deleteCampaign(projectId, campaignId),
    (qc, _data, campaignId) => {
      qc.removeQueries({ queryKey: [...campaignsQueryOptions(projectId).queryKey, campaignId] });
      void qc.invalidateQueries({ queryKey: campaignsQueryOptions(projectId).queryKey });
    },
  );
