import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import type { OutboxRow } from './types';

/** `GET /api/projects/:projectId/outbox` (coordinators): alert e-mails with their delivery status, newest first. */
export const getOutbox = (projectId: string) => api<OutboxRow[]>(`/api/projects/${projectId}/outbox`);

export const outboxQueryOptions = (projectId: string) =>
  queryOptions({ queryKey: ['projects', projectId, 'outbox'], queryFn: () => getOutbox(projectId) });

export const useOutbox = (projectId: string, enabled = true) => useQuery({ ...outboxQueryOptions(projectId), enabled });
