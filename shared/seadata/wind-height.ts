/**
 * Wind speed at 10 m from a measurement at another height, by the 1/7 power law.
 *
 *   U10 = Uz * (10 / z)^(1/7)
 *
 * Source: docs/domain.md#ndbc (a 1/7 power law to 10 m is common practice, no
 * published source quoted there). It assumes a neutral atmosphere; over open sea the true
 * exponent is often smaller, so the correction from buoy height (about 4-5 m) is modest: about
 * +10 % to +14 %.
 *
 * @param speedMs wind speed measured at `heightM`, m/s (NaN passes through as NaN).
 * @param heightM anemometer height above sea level, m; finite and > 0.
 * @returns wind speed at 10 m, m/s.
 * @throws RangeError when `heightM` is not a finite positive number.
 * @example windSpeedAt10m(10, 5) // 10.4089... (= 10 * 2^(1/7))
 */
export function windSpeedAt10m(speedMs: number, heightM: number): number {
  return speedMs * windHeightFactor(heightM);
}

/**
 * The factor (10 / z)^(1/7) of {@link windSpeedAt10m}, for correcting long series with one
 * multiplication per value.
 * @param heightM anemometer height above sea level, m; finite and > 0.
 * @throws RangeError when `heightM` is not a finite positive number.
 */
export function windHeightFactor(heightM: number): number {
  if (!Number.isFinite(heightM) || heightM <= 0) {
    throw new RangeError(`anemometer height must be a positive number of metres, got ${heightM}`);
  }
  return Math.pow(10 / heightM, 1 / 7);
}
