import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SiteResponse } from '../../../../shared/api-types-sites';
import { api } from '../../../lib/api';
import { projectQueryOptions } from '../../../api/projects';

/** `PATCH /api/projects/:projectId/sites/:siteId` with a new position only (coordinators and admins). */
export const setSitePosition = (projectId: string, siteId: string, latitude: number, longitude: number) =>
  api<SiteResponse>(`/api/projects/${projectId}/sites/${siteId}`, { method: 'PATCH', json: { latitude, longitude } });

export function useSetSitePosition(projectId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ siteId, latitude, longitude }: { siteId: string; latitude: number; longitude: number }) =>
      setSitePosition(projectId, siteId, latitude, longitude),
    // Positions feed the worksite list and the map; the whole project subtree is marked stale.
    onSuccess: () => qc.invalidateQueries({ queryKey: projectQueryOptions(projectId).queryKey }),
  });
}
