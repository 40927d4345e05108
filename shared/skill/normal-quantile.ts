import jstat from 'jstat';

/**
 * The p-quantile of the standard normal distribution (jstat's `normal.inv`, a general-purpose
 * statistics library): z such that P(Z <= z) = p.
 *
 * @param p probability, strictly between 0 and 1
 * @throws RangeError for p outside (0, 1)
 * @example standardNormalQuantile(1 - 1e-4) // 3.719
 */
export function standardNormalQuantile(p: number): number {
  if (!(p > 0 && p < 1)) throw new RangeError(`probability ${p} must be strictly between 0 and 1`);
  return jstat.normal.inv(p, 0, 1);
}
