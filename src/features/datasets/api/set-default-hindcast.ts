import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api';

/**
 * `PUT /api/projects/:projectId/default-hindcast` (coordinators and admins): the dataset statistics
 * use when none is named; null = the newest hindcast. Answers a warning for a span under a year.
 */
export const setDefaultHindcast = (projectId: string, datasetId: string | null) =>
  api<{ datasetId: string | null; warning: string | null }>(`/api/projects/${projectId}/default-hindcast`, {
    method: 'PUT',
    json: { datasetId },
  });

export function useSetDefaultHindcast(projectId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (datasetId: string | null) => setDefaultHindcast(projectId, datasetId),
    // Every statistic of the project may change with the default.
    onSuccess: () => qc.invalidateQueries({ queryKey: ['projects', projectId] }),
  });
}
