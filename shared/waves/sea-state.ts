/**
 * Sea-state (irregular wave) quantities from Hs and the periods: energy, power and near-bed orbital
 * velocity by two methods (docs/domain.md#sea-states).
 */
import { G_DEFAULT_MPS2, RHO_SEAWATER_KGM3 } from './constants';
import { celerities } from './celerity';
import { csch } from './hyperbolic';
import { completePeriods, JONSWAP_GAMMA_DEFAULT, type CompletedPeriods } from './period-conversion';
import { waveNumber } from './wave-number';

/** Physical constants of a computation (defaults: g = 9.81 m/s2, rho = 1025 kg/m3). */
export interface PhysicalConstants {
  g?: number;
  rhoKgM3?: number;
}

function assertHs(hsM: number): void {
  if (!(hsM >= 0 && hsM < Infinity)) throw new RangeError(`hsM must be a finite number >= 0, got ${hsM}`);
}

function assertPeriod(name: string, value: number): void {
  if (!(value > 0 && value < Infinity)) throw new RangeError(`${name} must be a positive finite period in s, got ${value}`);
}

function assertDepth(depthM: number): void {
  if (!(depthM > 0)) throw new RangeError(`depthM must be a positive number (Infinity = deep water), got ${depthM}`);
}

function constantsOf(c: PhysicalConstants | undefined): { g: number; rho: number } {
  const g = c?.g ?? G_DEFAULT_MPS2;
  const rho = c?.rhoKgM3 ?? RHO_SEAWATER_KGM3;
  if (!(g > 0 && g < Infinity)) throw new RangeError(`g must be a positive finite number, got ${g}`);
  if (!(rho > 0 && rho < Infinity)) throw new RangeError(`rhoKgM3 must be a positive finite number, got ${rho}`);
  return { g, rho };
}

/**
 * Energy density of a sea state, E = rho*g*Hs^2/16 (Hs = Hm0 = 4*sqrt(m0); linear theory).
 *
 * @param hsM - significant wave height Hs, m, >= 0.
 * @param constants - g (m/s2) and rho (kg/m3), defaults 9.81 and 1025.
 * @returns E, J/m2.
 * @throws RangeError for a negative or non-finite Hs, or bad constants.
 * @example seaStateEnergy(2) // 2513.8 J/m2
 */
export function seaStateEnergy(hsM: number, constants?: PhysicalConstants): number {
  assertHs(hsM);
  const { g, rho } = constantsOf(constants);
  return (rho * g * hsM * hsM) / 16;
}

/**
 * Wave power (energy flux per metre of crest) of a sea state, P = rho*g*Hs^2*Cg(Te, d)/16, with
 * Cg the linear group celerity at the energy period Te (docs/domain.md#sea-states). In deep water
 * P = rho*g^2*Hs^2*Te/(64*pi), about 0.49*Hs^2*Te kW/m (common practice in wave-energy resource work).
 *
 * @param hsM - significant wave height Hs, m, >= 0.
 * @param teS - energy period Te = Tm-1,0, s, > 0 (docs/domain.md#convention-8: 0.90*Tp when not given).
 * @param depthM - water depth, m, > 0; Infinity = deep water.
 * @param constants - g (m/s2) and rho (kg/m3).
 * @returns P, W/m.
 * @throws RangeError for bad Hs, Te, depth or constants.
 * @example seaStatePower(1, 10, Infinity) // 4906 W/m
 */
export function seaStatePower(hsM: number, teS: number, depthM: number, constants?: PhysicalConstants): number {
  assertHs(hsM);
  assertPeriod('teS', teS);
  assertDepth(depthM);
  const { g, rho } = constantsOf(constants);
  const cg = celerities(teS, depthM, g).groupCelerityMps;
  return (rho * g * hsM * hsM * cg) / 16;
}

/**
 * Near-bed orbital velocity, linear significant method (docs/domain.md, method 1, common practice):
 * u_bs = pi*Hs/(Tp*sinh(k_p*d)), k_p the linear wavenumber of Tp at depth d. 1/sinh is evaluated
 * overflow-free, so deep water gives 0, not NaN.
 *
 * @param hsM - significant wave height Hs, m, >= 0.
 * @param tpS - peak period Tp, s, > 0.
 * @param depthM - water depth d, m, > 0; Infinity gives 0.
 * @param g - gravitational acceleration, m/s2 (default 9.81).
 * @returns u_bs, m/s.
 * @throws RangeError for bad Hs, Tp, depth or g.
 * @example bedVelocityLinear(2, 10, 10) // 0.8562 m/s
 */
export function bedVelocityLinear(hsM: number, tpS: number, depthM: number, g: number = G_DEFAULT_MPS2): number {
  assertHs(hsM);
  assertPeriod('tpS', tpS);
  assertDepth(depthM);
  if (depthM === Infinity) return 0;
  const k = waveNumber(tpS, depthM, g);
  return ((Math.PI * hsM) / tpS) * csch(k * depthM);
}

/**
 * Root-mean-square near-bed velocity per metre of Hs by Soulsby (2006): the factor R with
 * U_rms = R*Hs, R = (1/(4 Tn)) / (1 + A t^2)^3. Used by the series transformation to cache per
 * period. See `bedVelocitySoulsby`.
 *
 * @param tzS - zero-crossing period Tz, s, > 0.
 * @param depthM - water depth d, m, > 0; Infinity gives 0.
 * @param g - gravitational acceleration, m/s2.
 * @returns R, 1/s.
 */
export function soulsbyRmsVelocityPerHs(tzS: number, depthM: number, g: number = G_DEFAULT_MPS2): number {
  if (depthM === Infinity) return 0;
  const tn = Math.sqrt(depthM / g);
  const t = tn / tzS;
  const base = 0.56 + 15.54 * t;
  const b2 = base * base;
  const a = Math.pow(6500 + b2 * b2 * b2, 1 / 6);
  const denom = 1 + a * t * t;
  return 1 / (4 * tn) / (denom * denom * denom);
}

/**
 * Significant near-bed velocity per metre of Hs by Soulsby (2006): the factor F with U_s = F*Hs,
 * F = 2*R (see `soulsbyRmsVelocityPerHs` and `bedVelocitySoulsby`). Used by the series
 * transformation to cache per period.
 *
 * @param tzS - zero-crossing period Tz, s, > 0.
 * @param depthM - water depth d, m, > 0; Infinity gives 0.
 * @param g - gravitational acceleration, m/s2.
 * @returns F, 1/s.
 */
export function soulsbyVelocityPerHs(tzS: number, depthM: number, g: number = G_DEFAULT_MPS2): number {
  return 2 * soulsbyRmsVelocityPerHs(tzS, depthM, g);
}

/**
 * Root-mean-square near-bed orbital velocity U_rms by Soulsby (2006), "Simplified calculation of
 * wave orbital velocities", HR Wallingford report TR 155 (from memory; docs/domain.md#bed-velocity):
 * Tn = sqrt(d/g), t = Tn/Tz, A = (6500 + (0.56 + 15.54 t)^6)^(1/6),
 * U_rms = (Hs/(4 Tn)) / (1 + A t^2)^3. U_rms is the standard deviation of the near-bed velocity
 * time series (the square root of the integral of its spectrum), not an amplitude.
 *
 * @param hsM - significant wave height Hs, m, >= 0.
 * @param tzS - mean zero-crossing period Tz, s, > 0.
 * @param depthM - water depth d, m, > 0; Infinity gives 0.
 * @param g - gravitational acceleration, m/s2 (default 9.81).
 * @returns U_rms, m/s.
 * @throws RangeError for bad Hs, Tz, depth or g.
 * @example bedVelocityRmsSoulsby(2, 6, 10) // 0.3475 m/s
 */
export function bedVelocityRmsSoulsby(hsM: number, tzS: number, depthM: number, g: number = G_DEFAULT_MPS2): number {
  assertHs(hsM);
  assertPeriod('tzS', tzS);
  assertDepth(depthM);
  if (!(g > 0 && g < Infinity)) throw new RangeError(`g must be a positive finite number, got ${g}`);
  return hsM * soulsbyRmsVelocityPerHs(tzS, depthM, g);
}

/**
 * Near-bed orbital velocity, significant amplitude, by Soulsby (2006) (see
 * `bedVelocityRmsSoulsby` for the formula of U_rms): U_s = 2*U_rms, consistent with
 * Hs = 4*sqrt(m0) (the significant value is twice the standard deviation) and so comparable with
 * the linear significant u_bs and with a limit stated as significant (docs/domain.md#bed-velocity).
 * Shallow-water limit U_s -> (1/2) Hs sqrt(g/d), as linear theory gives; deep water -> 0.
 *
 * @param hsM - significant wave height Hs, m, >= 0.
 * @param tzS - mean zero-crossing period Tz, s, > 0 (docs/domain.md#convention-8: from Tp by the JONSWAP ratio
 *   at gamma 3.3 when not given).
 * @param depthM - water depth d, m, > 0; Infinity gives 0.
 * @param g - gravitational acceleration, m/s2 (default 9.81).
 * @returns U_s, m/s.
 * @throws RangeError for bad Hs, Tz, depth or g.
 * @example bedVelocitySoulsby(2, 6, 10) // 0.6950 m/s
 */
export function bedVelocitySoulsby(hsM: number, tzS: number, depthM: number, g: number = G_DEFAULT_MPS2): number {
  return 2 * bedVelocityRmsSoulsby(hsM, tzS, depthM, g);
}

/** Inputs of `seaState`. */
export interface SeaStateParams extends PhysicalConstants {
  /** Significant wave height Hs (Hm0), m, >= 0. */
  hsM: number;
  /** Peak period Tp, s (optional if Tz or Te is given). */
  tpS?: number | null;
  /** Mean zero-crossing period Tz, s (optional). */
  tzS?: number | null;
  /** Energy period Te = Tm-1,0, s (optional). */
  teS?: number | null;
  /** JONSWAP peak enhancement factor, 1 to 7 (default 3.3). */
  gamma?: number;
  /** Water depth, m, > 0; Infinity = deep water. */
  depthM: number;
}

/** Everything the sea-state calculator shows. */
export interface SeaState {
  hsM: number;
  depthM: number;
  /** Completed periods (s) with their sources. */
  periods: CompletedPeriods;
  /** E = rho*g*Hs^2/16, J/m2. */
  energyJPerM2: number;
  /** P = rho*g*Hs^2*Cg(Te, d)/16, W/m. */
  powerWPerM: number;
  /** Linear wavelength at Tp and depth d, m. */
  peakWavelengthM: number;
  /** Linear significant bed velocity u_bs at Tp, m/s. */
  bedVelocityLinearMps: number;
  /** Soulsby (2006) significant bed velocity U_s = 2*U_rms at Tz, m/s. */
  bedVelocitySoulsbyMps: number;
  /** Soulsby (2006) root-mean-square bed velocity U_rms at Tz (the standard deviation of the near-bed velocity), m/s. */
  bedVelocityRmsSoulsbyMps: number;
}

/**
 * All sea-state quantities for one (Hs, periods, depth): the completed periods (`completePeriods`,
 * with the given gamma), energy, power at Te, and bed velocity by both methods (linear at Tp,
 * Soulsby at Tz).
 *
 * @param params - Hs (m), Tp/Tz/Te (s, at least one), gamma, depth (m), g, rho.
 * @returns the `SeaState`.
 * @throws RangeError if no period is given, or any input is out of range.
 * @example seaState({ hsM: 2, tpS: 10, depthM: 20 }).periods.teS // 9
 */
export function seaState(params: SeaStateParams): SeaState {
  const { hsM, depthM } = params;
  assertHs(hsM);
  assertDepth(depthM);
  const { g, rho } = constantsOf(params);
  const periods = completePeriods({ tpS: params.tpS, tzS: params.tzS, teS: params.teS }, params.gamma ?? JONSWAP_GAMMA_DEFAULT);
  if (periods.sources.tp === 'missing') {
    throw new RangeError('at least one of tpS, tzS, teS must be given');
  }
  const k = waveNumber(periods.tpS, depthM, g);
  return {
    hsM,
    depthM,
    periods,
    energyJPerM2: seaStateEnergy(hsM, { g, rhoKgM3: rho }),
    powerWPerM: seaStatePower(hsM, periods.teS, depthM, { g, rhoKgM3: rho }),
    peakWavelengthM: (2 * Math.PI) / k,
    bedVelocityLinearMps: bedVelocityLinear(hsM, periods.tpS, depthM, g),
    bedVelocitySoulsbyMps: bedVelocitySoulsby(hsM, periods.tzS, depthM, g),
    bedVelocityRmsSoulsbyMps: bedVelocityRmsSoulsby(hsM, periods.tzS, depthM, g),
  };
}
