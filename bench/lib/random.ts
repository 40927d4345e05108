/**
 * Seeded numbers for the benchmarks and the tests that build synthetic inputs: every run builds
 * the same series, so a figure or a failing case can be reproduced.
 */

/**
 * Mulberry32, a small deterministic pseudo-random generator (Tommy Ettinger's public-domain
 * 32-bit generator), uniform in [0, 1).
 *
 * @param seed - any number; its low 32 bits seed the generator.
 * @returns a function giving the next number of the sequence.
 */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/**
 * The median of timed runs (the mean of the two middle values for an even count).
 *
 * @param xs - the values (not changed).
 * @returns their median; NaN for none.
 */
export function median(xs: readonly number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const mid = s.length >> 1;
  return s.length % 2 ? s[mid] : (s[mid - 1] + s[mid]) / 2;
}
