import { keepPreviousData, queryOptions, skipToken, useQuery } from '@tanstack/react-query';
import type { WaveTableQuery } from '../../../../shared/schemas/wave';
import type { WaveTableRow } from '../../../../shared/waves/wave-table';
import { api } from '../../../lib/api';
import { waveQueryString } from './query-string';

export type { WaveTableRow };

export function getWaveTable(q: WaveTableQuery, signal?: AbortSignal): Promise<WaveTableRow[]> {
  const qs = waveQueryString({ from: q.from, to: q.to, step: q.step });
  return api<WaveTableRow[]>(`/api/wave/table?${qs}`, { signal });
}

/** Wave-table rows by d/L0 (at most 2,000); `null` skips the request and keeps the last rows. */
export const waveTableQueryOptions = (q: WaveTableQuery | null) =>
  queryOptions({
    queryKey: ['wave', 'table', q],
    queryFn: q ? ({ signal }) => getWaveTable(q, signal) : skipToken,
    placeholderData: keepPreviousData,
    staleTime: Infinity,
  });

export const useWaveTable = (q: WaveTableQuery | null) => useQuery(waveTableQueryOptions(q));
