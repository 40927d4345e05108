import type { NetcdfPointsAnswer } from '../../../../shared/api-types-datasets';
import { formatPosition } from '../../../lib/format';
import { HeadingRow } from '../../../components/ui/table';

const pct = (x: number) => `${Math.round(x * 1000) / 10} %`;

/**
 * The points of a NetCDF grid as a table to choose from: position, distance to the data point and
 * the share of wave heights missing. The sea point nearest the data point is marked; points with
 * over half their values missing (land, ice, dry cells) are never chosen by default.
 */
export function NetcdfPointsTable({
  answer,
  value,
  onChange,
}: {
  answer: NetcdfPointsAnswer;
  /** The chosen point as "j,i" ('' = the nearest sea point). */
  value: string;
  onChange: (v: string) => void;
}) {
  const key = (index: number[]) => index.join(',');
  const nearest = answer.nearest ? key(answer.nearest) : null;
  const chosen = value === '' ? nearest : value;
  const sorted = [...answer.points].sort((a, b) => (a.distanceKm ?? Infinity) - (b.distanceKm ?? Infinity));
  return (
    <div className="overflow-x-auto">
      <table className="w-full min-w-[36rem] text-sm" data-testid="netcdf-points">
        <caption className="mb-2 text-left text-ink-soft">
          {answer.points.length} point{answer.points.length === 1 ? '' : 's'} along ({answer.dimensions.join(', ') || 'one point'}), nearest
          to the data point {answer.dataPoint.name} first. {answer.times.count.toLocaleString('en-GB')} times,{' '}
          {answer.times.first?.slice(0, 16).replace('T', ' ') ?? '–'} to {answer.times.last?.slice(0, 16).replace('T', ' ') ?? '–'} UTC.
        </caption>
        <thead>
          <HeadingRow
            className="border-b border-line text-left"
            cellClassName="py-2 pr-3"
            right={[3, 4]}
            headings={['Use', 'Index', 'Position', 'Distance', 'Wave heights missing', { label: 'Note', className: 'py-2' }]}
          />
        </thead>
        <tbody>
          {sorted.map((p) => {
            const k = key(p.index);
            const mostlyMissing = p.missingShare > 0.5;
            return (
              <tr key={k} className="border-b border-line/60" data-point={k}>
                <td className="py-1 pr-3">
                  <label className="flex min-h-11 items-center">
                    <input
                      type="radio"
                      name="gridPoint"
                      value={k}
                      aria-label={`Use the point at index ${k}`}
                      className="size-5 accent-[var(--color-accent)]"
                      checked={chosen === k}
                      disabled={p.missingShare >= 1}
                      onChange={() => onChange(k === nearest ? '' : k)}
                    />
                  </label>
                </td>
                <td className="py-1 pr-3 tabular-nums">[{k}]</td>
                <td className="py-1 pr-3">{p.lat !== null && p.lon !== null ? formatPosition(p.lat, p.lon) : '–'}</td>
                <td className="py-1 pr-3 text-right tabular-nums">
                  {p.distanceKm !== null ? `${p.distanceKm.toLocaleString('en-GB')} km` : '–'}
                </td>
                <td className="py-1 pr-3 text-right tabular-nums">{pct(p.missingShare)}</td>
                <td className="py-1">
                  {k === nearest ? 'Nearest sea point' : mostlyMissing ? 'Over half missing (land, ice or dry)' : ''}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
