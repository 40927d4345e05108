import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RecurrenceInput } from '../../../../shared/recurrence';
import { api } from '../../../lib/api';
import { operationsQueryOptions } from '../../../api/operations';
import type { StoredRecurrence } from './types';

/** `PUT /api/projects/:projectId/operations/:operationId/recurrence` (coordinators): sets how the operation recurs. */
export const saveRecurrence = (projectId: string, operationId: string, input: RecurrenceInput) =>
  api<StoredRecurrence>(`/api/projects/${projectId}/operations/${operationId}/recurrence`, { method: 'PUT', json: input });

export function useSaveRecurrence(projectId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (v: { operationId: string; input: RecurrenceInput }) => saveRecurrence(projectId, v.operationId, v.input),
    onSuccess: () => qc.invalidateQueries({ queryKey: operationsQueryOptions(projectId).queryKey }),
  });
}
