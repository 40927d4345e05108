import type { AlphaResponse } from '../../../../shared/api-types-sites';
import { api } from '../../../lib/api';
import { alphaQueryOptions } from './get-alpha';
import { useSetupWrite } from './invalidate-project-setup';

/** `DELETE /api/projects/:projectId/alpha` (coordinators and admins): back to the default table. */
export const resetAlpha = (projectId: string) => api<AlphaResponse>(`/api/projects/${projectId}/alpha`, { method: 'DELETE' });

export const useResetAlpha = (projectId: string) =>
  useSetupWrite(
    projectId,
    () => resetAlpha(projectId),
    (qc, data) => qc.setQueryData(alphaQueryOptions(projectId).queryKey, data),
  );
