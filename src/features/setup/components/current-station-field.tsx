import { ErrorNotice } from '../../../components/ui';
import { useTideStations } from '../api/tide-stations';
import { StationFieldset, StationRadio } from './station-choice';

const dir = (d: number | null) => (d === null ? 'not given' : `${Math.round(d)}°`);

/**
 * The worksite's current station (docs/domain.md#tide): none, or one of the reference current
 * stations of the public tide database nearest the worksite, each shown with its name, distance,
 * source, flood and ebb directions (the water flowing towards) and warnings (far: over 5 km;
 * incomplete). Its predicted tidal current fills the hours where a dataset has no current.
 */
export function CurrentStationField({
  projectId,
  idPrefix,
  position,
  chosen,
  onChoose,
  error,
}: {
  projectId: string;
  idPrefix: string;
  position: { latitude: number; longitude: number } | null;
  chosen: string;
  onChoose: (id: string) => void;
  error: string | undefined;
}) {
  const stations = useTideStations(projectId, position, 'current');
  if (!position)
    return <p className="text-sm text-ink-soft">Enter the worksite’s latitude and longitude to find the nearest current stations.</p>;
  if (stations.isError) return <ErrorNotice error={stations.error} />;
  const list = stations.data?.stations ?? [];
  const option = (id: string, body: React.ReactNode) => (
    <StationRadio key={id || 'none'} group={`${idPrefix}-current-station`} id={id} chosen={chosen} onChoose={onChoose}>
      {body}
    </StationRadio>
  );
  return (
    <StationFieldset legend="Current station" error={error} testId="current-station-field">
      {option('', 'None: only a dataset’s own current column (no current limit data without one)')}
      {stations.isPending ? <p className="text-sm text-ink-soft">Looking for current stations…</p> : null}
      {!stations.isPending && list.length === 0 ? (
        <p className="text-sm text-ink-soft">No current station with harmonic constants within 200 km.</p>
      ) : null}
      {list.map((s) =>
        option(
          s.id,
          <>
            <span className="font-semibold">{s.name}</span>
            {s.distanceKm !== null ? `, ${s.distanceKm.toFixed(1)} km away` : ''} · {s.source} · flood towards {dir(s.floodDir)}, ebb
            towards {dir(s.ebbDir)} · {s.constituents} constituents
            {s.warnings.length > 0 ? <span className="block text-danger">{s.warnings.join(' ')}</span> : null}
          </>,
        ),
      )}
      {chosen && !list.some((s) => s.id === chosen) && !stations.isPending ? (
        <p className="text-sm text-ink-soft">Chosen: {chosen} (not among the nearest stations of this position).</p>
      ) : null}
    </StationFieldset>
  );
}
