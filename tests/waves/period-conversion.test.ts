import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  completePeriods,
  completePeriodSeries,
  jonswapShapeMoments,
  jonswapTeOverTp,
  jonswapTm01OverTp,
  jonswapTzOverTp,
  PERIOD_GIVEN,
  teOverTpForCompletion,
} from '../../shared/waves';
import { relClose } from './reference-dispersion';

// Gamma(5/4) = 0.9064024770554771 and sqrt(pi) (standard mathematical constants, e.g. Abramowitz
// & Stegun Table 6.1).
const GAMMA_5_4 = 0.9064024770554771;

describe('JONSWAP period ratios', () => {
  it('Pierson-Moskowitz (gamma = 1) matches the closed form: Te/Tp = 1.25^(-1/4) Gamma(5/4), Tz/Tp = (1.25^(-1/2)/sqrt(pi))^(1/2)', () => {
    // For S(x) = x^-5 exp(-1.25 x^-4): m_n = (1/4) 1.25^((n-4)/4) Gamma((4-n)/4) (substitution y = 1.25 x^-4).
    const teOverTp = Math.pow(1.25, -0.25) * GAMMA_5_4;
    const tzOverTp = Math.sqrt(Math.pow(1.25, -0.5) / Math.sqrt(Math.PI));
    const m = jonswapShapeMoments(1);
    expect(m.mMinus1 / m.m0).toBeRelClose(teOverTp, 1e-12);
    expect(m.m0).toBeRelClose(0.25 / 1.25, 1e-12); // m_0 = (1/4) 1.25^-1 Gamma(1)
    expect(Math.sqrt(m.m0 / m.m2)).toBeRelClose(tzOverTp, 1e-12);
    expect(jonswapTeOverTp(1)).toBeRelClose(teOverTp, 1e-9);
  });

  it('Te/Tp is about 0.857 for gamma = 1 and about 0.90 for gamma = 3.3 (docs/domain.md#sea-states, from memory)', () => {
    expect(Math.abs(jonswapTeOverTp(1) - 0.857)).toBeLessThan(0.0015);
    expect(Math.abs(jonswapTeOverTp(3.3) - 0.9)).toBeLessThan(0.005);
  });

  it('DNV-RP-C205 polynomials (from memory) agree with the integrated spectrum to 0.5 % for 1 <= gamma <= 7', () => {
    fc.assert(
      fc.property(fc.double({ min: 1, max: 7, noNaN: true }), (gamma) => {
        const m = jonswapShapeMoments(gamma);
        return relClose(jonswapTzOverTp(gamma), Math.sqrt(m.m0 / m.m2), 0.005) && relClose(jonswapTm01OverTp(gamma), m.m0 / m.m1, 0.005);
      }),
      { numRuns: 40 },
    );
  });

  it('the DNV-RP-C205 polynomials evaluate as written in docs/domain.md#sea-states (hand arithmetic at gamma = 3.3)', () => {
    // 0.6673 + 0.05037*3.3 - 0.006230*10.89 + 0.0003341*35.937 = 0.6673 + 0.166221 - 0.0678447 + 0.0120065
    expect(jonswapTzOverTp(3.3)).toBeCloseTo(0.7776828, 6);
    // 0.7303 + 0.04936*3.3 - 0.006556*10.89 + 0.0003610*35.937 = 0.7303 + 0.162888 - 0.0713948 + 0.0129733
    expect(jonswapTm01OverTp(3.3)).toBeCloseTo(0.8347665, 6);
    expect(jonswapTzOverTp()).toBe(jonswapTzOverTp(3.3));
  });

  it('ratios rise with gamma (a peakier spectrum has periods closer to Tp)', () => {
    let prev = [0, 0, 0];
    for (let gamma = 1; gamma <= 7; gamma += 0.5) {
      const now = [jonswapTzOverTp(gamma), jonswapTm01OverTp(gamma), jonswapTeOverTp(gamma)];
      now.forEach((v, i) => expect(v).toBeGreaterThan(prev[i]));
      expect(now[0]).toBeLessThan(now[1]); // Tz < Tm01 < Te < Tp
      expect(now[1]).toBeLessThan(now[2]);
      expect(now[2]).toBeLessThan(1);
      prev = now;
    }
  });

  it('throws RangeError for gamma outside [1, 7]', () => {
    expect(() => jonswapTzOverTp(0.5)).toThrow(RangeError);
    expect(() => jonswapTeOverTp(8)).toThrow(RangeError);
    expect(() => jonswapTm01OverTp(NaN)).toThrow(RangeError);
  });
});

describe('completePeriods (docs/domain.md#sea-states, #convention-8)', () => {
  const tzRatio = 0.6673 + 0.05037 * 3.3 - 0.00623 * 3.3 ** 2 + 0.0003341 * 3.3 ** 3;

  it('Tp given: Tz by the DNV ratio, Te = 0.90 Tp (docs/domain.md#convention-8), sources recorded', () => {
    const p = completePeriods({ tpS: 10 });
    expect(p.tpS).toBe(10);
    expect(p.tzS).toBeCloseTo(10 * tzRatio, 12);
    expect(p.teS).toBeCloseTo(9, 12);
    expect(p.sources).toEqual({ tp: 'given', tz: 'tp', te: 'tp' });
    expect(p.givenMask).toBe(PERIOD_GIVEN.TP);
  });

  it('Tp missing: derived from Tz first, else from Te; given periods are kept', () => {
    const fromTz = completePeriods({ tzS: 7, teS: 8.5 });
    expect(fromTz.tpS).toBeCloseTo(7 / tzRatio, 12);
    expect(fromTz.teS).toBe(8.5);
    expect(fromTz.sources).toEqual({ tp: 'tz', tz: 'given', te: 'given' });
    expect(fromTz.givenMask).toBe(PERIOD_GIVEN.TZ | PERIOD_GIVEN.TE);
    const fromTe = completePeriods({ teS: 9 });
    expect(fromTe.tpS).toBeCloseTo(10, 12);
    expect(fromTe.tzS).toBeCloseTo(10 * tzRatio, 12);
    expect(fromTe.sources).toEqual({ tp: 'te', tz: 'tp', te: 'given' });
  });

  it('other gamma: Te from the integrated ratio; gamma 1 gives 0.857 Tp', () => {
    const p = completePeriods({ tpS: 10 }, 1);
    expect(Math.abs(p.teS - 8.572)).toBeLessThan(0.001);
    expect(teOverTpForCompletion(3.3)).toBe(0.9);
  });

  it('nothing given: all NaN and missing; null, undefined and NaN all mean "not given"', () => {
    const p = completePeriods({ tpS: null, tzS: undefined, teS: NaN });
    expect([p.tpS, p.tzS, p.teS].every(Number.isNaN)).toBe(true);
    expect(p.sources).toEqual({ tp: 'missing', tz: 'missing', te: 'missing' });
    expect(p.givenMask).toBe(0);
  });

  it('throws RangeError for non-positive or infinite given periods', () => {
    expect(() => completePeriods({ tpS: 0 })).toThrow(RangeError);
    expect(() => completePeriods({ tzS: -3 })).toThrow(RangeError);
    expect(() => completePeriods({ teS: Infinity })).toThrow(RangeError);
    expect(() => completePeriods({ tpS: 10 }, 0)).toThrow(RangeError);
  });
});

describe('completePeriodSeries', () => {
  it('equals completePeriods record by record, returns new arrays and leaves the inputs alone', () => {
    const tp = Float64Array.from([10, NaN, NaN, 12, NaN, 0, 8]);
    const tz = Float64Array.from([NaN, 7, NaN, 9, NaN, NaN, -1]);
    const te = Float64Array.from([NaN, NaN, 9, 11, NaN, NaN, Infinity]);
    const copies = [tp.slice(), tz.slice(), te.slice()];
    const out = completePeriodSeries(tp, tz, te, 3.3);
    expect([tp, tz, te]).toEqual(copies);
    expect(out.tpS).not.toBe(tp);
    expect(Array.from(out.givenMask)).toEqual([1, 2, 4, 7, 0, 0, 1]);
    for (let i = 0; i < tp.length; i++) {
      const valid = (v: number) => (v > 0 && v < Infinity ? v : undefined);
      const one = completePeriods({ tpS: valid(tp[i]), tzS: valid(tz[i]), teS: valid(te[i]) });
      expect([out.tpS[i], out.tzS[i], out.teS[i]]).toEqual([one.tpS, one.tzS, one.teS]);
      expect(out.givenMask[i]).toBe(one.givenMask);
    }
  });

  it('accepts null for absent Tz/Te columns and checks lengths', () => {
    const out = completePeriodSeries(Float64Array.from([10, 5]), null, null);
    expect(Array.from(out.teS)).toEqual([9, 4.5]);
    expect(Array.from(out.givenMask)).toEqual([1, 1]);
    expect(() => completePeriodSeries(new Float64Array(3), new Float64Array(2), null)).toThrow(RangeError);
  });
});
