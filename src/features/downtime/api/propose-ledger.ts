import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { LedgerProposeAnswer } from '../../../../shared/api-types-downtime';
import { api } from '../../../lib/api';
import { ledgerKey, type LedgerRange } from './get-ledger';

/** `POST /api/projects/:projectId/ledger/propose?from=&to=` (coordinators). */
export const proposeLedger = (projectId: string, r: LedgerRange) =>
  api<LedgerProposeAnswer>(`/api/projects/${projectId}/ledger/propose?${new URLSearchParams({ from: r.from, to: r.to })}`, {
    method: 'POST',
  });

export function useProposeLedger(projectId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (r: LedgerRange) => proposeLedger(projectId, r),
    onSuccess: () => qc.invalidateQueries({ queryKey: ledgerKey(projectId) }),
  });
}
