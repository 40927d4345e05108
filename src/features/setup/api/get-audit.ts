import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { AuditEntryResponse } from '../../../../shared/api-types-sites';
import type { AuditEntity } from '../../../../shared/schemas/sites';
import { api } from '../../../lib/api';

export interface AuditFilter {
  /** one kind of entry; undefined = all */
  entity?: AuditEntity;
  /** at most this many entries, newest first (1-500) */
  limit: number;
}

/** `GET /api/projects/:projectId/audit?entity=&limit=`: the audit trail, newest first (read-only). */
export const getAudit = (projectId: string, { entity, limit }: AuditFilter) => {
  const q = new URLSearchParams({ limit: String(limit) });
  if (entity) q.set('entity', entity);
  return api<AuditEntryResponse[]>(`/api/projects/${projectId}/audit?${q}`);
};

export const auditQueryOptions = (projectId: string, filter: AuditFilter) =>
  queryOptions({
    queryKey: ['projects', projectId, 'audit', { entity: filter.entity ?? null, limit: filter.limit }],
    queryFn: () => getAudit(projectId, { entity: filter.entity, limit: filter.limit }),
    placeholderData: keepPreviousData,
  });

export const useAudit = (projectId: string, filter: AuditFilter) => useQuery(auditQueryOptions(projectId, filter));
