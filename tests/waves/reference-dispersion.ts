/**
 * Independent reference for the tests: the linear dispersion relation solved by plain bisection
 * (a different algorithm from the product's Newton solver), and the celerities from it with the
 * textbook formulas written out again here. Used as the oracle in property-based sweeps.
 */

/** Root x of x*tanh(x) = k0d by bisection to the last bit (common practice, no source). */
export function bisectKd(k0d: number): number {
  // x*tanh(x) is increasing; x*tanh(x) >= k0d at x = max(sqrt(k0d), k0d) + 1.
  let lo = 0;
  let hi = Math.max(Math.sqrt(k0d), k0d) + 1;
  for (let i = 0; i < 2000; i++) {
    const mid = 0.5 * (lo + hi);
    if (mid === lo || mid === hi) break;
    if (mid * Math.tanh(mid) < k0d) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
}

/** Reference wavenumber, rad/m (depth Infinity: omega^2/g). */
export function refK(periodS: number, depthM: number, g = 9.81): number {
  const omega = (2 * Math.PI) / periodS;
  const k0 = (omega * omega) / g;
  if (depthM === Infinity) return k0;
  return bisectKd(k0 * depthM) / depthM;
}

/** Reference phase celerity C = omega/k, m/s. */
export function refC(periodS: number, depthM: number, g = 9.81): number {
  return (2 * Math.PI) / periodS / refK(periodS, depthM, g);
}

/** Reference group celerity Cg = C*(1 + 2kd/sinh(2kd))/2, m/s (deep: C/2). */
export function refCg(periodS: number, depthM: number, g = 9.81): number {
  const k = refK(periodS, depthM, g);
  const c = (2 * Math.PI) / periodS / k;
  if (depthM === Infinity) return c / 2;
  const kd = k * depthM;
  const n = kd > 300 ? 0.5 : 0.5 * (1 + (2 * kd) / Math.sinh(2 * kd));
  return n * c;
}

/** |a - b| <= rel*|b|, with a message naming both. */
export function relClose(actual: number, expected: number, rel: number): boolean {
  return Math.abs(actual - expected) <= rel * Math.abs(expected);
}

/**
 * True when `actual` rounds to `expected` at `sig` significant figures, i.e. lies within half a
 * unit of the last printed figure of `expected` (plus 1e-12 relative for rounding noise).
 */
export function matchesSigFigs(actual: number, expected: number, sig: number): boolean {
  const exponent = Math.floor(Math.log10(Math.abs(expected)));
  const halfUnit = 0.5 * Math.pow(10, exponent - sig + 1);
  return Math.abs(actual - expected) <= halfUnit * (1 + 1e-9);
}
