/**
 * Wavenumber of a linear (Airy) wave from its period and the water depth: the dispersion relation
 * omega^2 = g*k*tanh(k*d) solved for k.
 */
import { G_DEFAULT_MPS2, TWO_PI } from './constants';

/**
 * Above this relative depth k*d, tanh(k*d) is 1 to double precision (1 - tanh(x) ~ 2exp(-2x) is
 * below half an ulp of 1 for x > 19.1), so the dispersion relation is exactly the deep-water
 * one, k = omega^2/g.
 */
export const DEEP_WATER_KD = 20;

const MAX_NEWTON_STEPS = 30;

/** Relative residual the solver guarantees (and checks before it returns). */
export const DISPERSION_TOLERANCE = 1e-12;

function assertPositive(name: string, value: number, allowInfinity: boolean): void {
  if (!(value > 0) || (!allowInfinity && value === Infinity)) {
    throw new RangeError(`${name} must be a positive${allowInfinity ? '' : ' finite'} number, got ${value}`);
  }
}

/**
 * Relative depth k*d from the deep-water relative depth k0*d = omega^2*d/g, i.e. the root x of
 * x*tanh(x) = k0d (the dimensionless dispersion relation).
 *
 * Method: explicit start of Fenton & McKee (1990), then Newton steps until the step is below
 * 4 ulp (three steps in practice); the result is checked to satisfy the relation to a relative
 * residual below 1e-12. For k0d >= 20, x = k0d exactly (deep water, tanh = 1 to double precision).
 *
 * @param k0d - omega^2*d/g, dimensionless, > 0; Infinity gives Infinity.
 * @returns k*d, dimensionless, > 0.
 * @throws RangeError if k0d is not a positive number; Error if Newton does not converge (not
 *   observed for k0d from 1e-300 to Infinity).
 * @example relativeDepthFromDeepWater(1) // 1.1996786402577337
 */
export function relativeDepthFromDeepWater(k0d: number): number {
  assertPositive('k0d', k0d, true);
  if (k0d >= DEEP_WATER_KD) return k0d;
  // Fenton & McKee (1990), Coastal Engineering 14:499-513: k*d = k0*d * coth((k0*d)^(3/4))^(2/3).
  let x = k0d / Math.pow(Math.tanh(Math.pow(k0d, 0.75)), 2 / 3);
  for (let step = 0; step < MAX_NEWTON_STEPS; step++) {
    const t = Math.tanh(x);
    const f = x * t - k0d;
    // d/dx (x tanh x) = tanh x + x sech^2 x; x < 20 here so cosh does not overflow.
    const ch = Math.cosh(x);
    const dx = f / (t + x / (ch * ch));
    x -= dx;
    if (Math.abs(dx) <= 4 * Number.EPSILON * x) {
      const residual = Math.abs(x * Math.tanh(x) - k0d) / k0d;
      if (residual < DISPERSION_TOLERANCE) return x;
    }
  }
  throw new Error(`dispersion relation did not converge for k0d = ${k0d}`);
}

/** The deep-water wavenumber w^2/g, rad/m, after checking the inputs of a wavenumber function. */
function checkedDeepWaterK(periodS: number, depthM: number, g: number): number {
  assertPositive('periodS', periodS, false);
  assertPositive('depthM', depthM, true);
  assertPositive('g', g, false);
  const omega = TWO_PI / periodS;
  return (omega * omega) / g;
}

/**
 * Explicit approximation of the wavenumber of Fenton & McKee (1990), "On calculating the lengths
 * of water waves", Coastal Engineering 14:499-513:
 * k*d = k0*d * coth((k0*d)^(3/4))^(2/3), k0 = omega^2/g, omega = 2*pi/T.
 * Accuracy: within about 1.7 % of the exact wavelength everywhere (largest near k0*d = 0.34).
 * Use `waveNumber` for the exact value; this is its start value.
 *
 * @param periodS - wave period T, s, > 0 and finite.
 * @param depthM - water depth d, m, > 0; Infinity means deep water (returns k0).
 * @param g - gravitational acceleration, m/s2 (default 9.81).
 * @returns approximate wavenumber k, rad/m.
 * @throws RangeError if an input is not a positive number (or the period is Infinity).
 * @example fentonMcKeeWaveNumber(10, 10) // 0.06693 rad/m (exact: 0.06802)
 */
export function fentonMcKeeWaveNumber(periodS: number, depthM: number, g: number = G_DEFAULT_MPS2): number {
  const k0 = checkedDeepWaterK(periodS, depthM, g);
  if (depthM === Infinity) return k0;
  const k0d = k0 * depthM;
  return k0 / Math.pow(Math.tanh(Math.pow(k0d, 0.75)), 2 / 3);
}

/**
 * Wavenumber k of a linear (Airy) wave: the root of the dispersion relation
 * omega^2 = g*k*tanh(k*d), omega = 2*pi/T (Airy theory; Shore Protection Manual 1984 Ch. 2;
 * CEM EM 1110-2-1100 Part II-1).
 *
 * Method: Fenton & McKee (1990) explicit start, then Newton steps on x*tanh(x) = k0*d.
 * Accuracy: relative residual |g*k*tanh(k*d) - omega^2|/omega^2 < 1e-12 (checked before return;
 * in practice a few 1e-16) for 0.5 s <= T <= 30 s and 0.05 m <= d <= 6000 m, and no NaN or
 * Infinity for any positive finite period and any positive depth. Where k0*d >= 20,
 * tanh(k*d) = 1 to double precision and k = omega^2/g is returned (deep water).
 *
 * @param periodS - wave period T, s, > 0 and finite.
 * @param depthM - water depth d, m, > 0; Infinity means deep water (k = omega^2/g exactly).
 * @param g - gravitational acceleration, m/s2, > 0 (default 9.81).
 * @returns wavenumber k = 2*pi/L, rad/m.
 * @throws RangeError if periodS or g is not a positive finite number, or depthM is not a
 *   positive number (NaN, 0 and negatives throw).
 * @example waveNumber(10, 10) // 0.068019 rad/m, i.e. L = 92.37 m
 */
export function waveNumber(periodS: number, depthM: number, g: number = G_DEFAULT_MPS2): number {
  const k0 = checkedDeepWaterK(periodS, depthM, g);
  if (depthM === Infinity) return k0;
  const k0d = k0 * depthM;
  if (k0d >= DEEP_WATER_KD) return k0;
  return relativeDepthFromDeepWater(k0d) / depthM;
}

/**
 * Relative residual of the dispersion relation, (g*k*tanh(k*d) - omega^2)/omega^2, for checking
 * a wavenumber. Signed: positive when k is too large.
 *
 * @param waveNumberRadPerM - wavenumber k, rad/m, > 0.
 * @param periodS - wave period T, s, > 0.
 * @param depthM - water depth d, m, > 0; Infinity means deep water (tanh = 1).
 * @param g - gravitational acceleration, m/s2 (default 9.81).
 * @returns the relative residual, dimensionless.
 * @example dispersionResidual(waveNumber(8, 20), 8, 20) // about 1e-16
 */
export function dispersionResidual(waveNumberRadPerM: number, periodS: number, depthM: number, g: number = G_DEFAULT_MPS2): number {
  const omega = TWO_PI / periodS;
  const omega2 = omega * omega;
  const tanhKd = depthM === Infinity ? 1 : Math.tanh(waveNumberRadPerM * depthM);
  return (g * waveNumberRadPerM * tanhKd - omega2) / omega2;
}
