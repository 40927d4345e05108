import { api } from '../../../lib/api';
import { useSetupWrite } from './invalidate-project-setup';

/**
 * `DELETE /api/projects/:projectId/sites/:siteId` (coordinators and admins), 204. Answers 409 when
 * an operation happens only at this worksite (its message names them).
 */
export const deleteSite = (projectId: string, siteId: string) =>
  api<void>(`/api/projects/${projectId}/sites/${siteId}`, { method: 'DELETE' });

export const useDeleteSite = (projectId: string) => useSetupWrite(projectId, (siteId: string) => deleteSite(projectId, siteId));
