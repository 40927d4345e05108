import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ProjectAccessRole, ProjectDetail } from '../../../../shared/api-types';
import { api } from '../../../lib/api';

/**
 * `GET /api/projects/:projectId`, read here only for the caller's role. Same key as the projects
 * feature, so both share one cache entry. Its key is also the owner of everything under the
 * project: setup changes invalidate through it (see {@link invalidateProjectSetup}).
 */
export const projectRoleQueryOptions = (projectId: string) =>
  queryOptions({
    queryKey: ['projects', projectId],
    queryFn: () => api<ProjectDetail>(`/api/projects/${projectId}`),
  });

/** Roles that change worksites, operations, the alpha table and import setups. */
const EDITOR_ROLES: readonly ProjectAccessRole[] = ['admin', 'coordinator'];

export function canEditSetup(role: ProjectAccessRole | undefined): boolean {
  return role !== undefined && EDITOR_ROLES.includes(role);
}

/** The caller's role in the project and whether they may edit its setup. */
export function useSetupAccess(projectId: string) {
  const query = useQuery(projectRoleQueryOptions(projectId));
  return { ...query, role: query.data?.role, canEdit: canEditSetup(query.data?.role) };
}
