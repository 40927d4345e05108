import { api } from '../../../lib/api';
import { useSetupWrite } from './invalidate-project-setup';

/** `DELETE /api/projects/:projectId/operations/:operationId` (coordinators and admins), 204. */
export const deleteOperation = (projectId: string, operationId: string) =>
  api<void>(`/api/projects/${projectId}/operations/${operationId}`, { method: 'DELETE' });

export const useDeleteOperation = (projectId: string) =>
  useSetupWrite(projectId, (operationId: string) => deleteOperation(projectId, operationId));
