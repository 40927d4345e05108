import { useId } from 'react';
import { tickStep, ticks } from 'd3-array';
import { fmt } from './format';
import { hsTpEnvelope, usableCurve, type EnvelopeLimits } from './hs-tp-envelope';

const W = 420;
const H = 260;
const PAD = { left: 44, right: 12, top: 14, bottom: 38 };

/**
 * The operation's Hs–Tp envelope drawn beside the limit inputs: the workable area under
 * min(Hs max, curve), the curve's points, the Tp no-go zones (hatched), and, when alpha applies,
 * the forecast limit OPWF = α·OPLIM dashed. Redrawn as the inputs change; values that do not
 * parse yet are left out.
 *
 * @param alphaAt alpha for an Hs limit in m (docs/domain.md#convention-5: looked up at the limit's own value);
 *   null when the operation works at OPLIM (not weather-restricted, TPOP above 72 h or TR above 96 h).
 */
export function HsTpPlot({ limits, alphaAt }: { limits: EnvelopeLimits; alphaAt: ((hsM: number) => number) | null }) {
  const id = useId();
  const curve = usableCurve(limits.curve);
  const hsFinite = limits.hsMax !== null && Number.isFinite(limits.hsMax) ? limits.hsMax : null;
  const tps = [
    ...(curve ?? []).map((p) => p[0]),
    ...(limits.tpMin !== null && Number.isFinite(limits.tpMin) ? [limits.tpMin] : []),
    ...(limits.tpMax !== null && Number.isFinite(limits.tpMax) ? [limits.tpMax] : []),
    ...limits.bands.flat().filter(Number.isFinite),
  ];
  const hss = [...(curve ?? []).map((p) => p[1]), ...(hsFinite !== null ? [hsFinite] : [])];
  const hasSomething = tps.length > 0 || hss.length > 0;

  const xEnd = Math.max(20, Math.ceil(((tps.length ? Math.max(...tps) : 0) + 2) / 5) * 5);
  const yTop = hss.length ? Math.max(...hss) * 1.3 : 3;
  // Round steps (1, 2 or 5 × 10^k) by d3-array; the Hs axis ends on a whole step.
  const yStep = tickStep(0, yTop, 5);
  const yEnd = Math.ceil(yTop / yStep) * yStep;

  const sx = (tp: number) => PAD.left + (tp / xEnd) * (W - PAD.left - PAD.right);
  const sy = (hs: number) => H - PAD.bottom - (Math.min(hs, yEnd) / yEnd) * (H - PAD.top - PAD.bottom);
  const pieces = hasSomething ? hsTpEnvelope(limits, xEnd) : [];

  const xTicks = ticks(0, xEnd, 8);
  const yTicks = ticks(0, yEnd, Math.round(yEnd / yStep));

  const opwf: string[] = [];
  if (alphaAt) {
    for (const p of pieces) {
      if (p.kind !== 'limit' || !Number.isFinite(p.hsFromM) || !Number.isFinite(p.hsToM)) continue;
      const pts: string[] = [];
      for (let k = 0; k <= 16; k++) {
        const tp = p.fromS + ((p.toS - p.fromS) * k) / 16;
        const hs = p.hsFromM + ((p.hsToM - p.hsFromM) * k) / 16;
        pts.push(`${sx(tp).toFixed(1)},${sy(alphaAt(hs) * hs).toFixed(1)}`);
      }
      opwf.push(pts.join(' '));
    }
  }

  const described = `${id}-desc`;
  return (
    <figure className="flex min-w-0 flex-col gap-2">
      <svg
        viewBox={`0 0 ${W} ${H}`}
        className="h-auto w-full max-w-[32rem] rounded-lg border border-line bg-surface text-ink"
        role="img"
        aria-labelledby={`${id}-title`}
        aria-describedby={described}
      >
        <title id={`${id}-title`}>Hs–Tp limits of the operation</title>
        <defs>
          <pattern id={`${id}-hatch`} width="6" height="6" patternUnits="userSpaceOnUse" patternTransform="rotate(45)">
            <rect width="6" height="6" fill="var(--color-st-notworkable)" fillOpacity="0.12" />
            <line x1="0" y1="0" x2="0" y2="6" stroke="var(--color-st-notworkable)" strokeWidth="2" strokeOpacity="0.55" />
          </pattern>
        </defs>
        {/* grid and axes */}
        {yTicks.map((y) => (
          <g key={`y${y}`}>
            <line x1={PAD.left} x2={W - PAD.right} y1={sy(y)} y2={sy(y)} stroke="var(--color-line)" strokeWidth="1" />
            <text x={PAD.left - 6} y={sy(y) + 4} textAnchor="end" fontSize="12.5" fill="currentColor" opacity="0.75">
              {fmt(y, 2)}
            </text>
          </g>
        ))}
        {xTicks.map((x) => (
          <text key={`x${x}`} x={sx(x)} y={H - PAD.bottom + 15} textAnchor="middle" fontSize="12.5" fill="currentColor" opacity="0.75">
            {fmt(x, 1)}
          </text>
        ))}
        <text x={(PAD.left + W - PAD.right) / 2} y={H - 6} textAnchor="middle" fontSize="13" fill="currentColor">
          Tp (s)
        </text>
        <text
          x={12}
          y={(PAD.top + H - PAD.bottom) / 2}
          textAnchor="middle"
          fontSize="12"
          fill="currentColor"
          transform={`rotate(-90 12 ${(PAD.top + H - PAD.bottom) / 2})`}
        >
          Hs (m)
        </text>

        {/* no-go zones and the workable area */}
        {pieces.map((p, i) =>
          p.kind === 'nogo' ? (
            <rect
              key={i}
              x={sx(p.fromS)}
              y={PAD.top}
              width={Math.max(0, sx(p.toS) - sx(p.fromS))}
              height={H - PAD.top - PAD.bottom}
              fill={`url(#${id}-hatch)`}
            >
              <title>
                No-go at Tp {fmt(p.fromS)}–{fmt(p.toS)} s ({p.reason})
              </title>
            </rect>
          ) : (
            <polygon
              key={i}
              points={[
                [sx(p.fromS), sy(0)],
                [sx(p.fromS), sy(Number.isFinite(p.hsFromM) ? p.hsFromM : yEnd)],
                [sx(p.toS), sy(Number.isFinite(p.hsToM) ? p.hsToM : yEnd)],
                [sx(p.toS), sy(0)],
              ]
                .map((q) => q.map((v) => v.toFixed(1)).join(','))
                .join(' ')}
              fill="var(--color-st-workable)"
              fillOpacity="0.22"
            />
          ),
        )}
        {pieces.map((p, i) =>
          p.kind === 'limit' && Number.isFinite(p.hsFromM) && Number.isFinite(p.hsToM) ? (
            <line
              key={`l${i}`}
              x1={sx(p.fromS)}
              y1={sy(p.hsFromM)}
              x2={sx(p.toS)}
              y2={sy(p.hsToM)}
              stroke="var(--color-accent)"
              strokeWidth="2.5"
            />
          ) : null,
        )}
        {curve && hsFinite !== null ? (
          <polyline
            points={curve.map(([tp, hs]) => `${sx(tp).toFixed(1)},${sy(hs).toFixed(1)}`).join(' ')}
            fill="none"
            stroke="var(--color-accent)"
            strokeOpacity="0.45"
            strokeWidth="1.5"
          />
        ) : null}
        {opwf.map((pts, i) => (
          <polyline key={`w${i}`} points={pts} fill="none" stroke="var(--color-st-marginal)" strokeWidth="2" strokeDasharray="5 4" />
        ))}
        {(curve ?? []).map(([tp, hs], i) => (
          <circle key={`c${i}`} cx={sx(tp)} cy={sy(hs)} r="4" fill="var(--color-surface)" stroke="var(--color-accent)" strokeWidth="2">
            <title>
              Curve point {i + 1}: Tp {fmt(tp)} s, Hs {fmt(hs)} m
            </title>
          </circle>
        ))}
        <line x1={PAD.left} x2={PAD.left} y1={PAD.top} y2={H - PAD.bottom} stroke="currentColor" strokeOpacity="0.5" />
        <line x1={PAD.left} x2={W - PAD.right} y1={H - PAD.bottom} y2={H - PAD.bottom} stroke="currentColor" strokeOpacity="0.5" />
        {!hasSomething ? (
          <text
            x={(PAD.left + W - PAD.right) / 2}
            y={(PAD.top + H - PAD.bottom) / 2}
            textAnchor="middle"
            fontSize="13"
            fill="currentColor"
            opacity="0.7"
          >
            No Hs or Tp limit to draw yet
          </text>
        ) : null}
      </svg>
      <figcaption id={described} className="flex flex-wrap gap-x-4 gap-y-1 text-xs text-ink-soft">
        <span className="inline-flex items-center gap-1.5">
          <span className="inline-block h-3 w-4 rounded-sm bg-st-workable/30 ring-1 ring-accent" aria-hidden /> workable at the limit
          (OPLIM)
        </span>
        <span className="inline-flex items-center gap-1.5">
          <span className="inline-block h-3 w-4 rounded-sm pattern-notworkable bg-st-notworkable/25" aria-hidden /> no-go Tp
        </span>
        {alphaAt ? (
          <span className="inline-flex items-center gap-1.5">
            <span className="inline-block w-4 border-t-2 border-dashed border-st-marginal" aria-hidden /> forecast limit OPWF = α·OPLIM
          </span>
        ) : null}
        {curve ? (
          <span>
            Curve covers Tp {fmt(curve[0][0])}–{fmt(curve[curve.length - 1][0])} s; no-go outside.
          </span>
        ) : null}
      </figcaption>
    </figure>
  );
}
