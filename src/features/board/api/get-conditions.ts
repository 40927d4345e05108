import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ConditionsAnswer } from '../../../../shared/api-types-plan';
import { api } from '../../../lib/api';

export interface ConditionsParams {
  projectId: string;
  siteId: string;
  /** undefined = the latest forecast */
  datasetId?: string;
}

/** `GET /api/projects/:projectId/conditions/:siteId?dataset=`: worksite series and the operations' limits. */
export function getConditions({ projectId, siteId, datasetId }: ConditionsParams): Promise<ConditionsAnswer> {
  const q = datasetId ? `?${new URLSearchParams({ dataset: datasetId })}` : '';
  return api<ConditionsAnswer>(`/api/projects/${projectId}/conditions/${siteId}${q}`);
}

/** Key of the conditions of every worksite of a project. */
export const conditionsBaseKey = (projectId: string) => ['projects', projectId, 'conditions'] as const;

export const conditionsQueryOptions = (p: ConditionsParams) =>
  queryOptions({
    queryKey: [...conditionsBaseKey(p.projectId), p.siteId, { datasetId: p.datasetId ?? null }],
    queryFn: () => getConditions({ projectId: p.projectId, siteId: p.siteId, datasetId: p.datasetId }),
  });

export const useConditions = (p: ConditionsParams) => useQuery(conditionsQueryOptions(p));
