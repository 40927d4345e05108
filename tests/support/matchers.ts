// Custom Vitest matchers, registered for every test file (vitest.config.ts `setupFiles`).
import { expect } from 'vitest';

interface RelCloseMatchers<R = unknown> {
  /** |actual - expected| <= rel * |expected|; the failure message names both values, the tolerance and the relative error. */
  toBeRelClose(expected: number, rel: number): R;
}

declare module 'vitest' {
  // eslint-disable-next-line @typescript-eslint/no-empty-object-type, @typescript-eslint/no-explicit-any
  interface Assertion<T = any> extends RelCloseMatchers<T> {}
  // eslint-disable-next-line @typescript-eslint/no-empty-object-type
  interface AsymmetricMatchersContaining extends RelCloseMatchers {}
}

expect.extend({
  toBeRelClose(actual: unknown, expected: number, rel: number) {
    if (typeof actual !== 'number' || !Number.isFinite(expected) || !(rel >= 0)) {
      return {
        pass: false,
        message: () =>
          `toBeRelClose needs a number, a finite expected value and a tolerance >= 0; got actual ${String(actual)}, expected ${expected}, tolerance ${rel}`,
      };
    }
    const error = Math.abs(actual - expected);
    const pass = error <= rel * Math.abs(expected);
    const relative = expected === 0 ? (error === 0 ? 0 : Infinity) : error / Math.abs(expected);
    return {
      pass,
      message: () =>
        `expected ${actual} ${pass ? 'not ' : ''}to be within a relative ${rel} of ${expected} (relative error ${relative.toExponential(3)}, absolute ${error.toExponential(3)})`,
    };
  },
});
