import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ProjectAccessRole, ProjectDetail } from '../../../../shared/api-types';
import { api } from '../../../lib/api';

/**
 * `GET /api/projects/:projectId`, read here for the caller's role and the project's name. Same key
 * as the projects feature, so both share one cache entry.
 */
export const projectRoleQueryOptions = (projectId: string) =>
  queryOptions({
    queryKey: ['projects', projectId],
    queryFn: () => api<ProjectDetail>(`/api/projects/${projectId}`),
  });

/** Roles that propose and confirm the ledger and edit campaigns (the API enforces the same). */
const EDITOR_ROLES: readonly ProjectAccessRole[] = ['admin', 'coordinator'];

/** The project, the caller's role, and whether they may edit downtime data. */
export function useDowntimeAccess(projectId: string) {
  const query = useQuery(projectRoleQueryOptions(projectId));
  const role = query.data?.role;
  return { ...query, role, canEdit: role !== undefined && EDITOR_ROLES.includes(role) };
}
