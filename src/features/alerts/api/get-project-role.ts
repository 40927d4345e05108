import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ProjectAccessRole, ProjectDetail } from '../../../../shared/api-types';
import { api } from '../../../lib/api';

/**
 * `GET /api/projects/:projectId`, read here for the caller's role. Same key as the projects
 * feature, so both share one cache entry.
 */
export const projectRoleQueryOptions = (projectId: string) =>
  queryOptions({
    queryKey: ['projects', projectId],
    queryFn: () => api<ProjectDetail>(`/api/projects/${projectId}`),
  });

/** Roles that re-plan, read the outbox and edit recurrences (the API enforces the same). */
const EDITOR_ROLES: readonly ProjectAccessRole[] = ['admin', 'coordinator'];

/** The project, the caller's role, and whether they may run the job and edit recurrences. */
export function useAlertsAccess(projectId: string) {
  const query = useQuery(projectRoleQueryOptions(projectId));
  const role = query.data?.role;
  return { ...query, role, canEdit: role !== undefined && EDITOR_ROLES.includes(role) };
}
