/**
 * Response limits in the engine (docs/domain.md#vessel-response): per record, the response
 * statistic from the worksite's sea partitions and the operation's vessel, and its class against
 * the limit with alpha applied through the equivalent Hs limit.
 *
 * Equivalent Hs: with every partition's shape held (its Tp, direction, spreading and the gamma
 * chosen for the record), scaling all partitions' Hs by k scales m0 and m2 of the response by
 * k^2, so R_s scales by k and Tz_R does not change; R_mpm = sqrt(2 m0 ln(tau/Tz_R)) then scales
 * by k too. So for both statistics the record's limit is the total-Hs limit
 * Hs_eq = Hs * R_lim / R exactly (no approximation for R_mpm), and alpha is looked up at Hs_eq:
 * met when R <= alpha(Hs_eq) * R_lim, marginal when only R <= R_lim.
 */
import {
  DEFAULT_RESPONSE_SEA,
  mostProbableMaximum,
  prepareRao,
  significantAmplitude,
  tabulatedMomentSeries,
  type SkipRecords,
  type ResponseSeaSettings,
  type SeaPartitionSeries,
} from '../response';
import { alphaAt, type CompiledLimits } from './compiled-limits';
import type { OperationSpec, ResponseLimit, ResponseSeaOptions, SiteSeries } from './types';

/** Default duration of a most-probable-maximum limit, h (docs/domain.md#vessel-response). */
export const DEFAULT_MPM_DURATION_H = 3;

/** The operation's spectrum settings with the defaults filled in. */
export function responseSettings(o: ResponseSeaOptions | null | undefined): ResponseSeaSettings {
  return {
    windSeaGamma: o?.windSeaGamma ?? DEFAULT_RESPONSE_SEA.windSeaGamma,
    swellGamma: o?.swellGamma ?? DEFAULT_RESPONSE_SEA.swellGamma,
    windSeaSpreading: o?.windSeaSpreading ?? DEFAULT_RESPONSE_SEA.windSeaSpreading,
    swellSpreading: o?.swellSpreading ?? DEFAULT_RESPONSE_SEA.swellSpreading,
  };
}

/** Total Hs of a record from its partitions, sqrt(sum Hs_i^2) (energies add); NaN when one is missing. */
export function totalHs(partitions: readonly { hsM: number }[]): number {
  let e = 0;
  for (const p of partitions) e += p.hsM * p.hsM;
  return Math.sqrt(e);
}

/** Moments m0, m2 of one response per record, in buffers kept per thread (fresh memory costs more than the work). */
let scratchM0 = new Float64Array(0);
let scratchM2 = new Float64Array(0);

function momentScratch(n: number): { m0: Float64Array; m2: Float64Array } {
  if (scratchM0.length < n) {
    // With room to spare, so that worksites a few records longer than the first reuse it.
    const size = n + (n >> 4);
    scratchM0 = new Float64Array(size);
    scratchM2 = new Float64Array(size);
  }
  return { m0: scratchM0.subarray(0, n), m2: scratchM2.subarray(0, n) };
}

/**
 * Works the moments of one response over the series into the thread's scratch buffers (NaN
 * throughout when the vessel has no RAO for it); `skip` as in tabulatedMomentSeries. The buffers
 * are overwritten by the next call.
 */
function momentsInto(
  parts: readonly SeaPartitionSeries[],
  vessel: NonNullable<OperationSpec['vessel']>,
  settings: ResponseSeaSettings,
  name: string,
  n: number,
  skip: SkipRecords | null,
): { m0: Float64Array; m2: Float64Array } {
  const out = momentScratch(n);
  const rao = prepareRao(vessel.raos);
  if (!rao.amplitudes[name]) {
    out.m0.fill(NaN);
    out.m2.fill(NaN);
  } else tabulatedMomentSeries(rao, name, vessel.headingDeg, parts, settings, out.m0, out.m2, skip);
  return out;
}

/** Per response limit of the operation, its statistic per record (NaN: no data), and the total Hs per record. */
export interface ResponseLimitSeries {
  values: Float64Array[];
  hsTotal: Float64Array;
}

/**
 * The operation's response statistics over the series. Without partitions in the series or a
 * vessel on the operation every value is NaN (no data).
 */
export function responseLimitSeries(series: SiteSeries, op: OperationSpec, limits: readonly ResponseLimit[]): ResponseLimitSeries {
  const n = series.timeMs.length;
  const parts = series.responsePartitions;
  const hsTotal = new Float64Array(n);
  const values = limits.map(() => new Float64Array(n));
  if (!parts || parts.length === 0 || !op.vessel) {
    hsTotal.fill(NaN);
    for (const v of values) v.fill(NaN);
    return { values, hsTotal };
  }
  for (const p of parts) {
    const hs = p.hsM;
    for (let i = 0; i < n; i++) hsTotal[i] += hs[i] * hs[i];
  }
  for (let i = 0; i < n; i++) hsTotal[i] = Math.sqrt(hsTotal[i]);
  const settings = responseSettings(op.limits.responseSea);
  // One moment pass per response named, for every limit on it.
  for (const name of new Set(limits.map((l) => l.response))) {
    const { m0, m2 } = momentsInto(parts, op.vessel, settings, name, n, null);
    limits.forEach((l, r) => {
      if (l.response !== name) return;
      const out = values[r];
      const d = l.durationH ?? DEFAULT_MPM_DURATION_H;
      if (l.statistic === 'significant') for (let i = 0; i < n; i++) out[i] = significantAmplitude(m0[i]);
      else for (let i = 0; i < n; i++) out[i] = mostProbableMaximum(m0[i], m2[i], d);
    });
  }
  return { values, hsTotal };
}

/**
 * The status pass of the response limits (docs/domain.md#vessel-response): raises each record's
 * class `cls` (0 met, 1 met at OPLIM only, 2 broken, `noData` no data) by the operation's
 * response limits, as {@link responseClass} classes a value; a record without its response's data
 * becomes `noData`. A record already broken or without data keeps its class unless its response
 * data is missing, so its response is not worked (the class could not rise further).
 */
export function raiseResponseClasses(series: SiteSeries, op: OperationSpec, c: CompiledLimits, cls: Uint8Array, noData: number): void {
  const n = cls.length;
  const parts = series.responsePartitions;
  if (!parts || parts.length === 0 || !op.vessel) {
    cls.fill(noData);
    return;
  }
  const settings = responseSettings(op.limits.responseSea);
  const skip: SkipRecords = { classes: cls, from: 2 };
  const tmp = new Float64Array(2);
  const hsOf = parts.map((p) => p.hsM);
  const np = hsOf.length;
  // Alpha is linear between its table's columns and held beyond them, so never below the row's
  // least value: a response at or under that share of its limit is met at OPWF whatever Hs_eq.
  const alphaLeast = Math.min(1, ...(c.alphaRow ?? [1]));
  // One moment pass per response named, for every limit on it (a record left out then is broken
  // or without data, and stays so).
  for (const name of new Set(c.responses.map((l) => l.response))) {
    const { m0, m2 } = momentsInto(parts, op.vessel, settings, name, n, skip);
    for (const l of c.responses) {
      if (l.response !== name) continue;
      const d = l.durationH ?? DEFAULT_MPM_DURATION_H;
      const significant = l.statistic === 'significant';
      const surelyMet = alphaLeast * l.max;
      for (let i = 0; i < n; i++) {
        const a = m0[i];
        if (a !== a || m2[i] !== m2[i]) {
          cls[i] = noData;
          continue;
        }
        if (cls[i] >= 2) continue;
        const value = significant ? significantAmplitude(a) : mostProbableMaximum(a, m2[i], d);
        if (value <= surelyMet) continue;
        let e = 0;
        for (let q = 0; q < np; q++) e += hsOf[q][i] * hsOf[q][i];
        const k = responseClass(c, value, l.max, Math.sqrt(e), tmp);
        if (k > cls[i]) cls[i] = k;
      }
    }
  }
}

/**
 * Class of one response value against its limit: 0 met at OPWF, 1 met at OPLIM only, 2 broken;
 * `out[0]` receives the relative margin (OPWF_R - R) / OPWF_R and `out[1]` OPWF_R, where
 * OPWF_R = alpha(Hs_eq) * R_lim and Hs_eq = Hs * R_lim / R (see the module comment).
 */
export function responseClass(c: CompiledLimits, value: number, max: number, hsTotal: number, out: Float64Array): number {
  const hsEq = value > 0 ? (hsTotal * max) / value : Infinity;
  const opwf = alphaAt(c, hsEq) * max;
  out[0] = (opwf - value) / opwf;
  out[1] = opwf;
  return (value > opwf ? 1 : 0) + (value > max ? 1 : 0);
}

/** The response that governs each record of an operation with response limits (the conditions chart). */
export interface GoverningResponseSeries {
  /** Per record, the index into the operation's response limits with the largest R / R_lim (-1: no data). */
  governing: Int8Array;
  /** Per record, R / R_lim of the governing response (NaN: no data); 1 = at the operation limit. */
  ratio: Float64Array;
  /** Per record, the governing response's R, in its unit (NaN: no data). */
  value: Float64Array;
  /**
   * Per record, the governing response's forecast limit as a ratio of R_lim: alpha at the
   * equivalent Hs limit Hs_eq = Hs * R_lim / R (see the module comment); 1 without alpha.
   */
  forecastRatio: Float64Array;
}

/**
 * Per record, the response limit nearest to (or furthest past) its operation limit, by R / R_lim,
 * with its forecast limit as a ratio (docs/domain.md#vessel-response). A record where any response
 * limit has no data has no governing response (the hour is "no data" for the status as well).
 */
export function governingResponseSeries(series: SiteSeries, op: OperationSpec, c: CompiledLimits): GoverningResponseSeries {
  const n = series.timeMs.length;
  const out: GoverningResponseSeries = {
    governing: new Int8Array(n).fill(-1),
    ratio: new Float64Array(n).fill(NaN),
    value: new Float64Array(n).fill(NaN),
    forecastRatio: new Float64Array(n).fill(NaN),
  };
  if (c.responses.length === 0) return out;
  const { values, hsTotal } = responseLimitSeries(series, op, c.responses);
  const tmp = new Float64Array(2);
  for (let i = 0; i < n; i++) {
    let best = -1;
    let bestRatio = -Infinity;
    for (let r = 0; r < c.responses.length; r++) {
      const v = values[r][i];
      if (v !== v || hsTotal[i] !== hsTotal[i]) {
        best = -1;
        break;
      }
      const ratio = v / c.responses[r].max;
      if (ratio > bestRatio) {
        bestRatio = ratio;
        best = r;
      }
    }
    if (best < 0) continue;
    const l = c.responses[best];
    responseClass(c, values[best][i], l.max, hsTotal[i], tmp);
    out.governing[i] = best;
    out.ratio[i] = bestRatio;
    out.value[i] = values[best][i];
    out.forecastRatio[i] = tmp[1] / l.max;
  }
  return out;
}
