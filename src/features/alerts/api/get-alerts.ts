import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import type { AlertResponse } from './types';

/** `GET /api/projects/:projectId/alerts?limit=`: the latest changes found by the planning job, newest first. */
export const getAlerts = (projectId: string, limit: number) => api<AlertResponse[]>(`/api/projects/${projectId}/alerts?limit=${limit}`);

/** The key every alerts query of a project starts with (for invalidation after a planning run). */
export const alertsKey = (projectId: string) => ['projects', projectId, 'alerts'] as const;

export const alertsQueryOptions = (projectId: string, limit = 50) =>
  queryOptions({ queryKey: [...alertsKey(projectId), { limit }], queryFn: () => getAlerts(projectId, limit) });

export const useAlerts = (projectId: string, limit = 50) => useQuery(alertsQueryOptions(projectId, limit));
