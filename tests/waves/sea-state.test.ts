import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  bedVelocityLinear,
  bedVelocityRmsSoulsby,
  bedVelocitySoulsby,
  regularWave,
  seaState,
  seaStateEnergy,
  seaStatePower,
} from '../../shared/waves';
import { refCg, refK } from './reference-dispersion';

const G = 9.81;
const RHO = 1025;

describe('sea-state energy and power (docs/domain.md#sea-states)', () => {
  it('E = rho g Hs^2 / 16', () => {
    expect(seaStateEnergy(2)).toBeCloseTo((RHO * G * 4) / 16, 9);
    expect(seaStateEnergy(2, { rhoKgM3: 1000, g: 9.8 })).toBeCloseTo((1000 * 9.8 * 4) / 16, 9);
    expect(seaStateEnergy(0)).toBe(0);
  });

  it('P = rho g Hs^2 Cg(Te, d) / 16 at any depth (bisection oracle for Cg)', () => {
    for (const [hs, te, d] of [
      [1.5, 7, 12],
      [3, 11, 40],
      [0.8, 5, 2],
    ]) {
      expect(seaStatePower(hs, te, d)).toBeRelClose((RHO * G * hs * hs * refCg(te, d)) / 16, 1e-11);
    }
  });

  it('deep water: P = rho g^2 Hs^2 Te / (64 pi), about 0.49 Hs^2 Te kW/m (common practice, no source)', () => {
    for (const [hs, te] of [
      [1, 10],
      [2.5, 8],
      [6, 13.5],
    ]) {
      const p = seaStatePower(hs, te, Infinity);
      expect(p).toBeRelClose((RHO * G * G * hs * hs * te) / (64 * Math.PI), 1e-13);
      expect(p / 1000).toBeRelClose(0.49 * hs * hs * te, 0.005);
    }
  });

  it('throws RangeError for negative Hs, bad periods, bad depth', () => {
    expect(() => seaStateEnergy(-1)).toThrow(RangeError);
    expect(() => seaStateEnergy(NaN)).toThrow(RangeError);
    expect(() => seaStatePower(1, 0, 10)).toThrow(RangeError);
    expect(() => seaStatePower(1, 8, 0)).toThrow(RangeError);
    expect(() => seaStatePower(1, 8, NaN)).toThrow(RangeError);
  });
});

describe('bedVelocityLinear: u_bs = pi Hs / (Tp sinh(k_p d)) (docs/domain.md#bed-velocity method 1, common practice)', () => {
  it('equals the written-out formula and the regular-wave bed velocity with H = Hs', () => {
    const k = refK(10, 10);
    expect(bedVelocityLinear(2, 10, 10)).toBeRelClose((Math.PI * 2) / (10 * Math.sinh(k * 10)), 1e-12);
    expect(bedVelocityLinear(2, 10, 10)).toBe(regularWave({ heightM: 2, periodS: 10, depthM: 10 }).bedVelocityMps);
  });

  it('-> 0 in deep water, -> (Hs/2) sqrt(g/d) in shallow water', () => {
    expect(bedVelocityLinear(3, 6, 300)).toBeLessThan(1e-12);
    expect(bedVelocityLinear(3, 6, Infinity)).toBe(0);
    expect(bedVelocityLinear(0.3, 25, 0.5)).toBeRelClose(0.15 * Math.sqrt(G / 0.5), 0.002);
  });
});

describe('bedVelocitySoulsby: Soulsby (2006), HR Wallingford TR 155 (formula in docs/domain.md#bed-velocity, from memory)', () => {
  it('Hs = 2 m, Tz = 6 s, d = 10 m: U_s = 0.4914 m/s (computed by hand below)', () => {
    // By hand (g = 9.81):
    // Tn = sqrt(10/9.81) = sqrt(1.019368) = 1.009638 s;  t = Tn/Tz = 1.009638/6 = 0.168273
    // 0.56 + 15.54 t = 0.56 + 2.614963 = 3.174963;  3.174963^2 = 10.080390;  ^6 = 10.080390^3 = 1024.31
    // A = (6500 + 1024.31)^(1/6) = 7524.31^(1/6) = exp(ln(7524.31)/6) = exp(8.92589/6) = 4.4267
    // A t^2 = 4.4267 * 0.0283158 = 0.125345;  (1.125345)^3 = 1.42514
    // U_rms = (2/(4*1.009638)) / 1.42514 = 0.495227/1.42514 = 0.347494 m/s
    // U_s = 2 * U_rms = 0.69499 m/s (significant = twice the standard deviation, as Hs = 4 sqrt(m0))
    expect(Math.abs(bedVelocityRmsSoulsby(2, 6, 10) - 0.347494)).toBeLessThan(5e-5);
    expect(Math.abs(bedVelocitySoulsby(2, 6, 10) - 0.69499)).toBeLessThan(1e-4);
  });

  it('Hs 1 m, Tp 10 s, d 10 m: U_s about 0.40 m/s (Tz = 0.7777 Tp, DNV-RP-C205 ratio at gamma 3.3, from memory)', () => {
    // By hand: Tz = 7.777 s, t = 1.009638/7.777 = 0.12982; (0.56 + 2.01743)^6 = 2.57743^6 = 293.6
    // A = 6793.6^(1/6) = 4.3528; A t^2 = 0.073362; 1.073362^3 = 1.23661
    // U_rms = (1/(4*1.009638))/1.23661 = 0.20025 m/s; U_s = 0.4005 m/s
    expect(Math.abs(bedVelocitySoulsby(1, 7.777, 10) - 0.4005)).toBeLessThan(5e-4);
    expect(Math.abs(seaState({ hsM: 1, tpS: 10, depthM: 10 }).bedVelocitySoulsbyMps - 0.4005)).toBeLessThan(1e-3);
  });

  it('shallow-water limit: U_s -> (1/2) Hs sqrt(g/d), the same as linear theory ((Hs/2) sqrt(g/d))', () => {
    const hs = 0.2;
    const d = 0.1;
    const us = bedVelocitySoulsby(hs, 12, d);
    expect(us).toBeRelClose(0.5 * hs * Math.sqrt(G / d), 0.003);
    const ratio = us / bedVelocityLinear(hs, 12 / 0.7777, d);
    expect(ratio).toBeGreaterThan(0.9);
    expect(ratio).toBeLessThan(1.1);
  });

  it('deep water: -> 0 (and exactly 0 for depth Infinity)', () => {
    expect(bedVelocitySoulsby(2, 6, 500)).toBeLessThan(1e-3);
    expect(bedVelocitySoulsby(2, 6, 5000)).toBeLessThan(1e-7);
    expect(bedVelocitySoulsby(2, 6, Infinity)).toBe(0);
  });

  it('is finite, non-negative, proportional to Hs and falls with depth (fast-check)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.01, max: 15, noNaN: true }),
        fc.double({ min: 1, max: 25, noNaN: true }),
        fc.double({ min: Math.log(0.05), max: Math.log(6000), noNaN: true }).map(Math.exp),
        (hs, tz, d) => {
          const u = bedVelocitySoulsby(hs, tz, d);
          return (
            Number.isFinite(u) &&
            u >= 0 &&
            Math.abs(bedVelocitySoulsby(2 * hs, tz, d) - 2 * u) <= 1e-12 * u &&
            bedVelocitySoulsby(hs, tz, d * 1.3) <= u
          );
        },
      ),
      { numRuns: 2000 },
    );
  });

  it('throws RangeError for bad inputs', () => {
    expect(() => bedVelocitySoulsby(-1, 6, 10)).toThrow(RangeError);
    expect(() => bedVelocitySoulsby(1, 0, 10)).toThrow(RangeError);
    expect(() => bedVelocitySoulsby(1, 6, -2)).toThrow(RangeError);
  });
});

describe('Soulsby (2006) against a numerical integration of a JONSWAP spectrum through linear theory', () => {
  // Independent check (the method, not the product's code): a JONSWAP spectrum with gamma 3.3
  // (Hasselmann et al. 1973; sigma 0.07 below the peak, 0.09 above; common practice, no source for
  // the constants beyond that paper), scaled so that its m0 = Hs^2/16, is passed through the linear
  // transfer function of the near-bed velocity, |u_b/eta| = omega/sinh(k d) (k from the dispersion
  // relation, solved here by bisection). The velocity variance is the integral of
  // S(f) (omega/sinh(kd))^2 over f; its square root is U_rms and 2 sqrt(integral) the significant
  // value U_s. Tz of the same spectrum is sqrt(m0/m2). Soulsby (2006), HR Wallingford TR 155, fitted
  // his formula to this kind of integration; it agrees within about 3 % for t = Tn/Tz < 0.4 (from
  // memory of that report).
  const GAMMA = 3.3;
  function jonswapShape(f: number, fp: number): number {
    const sigma = f <= fp ? 0.07 : 0.09;
    const r = Math.exp(-((f - fp) ** 2) / (2 * sigma * sigma * fp * fp));
    return f ** -5 * Math.exp(-1.25 * (fp / f) ** 4) * GAMMA ** r;
  }
  /** Simpson's rule over [a, b] with an even number of intervals. */
  function simpson(fn: (x: number) => number, a: number, b: number, intervals: number): number {
    const h = (b - a) / intervals;
    let sum = fn(a) + fn(b);
    for (let i = 1; i < intervals; i++) sum += (i % 2 === 1 ? 4 : 2) * fn(a + i * h);
    return (sum * h) / 3;
  }
  function integrated(hs: number, tp: number, d: number): { uS: number; uRms: number; tz: number } {
    const fp = 1 / tp;
    const lo = 0.2 * fp;
    const hi = 12 * fp;
    const N = 20_000;
    const m0Shape = simpson((f) => jonswapShape(f, fp), lo, hi, N);
    const scale = (hs * hs) / 16 / m0Shape;
    const m2 = simpson((f) => scale * f * f * jonswapShape(f, fp), lo, hi, N);
    const velocityVariance = simpson(
      (f) => {
        const omega = 2 * Math.PI * f;
        const k = refK(1 / f, d);
        const transfer = omega / Math.sinh(k * d);
        return scale * jonswapShape(f, fp) * transfer * transfer;
      },
      lo,
      hi,
      N,
    );
    const uRms = Math.sqrt(velocityVariance);
    return { uS: 2 * uRms, uRms, tz: Math.sqrt((hs * hs) / 16 / m2) };
  }

  it('2 sqrt(integral) agrees with U_s = 2 U_rms within 3 % for t = Tn/Tz < 0.4 over depths and periods', () => {
    let checked = 0;
    for (const d of [1, 2, 5, 10, 20, 40]) {
      for (const tp of [4, 6, 8, 10, 12, 14, 16]) {
        const ref = integrated(1.5, tp, d);
        const t = Math.sqrt(d / G) / ref.tz;
        if (t >= 0.4) continue;
        checked++;
        const us = bedVelocitySoulsby(1.5, ref.tz, d);
        expect(Math.abs(us - ref.uS) / ref.uS, `d ${d} m, Tp ${tp} s, t ${t.toFixed(3)}`).toBeLessThan(0.03);
        expect(Math.abs(bedVelocityRmsSoulsby(1.5, ref.tz, d) - ref.uRms) / ref.uRms).toBeLessThan(0.03);
      }
    }
    expect(checked).toBeGreaterThan(25);
  });

  it('the amplitude of the rms wave (1.414 times U_rms, used before) misses the integration by about 30 %', () => {
    const ref = integrated(1, 10, 10);
    const old = 1.41421356 * bedVelocityRmsSoulsby(1, ref.tz, 10);
    expect((ref.uS - old) / ref.uS).toBeGreaterThan(0.25);
  });
});

describe('seaState bundle', () => {
  it('completes the periods and computes energy, power at Te and both bed velocities', () => {
    const s = seaState({ hsM: 2, tpS: 10, depthM: 20 });
    expect(s.periods.sources).toEqual({ tp: 'given', tz: 'tp', te: 'tp' });
    expect(s.periods.teS).toBeCloseTo(9, 12);
    expect(s.energyJPerM2).toBeCloseTo((RHO * G * 4) / 16, 9);
    expect(s.powerWPerM).toBeRelClose((RHO * G * 4 * refCg(9, 20)) / 16, 1e-11);
    expect(s.bedVelocityLinearMps).toBe(bedVelocityLinear(2, 10, 20));
    expect(s.bedVelocitySoulsbyMps).toBe(bedVelocitySoulsby(2, s.periods.tzS, 20));
    expect(s.bedVelocityRmsSoulsbyMps).toBe(bedVelocityRmsSoulsby(2, s.periods.tzS, 20));
    expect(s.bedVelocitySoulsbyMps).toBe(2 * s.bedVelocityRmsSoulsbyMps);
    expect(s.peakWavelengthM).toBeRelClose((2 * Math.PI) / refK(10, 20), 1e-12);
  });

  it('uses given Tz and Te as they are', () => {
    const s = seaState({ hsM: 1, tpS: 8, tzS: 6, teS: 7.5, depthM: 15, gamma: 2 });
    expect(s.bedVelocitySoulsbyMps).toBe(bedVelocitySoulsby(1, 6, 15));
    expect(s.powerWPerM).toBe(seaStatePower(1, 7.5, 15));
    expect(s.periods.gamma).toBe(2);
  });

  it('throws RangeError when no period is given', () => {
    expect(() => seaState({ hsM: 1, depthM: 10 })).toThrow(RangeError);
  });
});
