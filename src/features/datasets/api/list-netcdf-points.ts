import { useMutation } from '@tanstack/react-query';
import type { NetcdfPointsAnswer } from '../../../../shared/api-types-datasets';
import { api } from '../../../lib/api';

/**
 * Lists a NetCDF file's grid points (`POST /api/projects/:projectId/datasets/netcdf-points`,
 * multipart): positions, missing share, distance to the data point and the nearest sea point.
 * Stores nothing, so it is a mutation without invalidation.
 */
export function listNetcdfPoints(projectId: string, file: File): Promise<NetcdfPointsAnswer> {
  const body = new FormData();
  body.append('file', file, file.name);
  return api<NetcdfPointsAnswer>(`/api/projects/${projectId}/datasets/netcdf-points`, { method: 'POST', body });
}

export function useNetcdfPoints(projectId: string) {
  return useMutation({ mutationFn: (file: File) => listNetcdfPoints(projectId, file) });
}
