import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { dispersionResidual, fentonMcKeeWaveNumber, relativeDepthFromDeepWater, waveNumber } from '../../shared/waves';
import { bisectKd, refK, relClose } from './reference-dispersion';

const G = 9.81;

/** Relative residual of omega^2 = g k tanh(kd), written out here independently of the product. */
function residual(k: number, periodS: number, depthM: number): number {
  const omega = (2 * Math.PI) / periodS;
  const tanhKd = depthM === Infinity ? 1 : Math.tanh(k * depthM);
  return Math.abs(G * k * tanhKd - omega * omega) / (omega * omega);
}

const logUniform = (min: number, max: number) =>
  fc.double({ min: Math.log(min), max: Math.log(max), noNaN: true }).map((x) => Math.min(max, Math.max(min, Math.exp(x))));

describe('waveNumber: dispersion relation omega^2 = g k tanh(kd) (docs/domain.md#dispersion requirement)', () => {
  it('meets a relative residual below 1e-12 on a 200 x 200 log grid, 0.5-30 s and 0.05-6000 m, with no NaN or Infinity', () => {
    let worst = 0;
    for (let i = 0; i < 200; i++) {
      const periodS = 0.5 * Math.pow(30 / 0.5, i / 199);
      for (let j = 0; j < 200; j++) {
        const depthM = 0.05 * Math.pow(6000 / 0.05, j / 199);
        const k = waveNumber(periodS, depthM);
        expect(Number.isFinite(k) && k > 0).toBe(true);
        worst = Math.max(worst, residual(k, periodS, depthM));
      }
    }
    expect(worst).toBeLessThan(1e-12);
  });

  it('meets the residual requirement for random periods and depths (fast-check sweep)', () => {
    fc.assert(
      fc.property(logUniform(0.5, 30), logUniform(0.05, 6000), (periodS, depthM) => {
        const k = waveNumber(periodS, depthM);
        return Number.isFinite(k) && k > 0 && residual(k, periodS, depthM) < 1e-12;
      }),
      { numRuns: 5000 },
    );
  });

  it('agrees with an independent bisection solution to 1e-12 (common practice, no source)', () => {
    fc.assert(
      fc.property(logUniform(0.5, 30), logUniform(0.05, 6000), (periodS, depthM) =>
        relClose(waveNumber(periodS, depthM), refK(periodS, depthM), 1e-12),
      ),
      { numRuns: 2000 },
    );
  });

  it('exports a residual helper that agrees with the written-out residual', () => {
    const k = waveNumber(8, 20);
    expect(Math.abs(dispersionResidual(k, 8, 20))).toBeLessThan(1e-15);
    // A wavenumber 1 % too large gives a positive residual of about 1 % or more.
    expect(dispersionResidual(1.01 * k, 8, 20)).toBeGreaterThan(0.01);
    expect(dispersionResidual(k, 8, 20)).toBeCloseTo(0, 14);
  });

  it('uses the deep-water form k = omega^2/g exactly for depth Infinity and for large k0*d (docs/domain.md#convention-1)', () => {
    const omega = (2 * Math.PI) / 10;
    expect(waveNumber(10, Infinity)).toBe((omega * omega) / G);
    // k0*d = 0.04024*6000 = 241: tanh is 1 to double precision.
    expect(waveNumber(10, 6000)).toBe((omega * omega) / G);
    // 0.5 s waves in 6000 m: k*d ~ 1e5, where sinh/cosh would overflow; still finite.
    expect(Number.isFinite(waveNumber(0.5, 6000))).toBe(true);
  });

  it('decreases with depth at a fixed period and with period at a fixed depth (monotonic sanity)', () => {
    fc.assert(
      fc.property(logUniform(0.5, 30), logUniform(0.05, 3000), (periodS, depthM) => {
        const k1 = waveNumber(periodS, depthM);
        return waveNumber(periodS, depthM * 1.5) <= k1 && waveNumber(periodS * 1.1, depthM) < k1;
      }),
    );
  });

  it('throws RangeError on non-positive or NaN inputs', () => {
    expect(() => waveNumber(0, 10)).toThrow(RangeError);
    expect(() => waveNumber(-1, 10)).toThrow(RangeError);
    expect(() => waveNumber(NaN, 10)).toThrow(RangeError);
    expect(() => waveNumber(Infinity, 10)).toThrow(RangeError);
    expect(() => waveNumber(10, 0)).toThrow(RangeError);
    expect(() => waveNumber(10, -5)).toThrow(RangeError);
    expect(() => waveNumber(10, NaN)).toThrow(RangeError);
    expect(() => waveNumber(10, 10, 0)).toThrow(RangeError);
    expect(() => waveNumber(10, 10, NaN)).toThrow(RangeError);
    expect(() => fentonMcKeeWaveNumber(10, NaN)).toThrow(RangeError);
    expect(() => relativeDepthFromDeepWater(0)).toThrow(RangeError);
  });

  it('solves the dimensionless relation x tanh x = k0d down to very small and up to very large k0d', () => {
    for (const k0d of [1e-12, 1e-6, 1e-3, 0.1, 1, 5, 19.999, 20, 1e3, 1e12]) {
      const x = relativeDepthFromDeepWater(k0d);
      expect(Math.abs(x * Math.tanh(x) - k0d) / k0d).toBeLessThan(1e-12);
      expect(x).toBeRelClose(bisectKd(k0d), 1e-12);
    }
    expect(relativeDepthFromDeepWater(Infinity)).toBe(Infinity);
  });
});

describe('fentonMcKeeWaveNumber: explicit approximation, Fenton & McKee (1990), Coastal Engineering 14:499-513', () => {
  it('is within its published accuracy of the exact wavelength across the range: 1.7 % (from memory; commonly quoted as 1.7 %)', () => {
    let worst = 0;
    for (let i = 0; i < 300; i++) {
      const periodS = 0.5 * Math.pow(60, i / 299);
      for (let j = 0; j < 300; j++) {
        const depthM = 0.05 * Math.pow(6000 / 0.05, j / 299);
        const lApprox = (2 * Math.PI) / fentonMcKeeWaveNumber(periodS, depthM);
        const lExact = (2 * Math.PI) / refK(periodS, depthM);
        worst = Math.max(worst, Math.abs(lApprox / lExact - 1));
      }
    }
    expect(worst).toBeLessThan(0.017);
    // The error is real (this is an approximation, not the exact solution): above 1 % somewhere.
    expect(worst).toBeGreaterThan(0.01);
  });

  it('is exact in the deep- and shallow-water limits (Fenton & McKee 1990, by construction)', () => {
    const omega = (2 * Math.PI) / 10;
    expect(fentonMcKeeWaveNumber(10, Infinity)).toBe((omega * omega) / G);
    expect(fentonMcKeeWaveNumber(10, 5000)).toBeRelClose(refK(10, 5000), 1e-12);
    // Shallow: k -> omega/sqrt(g d).
    expect(fentonMcKeeWaveNumber(30, 0.05)).toBeRelClose(omega / 3 / Math.sqrt(G * 0.05), 1e-3);
  });
});
