/**
 * Seeded, stateless pseudo-random numbers for the invented sea states.
 *
 * Everything here is a pure function of its integer arguments, so a value at a given time never
 * depends on which window a caller asked for: the synthetic hindcast and the fake forecasts of
 * overlapping periods agree. The mixing function is the 32-bit finaliser of MurmurHash3
 * (Austin Appleby, public domain), applied three times to (seed, channel, index).
 */

/** MurmurHash3 fmix32: avalanche of a 32-bit integer. Result: unsigned 32-bit integer. */
export function mix32(value: number): number {
  let h = value | 0;
  h ^= h >>> 16;
  h = Math.imul(h, 0x85ebca6b);
  h ^= h >>> 13;
  h = Math.imul(h, 0xc2b2ae35);
  h ^= h >>> 16;
  return h >>> 0;
}

/**
 * Uniform number in [0, 1) from (seed, channel, index).
 * @param seed any integer (taken modulo 2^32)
 * @param channel small integer naming the quantity drawn (so two quantities never share draws)
 * @param index integer position (storm number, lattice node...), negative allowed, |index| < 2^31
 */
export function hash01(seed: number, channel: number, index: number): number {
  let h = mix32((seed | 0) ^ 0x9e3779b9);
  h = mix32(h ^ Math.imul(channel + 1, 0x27d4eb2d));
  h = mix32(h ^ (index | 0));
  return h / 4294967296;
}

/** Reduces any finite number (a seed given as a large or fractional number) to a 32-bit integer. */
export function seed32(seed: number): number {
  if (!Number.isFinite(seed)) throw new RangeError(`seed must be a finite number, got ${seed}`);
  const t = Math.trunc(seed);
  // Fold the high part in, so seeds that differ above 2^32 still differ.
  const hi = Math.floor(t / 4294967296);
  return mix32((t >>> 0) ^ mix32(hi | 0));
}

/**
 * Standard normal deviate from two uniforms (Box-Muller). u1 in [0, 1) is moved off 0.
 * Result: dimensionless, mean 0, standard deviation 1.
 */
export function normalFromUniforms(u1: number, u2: number): number {
  const u = Math.max(u1, 1e-12);
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * u2);
}

/**
 * Smooth value noise in [-1, 1]: seeded random values at the nodes of a lattice of spacing
 * `periodH` hours, joined by smoothstep interpolation (continuous, with a continuous slope at
 * the nodes being zero). Pure in (seed, channel, timeH, periodH).
 * @param timeH time in hours since 1970-01-01T00:00Z (any real number)
 * @param periodH lattice spacing in hours, > 0
 */
export function smoothNoise(seed: number, channel: number, timeH: number, periodH: number): number {
  const x = timeH / periodH;
  const i = Math.floor(x);
  const f = x - i;
  const a = 2 * hash01(seed, channel, i) - 1;
  const b = 2 * hash01(seed, channel, i + 1) - 1;
  return a + (b - a) * f * f * (3 - 2 * f);
}
