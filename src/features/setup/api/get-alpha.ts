import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AlphaResponse } from '../../../../shared/api-types-sites';
import { api } from '../../../lib/api';

/** `GET /api/projects/:projectId/alpha`: the alpha table in force, and whether it is the default. */
export const getAlpha = (projectId: string) => api<AlphaResponse>(`/api/projects/${projectId}/alpha`);

export const alphaQueryOptions = (projectId: string) =>
  queryOptions({ queryKey: ['projects', projectId, 'alpha'], queryFn: () => getAlpha(projectId) });

export const useAlpha = (projectId: string) => useQuery(alphaQueryOptions(projectId));
