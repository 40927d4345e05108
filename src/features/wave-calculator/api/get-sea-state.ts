import type { SeaStateQuery } from '../../../../shared/schemas/wave';
import type { CompletedPeriods } from '../../../../shared/waves/period-conversion';
import { calculatorQuery, waveQueryString } from './calculator-query';

/** Answer of GET /api/wave/sea-state, SI units. */
export interface SeaStateAnswer {
  /** Hs, m. */
  hs: number;
  /** d, m. */
  depth: number;
  /** Tp, Tz, Te (s), which were given and which derived, and the gamma used. */
  periods: CompletedPeriods;
  /** E = rho*g*Hs^2/16, J/m2. */
  energy: number;
  /** P = E*Cg(Te, d), W/m. */
  power: number;
  /** Linear wavelength at Tp and depth d, m. */
  peakWavelength: number;
  /** Linear significant bed velocity at Tp, m/s. */
  bedVelocityLinear: number;
  /** Soulsby (2006) significant bed velocity U_s = 2*U_rms at Tz, m/s. */
  bedVelocitySoulsby: number;
  /** Soulsby (2006) U_rms at Tz: the root-mean-square (standard deviation) of the near-bed velocity, m/s. */
  bedVelocitySoulsbyRms: number;
}

/** One sea state; `null` skips the request and keeps the last answer on screen. */
export const seaStateQuery = calculatorQuery<SeaStateQuery, SeaStateAnswer>('sea-state', (q) =>
  waveQueryString({ hs: q.hs, tp: q.tp, tz: q.tz, te: q.te, gamma: q.gamma, depth: q.depth }),
);
export const useSeaState = seaStateQuery.use;
