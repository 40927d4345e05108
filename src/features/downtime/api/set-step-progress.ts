import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CampaignResponse } from '../../../../shared/api-types-downtime';
import type { StepProgressInput } from '../../../../shared/schemas/downtime';
import { api } from '../../../lib/api';
import { campaignsQueryOptions } from './get-campaigns';

/** `PATCH /api/projects/:projectId/campaigns/:campaignId/steps/:index` (coordinators, audited). */
export const setStepProgress = (projectId: string, campaignId: string, index: number, input: StepProgressInput) =>
  api<CampaignResponse>(`/api/projects/${projectId}/campaigns/${campaignId}/steps/${index}`, { method: 'PATCH', json: input });

/** Marks a step; refreshes the campaigns and their outlooks (they live under the same key). */
export function useSetStepProgress(projectId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (v: { campaignId: string; index: number; input: StepProgressInput }) =>
      setStepProgress(projectId, v.campaignId, v.index, v.input),
    onSuccess: () => qc.invalidateQueries({ queryKey: campaignsQueryOptions(projectId).queryKey }),
  });
}
