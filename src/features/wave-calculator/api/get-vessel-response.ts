import { keepPreviousData, queryOptions, skipToken, useQuery } from '@tanstack/react-query';
import type { ResponseRequest } from '../../../../shared/schemas/vessel';
import { api } from '../../../lib/api';

/** One response of GET /api/wave/response (docs/domain.md#vessel-response). */
export interface ResponseFigure {
  response: string;
  label: string;
  unit: string;
  /** R_s = 2 sqrt(m0), in the response's unit. */
  significant: number;
  /** R_mpm over 3 h. */
  mpm3h: number;
  /** Tz of the response, s (null when the response is zero). */
  tz: number | null;
  m0: number;
  m2: number;
  outsideShare: number;
  warning: string | null;
  /** S_R(omega) on `omega`, unit^2 s/rad. */
  spectrum: number[];
}

/** Answer of GET /api/wave/response. */
export interface VesselResponseAnswer {
  vesselId: string;
  heading: number;
  /** rad/s */
  omega: number[];
  /** S(omega) of the sea, m^2 s/rad (all partitions). */
  waveSpectrum: number[];
  responses: ResponseFigure[];
}

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
