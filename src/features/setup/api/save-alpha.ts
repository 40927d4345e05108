import type { AlphaResponse } from '../../../../shared/api-types-sites';
import type { AlphaTableInput } from '../../../../shared/schemas/sites';
import { api } from '../../../lib/api';
import { alphaQueryOptions } from './get-alpha';
import { useSetupWrite } from './invalidate-project-setup';

/** `PUT /api/projects/:projectId/alpha` (coordinators and admins): saves the project's own table. */
export const saveAlpha = (projectId: string, table: AlphaTableInput) =>
  api<AlphaResponse>(`/api/projects/${projectId}/alpha`, { method: 'PUT', json: table });

export const useSaveAlpha = (projectId: string) =>
  useSetupWrite(
    projectId,
    (table: AlphaTableInput) => saveAlpha(projectId, table),
    (qc, data) => qc.setQueryData(alphaQueryOptions(projectId).queryKey, data),
  );
