import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { datasetsQueryOptions } from './get-datasets';

/** Answer of `POST /api/projects/:projectId/forecasts/fetch`. */
export interface FetchedForecast {
  datasetId: string;
  /** Issue time of the forecast, ISO UTC. */
  issuedAt: string;
  records: number;
  /** False when this issue was already stored (nothing new from the service). */
  isNew: boolean;
}

/** Fetches the latest forecast for the project's data point (coordinators and admins); 503 keeps the previous one. */
export const fetchLatestForecast = (projectId: string) =>
  api<FetchedForecast>(`/api/projects/${projectId}/forecasts/fetch`, { method: 'POST' });

export function useFetchLatestForecast(projectId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => fetchLatestForecast(projectId),
    onSuccess: () => qc.invalidateQueries({ queryKey: datasetsQueryOptions(projectId).queryKey, exact: true }),
  });
}
