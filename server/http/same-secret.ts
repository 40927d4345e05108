import crypto from 'node:crypto';

/**
 * Compares a secret a caller sent with the expected one in constant time. The byte lengths are
 * compared first: `timingSafeEqual` throws on buffers of different lengths, and a string's length
 * in characters is not its length in bytes (a 32-character token of non-ASCII letters is longer
 * than 32 bytes), which turned such a token into a 500 that revealed the expected length.
 */
export function sameSecret(given: unknown, expected: string | undefined): boolean {
  if (!expected || typeof given !== 'string') return false;
  const a = Buffer.from(given, 'utf8');
  const b = Buffer.from(expected, 'utf8');
  return a.byteLength === b.byteLength && crypto.timingSafeEqual(a, b);
}
