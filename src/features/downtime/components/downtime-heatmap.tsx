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

/**
 * Downtime (100 - workability) in % per row and month, the value written in each cell; empty cells
 * (no data) are grey with a dash.
 */
export default function DowntimeHeatmap({ rows, label, labelWidth }: { rows: HeatRow[]; label: string; labelWidth?: number }) {
  const dark = useIsDark();
  // Phones: shorter row labels, so more months show before the chart scrolls sideways.
  const narrow = useSyncExternalStore(subscribeNarrow, isNarrow, () => false);
  const left = labelWidth ?? (narrow ? 136 : 270);
  const maxChars = narrow ? 20 : 40;
  const stops = dark ? RAMP_DARK : RAMP_LIGHT;
  const ink = dark ? '#e6eef0' : '#10222c';
  const soft = dark ? '#9fb4bc' : '#4a5d66';
  const height = 48 + rows.length * 40;
  return (
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
        labelTextColor={(cell: Omit<ComputedCell<{ x: string; y: number | null }>, 'labelTextColor'>) => (cell.value === null ? soft : textOn(cell.color))}
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
                <text textAnchor="end" dominantBaseline="central" fill={ink} style={{ fontSize: 12, fontWeight: second ? 600 : 500 }} y={second ? -7 : 0}>
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
        hoverTarget="cell"
        animate={false}
        theme={{
          text: { fill: ink, fontSize: 12, fontFamily: 'Manrope, ui-sans-serif, system-ui, sans-serif' },
          axis: { ticks: { text: { fill: ink, fontSize: 12 } } },
          labels: { text: { fontSize: 12, fontWeight: 600 } },
          tooltip: { container: { background: dark ? '#16303d' : '#ffffff', color: ink, fontSize: 13 } },
        }}
        tooltip={({ cell }) => (
          <div className="rounded-md border border-line bg-surface px-3 py-2 text-sm text-ink shadow">
            <div className="font-semibold">{cell.serieId}</div>
            <div>
              {cell.data.x}: {cell.value === null ? 'no data' : `${cell.value.toFixed(1)} % downtime`}
            </div>
          </div>
        )}
        role="img"
        ariaLabel={label}
      />
    </div>
  );
}
