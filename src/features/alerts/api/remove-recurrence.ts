import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { operationsQueryOptions } from '../../../api/operations';

/** `DELETE /api/projects/:projectId/operations/:operationId/recurrence` (coordinators): the operation no longer recurs. */
export const removeRecurrence = (projectId: string, operationId: string) =>
  api<void>(`/api/projects/${projectId}/operations/${operationId}/recurrence`, { method: 'DELETE' });

export function useRemoveRecurrence(projectId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (operationId: string) => removeRecurrence(projectId, operationId),
    onSuccess: () => qc.invalidateQueries({ queryKey: operationsQueryOptions(projectId).queryKey }),
  });
}
