import type { SiteResponse } from '../../../../shared/api-types-sites';
import type { WorksiteInput } from '../../../../shared/schemas/sites';
import { api } from '../../../lib/api';
import { useSetupWrite } from './invalidate-project-setup';

/** `POST /api/projects/:projectId/sites` (coordinators and admins): 201 with the new worksite. */
export const createSite = (projectId: string, input: WorksiteInput) =>
  api<SiteResponse>(`/api/projects/${projectId}/sites`, { method: 'POST', json: input });

export const useCreateSite = (projectId: string) => useSetupWrite(projectId, (input: WorksiteInput) => createSite(projectId, input));
