import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CampaignResponse } from '../../../../shared/api-types-downtime';
import type { CampaignInput } from '../../../../shared/schemas/downtime';
import { api } from '../../../lib/api';
import { campaignsQueryOptions } from './get-campaigns';

/** `POST /api/projects/:projectId/campaigns` (coordinators): 201 with the campaign. */
export const createCampaign = (projectId: string, input: CampaignInput) =>
  api<CampaignResponse>(`/api/projects/${projectId}/campaigns`, { method: 'POST', json: input });

export function useCreateCampaign(projectId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CampaignInput) => createCampaign(projectId, input),
    onSuccess: () => qc.invalidateQueries({ queryKey: campaignsQueryOptions(projectId).queryKey }),
  });
}
