import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { LedgerMonthlyAnswer } from '../../../../shared/api-types-downtime';
import { api } from '../../../lib/api';
import { ledgerKey, type LedgerRange } from './get-ledger';

export type LedgerMonthlyParams = LedgerRange & { datasetId: string; alpha: boolean };

/** `GET /api/projects/:projectId/ledger/monthly?dataset=&from=&to=&alpha=`: monthly totals against the hindcast expectation. */
export const getLedgerMonthly = (projectId: string, p: LedgerMonthlyParams) =>
  api<LedgerMonthlyAnswer>(
    `/api/projects/${projectId}/ledger/monthly?${new URLSearchParams({ from: p.from, to: p.to, alpha: String(p.alpha), ...(p.datasetId ? { dataset: p.datasetId } : {}) })}`,
  );

export const ledgerMonthlyQueryOptions = (projectId: string, p: LedgerMonthlyParams) =>
  queryOptions({
    queryKey: [...ledgerKey(projectId), 'monthly', { from: p.from, to: p.to, datasetId: p.datasetId, alpha: p.alpha }],
    queryFn: () => getLedgerMonthly(projectId, { from: p.from, to: p.to, datasetId: p.datasetId, alpha: p.alpha }),
  });

export const useLedgerMonthly = (projectId: string, p: LedgerMonthlyParams) =>
  useQuery({ ...ledgerMonthlyQueryOptions(projectId, p), placeholderData: keepPreviousData });
