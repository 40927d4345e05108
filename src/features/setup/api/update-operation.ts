import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { OperationResponse } from '../../../../shared/api-types-sites';
import type { OperationPatchInput } from '../../../../shared/schemas/sites';
import { api } from '../../../lib/api';
import { invalidateProjectSetup } from './invalidate-project-setup';

/**
 * `PATCH /api/projects/:projectId/operations/:operationId` (coordinators and admins): any subset of
 * the fields; `limits` and the id lists are replaced whole.
 */
export const updateOperation = (projectId: string, operationId: string, patch: OperationPatchInput) =>
  api<OperationResponse>(`/api/projects/${projectId}/operations/${operationId}`, { method: 'PATCH', json: patch });

export function useUpdateOperation(projectId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ operationId, patch }: { operationId: string; patch: OperationPatchInput }) =>
      updateOperation(projectId, operationId, patch),
    onSuccess: () => invalidateProjectSetup(qc, projectId),
  });
}
