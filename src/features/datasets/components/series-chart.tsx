// The time-series chart of a dataset: Hs, Tp and wind in three stacked panels sharing one time
// axis. Loaded lazily (the chart library is large); see dataset-detail-page.tsx.
import { createContext, useContext, useMemo } from 'react';
import { ResponsiveLine, type PointTooltipProps } from '@nivo/line';
import type { SeriesColumns } from '../api/get-dataset-records';
import { maxPerBucket, type ChartPoint } from './downsample';
import { formatStep, formatUtc } from './format';
import { chartPalette, nivoLineTheme } from '../../../lib/chart-theme';
import { useIsDark } from '../../../lib/use-is-dark';
import { useWidth } from '../../../lib/use-width';

/** Points per panel at most (3 panels, so at most about 1 800 points drawn). */
const MAX_POINTS = 600;

type PanelKey = 'hs' | 'tp' | 'wind';
type Series = { id: string; data: ChartPoint[] };

const PANELS: { key: PanelKey; title: string; unit: string; decimals: number; light: string; dark: string; area: boolean }[] = [
  { key: 'hs', title: 'Hs, significant wave height', unit: 'm', decimals: 2, light: '#0b7a72', dark: '#49c2b3', area: true },
  { key: 'tp', title: 'Tp, peak period', unit: 's', decimals: 1, light: '#3d5a99', dark: '#9db3ea', area: false },
  { key: 'wind', title: 'Wind speed at 10 m', unit: 'm/s', decimals: 1, light: '#a3612a', dark: '#f0b070', area: false },
];

const HOUR = 3_600_000;
const DAY = 24 * HOUR;
// Tick intervals (nivo/d3 time intervals, read in UTC), their nominal length and label pattern.
const TICKS: { every: string; ms: number; pattern: string }[] = [
  { every: 'every 1 hour', ms: HOUR, pattern: 'HH:mm' },
  { every: 'every 3 hours', ms: 3 * HOUR, pattern: 'd MMM HH:mm' },
  { every: 'every 6 hours', ms: 6 * HOUR, pattern: 'd MMM HH:mm' },
  { every: 'every 12 hours', ms: 12 * HOUR, pattern: 'd MMM HH:mm' },
  { every: 'every 1 day', ms: DAY, pattern: 'd MMM' },
  { every: 'every 2 days', ms: 2 * DAY, pattern: 'd MMM' },
  { every: 'every 1 week', ms: 7 * DAY, pattern: 'd MMM' },
  { every: 'every 2 weeks', ms: 14 * DAY, pattern: 'd MMM' },
  { every: 'every 1 month', ms: 30.4 * DAY, pattern: 'MMM yyyy' },
  { every: 'every 2 months', ms: 61 * DAY, pattern: 'MMM yyyy' },
  { every: 'every 3 months', ms: 91 * DAY, pattern: 'MMM yyyy' },
  { every: 'every 6 months', ms: 182 * DAY, pattern: 'MMM yyyy' },
  { every: 'every 1 year', ms: 365 * DAY, pattern: 'yyyy' },
  { every: 'every 2 years', ms: 730 * DAY, pattern: 'yyyy' },
  { every: 'every 5 years', ms: 1826 * DAY, pattern: 'yyyy' },
  { every: 'every 10 years', ms: 3652 * DAY, pattern: 'yyyy' },
];

function pickTicks(spanMs: number, widthPx: number, pxPerLabel: number) {
  const most = Math.max(2, Math.floor(widthPx / pxPerLabel));
  return TICKS.find((t) => spanMs / t.ms <= most) ?? TICKS[TICKS.length - 1];
}

/** What the tooltip of a panel needs to know. */
const PanelContext = createContext({ unit: '', decimals: 1, bucketMs: 0 });

function PanelTooltip({ point }: PointTooltipProps<Series>) {
  const { unit, decimals, bucketMs } = useContext(PanelContext);
  const at = point.data.x as Date;
  const y = point.data.y as number | null;
  return (
    <div className="w-max max-w-60 rounded-lg border border-line bg-surface px-3 py-2 text-xs text-ink shadow-lg">
      <strong>{y === null ? 'no data' : `${y.toFixed(decimals)} ${unit}`}</strong>
      <span className="block text-ink-soft">
        {bucketMs > 0 ? `highest of ${formatStep(bucketMs / 60_000)} from ${formatUtc(at.getTime() - bucketMs / 2)}` : formatUtc(at)}
      </span>
    </div>
  );
}

export interface SeriesChartProps {
  columns: SeriesColumns;
  /** Drawn range, UTC ms. */
  fromMs: number;
  toMs: number;
  /** The dataset's time step, minutes. */
  stepMinutes: number;
}

/** Hs (m), Tp (s) and wind (m/s) over the range, thinned to the highest value per interval. */
export default function SeriesChart({ columns, fromMs, toMs, stepMinutes }: SeriesChartProps) {
  const dark = useIsDark();
  const [ref, width] = useWidth<HTMLDivElement>();
  const span = Math.max(toMs - fromMs, 1);

  // About one point per pixel column; never more than MAX_POINTS per panel.
  const buckets = width > 0 ? Math.round(Math.min(MAX_POINTS, Math.max(150, width - 70))) : MAX_POINTS;
  const thinned = useMemo(() => {
    const out = {} as Record<PanelKey, { series: Series[]; bucketMs: number; peak: number }>;
    for (const p of PANELS) {
      const t = maxPerBucket(columns.timeMs, columns[p.key], fromMs, toMs, buckets, stepMinutes * 60_000);
      let peak = NaN;
      for (const pt of t.points) if (pt.y !== null && !(peak >= pt.y)) peak = pt.y;
      out[p.key] = { series: [{ id: p.key, data: t.points }], bucketMs: t.bucketMs, peak };
    }
    return out;
  }, [columns, fromMs, toMs, stepMinutes, buckets]);

  const ticks = pickTicks(span, Math.max(width - 70, 120), 80);
  const bucketMs = thinned.hs.bucketMs;
  const palette = chartPalette(dark);
  const theme = nivoLineTheme(palette, 0.6);

  return (
    <div ref={ref} className="flex flex-col gap-2" data-testid="series-chart">
      <p className="text-xs text-ink-soft">
        {bucketMs > 0
          ? `Each point is the highest value in a ${formatStep(bucketMs / 60_000)} interval; zoom in to see every record.`
          : `Every record is drawn (step ${formatStep(stepMinutes)}); breaks are gaps in the data.`}
      </p>
      {PANELS.map((p, i) => {
        const last = i === PANELS.length - 1;
        const data = thinned[p.key];
        const colour = dark ? p.dark : p.light;
        const empty = data.series[0].data.every((d) => d.y === null);
        return (
          <figure key={p.key} className="m-0">
            <figcaption className="flex flex-wrap items-center gap-x-2 text-sm font-semibold">
              <span className="inline-block h-1 w-5 rounded" style={{ background: colour }} aria-hidden />
              {p.title} ({p.unit})
              {Number.isFinite(data.peak) ? (
                <span className="font-normal whitespace-nowrap text-ink-soft">
                  highest {data.peak.toFixed(p.decimals)} {p.unit}
                </span>
              ) : null}
            </figcaption>
            <div
              className={last ? 'h-44' : 'h-36'}
              role="img"
              aria-label={
                empty
                  ? `${p.title}: no values in this range`
                  : `${p.title} from ${formatUtc(fromMs)} to ${formatUtc(toMs)} UTC, highest ${data.peak.toFixed(p.decimals)} ${p.unit}`
              }
            >
              {empty ? (
                <div className="flex h-full items-center justify-center rounded-lg border border-dashed border-line text-sm text-ink-soft">
                  Not in this dataset for this range.
                </div>
              ) : (
                <PanelContext.Provider value={{ unit: p.unit, decimals: p.decimals, bucketMs }}>
                  <ResponsiveLine<Series>
                    data={data.series}
                    xScale={{ type: 'time', min: new Date(fromMs), max: new Date(toMs), useUTC: true }}
                    yScale={{ type: 'linear', min: 0, max: 'auto', nice: true }}
                    margin={{ top: 8, right: 26, bottom: last ? 28 : 6, left: 44 }}
                    colors={[colour]}
                    lineWidth={1.5}
                    curve="linear"
                    enablePoints={false}
                    enableArea={p.area}
                    areaOpacity={0.15}
                    enableGridX
                    gridXValues={ticks.every}
                    gridYValues={4}
                    axisLeft={{ tickValues: 4, tickSize: 0, tickPadding: 6 }}
                    axisBottom={last ? { tickValues: ticks.every, format: (d: Date) => formatUtc(d, ticks.pattern), tickSize: 4 } : null}
                    theme={theme}
                    useMesh
                    enableCrosshair
                    crosshairType="bottom"
                    tooltip={PanelTooltip}
                    animate={false}
                    role="presentation"
                  />
                </PanelContext.Provider>
              )}
            </div>
          </figure>
        );
      })}
    </div>
  );
}
