import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { CampaignSimulation } from '../../../../shared/api-types-downtime';
import { api } from '../../../lib/api';
import { campaignsQueryOptions } from './get-campaigns';

export interface SimulationParams {
  campaignId: string;
  datasetId: string;
  alpha: boolean;
}

/**
 * `POST /api/projects/:projectId/campaigns/:campaignId/simulate?dataset=&alpha=`: a read (nothing
 * is stored), so it is cached like a query, under the campaigns key: editing a campaign refreshes it.
 */
export const simulateCampaign = (projectId: string, p: SimulationParams) =>
  api<CampaignSimulation>(
    `/api/projects/${projectId}/campaigns/${p.campaignId}/simulate?${new URLSearchParams({ dataset: p.datasetId, alpha: String(p.alpha) })}`,
    {
      method: 'POST',
    },
  );

export const simulationQueryOptions = (projectId: string, p: SimulationParams) =>
  queryOptions({
    queryKey: [...campaignsQueryOptions(projectId).queryKey, p.campaignId, 'simulation', { datasetId: p.datasetId, alpha: p.alpha }],
    queryFn: () => simulateCampaign(projectId, { campaignId: p.campaignId, datasetId: p.datasetId, alpha: p.alpha }),
    staleTime: 5 * 60_000,
  });

export const useSimulation = (projectId: string, p: SimulationParams | null) =>
  useQuery({
    ...simulationQueryOptions(projectId, p ?? { campaignId: '', datasetId: '', alpha: true }),
    enabled: p !== null && p.campaignId !== '' && p.datasetId !== '',
    placeholderData: keepPreviousData,
  });
