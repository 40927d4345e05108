import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DatasetSummary } from '../../shared/api-types-datasets';
import { api } from '../lib/api';

/** `GET /api/projects/:projectId/datasets`: every dataset of the project, newest first. */
export const getDatasets = (projectId: string) => api<DatasetSummary[]>(`/api/projects/${projectId}/datasets`);

/** Owner key of everything under a project's datasets (list, detail, records, monthly). */
export const datasetsQueryOptions = (projectId: string) =>
  queryOptions({ queryKey: ['projects', projectId, 'datasets'], queryFn: () => getDatasets(projectId) });

export const useDatasets = (projectId: string) => useQuery(datasetsQueryOptions(projectId));

const onlyHindcasts = (all: DatasetSummary[]) => all.filter((d) => d.kind === 'hindcast');

/** The project's hindcasts (the statistics datasets), newest first: the same cache entry, filtered. */
export const useHindcasts = (projectId: string) => useQuery({ ...datasetsQueryOptions(projectId), select: onlyHindcasts });

const statisticsDatasets = (all: DatasetSummary[]) => all.filter((d) => d.kind === 'hindcast' || d.statisticsDefault);

/** What statistics can run on: the hindcasts, and the dataset chosen as the project's default (it may be an observation record). */
export const useStatisticsDatasets = (projectId: string) => useQuery({ ...datasetsQueryOptions(projectId), select: statisticsDatasets });
