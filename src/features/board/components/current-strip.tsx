import type { ConditionsAnswer } from '../../../../shared/api-types-plan';
import { CURRENT_SOURCE_WORDS } from '../../../../shared/seadata/water-level';
import { formatAt } from '../../../lib/format';
import { LevelLine } from '../../../components/tide/level-line';
import { fmt, fmtTowards } from './board-format';

const W = 1000;
const H = 120;
const PAD = 18;

/** Local maxima of the speed that stand out from their neighbours: the strongest flood and ebb of each tide. */
function peaks(speed: (number | null)[]): number[] {
  const out: number[] = [];
  for (let k = 1; k < speed.length - 1; k++) {
    const v = speed[k];
    const a = speed[k - 1];
    const b = speed[k + 1];
    if (v === null || a === null || b === null) continue;
    if (v > a && v >= b && v >= 0.1) out.push(k);
  }
  return out;
}

/**
 * The worksite's current over the conditions' span (docs/domain.md#tide), beside the tide curve:
 * speed against time, drawn in one colour while the water flows towards the flood direction and
 * in another towards the ebb (or towards any other direction a dataset gives), the strongest
 * stream of each tide listed with its time in `zone`, speed and direction (flowing towards), where
 * each hour's current came from, the chosen station (name, distance, source, flood and ebb
 * directions, warnings, the database's notice) and the cautions.
 */
export function CurrentStrip({ conditions, zone }: { conditions: ConditionsAnswer; zone: string }) {
  const { times, current, currentDir, currentSource, currentStation: station, currentCautions } = conditions;
  const known = current.filter((v): v is number => v !== null);
  if (times.length < 2 || known.length === 0) {
    return (
      <p className="text-xs text-ink-soft" data-testid="current-strip">
        {station
          ? `Current station ${station.name}: no current in these hours.`
          : 'No current here: the sea data has no current and the worksite has no current station (Sites & limits), so a current limit sees no data.'}
      </p>
    );
  }
  const t0 = Date.parse(times[0]);
  const t1 = Date.parse(times[times.length - 1]);
  const hi = Math.max(...known, 0.1);
  const x = (ms: number) => PAD + ((ms - t0) / (t1 - t0)) * (W - 2 * PAD);
  const y = (v: number) => H - PAD - (v / hi) * (H - 2 * PAD);
  const isFlood = (k: number) => station !== null && currentDir[k] === station.floodDir;
  // One segment per pair of known hours, coloured by the direction of the later hour.
  const segments = times.slice(1).flatMap((t, j) => {
    const a = current[j];
    const b = current[j + 1];
    if (a === null || b === null) return [];
    return [
      {
        d: `M${x(Date.parse(times[j])).toFixed(1)},${y(a).toFixed(1)} L${x(Date.parse(t)).toFixed(1)},${y(b).toFixed(1)}`,
        flood: isFlood(j + 1),
        key: t,
      },
    ];
  });
  const strongest = peaks(current);
  const sources = new Set(currentSource.filter((s) => s !== 'none'));
  return (
    <section aria-labelledby="current-heading" data-testid="current-strip">
      <h3 id="current-heading" className="text-sm font-bold">
        Current <span className="font-normal text-ink-soft">(m/s, direction the water flows towards)</span>
      </h3>
      <svg
        viewBox={`0 0 ${W} ${H}`}
        className="mt-1 h-28 w-full"
        role="img"
        aria-label="Current speed over time"
        preserveAspectRatio="none"
      >
        <LevelLine x1={PAD} x2={W - PAD} y={y(0)} stroke="var(--color-line, #ccc)" />
        {segments.map((s) => (
          <path
            key={s.key}
            d={s.d}
            fill="none"
            stroke={s.flood ? 'var(--color-accent)' : 'var(--color-ink-soft, #666)'}
            strokeWidth={2}
            vectorEffect="non-scaling-stroke"
          />
        ))}
      </svg>
      <ul className="mt-1 flex flex-wrap gap-x-4 gap-y-1 text-xs" aria-label="Strongest current of each tide">
        {strongest.map((k) => (
          <li key={times[k]} data-testid="current-peak">
            <span className="font-semibold">
              {station && currentDir[k] === station.floodDir ? 'Flood' : station && currentDir[k] === station.ebbDir ? 'Ebb' : 'Current'}
            </span>{' '}
            {formatAt(Date.parse(times[k]), zone)} · {fmt(current[k], 2, 'm/s')}
            {currentDir[k] !== null ? ` towards ${fmtTowards(currentDir[k])}` : ''}
          </li>
        ))}
      </ul>
      <p className="mt-1 text-xs text-ink-soft" data-testid="current-source">
        From {[...sources].map((s) => CURRENT_SOURCE_WORDS[s]).join(' and ') || 'nowhere'}
        {sources.size > 1 ? ' (the dataset’s wins for the hours it covers)' : ''}.
      </p>
      {station ? (
        <p className="mt-1 text-xs text-ink-soft" data-testid="current-station">
          Current station {station.name}
          {station.distanceKm !== null ? `, ${station.distanceKm.toFixed(1)} km away` : ''}, {station.source}: flood towards{' '}
          {station.floodDir !== null ? fmtTowards(station.floodDir) : 'not given'}, ebb towards{' '}
          {station.ebbDir !== null ? fmtTowards(station.ebbDir) : 'not given'}. {station.warnings.join(' ')} {station.attribution}
        </p>
      ) : null}
      <p className="mt-1 text-xs text-ink-soft">{currentCautions.join(' ')}</p>
    </section>
  );
}
