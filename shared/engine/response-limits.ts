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
  type RaoTable,
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

const tableIds = new WeakMap<RaoTable, number>();
let nextTableId = 1;
function tableId(t: RaoTable): number {
  let id = tableIds.get(t);
  if (id === undefined) {
    id = nextTableId++;
    tableIds.set(t, id);
  }
  return id;
}

interface MomentSeries {
  m0: Float64Array;
  m2: Float64Array;
}
const momentCache = new WeakMap<SeaPartitionSeries[], Map<string, MomentSeries>>();

/** Moments of one response per record of the partition series (cached per series, vessel, heading and settings). */
function momentSeries(
  parts: SeaPartitionSeries[],
  raos: RaoTable,
  headingDeg: number,
  settings: ResponseSeaSettings,
  name: string,
): MomentSeries {
  let perSeries = momentCache.get(parts);
  if (!perSeries) {
    perSeries = new Map();
    momentCache.set(parts, perSeries);
  }
  const key = `${tableId(raos)}|${headingDeg}|${settings.windSeaGamma}|${settings.swellGamma}|${settings.windSeaSpreading}|${settings.swellSpreading}|${name}`;
  const hit = perSeries.get(key);
  if (hit) return hit;
  const rao = prepareRao(raos);
  const n = parts.length ? parts[0].hsM.length : 0;
  const m0 = new Float64Array(n);
  const m2 = new Float64Array(n);
  if (!rao.amplitudes[name]) {
    m0.fill(NaN);
    m2.fill(NaN);
  } else tabulatedMomentSeries(rao, name, headingDeg, parts, settings, m0, m2);
  const value = { m0, m2 };
  perSeries.set(key, value);
  return value;
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
  if (!parts || parts.length === 0 || !op.vessel) {
    hsTotal.fill(NaN);
    return { values: limits.map(() => new Float64Array(n).fill(NaN)), hsTotal };
  }
  for (const p of parts) {
    const hs = p.hsM;
    for (let i = 0; i < n; i++) hsTotal[i] += hs[i] * hs[i];
  }
  for (let i = 0; i < n; i++) hsTotal[i] = Math.sqrt(hsTotal[i]);
  const settings = responseSettings(op.limits.responseSea);
  const values = limits.map((l) => {
    const ms = momentSeries(parts, op.vessel!.raos, op.vessel!.headingDeg, settings, l.response);
    const out = new Float64Array(n);
    const d = l.durationH ?? DEFAULT_MPM_DURATION_H;
    const { m0, m2 } = ms;
    if (l.statistic === 'significant') for (let i = 0; i < n; i++) out[i] = significantAmplitude(m0[i]);
    else for (let i = 0; i < n; i++) out[i] = mostProbableMaximum(m0[i], m2[i], d);
    return out;
  });
  return { values, hsTotal };
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
