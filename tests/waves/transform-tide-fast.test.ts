/**
 * The fast tidal transformation (docs/domain.md#tide, docs/domain.md#dispersion): the series path
 * with a water level uses a dispersion lookup table, and must stay within a tight tolerance of
 * the record-by-record chain (`transformOne`, Newton's method) and of an independent bisection
 * solution of the dispersion relation.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { DISPERSION_TABLE_MIN_X, relativeDepthFromTable } from '../../shared/waves/dispersion-table';
import { TRANSFORM_FLAG, transformOne, transformToSite, type SiteGeometry } from '../../shared/waves';
import { BENCH_SITES, BENCH_SOURCE, syntheticSeries } from '../../bench/transform-bench';
import { bisectKd } from './reference-dispersion';

// M2 speed 28.9841042 deg/h (Schureman 1958); the level below is an invented 1.8 m M2 plus a 0.6 m S2
// (S2 speed 30 deg/h, Schureman 1958), around a mean level 2.2 m above chart datum.
function tideLevels(n: number): Float64Array {
  return Float64Array.from(
    { length: n },
    (_, i) => 2.2 + 1.8 * Math.cos((28.9841042 * i * Math.PI) / 180) + 0.6 * Math.cos((30 * i * Math.PI) / 180 + 1),
  );
}

/** |a - b| within rel*|b| (+ a tiny absolute floor for values near 0); NaN only against NaN. */
function within(a: number, b: number, rel: number): boolean {
  if (Number.isNaN(b)) return Number.isNaN(a);
  return Math.abs(a - b) <= rel * Math.abs(b) + 1e-15;
}

describe('dispersion lookup table', () => {
  it('agrees with bisection of k*d*tanh(k*d) = k0*d within 1e-10 relative over the whole table and beyond', () => {
    // The oracle solves x*tanh(x) = k0*d by bisection (common practice, no source).
    fc.assert(
      fc.property(fc.double({ min: Math.log(1e-8), max: Math.log(40), noNaN: true }), (u) => {
        const x = Math.exp(u);
        const ref = bisectKd(x);
        expect(Math.abs(relativeDepthFromTable(x) - ref) / ref).toBeLessThan(1e-10);
      }),
      { numRuns: 3000 },
    );
    // Below the table the exact solution is used: shallow water k*d -> sqrt(k0*d) (common practice, no source).
    const tiny = DISPERSION_TABLE_MIN_X / 100;
    expect(relativeDepthFromTable(tiny)).toBeCloseTo(Math.sqrt(tiny), 12);
  });

  it('gives the hand-worked k*h = 0.407 at T = 8 s, h = 2.5 m', () => {
    // By hand (docs/domain.md#dispersion): omega^2 h/g = (2 pi/8)^2 * 2.5/9.81 = 0.1572; kh tanh(kh) = 0.1572
    // gives kh = 0.407 by fixed-point steps on a calculator.
    expect(relativeDepthFromTable(((2 * Math.PI) / 8) ** 2 * (2.5 / 9.81))).toBeCloseTo(0.407, 3);
  });
});

describe('tidal transformation: fast series path against the exact chain', () => {
  const n = 20_000;
  const base = syntheticSeries(n, 7);
  const input = { ...base, waterLevelM: tideLevels(n) };
  // The benchmark's five worksites made shallow enough for the tide to matter (one dries at low water).
  const sites: SiteGeometry[] = BENCH_SITES.map((s, k) => ({ ...s, depthM: [0.1, 3, 6, 12, 2][k] }));

  it.each(sites.map((site, k) => [k, site] as const))('worksite %i: every output within 1e-9 relative of transformOne', (_k, site) => {
    const fast = transformToSite(input, BENCH_SOURCE, site);
    let compared = 0;
    for (let i = 0; i < n; i++) {
      const exact = transformOne(
        { hsM: base.hsM[i], tpS: base.tpS[i], tzS: base.tzS[i], dirDeg: base.dirDeg[i], waterLevelM: input.waterLevelM[i] },
        BENCH_SOURCE,
        site,
      );
      const ok =
        fast.flags[i] === exact.flags &&
        within(fast.hsM[i], exact.hsM, 1e-9) &&
        within(fast.dirDeg[i], exact.dirDeg, 1e-9) &&
        within(fast.ks[i], exact.ks, 1e-6) && // stored as float32
        within(fast.kr[i], exact.kr, 1e-6) &&
        within(fast.bedVelocityLinearMps[i], exact.bedVelocityLinearMps, 1e-9) &&
        within(fast.bedVelocitySoulsbyMps[i], exact.bedVelocitySoulsbyMps, 1e-9) &&
        fast.depthM![i] === exact.depthM;
      if (!ok)
        throw new Error(
          `record ${i}: fast ${JSON.stringify([fast.hsM[i], fast.flags[i]])} exact ${JSON.stringify([exact.hsM, exact.flags])}`,
        );
      compared++;
    }
    expect(compared).toBe(n);
  });

  it('flags dry records at the shallow worksite and keeps the depth per record', () => {
    const out = transformToSite(input, BENCH_SOURCE, sites[0]);
    let dry = 0;
    for (let i = 0; i < n; i++) {
      const h = 0.1 + input.waterLevelM[i];
      expect(out.depthM![i]).toBe(h);
      if (h <= 0) {
        dry++;
        expect(out.flags[i]).toBe(TRANSFORM_FLAG.DRY);
        expect(Number.isNaN(out.hsM[i])).toBe(true);
      }
    }
    // Low waters reach 2.2 - 1.8 - 0.6 = -0.2 m above chart datum at spring tide: the 0.1 m site dries some hours.
    expect(dry).toBeGreaterThan(0);
  });
});
