import { queryOptions, useQuery } from '@tanstack/react-query';
import type { HourChainAnswer } from '../../../../shared/api-types-plan';
import type { TransformChain } from '../../../../shared/waves';
import { api } from '../../../lib/api';
import { planBaseKey } from './get-plan';

/** JSON turns NaN into null: every number of the transform chain may arrive as null. */
export type WireNumbers<T> = { [K in keyof T]: T[K] extends number ? number | null : T[K] };

/** The hour chain as it comes over the wire. */
export type HourChain = Omit<HourChainAnswer, 'transform'> & { transform: WireNumbers<TransformChain> };

export interface HourChainParams {
  projectId: string;
  operationId: string;
  siteId: string;
  /** Record start, ISO 8601 UTC. */
  time: string;
  alpha: boolean;
  datasetId?: string;
}

/** `GET /api/projects/:projectId/plan/chain`: data point → Ks, Kr, flags → worksite → each limit. */
export function getHourChain({ projectId, operationId, siteId, time, alpha, datasetId }: HourChainParams): Promise<HourChain> {
  const q = new URLSearchParams({ operationId, siteId, time, alpha: String(alpha) });
  if (datasetId) q.set('dataset', datasetId);
  return api<HourChain>(`/api/projects/${projectId}/plan/chain?${q}`);
}

export const hourChainQueryOptions = (p: HourChainParams) =>
  queryOptions({
    // Under the plan's key: a new forecast invalidates the chains with the plans.
    queryKey: [
      ...planBaseKey(p.projectId),
      'chain',
      { operationId: p.operationId, siteId: p.siteId, time: p.time, alpha: p.alpha, datasetId: p.datasetId ?? null },
    ],
    queryFn: () =>
      getHourChain({
        projectId: p.projectId,
        operationId: p.operationId,
        siteId: p.siteId,
        time: p.time,
        alpha: p.alpha,
        datasetId: p.datasetId,
      }),
    staleTime: 5 * 60_000,
  });

export const useHourChain = (p: HourChainParams | null) =>
  useQuery({
    ...hourChainQueryOptions(p ?? { projectId: '', operationId: '', siteId: '', time: '', alpha: true }),
    enabled: p !== null,
  });
