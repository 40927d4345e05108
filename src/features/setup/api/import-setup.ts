import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ImportResultResponse } from '../../../../shared/api-types-sites';
import type { ImportMode, ProjectSetupDocument } from '../../../../shared/schemas/sites';
import { api } from '../../../lib/api';
import { invalidateProjectSetup } from './invalidate-project-setup';

/**
 * `POST /api/projects/:projectId/import?mode=merge|replace` (coordinators and admins). 400 names
 * each bad field path; 409 (merge) lists the clashing names; nothing changes on error.
 */
export const importSetup = (projectId: string, doc: ProjectSetupDocument, mode: ImportMode) =>
  api<ImportResultResponse>(`/api/projects/${projectId}/import?mode=${mode}`, { method: 'POST', json: doc });

export function useImportSetup(projectId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ doc, mode }: { doc: ProjectSetupDocument; mode: ImportMode }) => importSetup(projectId, doc, mode),
    onSuccess: () => invalidateProjectSetup(qc, projectId),
  });
}
