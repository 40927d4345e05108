import { keepPreviousData, queryOptions, skipToken, useQuery } from '@tanstack/react-query';
import type { VesselResponseSummary } from '../../../../shared/response/summary';
import type { ResponseRequest } from '../../../../shared/schemas/vessel';
import { api } from '../../../lib/api';

/** Answer of GET /api/wave/response: the spectra's omega (rad/s), the sea's S(omega) and every response. */
export type VesselResponseAnswer = VesselResponseSummary & { vesselId: string; heading: number };

/** The query string of a response request (partitions as JSON, as the API reads them). */
export function responseQueryString(q: ResponseRequest): string {
  const qs = new URLSearchParams({ vesselId: q.vesselId, heading: String(q.heading) });
  if (q.partitions) qs.set('partitions', JSON.stringify(q.partitions));
  else for (const k of ['hs', 'tp', 'dir'] as const) if (q[k] !== undefined) qs.set(k, String(q[k]));
  return qs.toString();
}

export function getVesselResponse(q: ResponseRequest, signal?: AbortSignal): Promise<VesselResponseAnswer> {
  return api<VesselResponseAnswer>(`/api/wave/response?${responseQueryString(q)}`, { signal });
}

/** A vessel's responses to one sea state; `null` skips the request and keeps the last answer on screen. */
export const vesselResponseQueryOptions = (q: ResponseRequest | null) =>
  queryOptions({
    queryKey: ['wave', 'response', q],
    queryFn: q ? ({ signal }) => getVesselResponse(q, signal) : skipToken,
    placeholderData: keepPreviousData,
    staleTime: Infinity,
  });

export const useVesselResponse = (q: ResponseRequest | null) => useQuery(vesselResponseQueryOptions(q));
