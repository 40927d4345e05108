import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CurrentStationInfo, TideStationInfo } from '../../../../shared/api-types-sites';
import { api } from '../../../lib/api';

/** Which list: tide stations (water level) or current stations (tidal stream), docs/domain.md#tide. */
export type StationKind = 'tide' | 'current';
type StationOf<K extends StationKind> = K extends 'current' ? CurrentStationInfo : TideStationInfo;

/**
 * `GET /api/projects/:projectId/tide-stations?latitude=&longitude=` (or `current-stations`):
 * database stations nearest a position.
 */
export const getTideStations = <K extends StationKind = 'tide'>(projectId: string, latitude: number, longitude: number, kind?: K) =>
  api<{ stations: StationOf<K>[] }>(
    `/api/projects/${projectId}/${kind ?? 'tide'}-stations?${new URLSearchParams({ latitude: String(latitude), longitude: String(longitude) })}`,
  );

export const tideStationsQueryOptions = <K extends StationKind = 'tide'>(
  projectId: string,
  latitude: number,
  longitude: number,
  kind?: K,
) =>
  queryOptions({
    queryKey: ['projects', projectId, `${kind ?? 'tide'}-stations`, { latitude, longitude }],
    queryFn: () => getTideStations<K>(projectId, latitude, longitude, kind),
    staleTime: 60 * 60_000,
  });

/** Stations near the position; idle until the position is known. */
export const useTideStations = <K extends StationKind = 'tide'>(
  projectId: string,
  position: { latitude: number; longitude: number } | null,
  kind?: K,
) =>
  useQuery({
    ...tideStationsQueryOptions<K>(projectId, position?.latitude ?? 0, position?.longitude ?? 0, kind),
    enabled: position !== null,
  });
