/**
 * An operation's limits (OPLIM) in words, one phrase per limit, every kind of limit the engine
 * tests: the Sites & limits page shows the short form, the printed downtime report the full form
 * (longer names, the Hs–Tp curve's points). One list, so that a new kind of limit is named
 * everywhere at once. Limits are inclusive (docs/domain.md#convention-6), hence "≤"; an excluded
 * band is closed, so "not in" includes its edges.
 */
import { DEFAULT_MPM_DURATION_H, responseSettings } from './engine/response-limits';
import type { HsTargetLimit, OperationLimits } from './engine/types';
import { responseLabel, responseUnit } from './response/rao';
import type { Spreading } from './response/spreading';

/** Names of the bed velocity methods, as the limit says which one it is compared with. */
export const BED_VELOCITY_METHOD_LABEL: Record<'linear' | 'soulsby', string> = {
  linear: 'linear significant',
  soulsby: 'Soulsby 2006',
};

/** A number rounded to at most 3 places, trailing zeros dropped ("1.5", "16", "0.35"). */
const num = (x: number): string => String(Number(x.toFixed(3)));

/** A number with its unit after a narrow no-break space ("1.5 m"); degrees close up ("300°"). */
const unit = (x: number, u: string): string => (u === '' ? num(x) : u === '°' ? `${num(x)}°` : `${num(x)}\u202f${u}`);

const range = (from: number, to: number, u: string): string => `${num(from)}–${unit(to, u)}`;

/** The part of the sea an Hs target limit takes (docs/domain.md#partitions). */
function targetWords(t: HsTargetLimit): string {
  switch (t.target) {
    case 'total':
      return 'total sea';
    case 'swell':
      return 'swell';
    case 'windSea':
      return 'wind sea';
    case 'longPeriod':
      return t.minPeriodS != null ? `long-period sea (Tp ≥ ${unit(t.minPeriodS, 's')})` : 'long-period sea';
  }
}

export type LimitWordsForm = 'short' | 'full';

/**
 * The limits as phrases, in the order the operation form lists them, e.g. (short) "Hs ≤ 1.5 m",
 * "Tp not in 13–15 s", "wind ≤ 16 m/s", "swell Hs ≤ 0.8 m", "roll significant ≤ 4 deg".
 */
export function describeLimits(limits: OperationLimits, form: LimitWordsForm = 'short'): string[] {
  const full = form === 'full';
  const out: string[] = [];
  if (limits.hsMax != null) out.push(`Hs ≤ ${unit(limits.hsMax, 'm')}`);
  const curve = limits.hsTpCurve ?? [];
  if (curve.length > 0) {
    const tps = curve.map((p) => p[0]);
    const hss = curve.map((p) => p[1]);
    const points = full
      ? curve.map(([tp, hs]) => `(${unit(tp, 's')}, ${unit(hs, 'm')})`).join(' ')
      : `(${range(Math.min(...hss), Math.max(...hss), 'm')})`;
    out.push(`Hs under the Hs–Tp curve ${points}, no-go outside Tp ${range(Math.min(...tps), Math.max(...tps), 's')}`);
  }
  if (limits.tpMin != null && limits.tpMax != null) out.push(`Tp ${range(limits.tpMin, limits.tpMax, 's')}`);
  else if (limits.tpMin != null) out.push(`Tp ≥ ${unit(limits.tpMin, 's')}`);
  else if (limits.tpMax != null) out.push(`Tp ≤ ${unit(limits.tpMax, 's')}`);
  for (const [from, to] of limits.tpExcluded ?? []) out.push(`Tp not in ${range(from, to, 's')}`);
  if ((limits.tpExcluded ?? []).length > 0 && limits.tpExcludedMinHs != null)
    // docs/domain.md#partitions: every partition from this Hs is tested against the bands too.
    out.push(`excluded bands tested on each partition from Hs ${unit(limits.tpExcludedMinHs, 'm')}`);
  if (limits.bedVelocityMax != null) {
    const name = full ? 'near-bed orbital velocity' : 'bed velocity';
    out.push(`${name} ≤ ${unit(limits.bedVelocityMax, 'm/s')} (${BED_VELOCITY_METHOD_LABEL[limits.bedVelocityMethod ?? 'linear']})`);
  }
  if (limits.windMax != null) out.push(`${full ? 'wind at 10 m' : 'wind'} ≤ ${unit(limits.windMax, 'm/s')}`);
  // Exact limits of docs/domain.md#tide (alpha never applies); the depth is chart depth + predicted tide.
  const depth = full ? 'still-water depth' : 'depth';
  if (limits.minDepth != null) {
    const p = limits.minDepthParts;
    const parts = p ? ` (draught ${unit(p.draught, 'm')} + ${full ? 'under-keel ' : ''}clearance ${unit(p.clearance, 'm')})` : '';
    out.push(`${depth} ≥ ${unit(limits.minDepth, 'm')}${parts}`);
  }
  if (limits.maxDepth != null) out.push(`${depth} ≤ ${unit(limits.maxDepth, 'm')}`);
  if (limits.currentMax != null) out.push(`current ≤ ${unit(limits.currentMax, 'm/s')}`);
  if (limits.tideWindow) {
    const w = limits.tideWindow;
    out.push(`only from ${unit(w.before, 'h')} before to ${unit(w.after, 'h')} after ${full ? 'predicted ' : ''}${w.reference} water`);
  }
  // Hs limits on part of the sea (docs/domain.md#partitions).
  for (const t of limits.hsTargets ?? []) out.push(`${targetWords(t)} Hs ≤ ${unit(t.max, 'm')}`);
  // Vessel response limits (docs/domain.md#vessel-response): R_s, or R_mpm over its duration (3 h by default).
  for (const r of limits.responses ?? []) {
    const statistic =
      r.statistic === 'significant' ? 'significant' : `most probable max over ${unit(r.durationH ?? DEFAULT_MPM_DURATION_H, 'h')}`;
    out.push(`${responseLabel(r.response).toLowerCase()} ${statistic} ≤ ${unit(r.max, responseUnit(r.response))}`);
  }
  if (full && (limits.responses ?? []).length > 0) {
    // The spectra the responses are worked from, defaults filled in (docs/domain.md#vessel-response).
    const sea = responseSettings(limits.responseSea);
    const gamma = (g: number | 'dnv') => (g === 'dnv' ? 'γ by the DNV-RP-C205 rule' : `γ ${num(g)}`);
    out.push(
      `responses worked from wind sea ${gamma(sea.windSeaGamma)}, ${spreadingWords(sea.windSeaSpreading)} and swell ${gamma(sea.swellGamma)}, ${spreadingWords(sea.swellSpreading)}`,
    );
  }
  return out;
}

const spreadingWords = (s: Spreading): string => (s === 'long-crested' ? 'long-crested' : `cos^${num(s)} spreading`);
