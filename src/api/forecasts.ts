import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../lib/api';
import { projectQueryOptions } from './projects';

/** Answer of `POST /api/projects/:projectId/forecasts/fetch`. */
export interface FetchedForecast {
  datasetId: string;
  /** Issue time of the forecast, ISO UTC. */
  issuedAt: string;
  records: number;
  /** false when this issue was already stored (nothing newer from the service). */
  isNew: boolean;
}

/** Fetches the latest forecast for the project's data point (coordinators and admins); 503 keeps the previous one. */
export const fetchForecast = (projectId: string) => api<FetchedForecast>(`/api/projects/${projectId}/forecasts/fetch`, { method: 'POST' });

/**
 * Fetches a forecast, then marks everything under the project stale: the dataset list, every plan,
 * hour chain and conditions view may change. Queries on screen refetch now, the others when shown.
 */
export function useFetchForecast(projectId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => fetchForecast(projectId),
    onSuccess: () => qc.invalidateQueries({ queryKey: projectQueryOptions(projectId).queryKey }),
  });
}
