import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CampaignResponse } from '../../../../shared/api-types-downtime';
import { api } from '../../../lib/api';

/** `GET /api/projects/:projectId/campaigns`: the project's campaigns by name. */
export const getCampaigns = (projectId: string) => api<CampaignResponse[]>(`/api/projects/${projectId}/campaigns`);

/** Owner key of everything under a project's campaigns (list and simulations). */
export const campaignsQueryOptions = (projectId: string) =>
  queryOptions({ queryKey: ['projects', projectId, 'campaigns'], queryFn: () => getCampaigns(projectId) });

export const useCampaigns = (projectId: string) => useQuery(campaignsQueryOptions(projectId));
