// Heat map of expected weather downtime (% of hours) by month. Loaded lazily: the chart library is
// large (see downtime-page.tsx). Every cell shows its value as text, so nothing depends on colour.
import { useSyncExternalStore } from 'react';
import { ResponsiveHeatMap, type ComputedCell } from '@nivo/heatmap';
import { useIsDark } from '../../../lib/use-is-dark';

export interface HeatRow {
  /** Row label shown on the left (unique). */
  id: string;
  data: { x: string; y: number | null }[];
}

function subscribeNarrow(onChange: () => void) {
  const mq = window.matchMedia('(max-width: 640px)');
  mq.addEventListener('change', onChange);
  return () => mq.removeEventListener('change', onChange);
}
const isNarrow = () => window.matchMedia('(max-width: 640px)').matches;

type Rgb = [number, number, number];
const hex = (h: string): Rgb => [parseInt(h.slice(1, 3), 16), parseInt(h.slice(3, 5), 16), parseInt(h.slice(5, 7), 16)];
const toHex = (c: Rgb) => `#${c.map((v) => Math.round(v).toString(16).padStart(2, '0')).join('')}`;

// Low downtime in the product's sea-glass, high in its heather (the status colours' meanings),
// through a pale dune (light theme) or a slate (dark theme) in the middle.
const RAMP_LIGHT = ['#e3f4f0', '#f1dca0', '#c59ab8', '#6b4a7a'].map(hex);
const RAMP_DARK = ['#143b37', '#3d4d66', '#7d62a0', '#c9a6dd'].map(hex);

function ramp(stops: Rgb[], t: number): string {
  const x = Math.min(1, Math.max(0, t)) * (stops.length - 1);
  const i = Math.min(stops.length - 2, Math.floor(x));
  const f = x - i;
  return toHex([0, 1, 2].map((k) => stops[i][k] + (stops[i + 1][k] - stops[i][k]) * f) as Rgb);
}

/** Relative luminance (WCAG 2.x) of a #rrggbb colour. */
function luminance(color: string): number {
  const [r, g, b] = hex(color).map((v) => {
    const c = v / 255;
    return c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
  });
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}

/** Dark or light text, whichever contrasts more with the cell. */
const textOn = (background: string) => (luminance(background) > 0.18 ? '#10222c' : '#ffffff');

/** The colour of a downtime share 0-100 % in the current theme ('' for no data). */
const cellColour = (stops: Rgb[], v: number | null) => (v === null ? '' : ramp(stops, v / 100));

/**
 * The colour key of the heat maps: the ramp from 0 % to 100 % downtime with its numbers, and the
 * no-data grey, in the theme's own colours (light and dark alike).
 */
export function HeatLegend({ dark }: { dark: boolean }) {
  const stops = dark ? RAMP_DARK : RAMP_LIGHT;
  const gradient = `linear-gradient(to right, ${[0, 0.25, 0.5, 0.75, 1].map((t) => ramp(stops, t)).join(', ')})`;
  return (
    <div
      className="mt-2 flex flex-wrap items-center gap-x-4 gap-y-1 text-xs text-ink-soft"
      data-testid="heat-legend"
      aria-label="Colour key: downtime from 0 % (light) to 100 % (dark); grey: no data"
    >
      <span className="font-semibold text-ink">Downtime</span>
      <span className="flex items-center gap-2">
        <span>0 %</span>
        <span
          className="h-3 w-32 rounded-sm border border-line sm:w-48"
          style={{ backgroundImage: gradient, printColorAdjust: 'exact' }}
          aria-hidden
        />
        <span>100 %</span>
      </span>
      <span className="flex items-center gap-1">
        <span
          className="inline-block size-3 rounded-sm border border-line"
          style={{ background: dark ? '#3a4a52' : '#c9cfd2', printColorAdjust: 'exact' }}
          aria-hidden
        />
        no data
      </span>
    </div>
  );
}

/**
 * The heat map as an HTML table: on paper (it fits the width of an A4 page) and on phones, where
 * the row labels wrap and stay beside their row while the months scroll.
 */
function HeatTable({ rows, label, stops, className }: { rows: HeatRow[]; label: string; stops: Rgb[]; className: string }) {
  const months = rows[0]?.data.map((d) => d.x) ?? [];
  return (
    <div className={`overflow-x-auto print:overflow-visible ${className}`} data-testid="heat-table">
      <table className="w-full border-separate border-spacing-0.5 text-xs" style={{ printColorAdjust: 'exact' }}>
        <caption className="sr-only">{label}</caption>
        <thead>
          <tr>
            <th scope="col" className="sticky left-0 z-10 bg-surface px-1 text-left font-semibold">
              <span className="sr-only">Row</span>
            </th>
            {months.map((m) => (
              <th key={m} scope="col" className="px-0.5 text-center font-semibold">
                {m}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => {
            const [first, second] = r.id.split(' · ');
            return (
              <tr key={r.id}>
                <th
                  scope="row"
                  className="sticky left-0 z-10 max-w-28 bg-surface px-1 py-0.5 text-left align-middle font-semibold break-words sm:max-w-48 print:max-w-40"
                >
                  {first}
                  {second ? <span className="block font-normal text-ink-soft">{second}</span> : null}
                </th>
                {r.data.map((d) => {
                  const bg = cellColour(stops, d.y);
                  return (
                    <td
                      key={d.x}
                      className={`min-w-7 rounded-sm px-0.5 py-1.5 text-center font-semibold tabular-nums ${bg ? '' : 'bg-st-nodata text-ink-soft'}`}
                      style={bg ? { background: bg, color: textOn(bg) } : undefined}
                    >
                      {d.y === null ? '–' : Math.round(d.y)}
                    </td>
                  );
                })}
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}

/**
 * Downtime (100 - workability) in % per row and month, the value written in each cell; empty cells
 * (no data) are grey with a dash. Wide screens draw it as a chart; phones and paper get the same
 * numbers as a table; both carry the colour key.
 */
export default function DowntimeHeatmap({ rows, label, labelWidth }: { rows: HeatRow[]; label: string; labelWidth?: number }) {
  const dark = useIsDark();
  // Phones: a table whose row labels wrap and stay in view while the months scroll sideways.
  const narrow = useSyncExternalStore(subscribeNarrow, isNarrow, () => false);
  const left = labelWidth ?? 270;
  const maxChars = 40;
  const stops = dark ? RAMP_DARK : RAMP_LIGHT;
  const ink = dark ? '#e6eef0' : '#10222c';
  const soft = dark ? '#9fb4bc' : '#4a5d66';
  const height = 48 + rows.length * 40;
  return (
    <div>
      <HeatTable rows={rows} label={label} stops={stops} className={narrow ? 'print:hidden' : 'hidden'} />
      {/* paper: the table, in the light colours whatever the screen's theme */}
      <HeatTable rows={rows} label={label} stops={RAMP_LIGHT} className="hidden print:block" />
      {narrow ? null : (
        <div className="overflow-x-auto print:hidden">
          <div style={{ height, minWidth: left + 12 * 38 }}>
            <ResponsiveHeatMap
              data={rows}
              margin={{ top: 36, right: 8, bottom: 8, left }}
              valueFormat={(v) => `${Math.round(v)}`}
              xInnerPadding={0.06}
              yInnerPadding={0.1}
              borderRadius={3}
              colors={(cell) => ramp(stops, (cell.value ?? 0) / 100)}
              emptyColor={dark ? '#3a4a52' : '#c9cfd2'}
              enableLabels
              label={(cell) => (cell.value === null ? '–' : `${Math.round(cell.value)}`)}
              labelTextColor={(cell: Omit<ComputedCell<{ x: string; y: number | null }>, 'labelTextColor'>) =>
                cell.value === null ? soft : textOn(cell.color)
              }
              axisTop={{ tickSize: 0, tickPadding: 8 }}
              axisLeft={{
                tickSize: 0,
                tickPadding: 8,
                // "Operation · Worksite" on two lines: the operation in bold, the worksite below it.
                renderTick: ({ x, y, value }) => {
                  const [first, second] = String(value).split(' · ');
                  const cut = (s: string) => (s.length > maxChars ? `${s.slice(0, maxChars - 1)}…` : s);
                  return (
                    <g transform={`translate(${x - 8},${y})`}>
                      <text
                        textAnchor="end"
                        dominantBaseline="central"
                        fill={ink}
                        style={{ fontSize: 12, fontWeight: second ? 600 : 500 }}
                        y={second ? -7 : 0}
                      >
                        {cut(first)}
                      </text>
                      {second ? (
                        <text textAnchor="end" dominantBaseline="central" fill={soft} style={{ fontSize: 11 }} y={8}>
                          {cut(second)}
                        </text>
                      ) : null}
                    </g>
                  );
                },
              }}
              axisBottom={null}
              axisRight={null}
              // Every cell writes its number; a hover box would be clipped by the scrolling card, so there is none.
              isInteractive={false}
              animate={false}
              theme={{
                text: { fill: ink, fontSize: 12, fontFamily: 'Manrope, ui-sans-serif, system-ui, sans-serif' },
                axis: { ticks: { text: { fill: ink, fontSize: 12 } } },
                labels: { text: { fontSize: 12, fontWeight: 600 } },
              }}
              role="img"
              ariaLabel={label}
            />
          </div>
        </div>
      )}
      <HeatLegend dark={dark} />
    </div>
  );
}
