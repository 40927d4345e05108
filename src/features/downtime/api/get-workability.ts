import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { WorkabilityEntry } from '../../../../shared/api-types-downtime';
import { api } from '../../../lib/api';

export interface WorkabilityParams {
  datasetId: string;
  alpha: boolean;
}

/** `GET /api/projects/:projectId/workability?dataset=&alpha=`: monthly statistics per operation and worksite. */
export const getWorkability = (projectId: string, p: WorkabilityParams) =>
  api<WorkabilityEntry[]>(
    `/api/projects/${projectId}/workability?${new URLSearchParams({ dataset: p.datasetId, alpha: String(p.alpha) })}`,
  );

export const workabilityQueryOptions = (projectId: string, p: WorkabilityParams) =>
  queryOptions({
    queryKey: ['projects', projectId, 'workability', { datasetId: p.datasetId, alpha: p.alpha }],
    queryFn: () => getWorkability(projectId, { datasetId: p.datasetId, alpha: p.alpha }),
    staleTime: 5 * 60_000,
  });

export const useWorkability = (projectId: string, p: WorkabilityParams | null) =>
  useQuery({
    ...workabilityQueryOptions(projectId, p ?? { datasetId: '', alpha: true }),
    enabled: p !== null && p.datasetId !== '',
    placeholderData: keepPreviousData,
  });
