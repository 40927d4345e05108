import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import type { SubscriptionResponse } from './types';

/** `GET /api/projects/:projectId/subscription`: what the caller hears about in the project. */
export const getSubscription = (projectId: string) => api<SubscriptionResponse>(`/api/projects/${projectId}/subscription`);

export const subscriptionQueryOptions = (projectId: string) =>
  queryOptions({ queryKey: ['projects', projectId, 'subscription'], queryFn: () => getSubscription(projectId) });

export const useSubscription = (projectId: string) => useQuery(subscriptionQueryOptions(projectId));
