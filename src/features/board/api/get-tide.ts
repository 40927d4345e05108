import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import type { TideAnswer } from '../../../../shared/api-types-sites';

export type { TideAnswer };

export interface TideParams {
  projectId: string;
  siteId: string;
  from: string;
  to: string;
}

/** The predicted tide at a worksite (GET …/sites/:siteId/tide; docs/domain.md#tide). */
export function getTide({ projectId, siteId, from, to }: TideParams): Promise<TideAnswer> {
  return api<TideAnswer>(`/api/projects/${projectId}/sites/${siteId}/tide?${new URLSearchParams({ from, to })}`);
}

export const tideQueryOptions = (p: TideParams) =>
  queryOptions({
    queryKey: ['projects', p.projectId, 'tide', p.siteId, { from: p.from, to: p.to }],
    queryFn: () => getTide({ projectId: p.projectId, siteId: p.siteId, from: p.from, to: p.to }),
    staleTime: 60 * 60_000,
  });

export const useTide = (p: TideParams, enabled = true) => useQuery({ ...tideQueryOptions(p), enabled });
