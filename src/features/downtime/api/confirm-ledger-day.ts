import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { LedgerEntry } from '../../../../shared/api-types-downtime';
import type { LedgerConfirmDayInput } from '../../../../shared/schemas/downtime';
import { api } from '../../../lib/api';
import { ledgerKey } from './get-ledger';

/** `POST /api/projects/:projectId/ledger/confirm-day` (coordinators): a day's proposals confirmed as proposed, all or none. */
export const confirmLedgerDay = (projectId: string, input: Partial<LedgerConfirmDayInput> & { day: string }) =>
  api<LedgerEntry[]>(`/api/projects/${projectId}/ledger/confirm-day`, { method: 'POST', json: input });

export function useConfirmLedgerDay(projectId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: Partial<LedgerConfirmDayInput> & { day: string }) => confirmLedgerDay(projectId, input),
    onSuccess: () => qc.invalidateQueries({ queryKey: ledgerKey(projectId) }),
  });
}
