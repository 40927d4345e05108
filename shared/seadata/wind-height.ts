/**
 * Wind speed at 10 m from a measurement at the anemometer height z, by a power law
 * (docs/domain.md#ndbc):
 *
 *   U10 = Uz * (10 / z)^a
 *
 * with a = 0.11 by default over the open sea (Hsu, Meindl & Gilhousen 1994, "Determining the
 * power-law wind-profile exponent under near-neutral stability conditions at sea", J. Appl.
 * Meteor. 33, 757-765; DNV-RP-C205 gives about 0.12, from memory). 1/7 is an over-land value and
 * may be chosen. Buoy anemometers are at about 4-5 m on many NDBC buoys; limits are stated for wind
 * at 10 m. NDBC WSPD is an 8-minute mean and limits are usually 10-minute means: they are treated
 * as equal.
 */

/** Default power-law exponent over the open sea (Hsu, Meindl & Gilhousen 1994). */
export const DEFAULT_WIND_EXPONENT = 0.11;

/** The over-land exponent 1/7, which may be chosen instead. */
export const OVER_LAND_WIND_EXPONENT = 1 / 7;

/** The height limits are stated at, m. */
export const WIND_REFERENCE_HEIGHT_M = 10;

/**
 * Wind speed at 10 m: U10 = Uz * (10 / z)^a.
 *
 * @param speedMs wind speed measured at `heightM`, m/s (NaN passes through as NaN).
 * @param heightM anemometer height above sea level, m; finite and > 0 (10: already at 10 m).
 * @param exponent power-law exponent a, in (0, 1); default 0.11 (open sea).
 * @returns wind speed at 10 m, m/s.
 * @throws RangeError for a height that is not a finite positive number or an exponent outside (0, 1).
 * @example windSpeedAt10m(10, 5) // 10.7923... (= 10 * 2^0.11)
 */
export function windSpeedAt10m(speedMs: number, heightM: number, exponent: number = DEFAULT_WIND_EXPONENT): number {
  return speedMs * windHeightFactor(heightM, exponent);
}

/**
 * The factor (10 / z)^a of {@link windSpeedAt10m}, for correcting long series with one
 * multiplication per value.
 * @param heightM anemometer height above sea level, m; finite and > 0.
 * @param exponent power-law exponent a, in (0, 1); default 0.11.
 * @throws RangeError for a height that is not a finite positive number or an exponent outside (0, 1).
 */
export function windHeightFactor(heightM: number, exponent: number = DEFAULT_WIND_EXPONENT): number {
  if (!Number.isFinite(heightM) || heightM <= 0) {
    throw new RangeError(`anemometer height must be a positive number of metres, got ${heightM}`);
  }
  if (!(exponent > 0 && exponent < 1)) throw new RangeError(`wind exponent must be between 0 and 1, got ${exponent}`);
  return Math.pow(WIND_REFERENCE_HEIGHT_M / heightM, exponent);
}

/** Words for the import report: the height, the exponent and the factor. */
export function windHeightNote(heightM: number, exponent: number): string {
  if (heightM === WIND_REFERENCE_HEIGHT_M) return 'Wind speed taken as measured at 10 m (no height correction).';
  const a = Math.abs(exponent - OVER_LAND_WIND_EXPONENT) < 1e-12 ? '1/7 (over land)' : String(exponent);
  return `Wind speed corrected from the anemometer height ${heightM} m to 10 m: U10 = Uz (10/z)^a with a = ${a} (factor ${windHeightFactor(heightM, exponent).toFixed(4)}).`;
}
