import { keepPreviousData, queryOptions, skipToken, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';

/** Query string of a wave-calculator request: numbers as typed, undefined parameters left out. */
export function waveQueryString(params: Record<string, number | undefined>): string {
  const qs = new URLSearchParams();
  for (const [name, value] of Object.entries(params)) {
    if (value !== undefined) qs.set(name, String(value));
  }
  return qs.toString();
}

/**
 * One calculator endpoint (`GET /api/wave/<endpoint>?<query string>`): its fetcher, its query options and
 * its hook. `null` (inputs not valid yet) skips the request and keeps the last answer on screen; the
 * answer is a pure function of the inputs, so it never goes stale. Keys: `['wave', endpoint, inputs]`.
 */
export function calculatorQuery<Q, A>(endpoint: string, queryString: (q: Q) => string) {
  const get = (q: Q, signal?: AbortSignal): Promise<A> => api<A>(`/api/wave/${endpoint}?${queryString(q)}`, { signal });
  const options = (q: Q | null) =>
    queryOptions({
      queryKey: ['wave', endpoint, q],
      queryFn: q ? ({ signal }) => get(q, signal) : skipToken,
      placeholderData: keepPreviousData,
      staleTime: Infinity,
    });
  const use = (q: Q | null) => useQuery(options(q));
  return { get, options, use };
}
