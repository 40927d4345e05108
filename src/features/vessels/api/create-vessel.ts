import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { VesselResponse } from '../../../../shared/api-types-vessels';
import type { VesselInput } from '../../../../shared/schemas/vessel';
import { api } from '../../../lib/api';
import { vesselsQueryOptions } from '../../../api/vessels';

/** `POST /api/projects/:projectId/vessels` (coordinators and admins): 201 with the new vessel; 409 for a name in use. */
export const createVessel = (projectId: string, input: VesselInput) =>
  api<VesselResponse>(`/api/projects/${projectId}/vessels`, { method: 'POST', json: input });

export function useCreateVessel(projectId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: VesselInput) => createVessel(projectId, input),
    onSuccess: () => qc.invalidateQueries({ queryKey: vesselsQueryOptions(projectId).queryKey }),
  });
}
