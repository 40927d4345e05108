/**
 * Physical constants and defaults of the wave physics core.
 *
 * Both defaults are common practice (no source) and can be set per project: every function that
 * uses them takes an optional `g` / `rhoKgM3`.
 */

/** Standard gravitational acceleration used by default, g = 9.81 m/s2 (common practice). */
export const G_DEFAULT_MPS2 = 9.81;

/** Seawater density used by default, rho = 1025 kg/m3 (common practice). */
export const RHO_SEAWATER_KGM3 = 1025;

/** 2*pi, rad per cycle. */
export const TWO_PI = 2 * Math.PI;

/** Degrees to radians. */
export const DEG_TO_RAD = Math.PI / 180;

/** Radians to degrees. */
export const RAD_TO_DEG = 180 / Math.PI;
