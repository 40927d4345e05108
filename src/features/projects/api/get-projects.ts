import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ProjectDetail, ProjectSummary } from '../../../../shared/api-types';
import { api } from '../../../lib/api';

export const projectsQueryOptions = () =>
  queryOptions({ queryKey: ['projects'], queryFn: () => api<ProjectSummary[]>('/api/projects') });

export const useProjects = () => useQuery(projectsQueryOptions());

export const projectQueryOptions = (projectId: string) =>
  queryOptions({
    queryKey: ['projects', projectId],
    queryFn: () => api<ProjectDetail>(`/api/projects/${projectId}`),
  });

export const useProject = (projectId: string) => useQuery(projectQueryOptions(projectId));
