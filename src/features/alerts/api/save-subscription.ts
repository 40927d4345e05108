import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SubscriptionInput } from '../../../../shared/schemas/alerts';
import { api } from '../../../lib/api';
import { subscriptionQueryOptions } from './get-subscription';
import type { SubscriptionResponse } from './types';

/** `PUT /api/projects/:projectId/subscription`: stores the caller's choices (answers the stored subscription). */
export const saveSubscription = (projectId: string, input: SubscriptionInput) =>
  api<SubscriptionResponse>(`/api/projects/${projectId}/subscription`, { method: 'PUT', json: input });

export function useSaveSubscription(projectId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: SubscriptionInput) => saveSubscription(projectId, input),
    onSuccess: (data) => {
      if (data) qc.setQueryData(subscriptionQueryOptions(projectId).queryKey, data);
      return qc.invalidateQueries({ queryKey: subscriptionQueryOptions(projectId).queryKey });
    },
  });
}
