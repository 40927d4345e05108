/**
 * One regular (monochromatic) linear wave of height H, period T in depth d: every quantity of
 * linear (Airy) theory the calculator shows, and the orbital kinematics at any elevation.
 * Sources: Airy theory as given in the Shore Protection Manual (1984) Ch. 2 and the Coastal
 * Engineering Manual EM 1110-2-1100 Part II-1.
 */
import { G_DEFAULT_MPS2, RHO_SEAWATER_KGM3, TWO_PI } from './constants';
import { celerities } from './celerity';
import { csch } from './hyperbolic';

/** Depth classes by d/L (common practice): deep d/L > 1/2, shallow d/L < 1/20, else intermediate. */
export const DEPTH_CLASSES = ['deep', 'intermediate', 'shallow'] as const;
export type DepthClass = (typeof DEPTH_CLASSES)[number];

/** Inputs of `regularWave`. */
export interface RegularWaveParams {
  /** Wave height H (crest to trough), m, >= 0 and finite. */
  heightM: number;
  /** Wave period T, s, > 0 and finite. */
  periodS: number;
  /** Still-water depth d, m, > 0; Infinity means deep water. */
  depthM: number;
  /** Gravitational acceleration, m/s2 (default 9.81). */
  g?: number;
  /** Water density, kg/m3 (default 1025, seawater). */
  rhoKgM3?: number;
}

/** All linear-theory quantities of one regular wave (SI units, as named). */
export interface RegularWave {
  heightM: number;
  periodS: number;
  depthM: number;
  g: number;
  rhoKgM3: number;
  /** omega = 2*pi/T, rad/s. */
  angularFrequencyRadPerS: number;
  /** k = 2*pi/L, rad/m, from omega^2 = g*k*tanh(k*d). */
  waveNumberRadPerM: number;
  /** L = 2*pi/k, m. */
  wavelengthM: number;
  /** C = L/T, m/s. */
  celerityMps: number;
  /** Cg = n*C, m/s. */
  groupCelerityMps: number;
  /** n = Cg/C = (1 + 2kd/sinh(2kd))/2. */
  n: number;
  /** L0 = g*T^2/(2*pi), m. */
  deepWaterWavelengthM: number;
  /** C0 = g*T/(2*pi), m/s. */
  deepWaterCelerityMps: number;
  /** Cg0 = C0/2, m/s. */
  deepWaterGroupCelerityMps: number;
  /** k*d, dimensionless (Infinity in deep water of unknown depth). */
  relativeDepthKd: number;
  /** d/L, dimensionless (Infinity in deep water of unknown depth). */
  depthOverWavelength: number;
  /** 'deep' (d/L > 1/2), 'shallow' (d/L < 1/20) or 'intermediate' (common practice). */
  depthClass: DepthClass;
  /** Ks = H/H0 = sqrt(Cg0/Cg) (energy-flux conservation from deep water), dimensionless. */
  shoalingCoefficient: number;
  /** Bed orbital velocity amplitude u_b = pi*H/(T*sinh(k*d)), m/s (0 in deep water). */
  bedVelocityMps: number;
  /** Bed orbital excursion amplitude A_b = H/(2*sinh(k*d)), m (0 in deep water). */
  bedExcursionM: number;
  /** Energy density E = rho*g*H^2/8, J/m2. */
  energyDensityJPerM2: number;
  /** Energy flux (power per metre of crest) P = E*Cg, W/m. */
  powerWPerM: number;
}

function assertFinite(name: string, value: number, min: number, inclusive: boolean): void {
  const ok = Number.isFinite(value) && (inclusive ? value >= min : value > min);
  if (!ok) throw new RangeError(`${name} must be a finite number ${inclusive ? '>=' : '>'} ${min}, got ${value}`);
}

/**
 * Linear (Airy) theory for one regular wave: wavelength, celerities, depth class, shoaling
 * coefficient, bed velocity and excursion, energy and power (formulas in docs/domain.md#dispersion;
 * SPM 1984 Ch. 2; CEM EM 1110-2-1100 Part II-1). Overflow-safe for any depth:
 * 1/sinh(k*d) is evaluated as 2exp(-kd)/(1 - exp(-2kd)).
 *
 * @param params - H (m, >= 0), T (s, > 0), d (m, > 0 or Infinity), g (m/s2), rho (kg/m3).
 * @returns every quantity of `RegularWave`, SI units.
 * @throws RangeError for a negative or non-finite height, a non-positive or non-finite period,
 *   g or rho, or a non-positive/NaN depth.
 * @example regularWave({ heightM: 1, periodS: 10, depthM: 10 }).wavelengthM // 92.37 m
 */
export function regularWave(params: RegularWaveParams): RegularWave {
  const { heightM, periodS, depthM } = params;
  const g = params.g ?? G_DEFAULT_MPS2;
  const rhoKgM3 = params.rhoKgM3 ?? RHO_SEAWATER_KGM3;
  assertFinite('heightM', heightM, 0, true);
  assertFinite('rhoKgM3', rhoKgM3, 0, false);
  const cel = celerities(periodS, depthM, g); // validates period, depth and g
  const k = cel.waveNumberRadPerM;
  const omega = TWO_PI / periodS;
  const kd = depthM === Infinity ? Infinity : k * depthM;
  const c0 = g / omega;
  const cg0 = c0 / 2;
  const dOverL = kd / TWO_PI;
  const depthClass: DepthClass = dOverL > 0.5 ? 'deep' : dOverL < 0.05 ? 'shallow' : 'intermediate';
  const cschKd = csch(kd);
  const energy = (rhoKgM3 * g * heightM * heightM) / 8;
  return {
    heightM,
    periodS,
    depthM,
    g,
    rhoKgM3,
    angularFrequencyRadPerS: omega,
    waveNumberRadPerM: k,
    wavelengthM: TWO_PI / k,
    celerityMps: cel.celerityMps,
    groupCelerityMps: cel.groupCelerityMps,
    n: cel.n,
    deepWaterWavelengthM: (g * periodS * periodS) / TWO_PI,
    deepWaterCelerityMps: c0,
    deepWaterGroupCelerityMps: cg0,
    relativeDepthKd: kd,
    depthOverWavelength: dOverL,
    depthClass,
    shoalingCoefficient: Math.sqrt(cg0 / cel.groupCelerityMps),
    bedVelocityMps: ((Math.PI * heightM) / periodS) * cschKd,
    bedExcursionM: (heightM / 2) * cschKd,
    energyDensityJPerM2: energy,
    powerWPerM: energy * cel.groupCelerityMps,
  };
}

/** Orbital kinematics and pressure factor at one elevation. */
export interface OrbitalKinematics {
  /** Elevation z above still water level, m (<= 0). */
  zM: number;
  /** Horizontal orbital velocity amplitude u(z) = (pi*H/T)*cosh(k(z+d))/sinh(kd), m/s. */
  horizontalVelocityMps: number;
  /** Vertical orbital velocity amplitude w(z) = (pi*H/T)*sinh(k(z+d))/sinh(kd), m/s. */
  verticalVelocityMps: number;
  /** Pressure response factor Kp(z) = cosh(k(z+d))/cosh(kd), dimensionless, in (0, 1]. */
  pressureFactor: number;
  /** Horizontal orbital excursion amplitude u(z)/omega, m. */
  horizontalExcursionM: number;
  /** Vertical orbital excursion amplitude w(z)/omega, m. */
  verticalExcursionM: number;
}

function isRegularWave(value: RegularWave | RegularWaveParams): value is RegularWave {
  return typeof (value as RegularWave).waveNumberRadPerM === 'number';
}

/**
 * Orbital velocity amplitudes u(z), w(z) and pressure response factor Kp(z) of a linear wave at
 * elevation z (upward from still water level; the bed is at z = -d), per docs/domain.md#dispersion:
 * u = (pi*H/T) cosh(k(z+d))/sinh(kd), w = (pi*H/T) sinh(k(z+d))/sinh(kd),
 * Kp = cosh(k(z+d))/cosh(kd) (SPM 1984 Ch. 2; CEM EM 1110-2-1100 Part II-1).
 *
 * Evaluated in the overflow-free form (a = k(z+d), b = kd, a - b = kz):
 * cosh(a)/sinh(b) = e^{kz}(1 + e^{-2a})/(1 - e^{-2b}), sinh(a)/sinh(b) = e^{kz}(1 - e^{-2a})/(1 - e^{-2b}),
 * cosh(a)/cosh(b) = e^{kz}(1 + e^{-2a})/(1 + e^{-2b}); exact, and in deep water (d = Infinity)
 * the familiar e^{kz} decay.
 *
 * @param wave - a `RegularWave` (from `regularWave`) or the parameters to build one.
 * @param zM - elevation z, m, with -d <= z <= 0 (any z <= 0 in water of infinite depth).
 * @returns u, w (m/s), Kp, and the excursion amplitudes (m) at z.
 * @throws RangeError if z is NaN, above the still water level, or below the bed (and whatever
 *   `regularWave` throws for bad parameters).
 * @example orbitalAt({ heightM: 1, periodS: 10, depthM: 10 }, -10).pressureFactor // 0.8062 (= 1/cosh kd)
 */
export function orbitalAt(wave: RegularWave | RegularWaveParams, zM: number): OrbitalKinematics {
  const w0 = isRegularWave(wave) ? wave : regularWave(wave);
  const d = w0.depthM;
  if (!(zM <= 0) || zM < -d) {
    throw new RangeError(`zM must be between -depth (${-d} m) and 0 (still water level), got ${zM}`);
  }
  const k = w0.waveNumberRadPerM;
  const a = d === Infinity ? Infinity : k * (zM + d);
  const b = d === Infinity ? Infinity : k * d;
  const ekz = Math.exp(k * zM);
  const e2a = Math.exp(-2 * a);
  const oneMinusE2b = -Math.expm1(-2 * b);
  const coshOverSinh = (ekz * (1 + e2a)) / oneMinusE2b;
  const sinhOverSinh = (ekz * -Math.expm1(-2 * a)) / oneMinusE2b;
  const coshOverCosh = (ekz * (1 + e2a)) / (1 + Math.exp(-2 * b));
  const amp = (Math.PI * w0.heightM) / w0.periodS;
  const u = amp * coshOverSinh;
  const w = amp * sinhOverSinh;
  const omega = w0.angularFrequencyRadPerS;
  return {
    zM,
    horizontalVelocityMps: u,
    verticalVelocityMps: w,
    pressureFactor: coshOverCosh,
    horizontalExcursionM: u / omega,
    verticalExcursionM: w / omega,
  };
}
