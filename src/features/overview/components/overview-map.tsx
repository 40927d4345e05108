import { useMemo, useState } from 'react';
import { useSites } from '../../../api/sites';
import type { ProjectDetail } from '../../../../shared/api-types';
import { useMapStyle } from '../../../api/map-style';
import { LazySiteMap, type MapSite } from '../../../components/map/lazy-site-map';
import { Card, ErrorNotice, NamedOptions, Notice, Select } from '../../../components/ui';
import { formatPosition } from '../../../lib/format';
import { useSetSitePosition } from '../api/set-site-position';
import { useTideStation } from '../api/get-tide-station';

/** The project's map on the Overview; coordinators choose a worksite and click to set its position. */
export function OverviewMap({
  project,
  waveDirection,
  canEdit,
}: {
  project: ProjectDetail;
  waveDirection: number | null;
  canEdit: boolean;
}) {
  const sites = useSites(project.id);
  const style = useMapStyle();
  const [placing, setPlacing] = useState('');
  const save = useSetSitePosition(project.id);
  const placed = useMemo<MapSite[]>(
    () =>
      (sites.data ?? []).flatMap((s) =>
        s.latitude !== null && s.longitude !== null
          ? [{ id: s.id, name: s.name, latitude: s.latitude, longitude: s.longitude, shoreNormal: s.shoreNormal }]
          : [],
      ),
    [sites.data],
  );
  const dataPoint = useMemo(
    () =>
      project.dataPointLatitude !== null && project.dataPointLongitude !== null
        ? { name: project.dataPointName || 'Data point', latitude: project.dataPointLatitude, longitude: project.dataPointLongitude }
        : null,
    [project.dataPointName, project.dataPointLatitude, project.dataPointLongitude],
  );
  // The map shows one tide station: that of the first worksite whose tide comes from a database station.
  const stationSiteId = sites.data?.find((s) => s.tide?.source === 'station')?.id ?? null;
  const tideStation = useTideStation(project.id, stationSiteId);
  const unplaced = (sites.data ?? []).filter((s) => s.latitude === null || s.longitude === null);
  const placingName = sites.data?.find((s) => s.id === placing)?.name;

  return (
    <Card aria-labelledby="overview-map-title">
      <h2 id="overview-map-title" className="mb-1 text-lg font-bold">
        Map
      </h2>
      <p className="mb-3 text-sm text-ink-soft">
        Worksites with their shore-normal arrows (teal); the offshore data point with the current forecast’s mean wave direction (red arrow:
        the way the waves travel)
        {tideStation.data ? `; the tide station ${tideStation.data.name}, whose constants a worksite's tide is predicted from` : ''}.
      </p>
      {canEdit ? (
        <div className="mb-3 flex flex-wrap items-end gap-2">
          <label className="grid gap-1 text-sm font-semibold" htmlFor="overview-map-place">
            Click the map to set the position of
            <Select id="overview-map-place" value={placing} onChange={(e) => setPlacing(e.target.value)}>
              <option value="">(no worksite: just look)</option>
              <NamedOptions items={sites.data ?? []} />
            </Select>
          </label>
        </div>
      ) : null}
      {save.error ? <ErrorNotice error={save.error} /> : null}
      {save.isSuccess && save.data ? (
        <Notice tone="success">
          {save.data.name} now at {formatPosition(save.data.latitude ?? 0, save.data.longitude ?? 0)}.
        </Notice>
      ) : null}
      {sites.error ? <ErrorNotice error={sites.error} /> : null}
      <LazySiteMap
        label={placingName ? `Map: click to set the position of ${placingName}` : 'Map of the worksites and the data point'}
        sites={placed}
        dataPoint={dataPoint}
        waveDirection={waveDirection}
        tideStation={tideStation.data ?? null}
        styleUrl={style.data?.styleUrl ?? null}
        attribution={style.data?.attribution ?? null}
        pickSiteId={placing || null}
        onPick={canEdit && placing ? (latitude, longitude) => save.mutate({ siteId: placing, latitude, longitude }) : undefined}
      />
      {unplaced.length > 0 ? (
        <p className="mt-2 text-sm text-ink-soft">Without a position, not on the map: {unplaced.map((s) => s.name).join(', ')}.</p>
      ) : null}
    </Card>
  );
}
