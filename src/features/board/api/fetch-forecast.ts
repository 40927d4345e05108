import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { conditionsBaseKey } from './get-conditions';
import { planBaseKey } from './get-plan';

/** Answer of `POST /api/projects/:projectId/forecasts/fetch`. */
export interface FetchedForecast {
  datasetId: string;
  /** Issue time, ISO UTC. */
  issuedAt: string;
  records: number;
  /** false when this issue was already stored (nothing newer from the service). */
  isNew: boolean;
}

/** Fetches the latest forecast for the project's data point (coordinators and admins; 503 keeps the previous one). */
export const fetchForecast = (projectId: string) => api<FetchedForecast>(`/api/projects/${projectId}/forecasts/fetch`, { method: 'POST' });

/** Fetches a forecast, then refreshes every plan, hour chain and conditions view of the project. */
export function useFetchForecast(projectId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => fetchForecast(projectId),
    onSuccess: () =>
      Promise.all([
        qc.invalidateQueries({ queryKey: planBaseKey(projectId) }),
        qc.invalidateQueries({ queryKey: conditionsBaseKey(projectId) }),
      ]),
  });
}
