import type { QueryClient } from '@tanstack/react-query';
import { projectQueryOptions } from '../../../api/projects';
import { useMutationThen } from '../../../lib/use-mutation-then';

/**
 * After any change to worksites, operations, limits or the alpha table: everything cached under
 * the project may depend on it (the lists here, the audit trail, and other pages' plans and
 * statistics), so the whole project subtree is marked stale. Only queries on screen refetch now;
 * the others refetch when next shown.
 */
export function invalidateProjectSetup(qc: QueryClient, projectId: string): Promise<void> {
  return qc.invalidateQueries({ queryKey: projectQueryOptions(projectId).queryKey });
}

/**
 * A write to the project's setup: run `write`, then `then(queryClient, data)` if given (e.g. set the
 * answer into its query), then mark the project's queries stale as {@link invalidateProjectSetup}.
 */
export const useSetupWrite = <TData, TVariables>(
  projectId: string,
  write: (variables: TVariables) => Promise<TData>,
  then?: (qc: QueryClient, data: TData) => void,
) =>
  useMutationThen(write, (qc, data) => {
    then?.(qc, data);
    return invalidateProjectSetup(qc, projectId);
  });
