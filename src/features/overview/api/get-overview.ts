import { queryOptions, useQuery } from '@tanstack/react-query';
import type { OverviewAnswer } from '../../../../shared/api-types-overview';
import { api } from '../../../lib/api';

/** `GET /api/projects/:projectId/overview?alpha=`: today's picture for the caller's role. */
export const getOverview = (projectId: string, alpha = true) => api<OverviewAnswer>(`/api/projects/${projectId}/overview?alpha=${alpha}`);

export const overviewQueryOptions = (projectId: string, alpha = true) =>
  queryOptions({
    queryKey: ['projects', projectId, 'overview', { alpha }],
    queryFn: () => getOverview(projectId, alpha),
    // "May start now" moves with the clock.
    refetchInterval: 5 * 60_000,
  });

export const useOverview = (projectId: string, alpha = true) => useQuery(overviewQueryOptions(projectId, alpha));
