import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DatasetSummary } from '../../../../shared/api-types-datasets';
import { api } from '../../../lib/api';

/**
 * `GET /api/projects/:projectId/datasets`: every dataset of the project, newest first. Same key as
 * the sea-data pages' list (one cache entry).
 */
export const getDatasets = (projectId: string) => api<DatasetSummary[]>(`/api/projects/${projectId}/datasets`);

export const datasetsQueryOptions = (projectId: string) =>
  queryOptions({ queryKey: ['projects', projectId, 'datasets'], queryFn: () => getDatasets(projectId) });

/** The project's hindcasts (the statistics datasets), newest first. */
export const useHindcasts = (projectId: string) =>
  useQuery({ ...datasetsQueryOptions(projectId), select: (all: DatasetSummary[]) => all.filter((d) => d.kind === 'hindcast' || d.statisticsDefault) });
