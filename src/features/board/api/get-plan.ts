import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { PlanAnswer } from '../../../../shared/api-types-plan';
import { api } from '../../../lib/api';

export interface PlanParams {
  projectId: string;
  /** Dataset to plan on; undefined = the project's latest forecast. */
  datasetId?: string;
  /** true: Hs limits of weather-restricted operations at OPWF = alpha × OPLIM; false: at OPLIM. */
  alpha: boolean;
}

/** `GET /api/projects/:projectId/plan?dataset=&alpha=`: every operation at each of its worksites. */
export function getPlan({ projectId, datasetId, alpha }: PlanParams): Promise<PlanAnswer> {
  const q = new URLSearchParams({ alpha: String(alpha) });
  if (datasetId) q.set('dataset', datasetId);
  return api<PlanAnswer>(`/api/projects/${projectId}/plan?${q}`);
}

/** Key of every plan of a project (all datasets, with and without alpha, and the hour chains). */
export const planBaseKey = (projectId: string) => ['projects', projectId, 'plan'] as const;

export const planQueryOptions = (p: PlanParams) =>
  queryOptions({
    queryKey: [...planBaseKey(p.projectId), { datasetId: p.datasetId ?? null, alpha: p.alpha }],
    queryFn: () => getPlan({ projectId: p.projectId, datasetId: p.datasetId, alpha: p.alpha }),
    // "May start now" moves with the clock: a watch board refreshes itself.
    refetchInterval: 5 * 60_000,
  });

/** The plan; the previous answer stays on screen while the alpha toggle fetches the other one. */
export const usePlan = (p: PlanParams) => useQuery({ ...planQueryOptions(p), placeholderData: keepPreviousData });
