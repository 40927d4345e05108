import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SiteResponse } from '../../shared/api-types-sites';
import { api } from '../lib/api';

/** `GET /api/projects/:projectId/sites`: the project's worksites by name. */
export const getSites = (projectId: string) => api<SiteResponse[]>(`/api/projects/${projectId}/sites`);

export const sitesQueryOptions = (projectId: string) =>
  queryOptions({ queryKey: ['projects', projectId, 'sites'], queryFn: () => getSites(projectId) });

export const useSites = (projectId: string) => useQuery(sitesQueryOptions(projectId));
