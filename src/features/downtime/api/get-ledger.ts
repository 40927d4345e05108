import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { LedgerEntry } from '../../../../shared/api-types-downtime';
import { api } from '../../../lib/api';

export interface LedgerRange {
  /** YYYY-MM-DD, inclusive. */
  from: string;
  to: string;
}

/** Key of everything under a project's ledger (days and monthly totals): mutations invalidate it. */
export const ledgerKey = (projectId: string) => ['projects', projectId, 'ledger'] as const;

/** `GET /api/projects/:projectId/ledger?from=&to=`: ledger days (clients see confirmed days only). */
export const getLedger = (projectId: string, r: LedgerRange) =>
  api<LedgerEntry[]>(`/api/projects/${projectId}/ledger?${new URLSearchParams({ from: r.from, to: r.to })}`);

export const ledgerQueryOptions = (projectId: string, r: LedgerRange) =>
  queryOptions({
    queryKey: [...ledgerKey(projectId), 'days', { from: r.from, to: r.to }],
    queryFn: () => getLedger(projectId, { from: r.from, to: r.to }),
  });

export const useLedger = (projectId: string, r: LedgerRange) =>
  useQuery({ ...ledgerQueryOptions(projectId, r), placeholderData: keepPreviousData });
