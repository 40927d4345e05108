import { useDeleteRow } from '../../../lib/use-delete-row';
import { datasetsQueryOptions } from '../../../api/datasets';

/** `DELETE /api/projects/:projectId/datasets/:datasetId` (coordinators and admins). */
export function useDeleteDataset(projectId: string) {
  const list = datasetsQueryOptions(projectId).queryKey;
  return useDeleteRow((datasetId) => `/api/projects/${projectId}/datasets/${datasetId}`, {
    list,
    row: (datasetId) => [...list, { id: datasetId }],
    exact: true,
  });
}
