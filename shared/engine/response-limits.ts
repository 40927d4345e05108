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
  GRID_X_MIN,
  mostProbableMaximum,
  prepareRao,
  significantAmplitude,
  markMissingPartitions,
  tabulatedMomentSeries,
  tabulatedMomentsOfOpen,
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

/**
 * Moments m0, m2 of one response per record, and a list of records, in buffers kept per thread
 * (fresh memory costs more than the work here).
 */
let scratchM0 = new Float64Array(0);
let scratchM2 = new Float64Array(0);
let scratchOpen = new Int32Array(0);

function momentScratch(n: number): { m0: Float64Array; m2: Float64Array; open: Int32Array } {
  if (scratchM0.length < n) {
    // With room to spare, so that worksites a few records longer than the first reuse it.
    const size = n + (n >> 4);
    scratchM0 = new Float64Array(size);
    scratchM2 = new Float64Array(size);
    scratchOpen = new Int32Array(size);
  }
  return { m0: scratchM0.subarray(0, n), m2: scratchM2.subarray(0, n), open: scratchOpen };
}

/**
 * Works the moments of one response over the series into the thread's scratch buffers (NaN
 * throughout when the vessel has no RAO for it). The buffers are overwritten by the next call.
 */
function momentsInto(
  parts: readonly SeaPartitionSeries[],
  vessel: NonNullable<OperationSpec['vessel']>,
  settings: ResponseSeaSettings,
  name: string,
  n: number,
): { m0: Float64Array; m2: Float64Array } {
  const out = momentScratch(n);
  const rao = prepareRao(vessel.raos);
  if (!rao.amplitudes[name]) {
    out.m0.fill(NaN);
    out.m2.fill(NaN);
  } else tabulatedMomentSeries(rao, name, vessel.headingDeg, parts, settings, out.m0, out.m2);
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
    const { m0, m2 } = momentsInto(parts, op.vessel, settings, name, n);
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

/** Relative margin on a surely-broken bound, far above the rounding of the exact path's sqrt and log. */
const BREAK_MARGIN = 1e-9;

const LOG_BITS = new Float64Array(1);
const LOG_WORDS = new Uint32Array(LOG_BITS.buffer);
/** The word of a float64 that holds its sign, exponent and top 20 mantissa bits (byte order of this machine). */
const HIGH_WORD = new Uint8Array(Uint16Array.of(1).buffer)[0] === 1 ? 1 : 0;

/**
 * A lower bound of ln x for x >= 1 without the logarithm: with x = m 2^e (1 <= m < 2),
 * ln x = (e + log2 m) ln 2 and log2 m >= m - 1 (the chord of a concave curve), m - 1 read from the
 * top 20 bits of the mantissa (rounded down). The bound is at most LN_CHORD_GAP under ln x; a
 * test holds both bounds on random x.
 */
export function lnBelow(x: number): number {
  LOG_BITS[0] = x;
  const high = LOG_WORDS[HIGH_WORD];
  return ((high >>> 20) - 1023 + (high & 0xfffff) / 1048576) * Math.LN2;
}

/**
 * The largest gap between ln x and {@link lnBelow}: max over m in [1, 2] of ln m - (m - 1) ln 2
 * (at m = 1/ln 2: 0.05966), plus the 20-bit rounding (2^-20 ln 2) and a margin.
 */
export const LN_CHORD_GAP = 0.0597 + 1e-6;

/**
 * Longest zero-crossing period a response to the series can have, s: every partition's spectrum
 * lies on omega >= GRID_X_MIN omega_p, so m2 >= (GRID_X_MIN 2 pi / Tp)^2 m0 for each and for their
 * sum, and Tz_R = 2 pi sqrt(m0/m2) <= Tp / GRID_X_MIN for the longest Tp of the series' partitions
 * (1 % more for the table's interpolation); Infinity when a Tp is infinite.
 */
function longestResponseTzS(parts: readonly SeaPartitionSeries[]): number {
  let top = 0;
  for (const p of parts) top = Math.max(top, longestPeriod(p.tpS));
  return (1.01 * top) / GRID_X_MIN;
}

/** Longest period of a series (NaN left out), kept per array: every operation on the worksite asks. */
const longestCache = new WeakMap<Float64Array, number>();

function longestPeriod(tpS: Float64Array): number {
  const hit = longestCache.get(tpS);
  if (hit !== undefined) return hit;
  const top = largestPositive(tpS);
  longestCache.set(tpS, top);
  return top;
}

/** The largest value of a series above 0 (NaN left out), 0 when none: a loop of its own, optimised once. */
function largestPositive(values: Float64Array): number {
  let top = 0;
  for (let i = 0; i < values.length; i++) if (values[i] > top) top = values[i];
  return top;
}

/**
 * m0 above which a record surely breaks the limit (R > R_lim), whatever the rest of its sea
 * (Infinity: no such bound). R_s = 2 sqrt(m0) > R_lim when m0 > R_lim^2 / 4. For R_mpm, with
 * Tz_R <= tzTopS, ln(tau/Tz_R) >= ln(tau/tzTopS) = L, so R_mpm^2 >= 2 m0 L > R_lim^2 when
 * m0 > R_lim^2 / (2 L). With every alpha at most 1, R > R_lim is class 2 (broken).
 */
export function surelyBrokenM0(l: ResponseLimit, tzTopS: number): number {
  if (l.statistic === 'significant') return ((l.max * l.max) / 4) * (1 + BREAK_MARGIN);
  const lnCycles = Math.log(((l.durationH ?? DEFAULT_MPM_DURATION_H) * 3600) / tzTopS);
  return lnCycles > 0 ? ((l.max * l.max) / (2 * lnCycles)) * (1 + BREAK_MARGIN) : Infinity;
}

/**
 * The status pass of the response limits (docs/domain.md#vessel-response): raises each record's
 * class `cls` (0 met, 1 met at OPLIM only, 2 broken, `noData` no data) by the operation's
 * response limits, as {@link responseClass} classes a value; a record without its response's data
 * becomes `noData`. A record already broken or without data keeps its class unless its response
 * data is missing, so its response is not worked (the class could not rise further): the moment
 * passes go over a list of the records still open. Alpha is at most 1, so a record whose m0 (after
 * any partition) is above {@link surelyBrokenM0} is broken without its statistic.
 */
export function raiseResponseClasses(series: SiteSeries, op: OperationSpec, c: CompiledLimits, cls: Uint8Array, noData: number): void {
  const n = cls.length;
  const parts = series.responsePartitions;
  if (!parts || parts.length === 0 || !op.vessel) {
    cls.fill(noData);
    return;
  }
  const rao = prepareRao(op.vessel.raos);
  const names = [...new Set(c.responses.map((l) => l.response))];
  if (names.some((name) => !rao.amplitudes[name])) {
    // No RAO for a limited response: no data throughout.
    cls.fill(noData);
    return;
  }
  const settings = responseSettings(op.limits.responseSea);
  const hsOf = parts.map((p) => p.hsM);
  // Alpha is linear between its table's columns and held beyond them, so never below the row's
  // least value: a response at or under that share of its limit is met at OPWF whatever Hs_eq.
  const alphaLeast = Math.min(1, ...(c.alphaRow ?? [1]));
  const tzTopS = c.responses.some((l) => l.statistic === 'mpm') ? longestResponseTzS(parts) : Infinity;
  // A missing partition value makes the record "no data" whatever else (and needs no moments).
  markMissingPartitions(parts, settings, cls, noData);
  const { m0, m2, open } = momentScratch(n);
  let count = keepOpen(open, -1, cls);
  // One moment pass per response named, for every limit on it, over the records still open.
  for (let k = 0; k < names.length; k++) {
    const name = names[k];
    const onName = c.responses.filter((l) => l.response === name);
    // The records the last name's limits broke leave the list (the first name finds it fresh).
    if (k > 0) count = keepOpen(open, count, cls);
    // Alpha is at most 1 (the alpha table is checked so), so a response over its limit is broken
    // whatever alpha: such records are classed from a bound on m0 without the statistic, and left
    // out of the partitions after the one that showed it.
    const breakAboveM0 = Math.min(...onName.map((l) => surelyBrokenM0(l, tzTopS)));
    count = tabulatedMomentsOfOpen(rao, name, op.vessel.headingDeg, parts, settings, m0, m2, open, count, cls, 2, breakAboveM0);
    for (const l of onName) classOpenRecords(open, count, m0, m2, cls, noData, hsOf, c, l, alphaLeast, surelyBrokenM0(l, tzTopS));
  }
}

/**
 * Keeps in open[0..count) the records of class below 2 (met, or met at OPLIM only), in order, and
 * returns how many; `count` -1 lists them from every record of `cls`.
 */
function keepOpen(open: Int32Array, count: number, cls: Uint8Array): number {
  let kept = 0;
  if (count < 0) {
    for (let i = 0; i < cls.length; i++) {
      open[kept] = i;
      if (cls[i] < 2) kept++;
    }
    return kept;
  }
  for (let r = 0; r < count; r++) {
    const i = open[r];
    open[kept] = i;
    if (cls[i] < 2) kept++;
  }
  return kept;
}

/**
 * Raises the classes of the records open[0..count) by one response limit from the moments (NaN:
 * no data); `brokenAbove` from {@link surelyBrokenM0}. Alpha is at most 1, so a value over its
 * limit is broken whatever alpha. Apart from the caller so that its loop takes only typed arrays
 * and numbers: optimised early, and never thrown away when the caller meets new shapes.
 */
function classOpenRecords(
  open: Int32Array,
  count: number,
  m0: Float64Array,
  m2: Float64Array,
  cls: Uint8Array,
  noData: number,
  hsOf: readonly Float64Array[],
  c: CompiledLimits,
  l: ResponseLimit,
  alphaLeast: number,
  brokenAbove: number,
): void {
  const tauS = (l.durationH ?? DEFAULT_MPM_DURATION_H) * 3600;
  const significant = l.statistic === 'significant';
  const max = l.max;
  const surelyMet = alphaLeast * max;
  const maxSquared = max * max * (1 + BREAK_MARGIN);
  const surelyMetSquared = surelyMet * surelyMet * (1 - BREAK_MARGIN);
  const np = hsOf.length;
  const alphaRow = c.alphaRow;
  const alphaCols = c.alphaCols;
  const lastCol = alphaCols.length - 1;
  for (let r = 0; r < count; r++) {
    const i = open[r];
    const a = m0[i];
    if (a !== a || m2[i] !== m2[i]) {
      cls[i] = noData;
      continue;
    }
    if (cls[i] >= 2) continue;
    if (a > brokenAbove) {
      cls[i] = 2;
      continue;
    }
    // significantAmplitude and mostProbableMaximum written out, with the same arithmetic, so that
    // the loop depends on no inlining; no conditional mixes a computed number with the global NaN
    // (that one boxed a number per record, measured). Tz_R = 2 pi sqrt(m0/m2); R_mpm = 0 where
    // there is none or N <= 1.
    let value = 0;
    if (significant) value = 2 * Math.sqrt(a);
    else {
      const b = m2[i];
      if (a > 0 && b > 0) {
        const cycles = tauS / (2 * Math.PI * Math.sqrt(a / b));
        if (cycles > 1) {
          // R_mpm^2 = 2 m0 ln N. Most records are decided by bounds on ln N from N's binary
          // exponent and leading bits (lnBelow, lnBelow + LN_CHORD_GAP), without the logarithm:
          // broken past max^2, met at OPWF under surelyMet^2 (margins far above rounding).
          const lnLow = lnBelow(cycles);
          if (2 * a * lnLow > maxSquared) {
            cls[i] = 2;
            continue;
          }
          if (2 * a * (lnLow + LN_CHORD_GAP) < surelyMetSquared) continue;
          value = Math.sqrt(2 * a * Math.log(cycles));
        }
      }
    }
    if (value <= surelyMet) continue;
    if (value > max) {
      cls[i] = 2;
      continue;
    }
    // responseClass and alphaAt, written out for the same reason: Hs_eq = Hs R_lim / R, alpha
    // there (linear between the row's columns, held beyond), OPWF_R = alpha R_lim.
    let e = 0;
    for (let q = 0; q < np; q++) e += hsOf[q][i] * hsOf[q][i];
    const hsEq = (Math.sqrt(e) * max) / value;
    let alpha = 1;
    if (alphaRow !== null) {
      // R = 0: Hs_eq is infinite, the row's last value (as alphaAt gives it).
      if (!(value > 0)) alpha = alphaRow[lastCol];
      else if (hsEq <= alphaCols[0]) alpha = alphaRow[0];
      else if (hsEq >= alphaCols[lastCol]) alpha = alphaRow[lastCol];
      else {
        let j = 1;
        while (alphaCols[j] < hsEq) j++;
        alpha = alphaRow[j - 1] + ((alphaRow[j] - alphaRow[j - 1]) * (hsEq - alphaCols[j - 1])) / (alphaCols[j] - alphaCols[j - 1]);
      }
    }
    const k = (value > alpha * max ? 1 : 0) + (value > max ? 1 : 0);
    if (k > cls[i]) cls[i] = k;
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
