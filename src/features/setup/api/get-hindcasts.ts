import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DatasetSummary } from '../../../../shared/api-types-datasets';
import { api } from '../../../lib/api';

/**
 * `GET /api/projects/:projectId/datasets`, for the worksite's hindcast choice. Same key as the
 * sea-data pages' list (one cache entry); the hindcasts are picked out with `select`.
 */
export const hindcastsQueryOptions = (projectId: string) =>
  queryOptions({
    queryKey: ['projects', projectId, 'datasets'],
    queryFn: () => api<DatasetSummary[]>(`/api/projects/${projectId}/datasets`),
    select: (all: DatasetSummary[]) => all.filter((d) => d.kind === 'hindcast'),
  });

export const useHindcasts = (projectId: string) => useQuery(hindcastsQueryOptions(projectId));
