import { queryOptions, useQuery } from '@tanstack/react-query';
import type { TideStationInfo } from '../../../../shared/api-types-sites';
import { api } from '../../../lib/api';

/** `GET /api/projects/:projectId/tide-stations?latitude=&longitude=`: database stations nearest a position. */
export const getTideStations = (projectId: string, latitude: number, longitude: number) =>
  api<{ stations: TideStationInfo[] }>(
    `/api/projects/${projectId}/tide-stations?${new URLSearchParams({ latitude: String(latitude), longitude: String(longitude) })}`,
  );

export const tideStationsQueryOptions = (projectId: string, latitude: number, longitude: number) =>
  queryOptions({
    queryKey: ['projects', projectId, 'tide-stations', { latitude, longitude }],
    queryFn: () => getTideStations(projectId, latitude, longitude),
    staleTime: 60 * 60_000,
  });

/** Stations near the position; idle until the position is known. */
export const useTideStations = (projectId: string, position: { latitude: number; longitude: number } | null) =>
  useQuery({ ...tideStationsQueryOptions(projectId, position?.latitude ?? 0, position?.longitude ?? 0), enabled: position !== null });
