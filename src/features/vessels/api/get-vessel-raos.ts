import { queryOptions, useQuery } from '@tanstack/react-query';
import type { VesselRaosResponse } from '../../../../shared/api-types-vessels';
import { api } from '../../../lib/api';
import { vesselsQueryOptions } from '../../../api/vessels';

/** `GET /api/projects/:projectId/vessels/:vesselId/raos`: the vessel's RAO table (empty before an import). */
export const getVesselRaos = (projectId: string, vesselId: string) =>
  api<VesselRaosResponse>(`/api/projects/${projectId}/vessels/${vesselId}/raos`);

export const vesselRaosQueryOptions = (projectId: string, vesselId: string) =>
  queryOptions({
    // Under the vessels list's key: a new import invalidates both.
    queryKey: [...vesselsQueryOptions(projectId).queryKey, vesselId, 'raos'],
    queryFn: () => getVesselRaos(projectId, vesselId),
  });

export const useVesselRaos = (projectId: string, vesselId: string) => useQuery(vesselRaosQueryOptions(projectId, vesselId));
