import type { QueryKey } from '@tanstack/react-query';
import { api } from './api';
import { useMutationThen } from './use-mutation-then';

/**
 * Deletes one row of a project's list by its id (`DELETE url(id)`), then drops the row's cached
 * query (`keys.row(id)`) and refreshes the list (`keys.list`; `exact`: that query alone, not the
 * ones below it).
 */
export function useDeleteRow(url: (id: string) => string, keys: { list: QueryKey; row: (id: string) => QueryKey; exact?: boolean }) {
  return useMutationThen(
    (id: string) => api<void>(url(id), { method: 'DELETE' }),
    (qc, _data, id) => {
      qc.removeQueries({ queryKey: keys.row(id) });
      void qc.invalidateQueries({ queryKey: keys.list, exact: keys.exact });
    },
  );
}
