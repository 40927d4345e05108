// One response of an RAO table against wave period, one line per relative heading
// (docs/domain.md#vessel-response). Lines differ by dash pattern as well as colour, and each is
// named in the key, so the plot reads without colour; the values are in a table below it.
import { ticks } from 'd3-array';
import { useId } from 'react';
import { LINE_COLOURS } from '../../../lib/line-colours';
import { useIsDark } from '../../../lib/use-is-dark';

const DASHES = [undefined, '8 4', '2 3', '10 3 2 3', '4 4', '12 4', '1 5'];

/** Headings shown as lines: all up to 8, else about 8 spread evenly (the table below keeps every one). */
export function headingsToDraw(count: number): number[] {
  if (count <= 8) return Array.from({ length: count }, (_, i) => i);
  const step = (count - 1) / 7;
  return [...new Set(Array.from({ length: 8 }, (_, i) => Math.round(i * step)))];
}

const W = 520;
const H = 260;
const L = 52;
const R = 12;
const T = 12;
const B = 40;

export function RaoPlot({
  label,
  unit,
  periods,
  headings,
  values,
}: {
  label: string;
  unit: string;
  periods: number[];
  headings: number[];
  /** Amplitude per metre of wave amplitude, [heading][period]. */
  values: number[][];
}) {
  const id = useId();
  const dark = useIsDark();
  const shown = headingsToDraw(headings.length);
  const x0 = periods[0];
  const x1 = periods[periods.length - 1];
  const yMax = Math.max(1e-9, ...shown.flatMap((h) => values[h]));
  const yTicks = ticks(0, yMax, 4);
  const yTop = Math.max(yMax, yTicks[yTicks.length - 1] ?? yMax);
  const sx = (x: number) => L + ((x - x0) / (x1 - x0 || 1)) * (W - L - R);
  const sy = (y: number) => H - B - (y / yTop) * (H - T - B);
  const xTicks = ticks(x0, x1, 6);
  const perMetre = `${unit} per m`;
  return (
    <figure className="flex flex-col gap-2" data-testid="rao-plot">
      <figcaption className="text-sm font-semibold" id={`${id}-cap`}>
        {label} RAO ({perMetre}) against wave period, one line per relative heading
      </figcaption>
      <svg viewBox={`0 0 ${W} ${H}`} className="w-full max-w-2xl text-ink" role="img" aria-labelledby={`${id}-cap`}>
        {yTicks.map((y) => (
          <g key={`y${y}`}>
            <line x1={L} x2={W - R} y1={sy(y)} y2={sy(y)} stroke="var(--color-line)" />
            <text x={L - 6} y={sy(y) + 4} textAnchor="end" fontSize="11" fill="currentColor">
              {y}
            </text>
          </g>
        ))}
        {xTicks.map((x) => (
          <text key={`x${x}`} x={sx(x)} y={H - B + 16} textAnchor="middle" fontSize="11" fill="currentColor">
            {x}
          </text>
        ))}
        <line x1={L} x2={W - R} y1={H - B} y2={H - B} stroke="currentColor" />
        <line x1={L} x2={L} y1={T} y2={H - B} stroke="currentColor" />
        <text x={(L + W - R) / 2} y={H - 6} textAnchor="middle" fontSize="12" fill="currentColor">
          Wave period (s)
        </text>
        <text
          x={14}
          y={(T + H - B) / 2}
          textAnchor="middle"
          fontSize="12"
          fill="currentColor"
          transform={`rotate(-90 14 ${(T + H - B) / 2})`}
        >
          {perMetre}
        </text>
        {shown.map((h, n) => (
          <polyline
            key={h}
            points={periods.map((p, i) => `${sx(p).toFixed(1)},${sy(values[h][i]).toFixed(1)}`).join(' ')}
            fill="none"
            stroke={LINE_COLOURS[n % LINE_COLOURS.length][dark ? 1 : 0]}
            strokeWidth="2"
            strokeDasharray={DASHES[n % DASHES.length]}
          />
        ))}
      </svg>
      <ul className="flex flex-wrap gap-x-4 gap-y-1 text-xs" aria-label={`Key of the ${label} plot`}>
        {shown.map((h, n) => (
          <li key={h} className="flex items-center gap-1">
            <svg width="28" height="8" aria-hidden>
              <line
                x1="0"
                x2="28"
                y1="4"
                y2="4"
                stroke={LINE_COLOURS[n % LINE_COLOURS.length][dark ? 1 : 0]}
                strokeWidth="2"
                strokeDasharray={DASHES[n % DASHES.length]}
              />
            </svg>
            heading {headings[h]}°
          </li>
        ))}
        {shown.length < headings.length ? (
          <li className="text-ink-soft">({headings.length - shown.length} more headings in the table)</li>
        ) : null}
      </ul>
      <details className="text-xs">
        <summary className="min-h-11 cursor-pointer content-center font-semibold">Values of {label.toLowerCase()} as a table</summary>
        <div className="max-h-72 overflow-auto">
          <table className="tabular-nums">
            <caption className="text-left text-ink-soft">
              {label} ({perMetre}); rows: period (s), columns: relative heading
            </caption>
            <thead>
              <tr>
                <th scope="col" className="px-2 text-left">
                  Period
                </th>
                {headings.map((h) => (
                  <th key={h} scope="col" className="px-2 text-right">
                    {h}°
                  </th>
                ))}
              </tr>
            </thead>
            <tbody>
              {periods.map((p, i) => (
                <tr key={p}>
                  <th scope="row" className="px-2 text-left font-normal">
                    {Math.round(p * 1000) / 1000} s
                  </th>
                  {headings.map((h, k) => (
                    <td key={h} className="px-2 text-right">
                      {Math.round(values[k][i] * 1000) / 1000}
                    </td>
                  ))}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </details>
    </figure>
  );
}
