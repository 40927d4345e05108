import type { OperationLimits } from '../../../../shared/engine/types';

const n = (x: number) => String(Math.round(x * 1000) / 1000);

/**
 * An operation's limits (OPLIM) in words for the printed report: "Hs ≤ 1.5 m; Tp not in 13–15 s;
 * wind ≤ 16 m/s". Limits are inclusive (docs/domain.md#convention-6); excluded bands include their edges.
 */
export function limitsInWords(limits: OperationLimits): string {
  const out: string[] = [];
  if (limits.hsMax != null) out.push(`Hs ≤ ${n(limits.hsMax)} m`);
  const curve = limits.hsTpCurve ?? [];
  if (curve.length > 0) {
    out.push(
      `Hs under the Hs–Tp curve ${curve.map(([tp, hs]) => `(${n(tp)} s, ${n(hs)} m)`).join(' ')}, no-go outside Tp ${n(curve[0][0])}–${n(curve[curve.length - 1][0])} s`,
    );
  }
  if (limits.tpMin != null && limits.tpMax != null) out.push(`Tp ${n(limits.tpMin)}–${n(limits.tpMax)} s`);
  else if (limits.tpMin != null) out.push(`Tp ≥ ${n(limits.tpMin)} s`);
  else if (limits.tpMax != null) out.push(`Tp ≤ ${n(limits.tpMax)} s`);
  for (const [a, b] of limits.tpExcluded ?? []) out.push(`Tp not in ${n(a)}–${n(b)} s`);
  if (limits.bedVelocityMax != null) {
    out.push(
      `near-bed orbital velocity ≤ ${n(limits.bedVelocityMax)} m/s (${limits.bedVelocityMethod === 'soulsby' ? 'Soulsby 2006' : 'linear significant'})`,
    );
  }
  if (limits.windMax != null) out.push(`wind at 10 m ≤ ${n(limits.windMax)} m/s`);
  // Exact limits of docs/domain.md#tide: alpha never applies; the depth is h = chart depth + predicted tide.
  if (limits.minDepth != null)
    out.push(
      `still-water depth ≥ ${n(limits.minDepth)} m${limits.minDepthParts ? ` (draught ${n(limits.minDepthParts.draught)} m + under-keel clearance ${n(limits.minDepthParts.clearance)} m)` : ''}`,
    );
  if (limits.maxDepth != null) out.push(`still-water depth ≤ ${n(limits.maxDepth)} m`);
  if (limits.currentMax != null) out.push(`current ≤ ${n(limits.currentMax)} m/s`);
  if (limits.tideWindow)
    out.push(
      `only from ${n(limits.tideWindow.before)} h before to ${n(limits.tideWindow.after)} h after predicted ${limits.tideWindow.reference} water`,
    );
  return out.length > 0 ? out.join('; ') : 'no limit set';
}
