import type { OperationResponse } from '../../../../shared/api-types-sites';
import type { OperationPatchInput } from '../../../../shared/schemas/sites';
import { api } from '../../../lib/api';
import { useSetupWrite } from './invalidate-project-setup';

/**
 * `PATCH /api/projects/:projectId/operations/:operationId` (coordinators and admins): any subset of
 * the fields; `limits` and the id lists are replaced whole.
 */
export const updateOperation = (projectId: string, operationId: string, patch: OperationPatchInput) =>
  api<OperationResponse>(`/api/projects/${projectId}/operations/${operationId}`, { method: 'PATCH', json: patch });

export const useUpdateOperation = (projectId: string) =>
  useSetupWrite(projectId, ({ operationId, patch }: { operationId: string; patch: OperationPatchInput }) =>
    updateOperation(projectId, operationId, patch),
  );
