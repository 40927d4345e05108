import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import type { MapPoint } from '../../../components/map/lazy-site-map';

/** The part of a worksite's tide answer (GET …/sites/:siteId/tide) the map needs: the station used. */
interface TideStationPart {
  station: { name: string; latitude: number; longitude: number } | null;
}

/** The database tide station a worksite's tide is predicted from, for its marker on the map (docs/domain.md#tide). */
export const tideStationQueryOptions = (projectId: string, siteId: string | null) =>
  queryOptions({
    queryKey: ['projects', projectId, 'tide-station', siteId],
    queryFn: async (): Promise<MapPoint | null> => {
      const from = new Date();
      const to = new Date(from.getTime() + 3_600_000);
      const answer = await api<TideStationPart>(
        `/api/projects/${projectId}/sites/${siteId}/tide?${new URLSearchParams({ from: from.toISOString(), to: to.toISOString() })}`,
      );
      return answer.station ? { name: answer.station.name, latitude: answer.station.latitude, longitude: answer.station.longitude } : null;
    },
    enabled: siteId !== null,
    staleTime: 60 * 60_000,
  });

export const useTideStation = (projectId: string, siteId: string | null) => useQuery(tideStationQueryOptions(projectId, siteId));
