import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { meQueryOptions } from './get-me';

/**
 * `POST /api/auth/change-password` (the auth library's route): the server ends every other
 * session of the account and gives this browser a fresh one.
 */
export function changePassword(input: { currentPassword: string; newPassword: string }) {
  return api<unknown>('/api/auth/change-password', { method: 'POST', json: { ...input, revokeOtherSessions: true } });
}

export function useChangePassword() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: changePassword,
    onSuccess: async () => {
      qc.clear();
      await qc.fetchQuery(meQueryOptions());
    },
  });
}
