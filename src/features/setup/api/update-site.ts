import type { SiteResponse } from '../../../../shared/api-types-sites';
import type { WorksitePatchInput } from '../../../../shared/schemas/sites';
import { api } from '../../../lib/api';
import { useSetupWrite } from './invalidate-project-setup';

/** `PATCH /api/projects/:projectId/sites/:siteId` (coordinators and admins): any subset of the fields. */
export const updateSite = (projectId: string, siteId: string, patch: WorksitePatchInput) =>
  api<SiteResponse>(`/api/projects/${projectId}/sites/${siteId}`, { method: 'PATCH', json: patch });

export const useUpdateSite = (projectId: string) =>
  useSetupWrite(projectId, ({ siteId, patch }: { siteId: string; patch: WorksitePatchInput }) => updateSite(projectId, siteId, patch));
