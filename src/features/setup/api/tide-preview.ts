import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { TideAnswer } from '../../../../shared/api-types-sites';
import type { TidePreviewInput } from '../../../../shared/schemas/sites';
import { api } from '../../../lib/api';

/**
 * `POST /api/projects/:projectId/tide-preview` (coordinators): the tide the worksite form is
 * editing, predicted for the next 3 days, before it is saved. It changes nothing, so it is read as
 * a query keyed by the whole input.
 */
export const getTidePreview = (projectId: string, input: TidePreviewInput) =>
  api<TideAnswer>(`/api/projects/${projectId}/tide-preview`, { method: 'POST', json: input });

export const tidePreviewQueryOptions = (projectId: string, input: TidePreviewInput) =>
  queryOptions({
    queryKey: ['projects', projectId, 'tide-preview', input],
    queryFn: () => getTidePreview(projectId, input),
    staleTime: 10 * 60_000,
    retry: false,
    placeholderData: keepPreviousData,
  });

/** The preview of `input`; idle while `input` is null (the form's tide is not complete). */
export const useTidePreview = (projectId: string, input: TidePreviewInput | null) =>
  useQuery({ ...tidePreviewQueryOptions(projectId, input ?? ({} as TidePreviewInput)), enabled: input !== null });
