import type { OperationLimits } from '../../../../shared/engine/types';
import { DEFAULT_MPM_DURATION_H } from '../../../../shared/engine/response-limits';
import { responseLabel, responseUnit } from '../../../../shared/response/rao';
import { fmt, range, withUnit } from './format';

/** Names of the bed velocity methods, as the limit says which one it is compared with. */
export const BED_VELOCITY_METHOD_LABEL: Record<'linear' | 'soulsby', string> = {
  linear: 'linear significant',
  soulsby: 'Soulsby 2006',
};

/**
 * An operation's limits (OPLIM) in words, one phrase per limit, in the order the form lists them:
 * "Hs ≤ 1.5 m", "Hs under the Hs–Tp curve, Tp 4–16 s", "Tp 3–14 s", "Tp not in 13–15 s",
 * "bed velocity ≤ 0.35 m/s (Soulsby 2006)", "wind ≤ 16 m/s". Limits are inclusive
 * (docs/domain.md#convention-6), hence "≤"; an excluded band is closed, so "not in" includes its edges.
 */
export function describeLimits(limits: OperationLimits): string[] {
  const out: string[] = [];
  if (limits.hsMax != null) out.push(`Hs ≤ ${withUnit(limits.hsMax, 'm')}`);
  const curve = limits.hsTpCurve ?? [];
  if (curve.length > 0) {
    const tps = curve.map((p) => p[0]);
    const hss = curve.map((p) => p[1]);
    out.push(
      `Hs under the Hs–Tp curve (${fmt(Math.min(...hss))}–${withUnit(Math.max(...hss), 'm')}), no-go outside Tp ${range(Math.min(...tps), Math.max(...tps), 's')}`,
    );
  }
  if (limits.tpMin != null && limits.tpMax != null) out.push(`Tp ${range(limits.tpMin, limits.tpMax, 's')}`);
  else if (limits.tpMin != null) out.push(`Tp ≥ ${withUnit(limits.tpMin, 's')}`);
  else if (limits.tpMax != null) out.push(`Tp ≤ ${withUnit(limits.tpMax, 's')}`);
  for (const [from, to] of limits.tpExcluded ?? []) out.push(`Tp not in ${range(from, to, 's')}`);
  if (limits.bedVelocityMax != null) {
    out.push(
      `bed velocity ≤ ${withUnit(limits.bedVelocityMax, 'm/s')} (${BED_VELOCITY_METHOD_LABEL[limits.bedVelocityMethod ?? 'linear']})`,
    );
  }
  if (limits.windMax != null) out.push(`wind ≤ ${withUnit(limits.windMax, 'm/s')}`);
  // Exact limits of docs/domain.md#tide (alpha never applies).
  if (limits.minDepth != null) {
    const p = limits.minDepthParts;
    out.push(
      `depth ≥ ${withUnit(limits.minDepth, 'm')}${p ? ` (draught ${withUnit(p.draught, 'm')} + clearance ${withUnit(p.clearance, 'm')})` : ''}`,
    );
  }
  if (limits.maxDepth != null) out.push(`depth ≤ ${withUnit(limits.maxDepth, 'm')}`);
  if (limits.currentMax != null) out.push(`current ≤ ${withUnit(limits.currentMax, 'm/s')}`);
  if (limits.tideWindow)
    out.push(
      `only ${withUnit(limits.tideWindow.before, 'h')} before to ${withUnit(limits.tideWindow.after, 'h')} after ${limits.tideWindow.reference} water`,
    );
  // Vessel response limits (docs/domain.md#vessel-response): R_s, or R_mpm over its duration (3 h by default).
  for (const r of limits.responses ?? [])
    out.push(
      `${responseLabel(r.response).toLowerCase()} ${r.statistic === 'significant' ? 'significant' : `most probable max over ${withUnit(r.durationH ?? DEFAULT_MPM_DURATION_H, 'h')}`} ≤ ${withUnit(r.max, responseUnit(r.response))}`,
    );
  return out;
}

/** The limits as one line: "Hs ≤ 1.5 m, Tp not in 13–15 s, wind ≤ 16 m/s". */
export function summarizeLimits(limits: OperationLimits): string {
  const parts = describeLimits(limits);
  return parts.length > 0 ? parts.join(', ') : 'No limit set';
}
