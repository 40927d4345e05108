import type { SiteResponse } from '../../../../shared/api-types-sites';
import { useTide } from '../api/get-tide';
import { formatIn } from './board-format';

const W = 1000;
const H = 120;
const PAD = 18;

/**
 * The predicted tide under the watch board (docs/domain.md#tide): water level above chart datum
 * over the hours shown, with each high and low water and its time in the worksite's zone.
 */
export function TideStrip({ projectId, site, fromMs, toMs }: { projectId: string; site: SiteResponse; fromMs: number; toMs: number }) {
  // Whole hours keep the query key stable while the board's clock ticks.
  const from = new Date(Math.floor(fromMs / 3_600_000) * 3_600_000).toISOString();
  const to = new Date(
    Math.min(Math.ceil(toMs / 3_600_000) * 3_600_000, Math.floor(fromMs / 3_600_000) * 3_600_000 + 31 * 86_400_000),
  ).toISOString();
  const tide = useTide({ projectId, siteId: site.id, from, to });
  if (!tide.data) return tide.isError ? <p className="text-xs text-ink-soft">Tide at {site.name}: not available.</p> : null;
  const { times, waterLevel, extremes, datum, station, cautions } = tide.data;
  if (times.length < 2) return null;
  const t0 = Date.parse(times[0]);
  const t1 = Date.parse(times[times.length - 1]);
  const lo = Math.min(...waterLevel, ...extremes.map((e) => e.level));
  const hi = Math.max(...waterLevel, ...extremes.map((e) => e.level));
  const x = (ms: number) => PAD + ((ms - t0) / (t1 - t0)) * (W - 2 * PAD);
  const y = (m: number) => H - PAD - ((m - lo) / Math.max(0.01, hi - lo)) * (H - 2 * PAD);
  const path = times.map((t, k) => `${k === 0 ? 'M' : 'L'}${x(Date.parse(t)).toFixed(1)},${y(waterLevel[k]).toFixed(1)}`).join(' ');
  const zone = site.timeZone;
  return (
    <section
      className="rounded-[var(--radius-card)] border border-line bg-surface p-3"
      aria-labelledby={`tide-${site.id}`}
      data-testid="tide-strip"
    >
      <h3 id={`tide-${site.id}`} className="text-sm font-bold">
        Tide at {site.name} <span className="font-normal text-ink-soft">(m above {datum})</span>
      </h3>
      <svg
        viewBox={`0 0 ${W} ${H}`}
        className="mt-1 h-28 w-full"
        role="img"
        aria-label={`Predicted water level at ${site.name}`}
        preserveAspectRatio="none"
      >
        <path d={path} fill="none" stroke="var(--color-accent)" strokeWidth={2} vectorEffect="non-scaling-stroke" />
        {extremes.map((e) => (
          <circle
            key={e.time}
            cx={x(Date.parse(e.time))}
            cy={y(e.level)}
            r={4}
            fill={e.kind === 'high' ? 'var(--color-accent)' : 'var(--color-ink-soft, #666)'}
          />
        ))}
      </svg>
      <ul className="mt-1 flex flex-wrap gap-x-4 gap-y-1 text-xs" aria-label="High and low waters">
        {extremes.map((e) => (
          <li key={e.time} data-testid={`tide-${e.kind}`}>
            <span className="font-semibold">{e.kind === 'high' ? 'High' : 'Low'}</span> {formatIn(Date.parse(e.time), zone)} ·{' '}
            {e.level.toFixed(2)} m
          </li>
        ))}
      </ul>
      {station ? (
        <p className="mt-1 text-xs text-ink-soft">
          Station {station.name}
          {station.distanceKm !== null ? `, ${station.distanceKm.toFixed(1)} km away` : ''}. {station.warnings.join(' ')}{' '}
          {station.attribution}
        </p>
      ) : null}
      <p className="mt-1 text-xs text-ink-soft">{cautions.join(' ')}</p>
    </section>
  );
}
