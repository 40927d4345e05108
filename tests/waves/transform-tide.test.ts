/**
 * The worksite transformation with a depth that moves with the tide (docs/domain.md#tide):
 * h(t) = chart depth + water level replaces the fixed depth in every step.
 */
import { describe, expect, it } from 'vitest';
import { TRANSFORM_FLAG, transformOne, transformToSite } from '../../shared/waves';

// M2 period 12.4206 h (speed 28.9841042 deg/h, Schureman 1958).
const M2_PERIOD_H = 360 / 28.9841042;

/** An offshore sea of constant Hs and Tp brought to a site of this chart depth, one record per water level. */
function transformWithTide(level: Float64Array, hsM: number, tpS: number, depthM: number) {
  const n = level.length;
  return transformToSite(
    {
      hsM: new Float64Array(n).fill(hsM),
      tpS: new Float64Array(n).fill(tpS),
      tzS: new Float64Array(n).fill(NaN),
      dirDeg: new Float64Array(n).fill(NaN),
      waterLevelM: level,
    },
    { depthM: Infinity },
    { depthM, shoreNormalDeg: null, breakerIndex: 0.6 },
  );
}

/** One hour at a site of this chart depth (breaker index 0.6). */
function transformHour(hour: Parameters<typeof transformOne>[0], depthM: number) {
  return transformOne(hour, { depthM: Infinity }, { depthM, shoreNormalDeg: null, breakerIndex: 0.6 });
}

describe('depth that moves with the tide', () => {
  it('caps Hs at gamma_b*h(t): a 2 m site with a 1.5 m M2 swings between 0.6*0.5 and 0.6*3.5 m under a large sea', () => {
    // Worked by hand: h = 2 + 1.5 cos(2 pi t / T_M2); at high water h = 3.5 m, cap 0.6*3.5 = 2.1 m; at low
    // water h = 0.5 m, cap 0.6*0.5 = 0.3 m (breaker index 0.6 for Hs, common practice, no source).
    // An offshore Hs of 6 m at Tp 10 s shoals to well above either cap.
    const n = 26;
    const times = Array.from({ length: n }, (_, k) => (k * M2_PERIOD_H) / 24);
    const level = Float64Array.from(times, (t) => 1.5 * Math.cos((2 * Math.PI * t) / M2_PERIOD_H));
    const out = transformWithTide(level, 6, 10, 2);
    expect(out.hsM[0]).toBeCloseTo(2.1, 12); // high water, t = 0
    expect(out.hsM[12]).toBeCloseTo(0.3, 12); // low water, t = T/2
    expect(out.hsM[24]).toBeCloseTo(2.1, 12); // high water again, t = T
    for (let k = 0; k < n; k++) {
      expect(out.hsM[k]).toBeCloseTo(0.6 * (2 + level[k]), 12);
      expect(out.flags[k] & TRANSFORM_FLAG.DEPTH_LIMITED).toBe(TRANSFORM_FLAG.DEPTH_LIMITED);
      expect(out.depthM![k]).toBeCloseTo(2 + level[k], 12);
    }
  });

  it('solves dispersion at h(t): the shoaled Hs and the bed velocity follow the depth of each record', () => {
    // Shallow water (common practice, no source): Cg -> sqrt(g h), so Ks = sqrt(Cg0/Cg) grows as h falls,
    // and the linear bed velocity pi Hs/(T sinh(k h)) grows too. A small offshore sea, no cap.
    const level = Float64Array.of(1.5, 0, -1.5);
    const out = transformWithTide(level, 0.2, 8, 4);
    expect(out.ks[0]).toBeLessThan(out.ks[1]);
    expect(out.ks[1]).toBeLessThan(out.ks[2]);
    expect(out.bedVelocityLinearMps[0]).toBeLessThan(out.bedVelocityLinearMps[2]);
    // The middle record is the chart depth exactly: the same figures as the fixed-depth path.
    const fixed = transformToSite(
      { hsM: Float64Array.of(0.2), tpS: Float64Array.of(8), tzS: Float64Array.of(NaN), dirDeg: Float64Array.of(NaN) },
      { depthM: Infinity },
      { depthM: 4, shoreNormalDeg: null, breakerIndex: 0.6 },
    );
    expect(out.hsM[1]).toBeCloseTo(fixed.hsM[0], 6);
    // By hand at h = 2.5 m, T = 8 s (linear theory, docs/domain.md#dispersion): omega^2 h/g = 0.1572, so
    // kh tanh(kh) = 0.1572 gives kh = 0.407 (fixed-point steps on a calculator); C = omega h/kh = 4.82 m/s,
    // n = (1 + 2kh/sinh(2kh))/2 = 0.949, Cg = 4.575 m/s; Cg0 = g T/(4 pi) = 6.245 m/s; Ks = sqrt(6.245/4.575) = 1.168.
    expect(out.ks[2]).toBeCloseTo(1.168, 2);
  });

  it('flags a dry hour (h <= 0) as no data, and a missing level as missing', () => {
    const level = Float64Array.of(-2.5, -2, NaN, 0.3);
    const out = transformWithTide(level, 1, 8, 2);
    expect(out.flags[0]).toBe(TRANSFORM_FLAG.DRY); // h = -0.5 m
    expect(out.flags[1]).toBe(TRANSFORM_FLAG.DRY); // h = 0 m exactly: dry (h <= 0)
    expect(out.flags[2]).toBe(TRANSFORM_FLAG.MISSING_INPUT);
    expect(Number.isNaN(out.hsM[0]) && Number.isNaN(out.bedVelocityLinearMps[1]) && Number.isNaN(out.hsM[2])).toBe(true);
    expect(out.hsM[3]).toBeGreaterThan(0);
    // The chain of one hour shows the water level and the depth used.
    const chain = transformHour({ hsM: 1, tpS: 8, waterLevelM: 0.3 }, 2);
    expect(chain.waterLevelM).toBe(0.3);
    expect(chain.depthM).toBeCloseTo(2.3, 12);
    expect(chain.depthLimitM).toBeCloseTo(0.6 * 2.3, 12);
    const dry = transformHour({ hsM: 1, tpS: 8, waterLevelM: -2.1 }, 2);
    expect(dry.flagNames).toEqual(['DRY']);
  });
});
