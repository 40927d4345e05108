import { type QueryClient, useMutation, useQueryClient } from '@tanstack/react-query';

/**
 * A write hook's one shape: run `mutationFn`, then `then(queryClient, data, variables)` on success
 * (set or invalidate through the owner's keys; a returned promise keeps the mutation pending until
 * it settles).
 */
export function useMutationThen<TData, TVariables>(
  mutationFn: (variables: TVariables) => Promise<TData>,
  then: (qc: QueryClient, data: TData, variables: TVariables) => unknown,
) {
  const qc = useQueryClient();
  return useMutation({ mutationFn, onSuccess: (data, variables) => then(qc, data, variables) });
}
