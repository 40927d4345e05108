import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { datasetsQueryOptions } from '../../../api/datasets';

/** `DELETE /api/projects/:projectId/datasets/:datasetId` (coordinators and admins). */
export const deleteDataset = (projectId: string, datasetId: string) =>
  api<void>(`/api/projects/${projectId}/datasets/${datasetId}`, { method: 'DELETE' });

export function useDeleteDataset(projectId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (datasetId: string) => deleteDataset(projectId, datasetId),
    onSuccess: (_data, datasetId) => {
      qc.removeQueries({ queryKey: [...datasetsQueryOptions(projectId).queryKey, { id: datasetId }] });
      void qc.invalidateQueries({ queryKey: datasetsQueryOptions(projectId).queryKey, exact: true });
    },
  });
}
