import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MapStyleAnswer } from '../../shared/api-types-overview';
import { api } from '../lib/api';

/** `GET /api/map-style`: the production tile style (MAP_STYLE_URL) and its attribution, nulls for the built-in coastline. */
export const getMapStyle = () => api<MapStyleAnswer>('/api/map-style');

export const mapStyleQueryOptions = () => queryOptions({ queryKey: ['map-style'], queryFn: getMapStyle, staleTime: Infinity });

export const useMapStyle = () => useQuery(mapStyleQueryOptions());
