/**
 * Direction arithmetic for nautical "coming from" directions (degrees clockwise from true north).
 */

/**
 * Wraps an angle to [0, 360) degrees.
 *
 * @param deg - angle, degrees (any finite value; NaN stays NaN).
 * @returns the same direction in [0, 360).
 * @example wrapDegrees360(-10) // 350
 */
export function wrapDegrees360(deg: number): number {
  let r = deg - 360 * Math.floor(deg / 360);
  if (r < 0) r += 360; // deg/360 underflows to -0 for |deg| < ~1e-321, leaving r = deg < 0
  if (r >= 360) r -= 360; // -1e-15 - 360*(-1) rounds to 360
  return r;
}

/**
 * Wraps an angle to (-180, 180] degrees (so -180 becomes +180).
 *
 * @param deg - angle, degrees (any finite value; NaN stays NaN).
 * @returns the same angle in (-180, 180].
 * @example wrapDegrees180(270) // -90
 */
export function wrapDegrees180(deg: number): number {
  let r = deg - 360 * Math.floor((deg + 180) / 360);
  if (r <= -180) r += 360;
  else if (r > 180) r -= 360;
  return r;
}
