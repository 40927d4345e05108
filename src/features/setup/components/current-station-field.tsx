import { ErrorNotice } from '../../../components/ui';
import { useTideStations } from '../api/tide-stations';

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
    <label key={id || 'none'} className="flex min-h-11 items-start gap-3 rounded-md border border-line p-2 text-sm">
      <input
        type="radio"
        name={`${idPrefix}-current-station`}
        className="mt-1 size-5 accent-[var(--color-accent)]"
        checked={chosen === id}
        onChange={() => onChoose(id)}
      />
      <span>{body}</span>
    </label>
  );
  return (
    <fieldset className="flex flex-col gap-2" data-testid="current-station-field">
      <legend className="text-sm font-semibold">Current station</legend>
      {error ? (
        <p role="alert" className="text-sm text-danger">
          {error}
        </p>
      ) : null}
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
    </fieldset>
  );
}
