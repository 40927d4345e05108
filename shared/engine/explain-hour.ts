import {
  mostProbableMaximum,
  prepareRao,
  responseLabel,
  tabulatedResponseMoments,
  responseUnit,
  significantAmplitude,
  zeroCrossingPeriod,
  type SeaPartition,
} from '../response';
import { alphaFor } from './alpha-factor';
import { DEFAULT_MPM_DURATION_H, responseSettings, totalHs } from './response-limits';
import { tideWindowMarginH } from './tide-window';
import { DEFAULT_BAND_MIN_HS_M } from './hs-targets';
import type { AlphaTable, EnginePartitionName, HsTarget, LimitName, OperationSpec, TideExtremes } from './types';

/** The response behind a response limit's check (docs/domain.md#vessel-response). */
export interface ResponseCheckDetail {
  /** RAO column, e.g. 'roll_deg_per_m'. */
  response: string;
  statistic: 'significant' | 'mpm';
  durationH: number;
  /** R_s = 2 sqrt(m0) and R_mpm over the limit's duration, in the response's unit. */
  significant: number | null;
  mpm: number | null;
  /** Tz of the response, s. */
  tz: number | null;
  /** Total Hs of the partitions and the equivalent Hs limit Hs * R_lim / R, m. */
  hsTotal: number | null;
  hsEquivalent: number | null;
  /** The partition that gives most of the response's m0, with its share (0-1). */
  drivenBy: { kind: SeaPartition['kind']; index: number; share: number } | null;
  /**
   * The sea the response was computed from, partition by partition, at the worksite (Hs m, Tp s,
   * direction deg true; null where unknown), with each one's share (0-1) of the response's m0
   * (null when the response could not be computed or is 0).
   */
  partitions: { kind: SeaPartition['kind']; hsM: number | null; tpS: number | null; dirDeg: number | null; share: number | null }[];
}

/** One limit tested against one hour: the values behind the "chain" view of the board. */
export interface LimitCheck {
  limit: LimitName;
  /** Plain-words label, e.g. "Hs max". */
  label: string;
  unit: 'm' | 's' | 'm/s' | 'h' | 'deg' | 'm/s²';
  /** The hour's value of the limited quantity (null when missing). */
  value: number | null;
  /** The operation limit OPLIM (for a band: its nearer edge). */
  oplim: number | null;
  /** The forecast limit OPWF = alpha*OPLIM (Hs limits only; else null). */
  opwf: number | null;
  alpha: number | null;
  /** Distance to the limit that decides (OPWF for Hs), in the unit; negative when broken. */
  margin: number | null;
  /** Met at the limit that decides; null = no data. */
  met: boolean | null;
  /** Met at OPLIM (differs from `met` only for Hs limits). */
  metAtOplim: boolean | null;
  /** Why the limit is broken, in words, where the numbers alone do not say it (the Hs-Tp curve). */
  reason?: string;
  /** For a response limit: the response's figures. */
  response?: ResponseCheckDetail;
  /** The partition that drives the value (the largest Hs among those the limit takes; for a band, the partition inside it). */
  drivenBy?: EnginePartitionName;
}

/** One partition at the worksite for one hour: Hs (m; 0 absent, NaN unknown) and Tp (s). */
export type HourPartitions = Record<EnginePartitionName, { hsM: number; tpS: number }>;

const PARTITION_ORDER: readonly EnginePartitionName[] = ['windSea', 'swell1', 'swell2'];

/** Words for an Hs target (docs/domain.md#partitions). */
export const HS_TARGET_LABELS: Record<HsTarget, string> = {
  total: 'total sea',
  swell: 'swell',
  windSea: 'wind sea',
  longPeriod: 'long-period sea',
};

/** The partitions a target takes at this hour (present ones only); null when one is unknown. */
function takenPartitions(p: HourPartitions, target: HsTarget, minPeriodS: number): EnginePartitionName[] | null {
  const keys: readonly EnginePartitionName[] =
    target === 'swell' ? ['swell1', 'swell2'] : target === 'windSea' ? ['windSea'] : PARTITION_ORDER;
  const taken: EnginePartitionName[] = [];
  for (const k of keys) {
    const { hsM, tpS } = p[k];
    if (Number.isNaN(hsM)) return null;
    if (hsM === 0) continue;
    if (target === 'longPeriod') {
      if (Number.isNaN(tpS)) return null;
      if (tpS < minPeriodS) continue;
    }
    taken.push(k);
  }
  return taken;
}

/** The partition with the largest Hs among `keys`, or undefined. */
function largest(p: HourPartitions | undefined, keys: readonly EnginePartitionName[]): EnginePartitionName | undefined {
  if (!p) return undefined;
  let best: EnginePartitionName | undefined;
  for (const k of keys) if (p[k].hsM > 0 && (best === undefined || p[k].hsM > p[best].hsM)) best = k;
  return best;
}

/** A number as people write it: at most one decimal, no trailing zero (14.73 → "14.7", 14 → "14"). */
const words1 = (x: number) => String(Math.round(x * 10) / 10);

/** Why an hour breaks the Hs-Tp curve: Tp outside its range, or Hs above it; undefined when met. */
function curveReason(
  curve: [number, number][],
  hsM: number,
  tpS: number,
  limitM: number | null,
  what: 'OPLIM' | 'OPWF',
): string | undefined {
  const first = curve[0][0];
  const last = curve[curve.length - 1][0];
  if (tpS > last) return `Tp ${words1(tpS)} s is beyond the curve's last point at ${words1(last)} s`;
  if (tpS < first) return `Tp ${words1(tpS)} s is below the curve's first point at ${words1(first)} s`;
  if (limitM !== null && hsM > limitM)
    return `Hs ${words1(hsM)} m is above the curve's ${words1(limitM)} m (${what}) at Tp ${words1(tpS)} s`;
  return undefined;
}

export interface HourValues {
  hsM: number;
  tpS: number;
  bedVelocityLinearMps: number;
  bedVelocitySoulsbyMps: number;
  windMps: number;
  /** Still-water depth h at the worksite, m (docs/domain.md#tide); absent or NaN: unknown. */
  depthM?: number;
  /** Current speed, m/s; absent or NaN: unknown. */
  currentMps?: number;
  /** The hour's start, UTC epoch ms, and the predicted extremes around it (for a tide window). */
  timeMs?: number;
  tide?: TideExtremes;
  /** Sea partitions at the worksite (for response limits); absent: response limits find no data. */
  responsePartitions?: SeaPartition[];
  /** The partitions at the worksite (docs/domain.md#partitions), when the dataset gives them. */
  partitions?: HourPartitions;
}

export type HourStatus = 'workable' | 'marginal' | 'not_workable' | 'no_data';

const ok = (x: number) => !Number.isNaN(x);

/**
 * The check of a limit without alpha: a maximum (met at or below `oplim`, margin oplim - value) or
 * a minimum (met at or above, margin value - oplim); no figures where the value is missing (null).
 */
function plainCheck(
  limit: LimitName,
  label: string,
  unit: LimitCheck['unit'],
  value: number | null,
  oplim: number,
  sense: 'max' | 'min',
): Omit<LimitCheck, 'metAtOplim'> {
  return {
    limit,
    label,
    unit,
    value,
    oplim,
    opwf: null,
    alpha: null,
    margin: value === null ? null : sense === 'max' ? oplim - value : value - oplim,
    met: value === null ? null : sense === 'max' ? value <= oplim : value >= oplim,
  };
}

/** Linear interpolation of the Hs-Tp curve at tp; null outside its (closed) Tp range. */
function curveAt(curve: [number, number][], tp: number): number | null {
  if (tp < curve[0][0] || tp > curve[curve.length - 1][0]) return null;
  for (let i = 1; i < curve.length; i++) {
    const [t0, h0] = curve[i - 1];
    const [t1, h1] = curve[i];
    if (tp === t1) return h1; // a curve point's own Hs, exactly (inclusive limits)
    if (tp < t1) return h0 + ((h1 - h0) * (tp - t0)) / (t1 - t0);
  }
  return curve[curve.length - 1][1];
}

/**
 * Every limit of an operation tested against one hour, written plainly (one limit at a time) so
 * the board can show the chain behind a status: value, OPLIM, OPWF = alpha*OPLIM, margin.
 * Follows docs/domain.md#convention-5 to #convention-7 (alpha on Hs limits only; inclusive limits; closed bands;
 * outside the curve's Tp range is not workable; no data wins).
 */
export function explainHour(
  v: HourValues,
  op: OperationSpec,
  alphaTable: AlphaTable,
  options: { alpha?: boolean } = {},
): { status: HourStatus; checks: LimitCheck[] } {
  const useAlpha = options.alpha !== false;
  const l = op.limits;
  const tr = op.tpopH + op.tcH;
  const alphaAt = (hsLimit: number) => (useAlpha ? alphaFor(alphaTable, op.tpopH, hsLimit, tr, op.weatherRestricted) : 1);
  const checks: LimitCheck[] = [];
  const driven = (keys: readonly EnginePartitionName[]) => {
    const k = largest(v.partitions, keys);
    return k ? { drivenBy: k } : {};
  };
  const push = (c: Omit<LimitCheck, 'metAtOplim'> & { metAtOplim?: boolean | null }) => checks.push({ metAtOplim: c.met, ...c });

  if (l.hsMax != null) {
    const a = alphaAt(l.hsMax);
    const opwf = a * l.hsMax;
    push({
      limit: 'hs',
      label: 'Hs max',
      unit: 'm',
      value: ok(v.hsM) ? v.hsM : null,
      oplim: l.hsMax,
      opwf,
      alpha: a,
      margin: ok(v.hsM) ? opwf - v.hsM : null,
      met: ok(v.hsM) ? v.hsM <= opwf : null,
      metAtOplim: ok(v.hsM) ? v.hsM <= l.hsMax : null,
      ...driven(PARTITION_ORDER),
    });
  }
  for (const t of l.hsTargets ?? []) {
    const a = alphaAt(t.max);
    const opwf = a * t.max;
    const T = t.minPeriodS ?? NaN;
    const taken = t.target === 'total' ? [] : v.partitions ? takenPartitions(v.partitions, t.target, T) : null;
    let value: number | null;
    if (t.target === 'total') value = ok(v.hsM) ? v.hsM : null;
    else if (taken === null || !v.partitions) value = null;
    else value = Math.sqrt(taken.reduce((e, k) => e + v.partitions![k].hsM ** 2, 0));
    push({
      limit: 'hsTarget',
      label: `Hs max (${HS_TARGET_LABELS[t.target]}${t.target === 'longPeriod' ? `, Tp at least ${words1(T)} s` : ''})`,
      unit: 'm',
      value,
      oplim: t.max,
      opwf,
      alpha: a,
      margin: value === null ? null : opwf - value,
      met: value === null ? null : value <= opwf,
      metAtOplim: value === null ? null : value <= t.max,
      ...driven(t.target === 'total' ? PARTITION_ORDER : (taken ?? [])),
    });
  }
  if (l.hsTpCurve && l.hsTpCurve.length >= 2) {
    const has = ok(v.hsM) && ok(v.tpS);
    const oplim = has ? curveAt(l.hsTpCurve, v.tpS) : null;
    const a = oplim !== null ? alphaAt(oplim) : null;
    const opwf = oplim !== null && a !== null ? a * oplim : null;
    const met = !has ? null : opwf === null ? false : v.hsM <= opwf;
    const metAtOplim = !has ? null : oplim === null ? false : v.hsM <= oplim;
    const reason =
      !has || met ? undefined : curveReason(l.hsTpCurve, v.hsM, v.tpS, metAtOplim ? opwf : oplim, metAtOplim ? 'OPWF' : 'OPLIM');
    push({
      limit: 'hsTpCurve',
      label: 'Hs-Tp curve',
      unit: 'm',
      value: ok(v.hsM) ? v.hsM : null,
      oplim,
      opwf,
      alpha: a,
      margin: has && opwf !== null ? opwf - v.hsM : null,
      met,
      metAtOplim,
      ...(reason ? { reason } : {}),
    });
  }
  const tp = ok(v.tpS) ? v.tpS : null;
  if (l.tpMin != null) push(plainCheck('tpMin', 'Tp min', 's', tp, l.tpMin, 'min'));
  if (l.tpMax != null) push(plainCheck('tpMax', 'Tp max', 's', tp, l.tpMax, 'max'));
  const bandMinHs = l.tpExcludedMinHs ?? DEFAULT_BAND_MIN_HS_M;
  for (const [from, to] of l.tpExcluded ?? []) {
    // A partition with enough worksite Hs inside the band breaks it too (docs/domain.md#partitions).
    const resonant =
      tp === null || !v.partitions
        ? undefined
        : PARTITION_ORDER.find((k) => {
            const p = v.partitions![k];
            return p.hsM > 0 && p.hsM >= bandMinHs && p.tpS >= from && p.tpS <= to;
          });
    if (resonant && !(tp !== null && tp >= from && tp <= to)) {
      const ptp = v.partitions![resonant].tpS;
      push({
        limit: 'tpBand',
        label: `Excluded Tp ${from}-${to} s`,
        unit: 's',
        value: ptp,
        oplim: Math.abs(ptp - from) <= Math.abs(ptp - to) ? from : to,
        opwf: null,
        alpha: null,
        margin: -Math.min(ptp - from, to - ptp),
        met: false,
        drivenBy: resonant,
      });
      continue;
    }
    const inside = tp !== null && tp >= from && tp <= to;
    const edge = tp === null ? null : Math.abs(tp - from) <= Math.abs(tp - to) ? from : to;
    push({
      limit: 'tpBand',
      label: `Excluded Tp ${from}-${to} s`,
      unit: 's',
      value: tp,
      oplim: edge,
      opwf: null,
      alpha: null,
      margin: tp === null ? null : inside ? -Math.min(tp - from, to - tp) : Math.min(Math.abs(tp - from), Math.abs(tp - to)),
      met: tp === null ? null : !inside,
    });
  }
  if (l.bedVelocityMax != null) {
    const soulsby = l.bedVelocityMethod === 'soulsby';
    const u = soulsby ? v.bedVelocitySoulsbyMps : v.bedVelocityLinearMps;
    const has = ok(u) && ok(v.hsM) && ok(v.tpS);
    const label = `Bed velocity max (${soulsby ? 'Soulsby 2006' : 'linear'})`;
    push(plainCheck('bedVelocity', label, 'm/s', has ? u : null, l.bedVelocityMax, 'max'));
  }
  if (l.windMax != null) {
    push(plainCheck('wind', 'Wind max', 'm/s', ok(v.windMps) ? v.windMps : null, l.windMax, 'max'));
  }

  // Exact limits of docs/domain.md#tide: alpha never applies.
  const depth = v.depthM !== undefined && ok(v.depthM) ? v.depthM : null;
  if (l.minDepth != null) {
    const parts = l.minDepthParts
      ? ` (draught ${words1(l.minDepthParts.draught)} m + clearance ${words1(l.minDepthParts.clearance)} m)`
      : '';
    push(plainCheck('minDepth', `Min depth${parts}`, 'm', depth, l.minDepth, 'min'));
  }
  if (l.maxDepth != null) push(plainCheck('maxDepth', 'Max depth', 'm', depth, l.maxDepth, 'max'));
  if (l.currentMax != null) {
    const cur = v.currentMps !== undefined && ok(v.currentMps) ? v.currentMps : null;
    push(plainCheck('current', 'Current max', 'm/s', cur, l.currentMax, 'max'));
  }
  if (l.tideWindow) {
    const tw = l.tideWindow;
    const m = v.timeMs === undefined ? NaN : tideWindowMarginH(v.tide, tw, v.timeMs);
    const has = ok(m);
    push({
      limit: 'tideWindow',
      label: `Tide window ${words1(tw.before)} h before to ${words1(tw.after)} h after ${tw.reference} water`,
      unit: 'h',
      value: has ? m : null,
      oplim: 0,
      opwf: null,
      alpha: null,
      margin: has ? m : null,
      met: has ? m >= 0 : null,
      ...(has && m < 0 ? { reason: `${words1(-m)} h outside the window around ${tw.reference} water` } : {}),
    });
  }

  if (l.responses && l.responses.length > 0) {
    const parts = v.responsePartitions ?? [];
    const settings = responseSettings(l.responseSea);
    const rao = op.vessel ? prepareRao(op.vessel.raos) : null;
    const hsTotal = parts.length > 0 ? totalHs(parts) : NaN;
    for (const r of l.responses) {
      const durationH = r.durationH ?? DEFAULT_MPM_DURATION_H;
      const known = rao !== null && rao.amplitudes[r.response] !== undefined && parts.length > 0;
      const m = known ? tabulatedResponseMoments(rao, r.response, op.vessel!.headingDeg, parts, settings) : null;
      const has = m !== null && ok(m.m0) && ok(hsTotal);
      const significant = has ? significantAmplitude(m.m0) : null;
      const mpm = has ? mostProbableMaximum(m.m0, m.m2, durationH) : null;
      const value = r.statistic === 'significant' ? significant : mpm;
      // Alpha through the equivalent Hs limit (docs/domain.md#vessel-response; see response-limits.ts).
      const hsEq = value === null ? null : value > 0 ? (hsTotal * r.max) / value : Infinity;
      const a = hsEq === null ? null : useAlpha ? alphaFor(alphaTable, op.tpopH, hsEq, tr, op.weatherRestricted) : 1;
      const opwf = a === null ? null : a * r.max;
      // Each partition's share of m0: the moments add over partitions (docs/domain.md#vessel-response).
      const shares: (number | null)[] = parts.map(() => null);
      if (has && m.m0 > 0 && parts.length > 1)
        parts.forEach(
          (p, index) => (shares[index] = tabulatedResponseMoments(rao!, r.response, op.vessel!.headingDeg, [p], settings).m0 / m.m0),
        );
      else if (has && m.m0 > 0 && parts.length === 1) shares[0] = 1;
      let drivenBy: ResponseCheckDetail['drivenBy'] = null;
      shares.forEach((share, index) => {
        if (share !== null && (!drivenBy || share > drivenBy.share)) drivenBy = { kind: parts[index].kind, index, share };
      });
      if (!drivenBy && has && parts.length === 1) drivenBy = { kind: parts[0].kind, index: 0, share: 1 };
      const unit = responseUnit(r.response);
      push({
        limit: 'response',
        label: `${responseLabel(r.response)} ${r.statistic === 'significant' ? 'significant' : `most probable max (${words1(durationH)} h)`}`,
        unit: unit === 'deg' || unit === 'm/s' || unit === 'm/s²' ? unit : 'm',
        value,
        oplim: r.max,
        opwf,
        alpha: a,
        margin: value !== null && opwf !== null ? opwf - value : null,
        met: value !== null && opwf !== null ? value <= opwf : null,
        metAtOplim: value !== null ? value <= r.max : null,
        response: {
          response: r.response,
          statistic: r.statistic,
          durationH,
          significant,
          mpm,
          tz: has && m.m0 > 0 ? zeroCrossingPeriod(m.m0, m.m2) : null,
          hsTotal: ok(hsTotal) ? hsTotal : null,
          hsEquivalent: hsEq !== null && Number.isFinite(hsEq) ? hsEq : null,
          drivenBy,
          partitions: parts.map((p, index) => ({
            kind: p.kind,
            hsM: ok(p.hsM) ? p.hsM : null,
            tpS: ok(p.tpS) ? p.tpS : null,
            dirDeg: ok(p.dirDeg) ? p.dirDeg : null,
            share: shares[index],
          })),
        },
        ...(!known && op.vessel && rao && rao.amplitudes[r.response] === undefined
          ? { reason: `the vessel has no RAO for ${responseLabel(r.response)}` }
          : {}),
      });
    }
  }

  let status: HourStatus;
  if (checks.some((c) => c.met === null)) status = 'no_data';
  else if (checks.every((c) => c.met)) status = 'workable';
  else if (checks.every((c) => c.metAtOplim)) status = 'marginal';
  else status = 'not_workable';
  return { status, checks };
}
