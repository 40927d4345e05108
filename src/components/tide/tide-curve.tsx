import type { TideAnswer } from '../../../shared/api-types-sites';
import { DATE_STYLE } from '../../../shared/dates';
import { formatAt } from '../../lib/format';
import { localMidnights } from '../../lib/local-midnights';
import { HAIRLINE, LevelLine } from './level-line';

const W = 1000;
const H = 120;
const PAD = 18;

/**
 * A predicted tide curve (docs/domain.md#tide): water level above chart datum over the answer's
 * span, each high and low water marked and listed with its time in `zone`, the station when one
 * is used (name, distance, warnings, the database's notice) and the cautions. Used under the
 * watch board and in the worksite form's tide section.
 */
export function TideCurve({ answer, zone, label }: { answer: TideAnswer; zone: string; label: string }) {
  const { times, waterLevel, extremes, station, cautions } = answer;
  if (times.length < 2) return null;
  const t0 = Date.parse(times[0]);
  const t1 = Date.parse(times[times.length - 1]);
  const lo = Math.min(...waterLevel, ...extremes.map((e) => e.level));
  const hi = Math.max(...waterLevel, ...extremes.map((e) => e.level));
  const x = (ms: number) => PAD + ((ms - t0) / (t1 - t0)) * (W - 2 * PAD);
  const y = (m: number) => H - PAD - ((m - lo) / Math.max(0.01, hi - lo)) * (H - 2 * PAD);
  const path = times.map((t, k) => `${k === 0 ? 'M' : 'L'}${x(Date.parse(t)).toFixed(1)},${y(waterLevel[k]).toFixed(1)}`).join(' ');
  const midnights = localMidnights(t0, t1, zone);
  const pct = (ms: number) => `${((x(ms) / W) * 100).toFixed(2)}%`;
  return (
    <>
      <div className="relative mt-1 pl-12">
        {/* The curve's highest and lowest levels, m above the datum. */}
        <span className="absolute top-3 left-0 text-[11px] text-ink-soft tabular-nums" aria-hidden>
          {hi.toFixed(1)} m
        </span>
        <span className="absolute bottom-3 left-0 text-[11px] text-ink-soft tabular-nums" aria-hidden>
          {lo.toFixed(1)} m
        </span>
        <svg viewBox={`0 0 ${W} ${H}`} className="h-28 w-full" role="img" aria-label={label} preserveAspectRatio="none">
          {midnights.map((m) => (
            <line key={m} x1={x(m)} x2={x(m)} y1={0} y2={H} stroke="var(--color-line)" {...HAIRLINE} />
          ))}
          {lo < 0 && hi > 0 ? <LevelLine x1={PAD} x2={W - PAD} y={y(0)} stroke="var(--color-ink-soft, #666)" dashed /> : null}
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
        {/* Each local day's label starts at its midnight (the gridline). */}
        <div className="relative h-4 overflow-hidden text-[11px] text-ink-soft" aria-hidden>
          {midnights.map((m) => (
            <span key={m} className="absolute top-0 pl-1 whitespace-nowrap" style={{ left: pct(m) }}>
              {formatAt(m, zone, DATE_STYLE.day)}
            </span>
          ))}
        </div>
      </div>
      <ul className="mt-1 flex flex-wrap gap-x-4 gap-y-1 text-xs" aria-label="High and low waters">
        {extremes.map((e) => (
          <li key={e.time} data-testid={`tide-${e.kind}`}>
            <span className="font-semibold">{e.kind === 'high' ? 'High' : 'Low'}</span> {formatAt(Date.parse(e.time), zone)} ·{' '}
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
    </>
  );
}
