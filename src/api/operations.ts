import { queryOptions, useQuery } from '@tanstack/react-query';
import type { OperationResponse } from '../../shared/api-types-sites';
import { api } from '../lib/api';

/** `GET /api/projects/:projectId/operations`: the project's operations with their limits (OPLIM), by name. */
export const getOperations = (projectId: string) => api<OperationResponse[]>(`/api/projects/${projectId}/operations`);

export const operationsQueryOptions = (projectId: string) =>
  queryOptions({ queryKey: ['projects', projectId, 'operations'], queryFn: () => getOperations(projectId) });

export const useOperations = (projectId: string) => useQuery(operationsQueryOptions(projectId));
