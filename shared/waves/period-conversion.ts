/**
 * Period conversions for a JONSWAP spectrum: the ratios of the mean zero-crossing period Tz, the
 * mean period Tm01 and the energy period Te = Tm-1,0 to the peak period Tp, and the completion of
 * a record's periods from whichever were given.
 */

/** Default JONSWAP peak enhancement factor (DNV-RP-C205; docs/domain.md#sea-states). */
export const JONSWAP_GAMMA_DEFAULT = 3.3;

/** Range of gamma the DNV-RP-C205 ratio polynomials are given for (1 <= gamma <= 7). */
export const JONSWAP_GAMMA_MIN = 1;
export const JONSWAP_GAMMA_MAX = 7;

/**
 * Te/Tp used when Te is not given and gamma is 3.3: 0.90 (docs/domain.md#convention-8).
 * The integrated JONSWAP shape gives 0.9033 at gamma 3.3; the convention's round figure wins.
 */
export const TE_OVER_TP_CONVENTION = 0.9;

function assertGamma(gamma: number): void {
  if (!(gamma >= JONSWAP_GAMMA_MIN && gamma <= JONSWAP_GAMMA_MAX)) {
    throw new RangeError(`gamma must be in [${JONSWAP_GAMMA_MIN}, ${JONSWAP_GAMMA_MAX}], got ${gamma}`);
  }
}

/**
 * Tz/Tp for a JONSWAP spectrum, DNV-RP-C205 (as written in docs/domain.md#sea-states, from memory):
 * Tz/Tp = 0.6673 + 0.05037*gamma - 0.006230*gamma^2 + 0.0003341*gamma^3.
 *
 * @param gamma - peak enhancement factor, 1 <= gamma <= 7 (default 3.3).
 * @returns Tz/Tp, dimensionless (0.7112 at gamma 1, 0.7777 at gamma 3.3).
 * @throws RangeError if gamma is outside [1, 7] or NaN.
 * @example jonswapTzOverTp(3.3) // 0.7777
 */
export function jonswapTzOverTp(gamma: number = JONSWAP_GAMMA_DEFAULT): number {
  assertGamma(gamma);
  return 0.6673 + gamma * (0.05037 + gamma * (-0.00623 + gamma * 0.0003341));
}

/**
 * Tm01/Tp for a JONSWAP spectrum, DNV-RP-C205 (as written in docs/domain.md#sea-states, from memory):
 * Tm01/Tp = 0.7303 + 0.04936*gamma - 0.006556*gamma^2 + 0.0003610*gamma^3.
 *
 * @param gamma - peak enhancement factor, 1 <= gamma <= 7 (default 3.3).
 * @returns Tm01/Tp, dimensionless (0.8348 at gamma 3.3).
 * @throws RangeError if gamma is outside [1, 7] or NaN.
 * @example jonswapTm01OverTp(3.3) // 0.8348
 */
export function jonswapTm01OverTp(gamma: number = JONSWAP_GAMMA_DEFAULT): number {
  assertGamma(gamma);
  return 0.7303 + gamma * (0.04936 + gamma * (-0.006556 + gamma * 0.000361));
}

/** Spectral moments m_n (n = -1, 0, 1, 2) of the JONSWAP shape with fp = 1 (arbitrary scale). */
export interface JonswapShapeMoments {
  mMinus1: number;
  m0: number;
  m1: number;
  m2: number;
}

const momentCache = new Map<number, JonswapShapeMoments>();

/**
 * Moments m_n = integral of f^n S(f) df of the JONSWAP spectral shape with peak frequency 1:
 * S(x) = x^-5 exp(-5/4 x^-4) gamma^exp(-(x-1)^2/(2 sigma^2)), sigma = 0.07 for x <= 1 and 0.09
 * above (Hasselmann et al. 1973; DNV-RP-C205). The scale (alpha) cancels in every period ratio.
 *
 * Numerical method: the substitution t = 1/x turns the semi-infinite integral into
 * integral over t from 0 to 4 of t^(3-n) exp(-5/4 t^4) gamma^exp(-(1/t - 1)^2/(2 sigma^2)) dt (the integrand
 * is below 1e-130 beyond t = 4), split at the kink t = 1 and integrated by composite Simpson's rule
 * with 4000 + 12000 intervals. Checked against the closed form for gamma = 1 (Pierson-Moskowitz)
 * to 1e-13. Results are cached per gamma.
 *
 * @param gamma - peak enhancement factor, 1 <= gamma <= 7.
 * @returns the moments m_-1, m_0, m_1, m_2 (arbitrary common scale).
 * @throws RangeError if gamma is outside [1, 7] or NaN.
 */
export function jonswapShapeMoments(gamma: number): JonswapShapeMoments {
  assertGamma(gamma);
  const cached = momentCache.get(gamma);
  if (cached) return cached;
  const acc = [0, 0, 0, 0]; // n = -1, 0, 1, 2 -> powers t^4, t^3, t^2, t^1
  const integrate = (a: number, b: number, intervals: number, sigma: number): void => {
    const h = (b - a) / intervals;
    const twoSigma2 = 2 * sigma * sigma;
    for (let i = 0; i <= intervals; i++) {
      const t = a + i * h;
      const weight = i === 0 || i === intervals ? 1 : i % 2 === 1 ? 4 : 2;
      let core = 0;
      if (t > 0) {
        const x = 1 / t;
        const t2 = t * t;
        core = Math.exp(-1.25 * t2 * t2) * Math.pow(gamma, Math.exp(-((x - 1) * (x - 1)) / twoSigma2));
      }
      const wc = (weight * core * h) / 3;
      acc[3] += wc * t;
      acc[2] += wc * t * t;
      acc[1] += wc * t * t * t;
      acc[0] += wc * t * t * t * t;
    }
  };
  // t in [0, 1] is x >= 1 (sigma 0.09); t in [1, 4] is x <= 1 (sigma 0.07).
  integrate(0, 1, 4000, 0.09);
  integrate(1, 4, 12000, 0.07);
  const moments = { mMinus1: acc[0], m0: acc[1], m1: acc[2], m2: acc[3] };
  if (momentCache.size > 64) momentCache.clear();
  momentCache.set(gamma, moments);
  return moments;
}

/**
 * Te/Tp (energy period Tm-1,0 = m_-1/m_0 over the peak period) of a JONSWAP spectrum, by
 * numerical integration of the spectral shape (`jonswapShapeMoments`). 0.8572 for gamma = 1
 * (Pierson-Moskowitz: closed form 1.25^(-1/4)*Gamma(5/4)), 0.9033 for gamma = 3.3.
 * For the completion of a record's periods, `completePeriods` uses 0.90 at gamma 3.3 (docs/domain.md#convention-8).
 *
 * @param gamma - peak enhancement factor, 1 <= gamma <= 7 (default 3.3).
 * @returns Te/Tp, dimensionless.
 * @throws RangeError if gamma is outside [1, 7] or NaN.
 * @example jonswapTeOverTp(1) // 0.8572
 */
export function jonswapTeOverTp(gamma: number = JONSWAP_GAMMA_DEFAULT): number {
  const m = jonswapShapeMoments(gamma);
  return m.mMinus1 / m.m0;
}

/**
 * The Te/Tp ratio used to complete a record's periods: 0.90 at gamma = 3.3 (docs/domain.md#convention-8),
 * otherwise the integrated JONSWAP value `jonswapTeOverTp(gamma)`.
 *
 * @param gamma - peak enhancement factor, 1 <= gamma <= 7 (default 3.3).
 * @throws RangeError if gamma is outside [1, 7] or NaN.
 */
export function teOverTpForCompletion(gamma: number = JONSWAP_GAMMA_DEFAULT): number {
  assertGamma(gamma);
  return gamma === JONSWAP_GAMMA_DEFAULT ? TE_OVER_TP_CONVENTION : jonswapTeOverTp(gamma);
}

/** Where a completed period came from: given in the record, derived from another period, or missing. */
export type TpSource = 'given' | 'tz' | 'te' | 'missing';
export type TzSource = 'given' | 'tp' | 'missing';
export type TeSource = 'given' | 'tp' | 'missing';

/** Bits of the "given periods" mask: Tp 1, Tz 2, Te 4. */
export const PERIOD_GIVEN = { TP: 1, TZ: 2, TE: 4 } as const;

/** A record's three periods after completion, and where each came from. */
export interface CompletedPeriods {
  /** Peak period Tp, s (NaN if no period was given). */
  tpS: number;
  /** Mean zero-crossing period Tz, s. */
  tzS: number;
  /** Energy period Te = Tm-1,0, s. */
  teS: number;
  sources: { tp: TpSource; tz: TzSource; te: TeSource };
  /** Bitmask of the periods that were given: 1 Tp, 2 Tz, 4 Te. */
  givenMask: number;
  /** Peak enhancement factor used. */
  gamma: number;
}

/** Periods a record may give; undefined, null and NaN mean "not given". */
export interface PeriodsInput {
  tpS?: number | null;
  tzS?: number | null;
  teS?: number | null;
}

function isGiven(value: number | null | undefined): value is number {
  return value !== undefined && value !== null && !Number.isNaN(value);
}

function assertPeriod(name: string, value: number): void {
  if (!(value > 0 && value < Infinity)) throw new RangeError(`${name} must be a positive finite period in s, got ${value}`);
}

/**
 * Completes a record's periods Tp, Tz, Te from those given, for a JONSWAP spectrum with peak
 * enhancement gamma, and records which were given and which derived (docs/domain.md#sea-states,
 * docs/domain.md#convention-8). Order of preference:
 * 1. Tp: as given; else from Tz (Tp = Tz / (Tz/Tp), DNV-RP-C205 ratio), since Tz is the period a
 *    buoy or hindcast usually gives next to Hs and its ratio is the published one; else from Te
 *    (Tp = Te / (Te/Tp)).
 * 2. Tz: as given; else from Tp by the DNV-RP-C205 ratio.
 * 3. Te: as given; else from Tp: 0.90*Tp at gamma 3.3 (docs/domain.md#convention-8), the integrated JONSWAP
 *    ratio for any other gamma.
 * Given periods are never altered, even if they disagree with the ratios.
 *
 * @param periods - tpS, tzS, teS in s; undefined, null or NaN = not given.
 * @param gamma - peak enhancement factor, 1 <= gamma <= 7 (default 3.3).
 * @returns the three periods (s; all NaN when none was given), their sources and the given mask.
 * @throws RangeError if a given period is not positive and finite, or gamma is out of range.
 * @example completePeriods({ tpS: 10 }).teS // 9
 */
export function completePeriods(periods: PeriodsInput, gamma: number = JONSWAP_GAMMA_DEFAULT): CompletedPeriods {
  assertGamma(gamma);
  const tzRatio = jonswapTzOverTp(gamma);
  const teRatio = teOverTpForCompletion(gamma);
  const { tpS, tzS, teS } = periods;
  let mask = 0;
  if (isGiven(tpS)) {
    assertPeriod('tpS', tpS);
    mask |= PERIOD_GIVEN.TP;
  }
  if (isGiven(tzS)) {
    assertPeriod('tzS', tzS);
    mask |= PERIOD_GIVEN.TZ;
  }
  if (isGiven(teS)) {
    assertPeriod('teS', teS);
    mask |= PERIOD_GIVEN.TE;
  }
  let tp = NaN;
  let tpSource: TpSource = 'missing';
  if (isGiven(tpS)) {
    tp = tpS;
    tpSource = 'given';
  } else if (isGiven(tzS)) {
    tp = tzS / tzRatio;
    tpSource = 'tz';
  } else if (isGiven(teS)) {
    tp = teS / teRatio;
    tpSource = 'te';
  }
  const haveTp = tpSource !== 'missing';
  const tz = isGiven(tzS) ? tzS : haveTp ? tp * tzRatio : NaN;
  const te = isGiven(teS) ? teS : haveTp ? tp * teRatio : NaN;
  return {
    tpS: tp,
    tzS: tz,
    teS: te,
    sources: {
      tp: tpSource,
      tz: isGiven(tzS) ? 'given' : haveTp ? 'tp' : 'missing',
      te: isGiven(teS) ? 'given' : haveTp ? 'tp' : 'missing',
    },
    givenMask: mask,
    gamma,
  };
}

/** Output of `completePeriodSeries`. */
export interface CompletedPeriodSeries {
  tpS: Float64Array;
  tzS: Float64Array;
  teS: Float64Array;
  /** Per record, bitmask of the periods given: 1 Tp, 2 Tz, 4 Te (0: none, all three NaN). */
  givenMask: Uint8Array;
}

/**
 * Array version of `completePeriods` for long series, same rules and order of preference.
 * A value is "given" when it is a positive finite number; NaN, zero, negatives and Infinity count
 * as missing (bad data are not allowed to throw in the middle of a 30-year series). The inputs
 * are not modified; new arrays are returned.
 *
 * @param tpS - peak periods, s (NaN = missing).
 * @param tzS - zero-crossing periods, s, same length, or null when the dataset has none.
 * @param teS - energy periods, s, same length, or null when the dataset has none.
 * @param gamma - peak enhancement factor, 1 <= gamma <= 7 (default 3.3).
 * @returns completed Tp, Tz, Te (s; NaN where no period was usable) and the given-bitmask.
 * @throws RangeError if lengths differ or gamma is out of range.
 */
export function completePeriodSeries(
  tpS: Float64Array,
  tzS: Float64Array | null,
  teS: Float64Array | null,
  gamma: number = JONSWAP_GAMMA_DEFAULT,
): CompletedPeriodSeries {
  assertGamma(gamma);
  const n = tpS.length;
  if ((tzS && tzS.length !== n) || (teS && teS.length !== n)) {
    throw new RangeError('tpS, tzS and teS must have the same length');
  }
  const tzRatio = jonswapTzOverTp(gamma);
  const teRatio = teOverTpForCompletion(gamma);
  const tpOut = new Float64Array(n);
  const tzOut = new Float64Array(n);
  const teOut = new Float64Array(n);
  const mask = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    const tp0 = tpS[i];
    const tz0 = tzS ? tzS[i] : NaN;
    const te0 = teS ? teS[i] : NaN;
    const hasTp = tp0 > 0 && tp0 < Infinity;
    const hasTz = tz0 > 0 && tz0 < Infinity;
    const hasTe = te0 > 0 && te0 < Infinity;
    const tp = hasTp ? tp0 : hasTz ? tz0 / tzRatio : hasTe ? te0 / teRatio : NaN;
    tpOut[i] = tp;
    tzOut[i] = hasTz ? tz0 : tp * tzRatio;
    teOut[i] = hasTe ? te0 : tp * teRatio;
    mask[i] = (hasTp ? PERIOD_GIVEN.TP : 0) | (hasTz ? PERIOD_GIVEN.TZ : 0) | (hasTe ? PERIOD_GIVEN.TE : 0);
  }
  return { tpS: tpOut, tzS: tzOut, teS: teOut, givenMask: mask };
}
