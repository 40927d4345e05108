// Charts of one worksite over the forecast: Hs with each operation's limit (OPLIM, solid) and
// forecast limit (OPWF, dashed), Tp with Tp limits and excluded bands, bed velocity by both
// methods with the bed-velocity limits, and wind with the wind limits. Time runs on a linear
// axis of UTC milliseconds whose ticks sit on the worksite's midnights (found with @date-fns/tz)
// and are labelled in its zone. Loaded lazily: the chart library is large. The sea is drawn in
// teal and slate; the numbered operation colours are kept for limits only.
import { createContext, useContext, useMemo } from 'react';
import { ResponsiveLine, type LineCustomSvgLayerProps, type SliceTooltipProps } from '@nivo/line';
import type { CartesianMarkerProps } from '@nivo/core';
import { localMidnights } from '../../../lib/local-midnights';
import { LABEL_HALO } from '../../../lib/chart-halo';
import type { ConditionsAnswer } from '../../../../shared/api-types-plan';
import { fmt, formatIn, responseLimitWords } from './board-format';
import { chartPalette, nivoLineTheme } from '../../../lib/chart-theme';
import { useIsDark } from '../../../lib/use-is-dark';
import { DrawnLines } from '../../../components/drawn-lines';
import { operationColour } from './operation-colours';
import { useWidth } from '../../../lib/use-width';

/**
 * An operation at the worksite with the limits the charts draw, numbered for the key: the answer's
 * limits (with its vessel-response limits, docs/domain.md#vessel-response) and the Tp limits.
 */
export interface ChartOperation extends Pick<
  ConditionsAnswer['operations'][number],
  'id' | 'name' | 'hsMax' | 'hsMaxForecast' | 'windMax' | 'bedVelocityMax' | 'bedVelocityMethod' | 'currentMax' | 'responses'
> {
  n: number;
  tpMin: number | null;
  tpMax: number | null;
  tpExcluded: [number, number][];
  hasCurve: boolean;
}

export interface ConditionsChartsProps {
  conditions: ConditionsAnswer;
  operations: ChartOperation[];
  nowMs: number;
}

type Pt = { x: number; y: number | null };
type Series = { id: string; data: Pt[] };

const TooltipContext = createContext<{
  zone: string;
  unit: string;
  decimals: number;
  names: Record<string, string>;
  /** Words after a series' value at record i (the governing response), when the panel has them. */
  details?: Record<string, (i: number) => string>;
}>({
  zone: 'UTC',
  unit: '',
  decimals: 2,
  names: {},
});

function SliceTip({ slice }: SliceTooltipProps<Series>) {
  const { zone, unit, decimals, names, details } = useContext(TooltipContext);
  const x = slice.points[0]?.data.x as number;
  return (
    <div className="rounded-lg border border-line bg-surface px-3 py-2 text-xs text-ink shadow-lg">
      <strong>{formatIn(x, zone)}</strong>
      {slice.points.map((p) => (
        <span key={p.id} className="mt-0.5 flex items-center gap-2">
          <span className="inline-block h-1 w-3 rounded" style={{ background: p.seriesColor }} aria-hidden />
          {names[String(p.seriesId)] ?? String(p.seriesId)}: {fmt(p.data.y as number | null, decimals, unit)}
          {details?.[String(p.seriesId)] ? ` ${details[String(p.seriesId)](p.indexInSeries)}` : ''}
        </span>
      ))}
    </div>
  );
}

const LABEL_POSITIONS = ['bottom-right', 'top-right', 'bottom', 'top'] as const;

interface PanelSpec {
  key: string;
  title: string;
  unit: string;
  decimals: number;
  series: { id: string; name: string; values: (number | null)[]; light: string; dark: string; dashed?: boolean }[];
  markers: (dark: boolean) => CartesianMarkerProps[];
  limitValues: number[];
  bands?: { from: number; to: number; n: number }[];
  note?: string;
  /** Tooltip words per series and record (see TooltipContext). */
  details?: Record<string, (i: number) => string>;
  /** Lines under the chart, also for screen readers. */
  lines?: string[];
}

export default function ConditionsCharts({ conditions, operations, nowMs }: ConditionsChartsProps) {
  const dark = useIsDark();
  const [ref, width] = useWidth<HTMLDivElement>();
  const zone = conditions.timeZone;
  const timesMs = useMemo(() => conditions.times.map((t) => Date.parse(t)), [conditions.times]);
  const fromMs = timesMs[0];
  const toMs = timesMs[timesMs.length - 1];
  const spanDays = (toMs - fromMs) / 86_400_000;
  const most = Math.max(2, Math.floor((width - 60) / 60));
  const stepDays = Math.max(1, Math.ceil(spanDays / most));
  const ticks = useMemo(() => localMidnights(fromMs, toMs, zone, stepDays), [fromMs, toMs, zone, stepDays]);
  const allMidnights = useMemo(() => localMidnights(fromMs, toMs, zone, 1), [fromMs, toMs, zone]);

  const palette = chartPalette(dark);
  const theme = nivoLineTheme(palette, 0.7);

  const limitMarker = (value: number, n: number, legend: string, dashed: boolean, isDark: boolean): CartesianMarkerProps => ({
    axis: 'y',
    value,
    legend,
    lineStyle: { stroke: operationColour(n, isDark), strokeWidth: 2, strokeDasharray: dashed ? '6 4' : undefined },
    textStyle: { ...LABEL_HALO, fill: operationColour(n, isDark), fontSize: 10, fontWeight: 700 },
  });
  /** Every operation's markers for the limits it sets: `limitsOf(o)` gives [value, legend after its number, dashed]. */
  const limitMarkers = (isDark: boolean, limitsOf: (o: ChartOperation) => [number | null | undefined, string, boolean?][]) =>
    operations.flatMap((o) =>
      limitsOf(o).flatMap(([value, legend, dashed = false]) =>
        value != null ? [limitMarker(value, o.n, `${o.n} ${legend}`, dashed, isDark)] : [],
      ),
    );

  const panels: PanelSpec[] = [
    {
      key: 'hs',
      title: 'Hs at the worksite',
      unit: 'm',
      decimals: 2,
      series: [{ id: 'hs', name: 'Hs at the worksite', values: conditions.hs, light: '#0b7a72', dark: '#49c2b3' }],
      markers: (d) =>
        limitMarkers(d, (o) => [
          [o.hsMax, `OPLIM ${fmt(o.hsMax, 2, 'm')}`],
          [o.hsMaxForecast !== o.hsMax ? o.hsMaxForecast : null, `OPWF ${fmt(o.hsMaxForecast, 2, 'm')}`, true],
        ]),
      limitValues: operations.flatMap((o) => [o.hsMax, o.hsMaxForecast].filter((v): v is number => v !== null)),
      note: operations.some((o) => o.hasCurve)
        ? 'Hs-Tp curve limits change with Tp from hour to hour and are not drawn here: open an hour on the board to see them.'
        : undefined,
    },
    {
      key: 'tp',
      title: 'Tp, peak period',
      unit: 's',
      decimals: 1,
      series: [{ id: 'tp', name: 'Tp', values: conditions.tp, light: '#334155', dark: '#cbd5e1' }],
      markers: (d) =>
        limitMarkers(d, (o) => [
          [o.tpMin, `Tp min ${fmt(o.tpMin, 1, 's')}`],
          [o.tpMax, `Tp max ${fmt(o.tpMax, 1, 's')}`],
        ]),
      limitValues: operations.flatMap((o) => [o.tpMin, o.tpMax, ...o.tpExcluded.flat()].filter((v): v is number => v !== null)),
      bands: operations.flatMap((o) => o.tpExcluded.map(([from, to]) => ({ from, to, n: o.n }))),
    },
    {
      key: 'bed',
      title: 'Near-bed orbital velocity (significant)',
      unit: 'm/s',
      decimals: 2,
      series: [
        { id: 'linear', name: 'Linear (Airy)', values: conditions.bedVelocityLinear, light: '#0b7a72', dark: '#49c2b3' },
        { id: 'soulsby', name: 'Soulsby (2006)', values: conditions.bedVelocitySoulsby, light: '#475569', dark: '#cbd5e1', dashed: true },
      ],
      markers: (d) =>
        limitMarkers(d, (o) => [
          [o.bedVelocityMax, `max ${fmt(o.bedVelocityMax, 2, 'm/s')} (${o.bedVelocityMethod === 'soulsby' ? 'Soulsby' : 'linear'})`],
        ]),
      limitValues: operations.flatMap((o) => (o.bedVelocityMax !== null ? [o.bedVelocityMax] : [])),
    },
    // Current (docs/domain.md#tide): the dataset's, else the predicted tidal current of the worksite's station; only when there is one.
    ...(conditions.current.some((x) => x !== null)
      ? [
          {
            key: 'current',
            title: conditions.currentSource.some((s) => s === 'predicted')
              ? 'Current speed (predicted tidal current where the dataset has none)'
              : 'Current speed (as the dataset gives it)',
            unit: 'm/s',
            decimals: 2,
            series: [{ id: 'current', name: 'Current', values: conditions.current, light: '#1d4ed8', dark: '#93c5fd' }],
            markers: (d: boolean) => limitMarkers(d, (o) => [[o.currentMax, `current max ${fmt(o.currentMax, 2, 'm/s')}`]]),
            limitValues: operations.flatMap((o) => (o.currentMax != null ? [o.currentMax] : [])),
          } satisfies PanelSpec,
        ]
      : []),
    // Vessel response (docs/domain.md#vessel-response): per operation with response limits, the
    // response nearest to (or furthest past) its limit each hour, as R / R_lim (1 = OPLIM), with
    // its forecast limit alpha x R_lim dashed (alpha at the hour's equivalent Hs limit).
    ...(operations.some((o) => o.responses)
      ? [
          {
            key: 'response',
            title: 'Governing vessel response, R / R_lim',
            unit: '',
            decimals: 2,
            series: operations.flatMap((o) =>
              o.responses
                ? [
                    {
                      id: `r${o.n}`,
                      name: `${o.n} R / R_lim`,
                      values: o.responses.ratio,
                      light: operationColour(o.n, false),
                      dark: operationColour(o.n, true),
                    },
                    {
                      id: `f${o.n}`,
                      name: `${o.n} OPWF / R_lim`,
                      values: o.responses.forecastRatio,
                      light: operationColour(o.n, false),
                      dark: operationColour(o.n, true),
                      dashed: true,
                    },
                  ]
                : [],
            ),
            markers: (): CartesianMarkerProps[] => [
              {
                axis: 'y',
                value: 1,
                legend: 'OPLIM (R = R_lim)',
                lineStyle: { stroke: palette.ink, strokeWidth: 1.5 },
                textStyle: { ...LABEL_HALO, fill: palette.ink, fontSize: 10, fontWeight: 700 },
              },
            ],
            limitValues: [1],
            details: Object.fromEntries(
              operations.flatMap((o) => {
                const r = o.responses;
                if (!r) return [];
                return [
                  [
                    `r${o.n}`,
                    (i: number) => {
                      const g = r.governing[i];
                      return g === null ? '(no data)' : `(${r.limits[g].label}: ${fmt(r.value[i], 2, r.limits[g].unit)})`;
                    },
                  ],
                ];
              }),
            ),
            lines: operations.flatMap((o) => (o.responses ? [responseSummary(o, o.responses, zone, timesMs)] : [])),
            note: 'Solid: the governing response against its operation limit; dashed: its forecast limit α × R_lim, with α taken at the hour’s equivalent Hs limit. Above 1 the vessel moves more than the limit allows.',
          } satisfies PanelSpec,
        ]
      : []),
    {
      key: 'wind',
      title: 'Wind speed at 10 m',
      unit: 'm/s',
      decimals: 1,
      series: [{ id: 'wind', name: 'Wind', values: conditions.wind, light: '#334155', dark: '#cbd5e1' }],
      markers: (d) => limitMarkers(d, (o) => [[o.windMax, `max ${fmt(o.windMax, 1, 'm/s')}`]]),
      limitValues: operations.flatMap((o) => (o.windMax !== null ? [o.windMax] : [])),
    },
  ];

  return (
    <div ref={ref} className="flex flex-col gap-5" data-testid="conditions-charts">
      {panels.map((p) => {
        const data: Series[] = p.series.map((s) => ({ id: s.id, data: timesMs.map((x, i) => ({ x, y: s.values[i] })) }));
        let peak = -Infinity;
        for (const s of p.series) for (const v of s.values) if (v !== null && v > peak) peak = v;
        const top = Math.max(peak, ...p.limitValues, 0) * 1.12 || 1;
        const empty = !Number.isFinite(peak);
        const colours = p.series.map((s) => (dark ? s.dark : s.light));
        const names = Object.fromEntries(p.series.map((s) => [s.id, s.name]));
        // Limit labels alternate above and below their lines, and between the right end and the
        // middle, in order of value, so two close limits do not print over each other.
        const placed = [...p.markers(dark)]
          .sort((a, b) => Number(a.value) - Number(b.value))
          .map((m, i) => ({ ...m, legendPosition: LABEL_POSITIONS[i % LABEL_POSITIONS.length] }));
        // Every limit line first, then every label with its halo on top (nivo draws each marker's
        // label right after its line, so a later line would cross an earlier label); the markers'
        // layer comes after the data lines for the same reason.
        const markers: CartesianMarkerProps[] = [
          ...placed.map((m) => ({ ...m, legend: undefined })),
          ...placed.map((m) => ({ ...m, lineStyle: { ...m.lineStyle, stroke: 'none' } })),
          ...(nowMs >= fromMs && nowMs <= toMs
            ? [
                {
                  axis: 'x' as const,
                  value: nowMs,
                  legend: 'now',
                  // Right of the line: the forecast starts at now, so the left side is the y axis's ticks.
                  legendPosition: 'top-right' as const,
                  lineStyle: { stroke: palette.now, strokeWidth: 2 },
                  textStyle: { ...LABEL_HALO, fill: palette.now, fontSize: 10, fontWeight: 700 },
                },
              ]
            : []),
        ];
        const bands = p.bands ?? [];
        const BandLayer = ({ yScale, innerWidth }: LineCustomSvgLayerProps<Series>) => (
          <g>
            {bands.map((b, i) => {
              const y1 = (yScale as (v: number) => number)(b.to);
              const y0 = (yScale as (v: number) => number)(b.from);
              return (
                <g key={i}>
                  <rect
                    x={0}
                    width={innerWidth}
                    y={y1}
                    height={Math.max(1, y0 - y1)}
                    fill={operationColour(b.n, dark)}
                    fillOpacity={0.16}
                  />
                  <text x={4} y={y1 + 11} fontSize={10} fontWeight={700} fill={operationColour(b.n, dark)}>
                    {b.n} excluded {b.from}–{b.to} s
                  </text>
                </g>
              );
            })}
          </g>
        );
        const dashedIds = new Set(p.series.filter((s) => s.dashed).map((s) => s.id));
        // The lines, drawn here rather than by the library so a second method can be dashed.
        const LinesLayer = (props: LineCustomSvgLayerProps<Series>) => (
          <DrawnLines {...props} strokeWidth={2} dashOf={(id) => (dashedIds.has(id) ? '6 4' : undefined)} />
        );
        const summary = empty ? 'no values in this forecast' : `highest ${fmt(peak, p.decimals, p.unit)}`;
        return (
          <figure key={p.key} className="m-0">
            <figcaption className="flex flex-wrap items-center gap-x-3 gap-y-1 text-sm font-semibold">
              <span>
                {p.title}
                {p.unit ? ` (${p.unit})` : ''}
              </span>
              {p.series.length > 1
                ? p.series.map((s) => (
                    <span key={s.id} className="inline-flex items-center gap-1 text-xs font-normal text-ink-soft">
                      <svg width="20" height="6" aria-hidden>
                        <line
                          x1="0"
                          y1="3"
                          x2="20"
                          y2="3"
                          stroke={dark ? s.dark : s.light}
                          strokeWidth="2"
                          strokeDasharray={s.dashed ? '4 3' : undefined}
                        />
                      </svg>
                      {s.name}
                    </span>
                  ))
                : null}
              <span className="text-xs font-normal text-ink-soft">{summary}</span>
            </figcaption>
            <div className="h-56" role="img" aria-label={`${p.title} over the forecast at the worksite, ${summary}; times in ${zone}.`}>
              {empty ? (
                <div className="flex h-full items-center justify-center rounded-lg border border-dashed border-line text-sm text-ink-soft">
                  Not in this forecast.
                </div>
              ) : (
                <TooltipContext.Provider value={{ zone, unit: p.unit, decimals: p.decimals, names, details: p.details }}>
                  <ResponsiveLine<Series>
                    data={data}
                    xScale={{ type: 'linear', min: fromMs, max: toMs, nice: false }}
                    yScale={{ type: 'linear', min: 0, max: top, nice: true }}
                    margin={{ top: 10, right: 12, bottom: 28, left: 44 }}
                    colors={colours}
                    lineWidth={2}
                    curve="linear"
                    enablePoints={false}
                    enableArea={p.key === 'hs'}
                    areaOpacity={0.12}
                    enableGridX
                    gridXValues={allMidnights}
                    gridYValues={4}
                    axisLeft={{ tickValues: 4, tickSize: 0, tickPadding: 6 }}
                    axisBottom={{ tickValues: ticks, format: (d: number) => formatIn(d, zone, 'EEE d'), tickSize: 4 }}
                    markers={markers}
                    layers={['grid', BandLayer, 'axes', 'areas', LinesLayer, 'markers', 'crosshair', 'slices']}
                    enableSlices="x"
                    sliceTooltip={SliceTip}
                    theme={theme}
                    animate={false}
                    role="presentation"
                  />
                </TooltipContext.Provider>
              )}
            </div>
            {p.lines ? (
              <ul className="mt-1 text-xs" data-testid={`conditions-${p.key}-lines`}>
                {p.lines.map((line) => (
                  <li key={line}>{line}</li>
                ))}
              </ul>
            ) : null}
            {p.note ? <p className="mt-1 text-xs text-ink-soft">{p.note}</p> : null}
          </figure>
        );
      })}
    </div>
  );
}

/**
 * One operation's governing response in words: which response governs most hours, the highest
 * R / R_lim and when, and how many hours are past the limit.
 */
function responseSummary(o: ChartOperation, r: NonNullable<ChartOperation['responses']>, zone: string, timesMs: number[]): string {
  const counts = r.limits.map(() => 0);
  let top = -1;
  let over = 0;
  r.governing.forEach((g, i) => {
    if (g === null) return;
    counts[g]++;
    if (top < 0 || r.ratio[i]! > r.ratio[top]!) top = i;
    if (r.ratio[i]! > 1) over++;
  });
  if (top < 0) return `${o.n} ${o.name}: no response figures (the forecast lacks what the response limits need).`;
  const most = counts.indexOf(Math.max(...counts));
  const g = r.governing[top]!;
  return (
    `${o.n} ${o.name}: ${r.limits[most].label} governs ${counts[most]} of ${r.governing.length} hours; ` +
    `highest ${fmt(r.ratio[top], 2, '')} of the limit (${responseLimitWords(r.limits[g])}: ${fmt(r.value[top], 2, r.limits[g].unit)}) ` +
    `at ${formatIn(timesMs[top], zone)}; ${over} h past the limit.`
  );
}
