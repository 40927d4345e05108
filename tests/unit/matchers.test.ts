// The toBeRelClose matcher (tests/support/matchers.ts): passes inside the tolerance, fails outside
// it with a message naming both values and the tolerance. Values are hand-picked here.
import { describe, expect, it } from 'vitest';

describe('toBeRelClose', () => {
  it('passes within the relative tolerance, edge included', () => {
    expect(1.0005).toBeRelClose(1, 1e-3);
    expect(1.001).toBeRelClose(1, 1e-3);
    expect(-2).toBeRelClose(-2, 0);
  });

  it('fails outside it, naming both values and the tolerance', () => {
    let message = '';
    try {
      expect(1.01).toBeRelClose(1, 1e-3);
    } catch (err) {
      message = (err as Error).message;
    }
    expect(message).toContain('1.01');
    expect(message).toContain('within a relative 0.001 of 1');
    expect(message).toContain('relative error 1.000e-2');
  });

  it('refuses a value that is not a number', () => {
    expect(() => expect('1').toBeRelClose(1, 1e-3)).toThrow(/needs a number/);
  });

  it('works negated', () => {
    expect(1.1).not.toBeRelClose(1, 1e-3);
  });
});
