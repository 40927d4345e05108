import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { ImportPreviewResponse, ImportResultResponse } from '../../../../shared/api-types-sites';
import type { ImportChoice, ImportMode, ProjectSetupDocument } from '../../../../shared/schemas/sites';
import { api } from '../../../lib/api';
import { invalidateProjectSetup } from './invalidate-project-setup';

/** What an import does: the mode, and whether it takes the file's alpha table and data point. */
export interface ImportRequest {
  mode: ImportMode;
  alphaTable: ImportChoice;
  dataPoint: ImportChoice;
}

const query = (r: ImportRequest) => `mode=${r.mode}&alphaTable=${r.alphaTable}&dataPoint=${r.dataPoint}`;

/**
 * `POST /api/projects/:projectId/import?mode=&alphaTable=&dataPoint=` (coordinators and admins).
 * 400 names each bad field path; 409 lists clashing names (merge) or the confirmed ledger days
 * (replace); nothing changes on error.
 */
export const importSetup = (projectId: string, doc: ProjectSetupDocument, r: ImportRequest) =>
  api<ImportResultResponse>(`/api/projects/${projectId}/import?${query(r)}`, { method: 'POST', json: doc });

/** `POST /api/projects/:projectId/import/preview`: what the same import would change; writes nothing. */
export const previewImport = (projectId: string, doc: ProjectSetupDocument, r: ImportRequest) =>
  api<ImportPreviewResponse>(`/api/projects/${projectId}/import/preview?${query(r)}`, { method: 'POST', json: doc });

export const importPreviewQueryOptions = (projectId: string, doc: ProjectSetupDocument | null, fileKey: string, r: ImportRequest) =>
  // The chosen file is in the key as `fileKey`, not as its whole parsed document.
  // eslint-disable-next-line @tanstack/query/exhaustive-deps
  queryOptions({
    queryKey: ['projects', projectId, 'import-preview', fileKey, r.mode, r.alphaTable, r.dataPoint],
    queryFn: () => previewImport(projectId, doc!, { mode: r.mode, alphaTable: r.alphaTable, dataPoint: r.dataPoint }),
    enabled: doc !== null,
    staleTime: 0,
    gcTime: 0,
  });

export function useImportPreview(projectId: string, doc: ProjectSetupDocument | null, fileKey: string, r: ImportRequest) {
  return useQuery(importPreviewQueryOptions(projectId, doc, fileKey, r));
}

export function useImportSetup(projectId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ doc, request }: { doc: ProjectSetupDocument; request: ImportRequest }) => importSetup(projectId, doc, request),
    onSuccess: () => {
      void qc.removeQueries({ queryKey: ['projects', projectId, 'import-preview'] });
      return invalidateProjectSetup(qc, projectId);
    },
  });
}
