import { api } from '../../../lib/api';
import { useMutationThen } from '../../../lib/use-mutation-then';
import { datasetsQueryOptions } from '../../../api/datasets';

/** `DELETE /api/projects/:projectId/datasets/:datasetId` (coordinators and admins). */
export const deleteDataset = (projectId: string, datasetId: string) =>
  api<void>(`/api/projects/${projectId}/datasets/${datasetId}`, { method: 'DELETE' });

export const useDeleteDataset = (projectId: string) =>
  useMutationThen(
    (datasetId: string) => deleteDataset(projectId, datasetId),
    (qc, _data, datasetId) => {
      qc.removeQueries({ queryKey: [...datasetsQueryOptions(projectId).queryKey, { id: datasetId }] });
      void qc.invalidateQueries({ queryKey: datasetsQueryOptions(projectId).queryKey, exact: true });
    },
  );
