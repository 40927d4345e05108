import { useMemo, useState } from 'react';
import { ResponsiveLine, type LineSeries } from '@nivo/line';
import type { VesselResponseAnswer } from '../api/get-vessel-response';
import { useIsDark } from '../../../lib/use-is-dark';
import { formatSig } from '../utils/format-number';
import { ModeTabs } from './mode-tabs';
import { themeFor } from './profile-chart';

type Axis = 'frequency' | 'period';

interface SpectrumSeries extends LineSeries {
  id: string;
  data: { x: number; y: number }[];
}

/** The x value of a point: angular frequency (rad/s) or period 2π/ω (s). */
const xOf = (omega: number, axis: Axis) => (axis === 'frequency' ? omega : (2 * Math.PI) / omega);

/** The peak of a spectrum: its angular frequency and value (null when it is zero everywhere). */
function peakOf(omega: number[], s: number[]): { omega: number; value: number } | null {
  let k = -1;
  for (let i = 0; i < s.length; i++) if (s[i] > 0 && (k < 0 || s[i] > s[k])) k = i;
  return k < 0 ? null : { omega: omega[k], value: s[k] };
}

/**
 * The sea's spectrum and each response's spectrum, one small chart each (their units differ),
 * against angular frequency or period; each chart is described in words for screen readers.
 */
export default function ResponseSpectraChart({ answer }: { answer: VesselResponseAnswer }) {
  const [axis, setAxis] = useState<Axis>('frequency');
  const dark = useIsDark();
  const theme = useMemo(() => themeFor(dark), [dark]);
  const colour = dark ? '#49c2b3' : '#0b7a72';
  const waveColour = dark ? '#a9c4ff' : '#16415a';
  const panels = [
    { id: 'wave', title: 'Sea, S(ω)', unit: 'm²·s/rad', values: answer.waveSpectrum, colour: waveColour },
    ...answer.responses.map((r) => ({
      id: r.response,
      title: `${r.label}, S_R(ω)`,
      unit: `${r.unit.includes('/') ? `(${r.unit})` : r.unit}²·s/rad`,
      values: r.spectrum,
      colour,
    })),
  ];
  return (
    <div>
      <div className="mb-3 flex flex-wrap items-center justify-between gap-2">
        <h2 id="response-spectra-title" className="text-lg font-bold">
          Spectra
        </h2>
        <ModeTabs
          modes={[
            { id: 'frequency', label: 'Against frequency ω' },
            { id: 'period', label: 'Against period T' },
          ]}
          value={axis}
          onChange={setAxis}
          label="Spectra axis"
          idPrefix="response-axis"
        />
      </div>
      <div
        role="tabpanel"
        id={`response-axis-panel-${axis}`}
        aria-labelledby={`response-axis-tab-${axis}`}
        className="grid gap-4 sm:grid-cols-2"
      >
        {panels.map((p) => {
          const peak = peakOf(answer.omega, p.values);
          const words = peak
            ? `peak ${formatSig(peak.value, 3)} ${p.unit} at ω = ${formatSig(peak.omega, 3)} rad/s (T = ${formatSig((2 * Math.PI) / peak.omega, 3)} s)`
            : 'zero at every frequency';
          const data: SpectrumSeries[] = [
            { id: p.id, data: answer.omega.map((w, i) => ({ x: xOf(w, axis), y: p.values[i] })).sort((a, b) => a.x - b.x) },
          ];
          return (
            <figure key={p.id} className="m-0" data-testid={`spectrum-${p.id}`}>
              <figcaption className="text-sm font-semibold">
                {p.title} <span className="font-normal text-ink-soft">({p.unit})</span>
                <span className="block text-xs font-normal text-ink-soft">{words}</span>
              </figcaption>
              <div
                className="h-44"
                role="img"
                aria-label={`${p.title} against ${axis === 'frequency' ? 'angular frequency' : 'period'}: ${words}.`}
              >
                <ResponsiveLine<SpectrumSeries>
                  data={data}
                  xScale={{ type: 'linear', min: 'auto', max: 'auto' }}
                  yScale={{ type: 'linear', min: 0, max: 'auto' }}
                  margin={{ top: 8, right: 12, bottom: 36, left: 52 }}
                  colors={[p.colour]}
                  lineWidth={2}
                  enablePoints={false}
                  enableArea
                  areaOpacity={0.12}
                  axisBottom={{
                    tickValues: 5,
                    legend: axis === 'frequency' ? 'ω (rad/s)' : 'T (s)',
                    legendOffset: 28,
                    legendPosition: 'middle',
                    format: (v: number) => formatSig(v, 3),
                  }}
                  axisLeft={{ tickValues: 3, format: (v: number) => formatSig(v, 2) }}
                  enableGridX={false}
                  gridYValues={3}
                  isInteractive={false}
                  theme={theme}
                  animate={false}
                  role="presentation"
                />
              </div>
            </figure>
          );
        })}
      </div>
    </div>
  );
}
