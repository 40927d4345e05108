import type { SubscriptionInput } from '../../../../shared/schemas/alerts';
import { api } from '../../../lib/api';
import { useMutationThen } from '../../../lib/use-mutation-then';
import { subscriptionQueryOptions } from './get-subscription';
import type { SubscriptionResponse } from './types';

/** `PUT /api/projects/:projectId/subscription`: stores the caller's choices (answers the stored subscription). */
export const saveSubscription = (projectId: string, input: SubscriptionInput) =>
  api<SubscriptionResponse>(`/api/projects/${projectId}/subscription`, { method: 'PUT', json: input });

export const useSaveSubscription = (projectId: string) =>
  useMutationThen(
    (input: SubscriptionInput) => saveSubscription(projectId, input),
    (qc, data) => {
      if (data) qc.setQueryData(subscriptionQueryOptions(projectId).queryKey, data);
      return qc.invalidateQueries({ queryKey: subscriptionQueryOptions(projectId).queryKey });
    },
  );
