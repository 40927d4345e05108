import { useId, useMemo } from 'react';
import { ResponsiveLine, type LineCustomSvgLayerProps, type LineSeries, type SliceTooltipProps } from '@nivo/line';
import type { CartesianMarkerProps } from '@nivo/core';
import type { PartialTheme } from '@nivo/theming';
import type { WaveProfilePoint } from '../api/get-wave-profile';
import { useIsDark } from '../../../lib/use-is-dark';
import { DrawnLines } from '../../../components/drawn-lines';
import { ticks as niceTicks } from 'd3-array';
import { formatSig } from '../utils/format-number';
import { LABEL_HALO } from '../../../lib/chart-halo';

interface ProfileSeries extends LineSeries {
  id: 'u' | 'w' | 'kp';
  data: { x: number; y: number }[];
}

/** Line colours by series, light and dark; w is also dashed so nothing rests on colour alone. */
const COLOURS = {
  light: { u: '#0b7a72', w: '#b0571a', kp: '#16415a' },
  dark: { u: '#49c2b3', w: '#f2c46d', kp: '#a9c4ff' },
} as const;

const DASH: Record<ProfileSeries['id'], string | undefined> = { u: undefined, w: '7 5', kp: undefined };

const LABEL: Record<ProfileSeries['id'], string> = {
  u: 'u(z), horizontal',
  w: 'w(z), vertical',
  kp: 'Kp(z)',
};

export function themeFor(dark: boolean): PartialTheme {
  const ink = dark ? '#e6eef0' : '#10222c';
  const soft = dark ? '#9fb4bc' : '#4a5d66';
  const line = dark ? '#24485a' : '#cfd9d8';
  return {
    text: { fill: soft, fontFamily: 'Manrope, ui-sans-serif, system-ui, sans-serif', fontSize: 12 },
    axis: {
      domain: { line: { stroke: line, strokeWidth: 1 } },
      ticks: { line: { stroke: line }, text: { fill: soft, fontSize: 12 } },
      legend: { text: { fill: ink, fontSize: 12, fontWeight: 600 } },
    },
    grid: { line: { stroke: line, strokeWidth: 1, strokeOpacity: 0.6 } },
    markers: { lineColor: soft, lineStrokeWidth: 1 },
    crosshair: { line: { stroke: soft, strokeWidth: 1, strokeOpacity: 0.8, strokeDasharray: '4 4' } },
    tooltip: {
      container: {
        background: dark ? '#16303d' : '#ffffff',
        color: ink,
        border: `1px solid ${line}`,
        borderRadius: 8,
        fontSize: 13,
        boxShadow: '0 4px 12px rgb(0 0 0 / 0.2)',
      },
    },
  };
}

/**
 * The still water level (a line with the ▽ mark) and, when the plot reaches it, the seabed as a
 * hatched band, drawn behind the lines.
 */
function makeWaterLayer(patternId: string, depthM: number, showBed: boolean, colours: { line: string; text: string; bed: string }) {
  return function WaterLayer({ yScale, innerWidth, innerHeight }: LineCustomSvgLayerProps<ProfileSeries>) {
    const ySwl = yScale(0);
    const yBed = yScale(-depthM);
    return (
      <g>
        {showBed ? (
          <>
            <defs>
              <pattern id={patternId} width="6" height="6" patternUnits="userSpaceOnUse" patternTransform="rotate(45)">
                <line x1="0" y1="0" x2="0" y2="6" stroke={colours.bed} strokeWidth="2" />
              </pattern>
            </defs>
            <rect x={0} y={yBed} width={innerWidth} height={Math.max(0, innerHeight - yBed)} fill={`url(#${patternId})`} />
            <line x1={0} x2={innerWidth} y1={yBed} y2={yBed} stroke={colours.bed} strokeWidth={2} />
            <text x={innerWidth - 4} y={yBed + 13} textAnchor="end" fontSize={11} fontWeight={600} fill={colours.text}>
              seabed
            </text>
          </>
        ) : null}
        <line x1={0} x2={innerWidth} y1={ySwl} y2={ySwl} stroke={colours.line} strokeWidth={1.5} />
        <text x={4} y={ySwl - 4} fontSize={11} fontWeight={600} fill={colours.text}>
          ▽ still water level
        </text>
      </g>
    );
  };
}

/** Draws the series' lines itself so that w can be dashed. */
function StyledLines(props: LineCustomSvgLayerProps<ProfileSeries>) {
  return <DrawnLines {...props} strokeWidth={2.5} dashOf={(id) => DASH[id]} lineJoin="round" />;
}

function SliceTooltip({ slice }: SliceTooltipProps<ProfileSeries>) {
  const z = slice.points[0]?.data.y;
  return (
    <div className="rounded-lg px-3 py-2 tabular-nums" style={{ minWidth: 150 }}>
      <p className="font-semibold">z = {formatSig(z)} m</p>
      {slice.points.map((p) => (
        <p key={p.id} style={{ color: p.seriesColor }}>
          {p.seriesId === 'kp' ? 'Kp' : p.seriesId} = {formatSig(p.data.x)} {p.seriesId === 'kp' ? '' : 'm/s'}
        </p>
      ))}
    </div>
  );
}

interface ProfileChartProps {
  points: WaveProfilePoint[];
  depthM: number;
  wavelengthM: number;
  /** Elevation the user asked about, m (marked on the plot). */
  zM?: number;
}

/**
 * u(z), w(z) (m/s) and Kp(z) (dimensionless) against elevation z, bed at the bottom and still
 * water level at the top, as two charts side by side (one above the other on a phone). Lazy-loaded.
 */
export default function ProfileChart({ points, depthM, wavelengthM, zM }: ProfileChartProps) {
  const dark = useIsDark();
  const colours = dark ? COLOURS.dark : COLOURS.light;
  const bottom = points.length ? points[0].z : -depthM;
  const reachesBed = Math.abs(bottom + depthM) < 1e-9 * Math.max(1, depthM);
  const velocity: ProfileSeries[] = [
    { id: 'u', data: points.map((p) => ({ x: p.u, y: p.z })) },
    { id: 'w', data: points.map((p) => ({ x: p.w, y: p.z })) },
  ];
  const pressure: ProfileSeries[] = [{ id: 'kp', data: points.map((p) => ({ x: p.kp, y: p.z })) }];
  const soft = dark ? '#9fb4bc' : '#4a5d66';
  const markerText = { fill: soft, fontSize: 11, fontWeight: 600 };
  const markerLabel = { ...LABEL_HALO, ...markerText };
  const markers: CartesianMarkerProps<number>[] = [];
  if (zM !== undefined && zM >= bottom) {
    markers.push({
      axis: 'y',
      value: zM,
      legend: `z = ${formatSig(zM)} m`,
      legendPosition: 'bottom-left',
      lineStyle: { stroke: markerText.fill, strokeDasharray: '3 3' },
      textStyle: markerLabel,
    });
  }
  const theme = themeFor(dark);
  // Room above still water level for its label, and below the bed for the seabed band.
  const span = -bottom;
  const yMin = reachesBed ? bottom - 0.08 * span : bottom;
  // About five round depths from the bed up to the surface (d3-array).
  const ticks = niceTicks(bottom, 0, 5);
  const id = `wl${useId().replace(/[^a-zA-Z0-9_-]/g, '')}`;
  const [velocityWater, pressureWater] = useMemo(() => {
    const c = { line: dark ? '#5fd0c1' : '#0b7a72', text: soft, bed: dark ? '#3a5a66' : '#b9c6c4' };
    return [makeWaterLayer(`${id}-bed-v`, depthM, reachesBed, c), makeWaterLayer(`${id}-bed-p`, depthM, reachesBed, c)];
  }, [id, depthM, reachesBed, dark, soft]);
  // A wave of zero height has no motion: keep a finite velocity axis.
  const anyMotion = points.some((p) => p.u > 0 || p.w > 0);
  const common = {
    theme,
    // The figure around each chart is the image with its words; the chart's own svg is drawing only.
    role: 'presentation',
    animate: false,
    curve: 'monotoneY' as const,
    yScale: { type: 'linear' as const, min: yMin, max: 0.1 * span },
    yFormat: (v: unknown) => formatSig(v as number),
    enablePoints: false,
    enableSlices: 'y' as const,
    sliceTooltip: SliceTooltip,
    markers,
    axisLeft: {
      legend: 'z (m)',
      legendOffset: -46,
      legendPosition: 'middle' as const,
      tickValues: ticks,
      format: (v: number) => formatSig(v, 3),
    },
    gridYValues: ticks,
  };

  return (
    <div>
      <div className="grid gap-2 sm:grid-cols-[3fr_2fr]">
        <figure
          className="h-80"
          role="img"
          aria-label={`Orbital velocity amplitudes u and w from z = ${formatSig(bottom)} m to the surface`}
        >
          <ResponsiveLine<ProfileSeries>
            {...common}
            data={velocity}
            layers={['grid', velocityWater, 'markers', 'axes', StyledLines, 'crosshair', 'slices']}
            colors={({ id }) => colours[id as ProfileSeries['id']]}
            margin={{ top: 12, right: 16, bottom: 48, left: 56 }}
            xScale={{ type: 'linear', min: 0, max: anyMotion ? 'auto' : 1 }}
            gridXValues={4}
            axisBottom={{
              legend: 'u, w (m/s)',
              legendOffset: 38,
              legendPosition: 'middle',
              tickValues: 4,
              format: (v: number) => formatSig(v, 3),
            }}
          />
        </figure>
        <figure className="h-80" role="img" aria-label="Pressure response factor Kp from the bed to the surface">
          <ResponsiveLine<ProfileSeries>
            {...common}
            data={pressure}
            layers={['grid', pressureWater, 'markers', 'axes', StyledLines, 'crosshair', 'slices']}
            colors={() => colours.kp}
            margin={{ top: 12, right: 16, bottom: 48, left: 56 }}
            xScale={{ type: 'linear', min: 0, max: 1 }}
            gridXValues={[0, 0.25, 0.5, 0.75, 1]}
            axisBottom={{
              legend: 'Kp (–)',
              legendOffset: 38,
              legendPosition: 'middle',
              tickValues: [0, 0.5, 1],
              format: (v: number) => formatSig(v, 2),
            }}
          />
        </figure>
      </div>
      <ul className="mt-2 flex flex-wrap gap-x-5 gap-y-1 text-sm" aria-label="Legend">
        {(['u', 'w', 'kp'] as const).map((id) => (
          <li key={id} className="flex items-center gap-2">
            <svg width="28" height="10" aria-hidden>
              <line x1="1" y1="5" x2="27" y2="5" stroke={colours[id]} strokeWidth="2.5" strokeDasharray={DASH[id]} />
            </svg>
            {LABEL[id]}
          </li>
        ))}
      </ul>
      <p className="mt-2 text-xs text-ink-soft">
        {reachesBed
          ? `Plotted from the seabed (z = −${formatSig(depthM)} m) to still water level.`
          : `Plotted from z = −L/2 = ${formatSig(-wavelengthM / 2)} m up: deeper down the orbital motion has all but died out.`}
      </p>
      <details className="mt-2 text-sm">
        <summary className="inline-flex min-h-11 cursor-pointer items-center font-semibold">The numbers behind the plot</summary>
        <div className="max-h-72 overflow-auto rounded-lg border border-line">
          <table className="w-full text-right text-sm tabular-nums">
            <thead className="sticky top-0 bg-surface-2">
              <tr>
                <th className="px-3 py-1.5">z (m)</th>
                <th className="px-3 py-1.5">u (m/s)</th>
                <th className="px-3 py-1.5">w (m/s)</th>
                <th className="px-3 py-1.5">Kp (–)</th>
              </tr>
            </thead>
            <tbody>
              {[...points].reverse().map((p) => (
                <tr key={p.z} className="border-t border-line">
                  <td className="px-3 py-1">{formatSig(p.z)}</td>
                  <td className="px-3 py-1">{formatSig(p.u)}</td>
                  <td className="px-3 py-1">{formatSig(p.w)}</td>
                  <td className="px-3 py-1">{formatSig(p.kp)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </details>
    </div>
  );
}
