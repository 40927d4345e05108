/**
 * Vessel response to a sea of one or more partitions (docs/domain.md#vessel-response):
 * S_R(omega) = sum over partitions and direction bins of D(theta) |RAO(omega, theta - heading)|^2 S(omega),
 * its moments m0 and m2, the significant amplitude R_s = 2 sqrt(m0), the zero-crossing period
 * Tz_R = 2 pi sqrt(m0/m2) and the most probable maximum over a duration tau,
 * R_mpm = sqrt(2 m0 ln(tau/Tz_R)) (Rayleigh maxima of a narrow-band process, Longuet-Higgins 1952;
 * DNV-RP-C205 and DNV-RP-H103, from memory).
 */
import { dnvGamma, GRID_POINTS, GRID_W, GRID_X, jonswapWeights } from './jonswap';
import { headingPosition, periodSegment, raoSquaredAtPosition, type PreparedRao } from './rao';
import { spreadingBins, type Spreading } from './spreading';

export type PartitionKind = 'windSea' | 'swell';

/** One partition of one record at the worksite. */
export interface SeaPartition {
  kind: PartitionKind;
  hsM: number;
  tpS: number;
  /** Mean direction the waves come from, deg true. */
  dirDeg: number;
}

/** Partitions of a series at the worksite, typed arrays of the series' length; NaN = missing. */
export interface SeaPartitionSeries {
  kind: PartitionKind;
  hsM: Float64Array;
  tpS: Float64Array;
  dirDeg: Float64Array;
}

/** How each partition's spectrum is shaped; settable per operation. */
export interface ResponseSeaSettings {
  /** Wind-sea gamma: 'dnv' = the DNV-RP-C205 rule from Hs and Tp, or a fixed value 1-20. */
  windSeaGamma: number | 'dnv';
  /** Swell gamma (default 5: narrow swell, common practice, no source). */
  swellGamma: number;
  windSeaSpreading: Spreading;
  swellSpreading: Spreading;
}

/** Defaults of docs/domain.md#vessel-response: DNV gamma rule and cos^2 for wind sea, gamma 5 and cos^8 for swell. */
export const DEFAULT_RESPONSE_SEA: ResponseSeaSettings = {
  windSeaGamma: 'dnv',
  swellGamma: 5,
  windSeaSpreading: 2,
  swellSpreading: 8,
};

/** Gamma of a partition under the settings; NaN when the DNV rule lacks Hs or Tp. */
export function partitionGamma(p: Pick<SeaPartition, 'kind' | 'hsM' | 'tpS'>, s: ResponseSeaSettings): number {
  if (p.kind === 'swell') return s.swellGamma;
  return s.windSeaGamma === 'dnv' ? dnvGamma(p.hsM, p.tpS) : s.windSeaGamma;
}

/** Moments of one response for one record. */
export interface ResponseMoments {
  m0: number;
  m2: number;
  /** Part of m0 from periods outside the RAO table's range (end values held there). */
  m0Outside: number;
}

const HEADING_POS = new Float64Array(2);
const P_IDX = new Int32Array(GRID_POINTS);
const P_FRAC = new Float64Array(GRID_POINTS);
const P_OUT = new Uint8Array(GRID_POINTS);

/**
 * Moments m0, m2 of one response to a list of partitions, by direct integration. A partition with
 * Hs = 0 adds nothing; a missing (NaN) Hs, Tp, direction or gamma makes every moment NaN.
 * `out` is filled and returned.
 */
export function responseMoments(
  rao: PreparedRao,
  name: string,
  vesselHeadingDeg: number,
  partitions: readonly SeaPartition[],
  settings: ResponseSeaSettings,
  out: ResponseMoments = { m0: 0, m2: 0, m0Outside: 0 },
): ResponseMoments {
  const amp = rao.amplitudes[name];
  if (!amp) throw new RangeError(`the vessel has no RAO for ${name}`);
  const periods = rao.periods;
  const np = periods.length;
  const pFirst = periods[0];
  const pLast = periods[np - 1];
  let m0 = 0;
  let m2 = 0;
  let outside = 0;
  for (const p of partitions) {
    const hs = p.hsM;
    if (hs === 0) continue;
    const gamma = partitionGamma(p, settings);
    if (!(hs > 0) || !(p.tpS > 0) || p.dirDeg !== p.dirDeg || gamma !== gamma) {
      out.m0 = NaN;
      out.m2 = NaN;
      out.m0Outside = NaN;
      return out;
    }
    const weights = jonswapWeights(gamma);
    const bins = spreadingBins(p.kind === 'swell' ? settings.swellSpreading : settings.windSeaSpreading);
    const wp = (2 * Math.PI) / p.tpS;
    // Period position of every grid point once for all direction bins (held at the ends).
    for (let j = 0; j < GRID_POINTS; j++) {
      const T = p.tpS / GRID_X[j];
      if (T <= pFirst || T >= pLast) {
        P_IDX[j] = T <= pFirst ? 0 : np - 1;
        P_FRAC[j] = 0;
        P_OUT[j] = T < pFirst || T > pLast ? 1 : 0;
      } else {
        const lo = periodSegment(periods, T);
        P_IDX[j] = lo;
        P_FRAC[j] = (T - periods[lo]) / (periods[lo + 1] - periods[lo]);
        P_OUT[j] = 0;
      }
    }
    let a0 = 0;
    let a2 = 0;
    let ao = 0;
    for (let b = 0; b < bins.weights.length; b++) {
      headingPosition(rao, p.dirDeg + bins.offsetsDeg[b] - vesselHeadingDeg, HEADING_POS);
      const rowA = HEADING_POS[0] * np;
      const rowB = rowA + np;
      const fh = HEADING_POS[1];
      const db = bins.weights[b];
      let s0 = 0;
      let s2 = 0;
      let so = 0;
      for (let j = 0; j < GRID_POINTS; j++) {
        const i = P_IDX[j];
        const fp = P_FRAC[j];
        const i1 = fp > 0 ? i + 1 : i;
        const lowRow = amp[rowA + i] + (amp[rowA + i1] - amp[rowA + i]) * fp;
        const highRow = amp[rowB + i] + (amp[rowB + i1] - amp[rowB + i]) * fp;
        const r = lowRow + (highRow - lowRow) * fh;
        const e = weights[j] * r * r;
        const x = GRID_X[j];
        s0 += e;
        s2 += e * x * x;
        if (P_OUT[j]) so += e;
      }
      a0 += db * s0;
      a2 += db * s2;
      ao += db * so;
    }
    const h2 = hs * hs;
    m0 += h2 * a0;
    m2 += h2 * a2 * wp * wp;
    outside += h2 * ao;
  }
  out.m0 = m0;
  out.m2 = m2;
  out.m0Outside = outside;
  return out;
}

/** Significant response amplitude R_s = 2 sqrt(m0) (double amplitude 4 sqrt(m0)). */
export function significantAmplitude(m0: number): number {
  return 2 * Math.sqrt(m0);
}

/** Zero-crossing period of the response Tz_R = 2 pi sqrt(m0/m2), s; NaN when m0 = 0. */
export function zeroCrossingPeriod(m0: number, m2: number): number {
  return m0 > 0 && m2 > 0 ? 2 * Math.PI * Math.sqrt(m0 / m2) : NaN;
}

/**
 * Most probable maximum amplitude over `durationH` hours: sqrt(2 m0 ln(tau/Tz_R)) for tau > Tz_R,
 * else 0 (fewer than one cycle expected); 0 for a response of zero.
 */
export function mostProbableMaximum(m0: number, m2: number, durationH: number): number {
  if (m0 !== m0 || m2 !== m2) return NaN;
  if (m0 === 0) return 0;
  const tz = zeroCrossingPeriod(m0, m2);
  const n = (durationH * 3600) / tz;
  return n > 1 ? Math.sqrt(2 * m0 * Math.log(n)) : 0;
}

/** The statistic a response limit is set on. */
export type ResponseStatistic = 'significant' | 'mpm';

/** Value of a statistic from the moments. */
export function responseStatistic(m: Pick<ResponseMoments, 'm0' | 'm2'>, statistic: ResponseStatistic, durationH: number): number {
  return statistic === 'significant' ? significantAmplitude(m.m0) : mostProbableMaximum(m.m0, m.m2, durationH);
}

/** Share of m0 from outside the RAO table's period range above which a warning is given (1 %). */
export const OUTSIDE_SHARE_WARNING = 0.01;

/** Density of the response spectrum of one response on a grid, for plots: S_R(omega) in unit^2 s/rad. */
export function responseSpectrum(
  rao: PreparedRao,
  name: string,
  vesselHeadingDeg: number,
  partitions: readonly SeaPartition[],
  settings: ResponseSeaSettings,
  omega: Float64Array,
): { response: Float64Array; wave: Float64Array } {
  const amp = rao.amplitudes[name];
  const response = new Float64Array(omega.length);
  const wave = new Float64Array(omega.length);
  const dx = GRID_X[1] - GRID_X[0];
  for (const p of partitions) {
    if (!(p.hsM > 0)) continue;
    const gamma = partitionGamma(p, settings);
    const weights = jonswapWeights(gamma);
    const bins = spreadingBins(p.kind === 'swell' ? settings.swellSpreading : settings.windSeaSpreading);
    const wp = (2 * Math.PI) / p.tpS;
    for (let q = 0; q < omega.length; q++) {
      const x = omega[q] / wp;
      if (x < GRID_X[0] || x > GRID_X[GRID_POINTS - 1]) continue;
      // Density of the normalised shape at x: interpolate weights / grid weight.
      const f = (x - GRID_X[0]) / dx;
      const j = Math.min(GRID_POINTS - 2, Math.floor(f));
      const t = f - j;
      const d0 = weights[j] / GRID_W[j];
      const d1 = weights[j + 1] / GRID_W[j + 1];
      const s = (p.hsM * p.hsM * (d0 + (d1 - d0) * t)) / wp;
      wave[q] += s;
      const T = (2 * Math.PI) / omega[q];
      let r2 = 0;
      for (let b = 0; b < bins.weights.length; b++) {
        headingPosition(rao, p.dirDeg + bins.offsetsDeg[b] - vesselHeadingDeg, HEADING_POS);
        r2 += bins.weights[b] * raoSquaredAtPosition(amp, rao.periods, HEADING_POS[0], HEADING_POS[1], T);
      }
      response[q] += s * r2;
    }
  }
  return { response, wave };
}
