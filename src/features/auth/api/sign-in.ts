import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { meQueryOptions } from '../../../api/me';

export function signIn(input: { email: string; password: string }) {
  return api<unknown>('/api/auth/sign-in/email', { method: 'POST', json: input });
}

export function useSignIn() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: signIn,
    onSuccess: async () => {
      qc.clear();
      await qc.fetchQuery(meQueryOptions());
    },
  });
}

export function useSignOut() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => api<unknown>('/api/auth/sign-out', { method: 'POST', json: {} }),
    onSuccess: () => {
      qc.clear();
      qc.setQueryData(meQueryOptions().queryKey, null);
    },
  });
}
