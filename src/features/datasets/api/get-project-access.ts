import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ProjectAccessRole, ProjectDetail } from '../../../../shared/api-types';
import { api } from '../../../lib/api';

/**
 * The project itself (`GET /api/projects/:projectId`), read here only for the caller's role and the
 * data-point defaults. Same key as the projects feature, so both share one cache entry.
 */
export const projectAccessQueryOptions = (projectId: string) =>
  queryOptions({
    queryKey: ['projects', projectId],
    queryFn: () => api<ProjectDetail>(`/api/projects/${projectId}`),
  });

/** Roles that may import files, fetch forecasts and delete datasets. */
const EDITOR_ROLES: readonly ProjectAccessRole[] = ['admin', 'coordinator'];

export function canEditSeaData(role: ProjectAccessRole | undefined): boolean {
  return role !== undefined && EDITOR_ROLES.includes(role);
}

/** The project, plus whether the caller may change its sea data. */
export function useProjectAccess(projectId: string) {
  const query = useQuery(projectAccessQueryOptions(projectId));
  return { ...query, canEdit: canEditSeaData(query.data?.role) };
}
