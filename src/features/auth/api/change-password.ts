import { api } from '../../../lib/api';
import { useMutationThen } from '../../../lib/use-mutation-then';
import { restartSession } from './sign-in';

/**
 * `POST /api/auth/change-password` (the auth library's route): the server ends every other
 * session of the account and gives this browser a fresh one.
 */
export function changePassword(input: { currentPassword: string; newPassword: string }) {
  return api<unknown>('/api/auth/change-password', { method: 'POST', json: { ...input, revokeOtherSessions: true } });
}

export const useChangePassword = () => useMutationThen(changePassword, restartSession);
