/**
 * Directional spreading D(theta) proportional to cos^n(theta - theta_p) for |theta - theta_p| < 90
 * deg, in bins of at most 5 deg, normalised so the weights (D * d theta) sum to 1; n = 2 for wind
 * sea and 8 for swell by default (DNV-RP-C205 gives 2-4 for wind sea and 6 or more for swell, from
 * memory); long-crested = one bin at the mean direction (docs/domain.md#vessel-response).
 */

/** Spreading of one partition: exponent n, or 'long-crested'. */
export type Spreading = number | 'long-crested';

export interface SpreadingBins {
  /** Offsets from the mean direction, deg. */
  offsetsDeg: Float64Array;
  /** D * d theta per bin, summing to 1. */
  weights: Float64Array;
}

/** Bin width, deg (at most 5, docs/domain.md#vessel-response). */
export const SPREADING_BIN_DEG = 5;

const cache = new Map<Spreading, SpreadingBins>();

/** The bins of a spreading (cached). */
export function spreadingBins(spreading: Spreading): SpreadingBins {
  const hit = cache.get(spreading);
  if (hit) return hit;
  let bins: SpreadingBins;
  if (spreading === 'long-crested') {
    bins = { offsetsDeg: Float64Array.of(0), weights: Float64Array.of(1) };
  } else {
    if (!(spreading > 0 && spreading <= 100)) throw new RangeError(`spreading exponent ${spreading} must be above 0 and at most 100`);
    // Bin centres at 0, +-5, ... +-85 deg: cos^n is zero at +-90.
    const half = Math.floor((90 - 1e-9) / SPREADING_BIN_DEG);
    const count = 2 * half + 1;
    const offsetsDeg = new Float64Array(count);
    const weights = new Float64Array(count);
    let sum = 0;
    for (let k = 0; k < count; k++) {
      const off = (k - half) * SPREADING_BIN_DEG;
      offsetsDeg[k] = off;
      const w = Math.pow(Math.cos((off * Math.PI) / 180), spreading);
      weights[k] = w;
      sum += w;
    }
    for (let k = 0; k < count; k++) weights[k] /= sum;
    bins = { offsetsDeg, weights };
  }
  cache.set(spreading, bins);
  return bins;
}
