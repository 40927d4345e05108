import type { OperationResponse } from '../../../../shared/api-types-sites';
import type { OperationInput } from '../../../../shared/schemas/sites';
import { api } from '../../../lib/api';
import { useSetupWrite } from './invalidate-project-setup';

/** `POST /api/projects/:projectId/operations` (coordinators and admins): 201 with the new operation. */
export const createOperation = (projectId: string, input: OperationInput) =>
  api<OperationResponse>(`/api/projects/${projectId}/operations`, { method: 'POST', json: input });

export const useCreateOperation = (projectId: string) =>
  useSetupWrite(projectId, (input: OperationInput) => createOperation(projectId, input));
