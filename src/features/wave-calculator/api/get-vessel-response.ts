import type { VesselResponseSummary } from '../../../../shared/response/summary';
import type { ResponseRequest } from '../../../../shared/schemas/vessel';
import { calculatorQuery } from './calculator-query';

/** Answer of GET /api/wave/response: the spectra's omega (rad/s), the sea's S(omega) and every response. */
export type VesselResponseAnswer = VesselResponseSummary & { vesselId: string; heading: number };

/** The query string of a response request (partitions as JSON, as the API reads them). */
export function responseQueryString(q: ResponseRequest): string {
  const qs = new URLSearchParams({ vesselId: q.vesselId, heading: String(q.heading) });
  if (q.partitions) qs.set('partitions', JSON.stringify(q.partitions));
  else for (const k of ['hs', 'tp', 'dir'] as const) if (q[k] !== undefined) qs.set(k, String(q[k]));
  return qs.toString();
}

/** A vessel's responses to one sea state; `null` skips the request and keeps the last answer on screen. */
export const vesselResponseQuery = calculatorQuery<ResponseRequest, VesselResponseAnswer>('response', responseQueryString);
export const useVesselResponse = vesselResponseQuery.use;
