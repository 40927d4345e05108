/**
 * Phase and group celerity of a linear (Airy) wave of given period at a given depth.
 */
import { G_DEFAULT_MPS2, TWO_PI } from './constants';
import { groupCelerityRatio } from './hyperbolic';
import { waveNumber } from './wave-number';

/** Celerities of one linear wave (all SI). */
export interface Celerities {
  /** Wavenumber k = 2*pi/L, rad/m. */
  waveNumberRadPerM: number;
  /** Phase celerity C = omega/k = L/T, m/s. */
  celerityMps: number;
  /** Ratio n = Cg/C = (1 + 2kd/sinh(2kd))/2, dimensionless, in [0.5, 1). */
  n: number;
  /** Group celerity Cg = n*C, m/s. */
  groupCelerityMps: number;
}

/**
 * Phase celerity C = omega/k and group celerity Cg = n*C of a linear wave, with
 * n = (1 + 2kd/sinh(2kd))/2 (Airy theory; Shore Protection Manual 1984 Ch. 2; CEM EM 1110-2-1100
 * Part II-1). In deep water (depth Infinity, or k0*d >= 20 where tanh = 1 to double precision)
 * C = C0 = g*T/(2*pi) and Cg = C0/2 exactly (docs/domain.md#convention-1).
 *
 * @param periodS - wave period T, s, > 0 and finite.
 * @param depthM - water depth d, m, > 0; Infinity means deep water.
 * @param g - gravitational acceleration, m/s2 (default 9.81).
 * @returns k (rad/m), C (m/s), n, Cg (m/s).
 * @throws RangeError if an input is not a positive number (see `waveNumber`).
 * @example celerities(10, 10).celerityMps // 9.237 m/s
 */
export function celerities(periodS: number, depthM: number, g: number = G_DEFAULT_MPS2): Celerities {
  const k = waveNumber(periodS, depthM, g);
  const omega = TWO_PI / periodS;
  const kd = k * depthM;
  // In deep water k = omega^2/g exactly, so C = g/omega = C0 and n = 0.5 exactly.
  const n = kd >= 20 ? 0.5 : groupCelerityRatio(kd);
  const c = depthM === Infinity || kd >= 20 ? g / omega : omega / k;
  return { waveNumberRadPerM: k, celerityMps: c, n, groupCelerityMps: n * c };
}
