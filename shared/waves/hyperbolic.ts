/**
 * Overflow-safe hyperbolic forms used by linear wave theory.
 *
 * `Math.sinh` and `Math.cosh` overflow to Infinity above about 710, and `x / Math.sinh(x)` then
 * gives 0 but `Infinity / Infinity` gives NaN. The forms here are written with exp(-x) and
 * expm1, so they hold their relative accuracy (a few units in the last place) for every
 * argument from about 1e-300 up to and including Infinity, and never return NaN or Infinity
 * for a positive argument.
 */

/**
 * Hyperbolic cosecant, csch(x) = 1/sinh(x) = 2*exp(-x) / (1 - exp(-2x)).
 *
 * @param x - argument, > 0 (Infinity allowed: returns 0).
 * @returns csch(x), dimensionless; 0 for x = Infinity.
 * @example csch(1) // 0.8509181282393216
 */
export function csch(x: number): number {
  return (2 * Math.exp(-x)) / -Math.expm1(-2 * x);
}

/**
 * Hyperbolic secant, sech(x) = 1/cosh(x) = 2*exp(-x) / (1 + exp(-2x)).
 *
 * @param x - argument, >= 0 (Infinity allowed: returns 0).
 * @returns sech(x), dimensionless, in (0, 1]; 0 for x = Infinity.
 * @example sech(0) // 1
 */
export function sech(x: number): number {
  return (2 * Math.exp(-x)) / (1 + Math.exp(-2 * x));
}

/**
 * Ratio of group to phase celerity of linear waves, n = (1 + 2kd/sinh(2kd))/2.
 * Source: linear (Airy) theory, e.g. Shore Protection Manual (1984) Ch. 2, CEM EM 1110-2-1100 Part II-1.
 *
 * @param kd - relative depth k*d, dimensionless, > 0; Infinity (deep water) gives exactly 0.5.
 * @returns n, dimensionless, in [0.5, 1): 1 in the shallow-water limit, 0.5 in deep water.
 * @example groupCelerityRatio(1) // 0.7757205647717833
 */
export function groupCelerityRatio(kd: number): number {
  if (kd === Infinity) return 0.5;
  return 0.5 + kd * csch(2 * kd);
}
