import { tickStep } from 'd3-array';
import type { ForecastSkillAnswer } from '../../../../shared/api-types-skill';
import { trimmed } from '../../../lib/format';

const W = 420;
const H = 300;
const PAD = { left: 48, right: 14, top: 14, bottom: 42 };

function axisTicks(from: number, to: number, count: number): number[] {
  const step = tickStep(from, to, count);
  const out: number[] = [];
  for (let v = Math.ceil(from / step) * step; v <= to + 1e-9; v += step) out.push(Math.round(v / step) * step);
  return out;
}

/**
 * Forecast against observed Hs, one dot per sampled pair, coloured by lead bin (and shaped, so the
 * lead reads without colour: filled to 24 h, hollow beyond), with the 1:1 line.
 */
export function SkillScatter({ points }: { points: ForecastSkillAnswer['points'] }) {
  const max = Math.max(1, ...points.map((p) => Math.max(p.fc, p.obs)));
  const end = Math.ceil(max / tickStep(0, max, 5)) * tickStep(0, max, 5);
  const sx = (v: number) => PAD.left + (v / end) * (W - PAD.left - PAD.right);
  const sy = (v: number) => H - PAD.bottom - (v / end) * (H - PAD.top - PAD.bottom);
  const ticks = axisTicks(0, end, 5);
  return (
    <svg
      viewBox={`0 0 ${W} ${H}`}
      className="w-full max-w-xl"
      role="img"
      aria-label={`Forecast against observed Hs, ${points.length} pairs`}
    >
      {ticks.map((t) => (
        <g key={t} className="text-ink-soft">
          <line x1={sx(t)} x2={sx(t)} y1={sy(0)} y2={sy(end)} stroke="currentColor" strokeOpacity={0.15} />
          <line x1={sx(0)} x2={sx(end)} y1={sy(t)} y2={sy(t)} stroke="currentColor" strokeOpacity={0.15} />
          <text x={sx(t)} y={H - PAD.bottom + 16} textAnchor="middle" fontSize={11} fill="currentColor">
            {trimmed(t, 1)}
          </text>
          <text x={PAD.left - 6} y={sy(t) + 4} textAnchor="end" fontSize={11} fill="currentColor">
            {trimmed(t, 1)}
          </text>
        </g>
      ))}
      <line x1={sx(0)} y1={sy(0)} x2={sx(end)} y2={sy(end)} stroke="currentColor" strokeDasharray="4 3" className="text-ink" />
      {points.map((p, i) => (
        <circle
          key={i}
          cx={sx(p.fc)}
          cy={sy(p.obs)}
          r={2.2}
          className={p.leadH < 24 ? 'text-accent' : 'text-lamp'}
          fill={p.leadH < 24 ? 'currentColor' : 'none'}
          stroke="currentColor"
          strokeOpacity={0.8}
          fillOpacity={0.5}
        />
      ))}
      <text x={(sx(0) + sx(end)) / 2} y={H - 6} textAnchor="middle" fontSize={12} fill="currentColor" className="text-ink">
        Forecast Hs (m)
      </text>
      <text
        x={12}
        y={(sy(0) + sy(end)) / 2}
        textAnchor="middle"
        fontSize={12}
        fill="currentColor"
        className="text-ink"
        transform={`rotate(-90 12 ${(sy(0) + sy(end)) / 2})`}
      >
        Observed Hs (m)
      </text>
    </svg>
  );
}

/** Mean log error per lead bin with a bar of ± one standard deviation; 0 = no bias. */
export function BiasByLead({ byLead }: { byLead: ForecastSkillAnswer['byLead'] }) {
  const shown = byLead.filter((b) => b.mean !== null);
  const reach = Math.max(0.05, ...shown.map((b) => Math.abs(b.mean!) + (b.sd ?? 0)));
  const top = Math.ceil(reach / tickStep(0, reach, 3)) * tickStep(0, reach, 3);
  const slot = (W - PAD.left - PAD.right) / byLead.length;
  const sx = (i: number) => PAD.left + slot * (i + 0.5);
  const sy = (v: number) => PAD.top + ((top - v) / (2 * top)) * (H - PAD.top - PAD.bottom);
  const ticks = axisTicks(-top, top, 4);
  return (
    <svg
      viewBox={`0 0 ${W} ${H}`}
      className="w-full max-w-xl"
      role="img"
      aria-label="Mean log error ln(observed/forecast) by lead time, with one standard deviation"
    >
      {ticks.map((t) => (
        <g key={t} className="text-ink-soft">
          <line x1={PAD.left} x2={W - PAD.right} y1={sy(t)} y2={sy(t)} stroke="currentColor" strokeOpacity={t === 0 ? 0.6 : 0.15} />
          <text x={PAD.left - 6} y={sy(t) + 4} textAnchor="end" fontSize={11} fill="currentColor">
            {trimmed(t, 2)}
          </text>
        </g>
      ))}
      {byLead.map((b, i) => (
        <g key={b.fromH} className="text-ink">
          <text x={sx(i)} y={H - PAD.bottom + 16} textAnchor="middle" fontSize={11} fill="currentColor">
            {b.fromH}–{b.toH} h
          </text>
          {b.mean !== null ? (
            <>
              {b.sd !== null ? (
                <line
                  x1={sx(i)}
                  x2={sx(i)}
                  y1={sy(b.mean + b.sd)}
                  y2={sy(b.mean - b.sd)}
                  stroke="currentColor"
                  strokeWidth={2}
                  className="text-accent"
                />
              ) : null}
              <rect x={sx(i) - 5} y={sy(b.mean) - 5} width={10} height={10} fill="currentColor" />
              <text x={sx(i) + 9} y={sy(b.mean) + 4} fontSize={11} fill="currentColor">
                {trimmed(b.mean, 3)}
              </text>
            </>
          ) : (
            <text x={sx(i)} y={sy(0) - 6} textAnchor="middle" fontSize={11} fill="currentColor">
              no data
            </text>
          )}
        </g>
      ))}
      <text x={(PAD.left + W - PAD.right) / 2} y={H - 6} textAnchor="middle" fontSize={12} fill="currentColor" className="text-ink">
        Lead time (square: mean, bar: ± 1 sd)
      </text>
    </svg>
  );
}
