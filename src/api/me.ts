import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MeResponse } from '../../shared/api-types';
import { api, ApiError } from '../lib/api';

/** `GET /api/me`: the signed-in user, or null when anonymous. */
export async function getMe(): Promise<MeResponse | null> {
  try {
    return await api<MeResponse>('/api/me');
  } catch (err) {
    if (err instanceof ApiError && err.status === 401) return null;
    throw err;
  }
}

export const meQueryOptions = () => queryOptions({ queryKey: ['me'], queryFn: getMe, staleTime: 60_000 });

export const useMe = () => useQuery(meQueryOptions());
