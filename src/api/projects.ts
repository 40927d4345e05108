import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ProjectAccessRole, ProjectDetail, ProjectSummary } from '../../shared/api-types';
import { api } from '../lib/api';

/** `GET /api/projects`: the projects the caller may see. */
export const projectsQueryOptions = () => queryOptions({ queryKey: ['projects'], queryFn: () => api<ProjectSummary[]>('/api/projects') });

export const useProjects = () => useQuery(projectsQueryOptions());

/**
 * `GET /api/projects/:projectId`: the project with the caller's role. Its key is also the owner of
 * everything cached under the project: a change that may touch all of it (setup, a new forecast,
 * a re-plan) invalidates through this key.
 */
export const projectQueryOptions = (projectId: string) =>
  queryOptions({
    queryKey: ['projects', projectId],
    queryFn: () => api<ProjectDetail>(`/api/projects/${projectId}`),
  });

export const useProject = (projectId: string) => useQuery(projectQueryOptions(projectId));

/** Roles that change a project's data: setup, sea data, re-plans, recurrences, ledger, campaigns (the API enforces the same). */
const EDITOR_ROLES: readonly ProjectAccessRole[] = ['admin', 'coordinator'];

export function isEditorRole(role: ProjectAccessRole | undefined): boolean {
  return role !== undefined && EDITOR_ROLES.includes(role);
}

/** The project, the caller's role in it, and whether they may change its data. */
export function useProjectAccess(projectId: string) {
  const { data, isPending, error } = useQuery(projectQueryOptions(projectId));
  const role = data?.role;
  return { data, isPending, error, role, canEdit: isEditorRole(role) };
}
