import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { projectQueryOptions } from '../../../api/projects';
import type { JobResult } from './types';

/** `POST /api/projects/:projectId/replan` (coordinators): runs the planning job for this project now. */
export const replan = (projectId: string) => api<JobResult>(`/api/projects/${projectId}/replan`, { method: 'POST', json: {} });

/**
 * Re-plan now. A run may store a new forecast issue, so everything read under the project's key
 * (alerts, outbox, the board's plan, the sea-data list) is marked stale, not only this page's lists.
 */
export function useReplan(projectId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => replan(projectId),
    onSuccess: () => qc.invalidateQueries({ queryKey: projectQueryOptions(projectId).queryKey }),
  });
}
