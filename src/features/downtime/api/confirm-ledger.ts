import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { LedgerEntry } from '../../../../shared/api-types-downtime';
import type { LedgerConfirmInput } from '../../../../shared/schemas/downtime';
import { api } from '../../../lib/api';
import { ledgerKey } from './get-ledger';

/** `POST /api/projects/:projectId/ledger/:entryId/confirm` (coordinators): confirms and locks the day. */
export const confirmLedger = (projectId: string, entryId: string, input: Partial<LedgerConfirmInput>) =>
  api<LedgerEntry>(`/api/projects/${projectId}/ledger/${entryId}/confirm`, { method: 'POST', json: input });

export function useConfirmLedger(projectId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (v: { entryId: string; input: Partial<LedgerConfirmInput> }) => confirmLedger(projectId, v.entryId, v.input),
    onSuccess: () => qc.invalidateQueries({ queryKey: ledgerKey(projectId) }),
  });
}
