/**
 * JONSWAP spectrum shapes for the vessel-response engine (docs/domain.md#vessel-response).
 *
 * Hasselmann et al. (1973), "Measurements of wind-wave growth and swell decay during the Joint
 * North Sea Wave Project (JONSWAP)": a Pierson-Moskowitz shape times a peak enhancement gamma^r,
 * r = exp(-(omega - omega_p)^2 / (2 sigma^2 omega_p^2)), sigma 0.07 below the peak and 0.09 above.
 * Here the shape is written in x = omega / omega_p and normalised numerically on the grid, so the
 * zeroth moment is Hs^2/16 exactly whatever gamma (docs/domain.md#vessel-response).
 */

/** Points of the frequency grid per partition (at least 200, docs/domain.md#vessel-response). */
export const GRID_POINTS = 240;
/** Grid from 0.2 omega_p to 6 omega_p (docs/domain.md#vessel-response). */
export const GRID_X_MIN = 0.2;
export const GRID_X_MAX = 6;

/** The grid in x = omega/omega_p and its trapezoid weights (uniform). */
export const GRID_X: Float64Array = (() => {
  const x = new Float64Array(GRID_POINTS);
  const dx = (GRID_X_MAX - GRID_X_MIN) / (GRID_POINTS - 1);
  for (let j = 0; j < GRID_POINTS; j++) x[j] = GRID_X_MIN + j * dx;
  return x;
})();
export const GRID_W: Float64Array = (() => {
  const w = new Float64Array(GRID_POINTS);
  const dx = (GRID_X_MAX - GRID_X_MIN) / (GRID_POINTS - 1);
  w.fill(dx);
  w[0] = dx / 2;
  w[GRID_POINTS - 1] = dx / 2;
  return w;
})();

/**
 * Gamma of a wind sea or an unpartitioned sea by the DNV-RP-C205 rule (from memory):
 * r = Tp / sqrt(Hs); 5 for r <= 3.6, exp(5.75 - 1.15 r) for 3.6 < r < 5, 1 for r >= 5.
 * NaN for a missing Hs or Tp; 1 for Hs = 0 (r is infinite).
 */
export function dnvGamma(hsM: number, tpS: number): number {
  if (!(hsM >= 0) || !(tpS > 0)) return NaN;
  if (hsM === 0) return 1;
  const r = tpS / Math.sqrt(hsM);
  if (r <= 3.6) return 5;
  if (r >= 5) return 1;
  return Math.exp(5.75 - 1.15 * r);
}

const shapeCache = new Map<number, Float64Array>();

/** The unnormalised weighted shape w_j * s(x_j) for one gamma into `out`; returns its sum. */
function rawShape(gamma: number, out: Float64Array): number {
  if (!(gamma >= 1 && gamma <= 20)) throw new RangeError(`JONSWAP gamma ${gamma} must be between 1 and 20`);
  let sum = 0;
  const lnGamma = Math.log(gamma);
  for (let j = 0; j < GRID_POINTS; j++) {
    const x = GRID_X[j];
    const sigma = x <= 1 ? 0.07 : 0.09;
    const r = Math.exp(-((x - 1) ** 2) / (2 * sigma * sigma));
    const x4 = x * x * x * x;
    const pm = Math.pow(x, -5) * Math.exp(-1.25 / x4);
    const v = GRID_W[j] * pm * Math.exp(r * lnGamma);
    out[j] = v;
    sum += v;
  }
  return sum;
}

/**
 * Weighted JONSWAP shape on the grid for one gamma: entry j = w_j * s(x_j) with s the shape in x,
 * normalised so that the entries sum to 1/16. Then for a sea of Hs and omega_p,
 * S(omega_j) * d omega_j = Hs^2 * entry_j, and the entries' sum times Hs^2 is Hs^2/16 exactly.
 */
export function jonswapWeights(gamma: number): Float64Array {
  const hit = shapeCache.get(gamma);
  if (hit) return hit;
  const out = new Float64Array(GRID_POINTS);
  const sum = rawShape(gamma, out);
  for (let j = 0; j < GRID_POINTS; j++) out[j] /= 16 * sum;
  if (shapeCache.size > 4096) shapeCache.clear();
  shapeCache.set(gamma, out);
  return out;
}

const SCRATCH = new Float64Array(GRID_POINTS);

/**
 * The sum of the unnormalised weighted shape for one gamma (the divisor {@link jonswapWeights}
 * normalises by, over 16): sum_j w_j x_j^-5 exp(-1.25 x_j^-4) gamma^r_j. It is a sum of
 * exponentials in ln gamma, as is the unnormalised sum of weights times any positive function.
 */
export function jonswapShapeSum(gamma: number): number {
  return rawShape(gamma, SCRATCH);
}

/** S(omega) of one JONSWAP sea at the grid points, m^2 s/rad (for plots): Hs^2 * weights / (w_j * omega_p). */
export function jonswapDensity(hsM: number, tpS: number, gamma: number): { omega: Float64Array; density: Float64Array } {
  const wp = (2 * Math.PI) / tpS;
  const weights = jonswapWeights(gamma);
  const omega = new Float64Array(GRID_POINTS);
  const density = new Float64Array(GRID_POINTS);
  for (let j = 0; j < GRID_POINTS; j++) {
    omega[j] = wp * GRID_X[j];
    density[j] = (hsM * hsM * weights[j]) / (GRID_W[j] * wp);
  }
  return { omega, density };
}
