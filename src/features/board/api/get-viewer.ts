import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MeResponse, ProjectAccessRole, ProjectDetail } from '../../../../shared/api-types';
import { api, ApiError } from '../../../lib/api';

/**
 * The project (`GET /api/projects/:projectId`), read here for the caller's role only. Same key
 * and answer as the projects feature, so both share one cache entry.
 */
export const boardProjectQueryOptions = (projectId: string) =>
  queryOptions({
    queryKey: ['projects', projectId],
    queryFn: () => api<ProjectDetail>(`/api/projects/${projectId}`),
  });

/** The signed-in user (`GET /api/me`), null when anonymous; same key and answer as the sign-in feature. */
export const boardMeQueryOptions = () =>
  queryOptions({
    queryKey: ['me'],
    queryFn: async (): Promise<MeResponse | null> => {
      try {
        return await api<MeResponse>('/api/me');
      } catch (err) {
        if (err instanceof ApiError && err.status === 401) return null;
        throw err;
      }
    },
    staleTime: 60_000,
  });

/** Roles that may fetch a forecast (the board's only write). */
const FETCH_ROLES: readonly ProjectAccessRole[] = ['admin', 'coordinator'];

/** Who is looking at the board: their user id, project role, and what they may do. */
export function useViewer(projectId: string) {
  const project = useQuery(boardProjectQueryOptions(projectId));
  const me = useQuery(boardMeQueryOptions());
  const role = project.data?.role;
  return {
    isPending: project.isPending || me.isPending,
    error: project.error ?? me.error,
    userId: me.data?.id ?? null,
    role,
    canFetchForecast: role !== undefined && FETCH_ROLES.includes(role),
    isSkipper: role === 'skipper',
  };
}
