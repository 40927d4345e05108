import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { invalidateProjectSetup } from './invalidate-project-setup';

/** `DELETE /api/projects/:projectId/operations/:operationId` (coordinators and admins), 204. */
export const deleteOperation = (projectId: string, operationId: string) =>
  api<void>(`/api/projects/${projectId}/operations/${operationId}`, { method: 'DELETE' });

export function useDeleteOperation(projectId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (operationId: string) => deleteOperation(projectId, operationId),
    onSuccess: () => invalidateProjectSetup(qc, projectId),
  });
}
