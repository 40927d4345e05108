import { queryOptions, useQuery } from '@tanstack/react-query';
import type { VesselResponse } from '../../shared/api-types-vessels';
import { api } from '../lib/api';

/** `GET /api/projects/:projectId/vessels`: the project's vessels by name, each with its RAO columns. */
export const getVessels = (projectId: string) => api<VesselResponse[]>(`/api/projects/${projectId}/vessels`);

export const vesselsQueryOptions = (projectId: string) =>
  queryOptions({ queryKey: ['projects', projectId, 'vessels'], queryFn: () => getVessels(projectId) });

export const useVessels = (projectId: string) => useQuery(vesselsQueryOptions(projectId));
