import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AlphaResponse } from '../../../../shared/api-types-sites';
import { api } from '../../../lib/api';
import { alphaQueryOptions } from './get-alpha';
import { invalidateProjectSetup } from './invalidate-project-setup';

/** `DELETE /api/projects/:projectId/alpha` (coordinators and admins): back to the default table. */
export const resetAlpha = (projectId: string) => api<AlphaResponse>(`/api/projects/${projectId}/alpha`, { method: 'DELETE' });

export function useResetAlpha(projectId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => resetAlpha(projectId),
    onSuccess: (data) => {
      qc.setQueryData(alphaQueryOptions(projectId).queryKey, data);
      return invalidateProjectSetup(qc, projectId);
    },
  });
}
