import type { RegularWaveQuery } from '../../../../shared/schemas/wave';
import type { DepthClass } from '../../../../shared/waves/regular-wave';
import { calculatorQuery, waveQueryString } from './calculator-query';

/**
 * Answer of GET /api/wave/regular: one regular wave by linear (Airy) theory, SI units.
 * The z-dependent fields are present only when z was asked for.
 */
export interface RegularWaveAnswer {
  /** Inputs echoed back: T (s), H (m), d (m). */
  period: number;
  height: number;
  depth: number;
  /** L, m. */
  wavelength: number;
  /** C, m/s. */
  celerity: number;
  /** Cg, m/s. */
  groupCelerity: number;
  /** n = Cg/C, dimensionless. */
  n: number;
  /** k, rad/m. */
  waveNumber: number;
  /** L0, m. */
  deepWaterWavelength: number;
  /** C0, m/s. */
  deepWaterCelerity: number;
  /** d/L, dimensionless. */
  depthOverWavelength: number;
  depthClass: DepthClass;
  /** Ks = sqrt(Cg0/Cg), dimensionless. */
  shoalingCoefficient: number;
  /** u_b, m/s. */
  bedVelocity: number;
  /** A_b, m. */
  bedExcursion: number;
  /** E, J/m2. */
  energyDensity: number;
  /** P = E*Cg, W/m. */
  power: number;
  /** Elevation asked for, m (upward from still water level). */
  z?: number;
  /** u(z) amplitude, m/s. */
  horizontalVelocity?: number;
  /** w(z) amplitude, m/s. */
  verticalVelocity?: number;
  /** Kp(z), dimensionless. */
  pressureFactor?: number;
}

/**
 * One regular wave; `null` (inputs not valid yet) skips the request and keeps the last answer
 * on screen. The answer is a pure function of the inputs, so it never goes stale.
 */
export const regularWaveQuery = calculatorQuery<RegularWaveQuery, RegularWaveAnswer>('regular', (q) =>
  waveQueryString({ period: q.period, height: q.height, depth: q.depth, z: q.z }),
);
export const useRegularWave = regularWaveQuery.use;
