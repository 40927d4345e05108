import type { QueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { useMutationThen } from '../../../lib/use-mutation-then';
import { meQueryOptions } from '../../../api/me';

export function signIn(input: { email: string; password: string }) {
  return api<unknown>('/api/auth/sign-in/email', { method: 'POST', json: input });
}

/** After a new session (sign-in, changed password): drop every cached answer and read `me` again. */
export async function restartSession(qc: QueryClient) {
  qc.clear();
  await qc.fetchQuery(meQueryOptions());
}

export const useSignIn = () => useMutationThen(signIn, restartSession);

export const useSignOut = () =>
  useMutationThen(
    () => api<unknown>('/api/auth/sign-out', { method: 'POST', json: {} }),
    (qc) => {
      qc.clear();
      qc.setQueryData(meQueryOptions().queryKey, null);
    },
  );
