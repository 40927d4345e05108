import { keepPreviousData, queryOptions, skipToken, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { waveQueryString } from './query-string';

/** One point of GET /api/wave/profile: elevation z (m), amplitudes u, w (m/s), Kp (dimensionless). */
export interface WaveProfilePoint {
  z: number;
  u: number;
  w: number;
  kp: number;
}

/** Inputs of the profile: T (s), H (m), d (m). */
export interface WaveProfileQuery {
  period: number;
  height: number;
  depth: number;
}

export function getWaveProfile(q: WaveProfileQuery, signal?: AbortSignal): Promise<WaveProfilePoint[]> {
  const qs = waveQueryString({ period: q.period, height: q.height, depth: q.depth });
  return api<WaveProfilePoint[]>(`/api/wave/profile?${qs}`, { signal });
}

/** u(z), w(z), Kp(z) from the bed (or z = -L/2 in deep water) up to still water level. */
export const waveProfileQueryOptions = (q: WaveProfileQuery | null) =>
  queryOptions({
    queryKey: ['wave', 'profile', q],
    queryFn: q ? ({ signal }) => getWaveProfile(q, signal) : skipToken,
    placeholderData: keepPreviousData,
    staleTime: Infinity,
  });

export const useWaveProfile = (q: WaveProfileQuery | null) => useQuery(waveProfileQueryOptions(q));
