import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { VesselRaosResponse } from '../../../../shared/api-types-vessels';
import { api } from '../../../lib/api';
import { vesselsQueryOptions } from '../../../api/vessels';

/**
 * `POST /api/projects/:projectId/vessels/:vesselId/raos` (coordinators and admins), multipart
 * field `file`: the new table replaces the old, or 400 naming every problem (line, column).
 */
export function importRaos(projectId: string, vesselId: string, file: File): Promise<VesselRaosResponse> {
  const body = new FormData();
  body.append('file', file, file.name);
  return api<VesselRaosResponse>(`/api/projects/${projectId}/vessels/${vesselId}/raos`, { method: 'POST', body });
}

export function useImportRaos(projectId: string, vesselId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (file: File) => importRaos(projectId, vesselId, file),
    // The list (its response columns) and this vessel's table, both under the list's key.
    onSuccess: () => qc.invalidateQueries({ queryKey: vesselsQueryOptions(projectId).queryKey }),
  });
}
