import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CalibratedAlphaAnswer } from '../../../../shared/api-types-skill';
import type { AdoptCalibratedInput } from '../../../../shared/schemas/forecast-skill';
import { projectQueryOptions } from '../../../api/projects';
import { api } from '../../../lib/api';

/** `POST /api/projects/:projectId/alpha/adopt-calibrated` (coordinators and admins). */
export const adoptCalibrated = (projectId: string, input: AdoptCalibratedInput) =>
  api<CalibratedAlphaAnswer>(`/api/projects/${projectId}/alpha/adopt-calibrated`, { method: 'POST', json: input });

/** Adopting changes the alpha table, so every plan and statistic under the project may change: the whole project is marked stale. */
export function useAdoptCalibrated(projectId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: AdoptCalibratedInput) => adoptCalibrated(projectId, input),
    onSuccess: () => qc.invalidateQueries({ queryKey: projectQueryOptions(projectId).queryKey }),
  });
}
