import type { CampaignResponse } from '../../../../shared/api-types-downtime';
import type { CampaignInput } from '../../../../shared/schemas/downtime';
import { api } from '../../../lib/api';
import { useMutationThen } from '../../../lib/use-mutation-then';
import { campaignsQueryOptions } from './get-campaigns';

/** `POST /api/projects/:projectId/campaigns` (coordinators): 201 with the campaign. */
export const createCampaign = (projectId: string, input: CampaignInput) =>
  api<CampaignResponse>(`/api/projects/${projectId}/campaigns`, { method: 'POST', json: input });

export const useCreateCampaign = (projectId: string) =>
  useMutationThen(
    (input: CampaignInput) => createCampaign(projectId, input),
    (qc) => qc.invalidateQueries({ queryKey: campaignsQueryOptions(projectId).queryKey }),
  );
