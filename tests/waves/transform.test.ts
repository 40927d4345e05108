import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  bedVelocityLinear,
  bedVelocitySoulsby,
  createSiteSeries,
  TRANSFORM_FLAG,
  transformFlagNames,
  transformOne,
  transformToSite,
  type SeaSeriesInput,
  type SiteGeometry,
  type SourcePoint,
  type TransferTable,
  wrapDegrees180,
  wrapDegrees360,
} from '../../shared/waves';
import { refC, refCg, relClose } from './reference-dispersion';

const G = 9.81;
const DEG = Math.PI / 180;
const DEEP: SourcePoint = { depthM: Infinity };
const { LANDWARD, DEPTH_LIMITED, REFRACTION_SKIPPED, TRANSFER_TABLE, MISSING_INPUT } = TRANSFORM_FLAG;

interface Rec {
  hs: number;
  tp: number;
  tz?: number;
  dir?: number;
}

function series(records: Rec[]): SeaSeriesInput {
  return {
    hsM: Float64Array.from(records.map((r) => r.hs)),
    tpS: Float64Array.from(records.map((r) => r.tp)),
    tzS: Float64Array.from(records.map((r) => r.tz ?? NaN)),
    dirDeg: Float64Array.from(records.map((r) => r.dir ?? NaN)),
  };
}

/** Transforms one record through the array path and returns index 0 of every output. */
function viaArray(rec: Rec, source: SourcePoint, site: SiteGeometry) {
  const out = transformToSite(series([rec]), source, site);
  return {
    hs: out.hsM[0],
    dir: out.dirDeg[0],
    ks: out.ks[0],
    kr: out.kr[0],
    flags: out.flags[0],
    uLin: out.bedVelocityLinearMps[0],
    uSoul: out.bedVelocitySoulsbyMps[0],
  };
}

/** Signed angle a - b wrapped to (-180, 180], degrees. */
function angleDiff(a: number, b: number): number {
  let d = (a - b) % 360;
  if (d > 180) d -= 360;
  if (d <= -180) d += 360;
  return d;
}

describe('transform: refraction and shoaling (docs/domain.md#transformation steps 1-4; Snell; energy flux)', () => {
  const site: SiteGeometry = { depthM: 10, shoreNormalDeg: 270, breakerIndex: 0.6 };

  it('a deep-water sea 20 deg off the shore normal: Snell, Kr, Ks and direction by hand from the oracle', () => {
    const r = viaArray({ hs: 2, tp: 10, dir: 250 }, DEEP, site);
    const c0 = (G * 10) / (2 * Math.PI); // docs/domain.md#convention-1: unknown depth = deep water, C = C0, Cg = C0/2
    const cSite = refC(10, 10);
    const thetaSite = Math.asin((cSite / c0) * Math.sin(-20 * DEG));
    const kr = Math.sqrt(Math.cos(-20 * DEG) / Math.cos(thetaSite));
    const ks = Math.sqrt(c0 / 2 / refCg(10, 10));
    expect(r.flags).toBe(0);
    expect(r.kr).toBeRelClose(kr, 1e-6); // float32 storage
    expect(r.ks).toBeRelClose(ks, 1e-6);
    expect(r.hs).toBeRelClose(2 * ks * kr, 1e-11);
    expect(r.dir).toBeCloseTo(270 + thetaSite / DEG, 9);
    // The wave turns toward the shore normal.
    expect(Math.abs(angleDiff(r.dir, 270))).toBeLessThan(20);
  });

  it('wraps directions across north: bearing 10 and Dir 350 is theta = -20; bearing 350 and Dir 10 is +20', () => {
    const a = transformOne({ hsM: 1, tpS: 8, dirDeg: 350 }, DEEP, { ...site, shoreNormalDeg: 10 });
    expect(a.thetaSrcDeg).toBeCloseTo(-20, 12);
    expect(a.dirDeg).toBeGreaterThan(350);
    expect(a.dirDeg).toBeLessThan(360);
    const b = transformOne({ hsM: 1, tpS: 8, dirDeg: 10 }, DEEP, { ...site, shoreNormalDeg: 350 });
    expect(b.thetaSrcDeg).toBeCloseTo(20, 12);
    expect(b.dirDeg).toBeGreaterThanOrEqual(0);
    expect(b.dirDeg).toBeLessThan(10);
    // Head-on: no turning, Kr = 1.
    const c = transformOne({ hsM: 1, tpS: 8, dirDeg: 0 }, DEEP, { ...site, shoreNormalDeg: 360 });
    expect(c.thetaSrcDeg).toBe(0);
    expect(c.kr).toBe(1);
    expect(c.dirDeg).toBe(0);
  });

  it("conserves energy flux Hs^2 Cg cos(theta) and Snell's invariant sin(theta)/C below the depth limit (fast-check)", () => {
    let refracted = 0;
    fc.assert(
      fc.property(
        fc.oneof(fc.constant(Infinity), fc.double({ min: 20, max: 3000, noNaN: true })),
        fc.double({ min: 1, max: 200, noNaN: true }),
        fc.double({ min: 0, max: 359.9, noNaN: true }),
        fc.double({ min: -89.5, max: 89.5, noNaN: true }),
        fc.integer({ min: 30, max: 250 }).map((t) => t / 10),
        fc.double({ min: 0.1, max: 8, noNaN: true }),
        (srcDepth, siteDepth, bearing, theta, tp, hs) => {
          const s: SiteGeometry = { depthM: siteDepth, shoreNormalDeg: bearing, breakerIndex: 100 };
          const r = viaArray({ hs, tp, dir: bearing + theta }, { depthM: srcDepth }, s);
          if (r.flags !== 0) return r.flags === REFRACTION_SKIPPED; // only when the site is deeper
          const thetaSite = angleDiff(r.dir, bearing) * DEG;
          const cSrc = refC(tp, srcDepth);
          const cSite = refC(tp, siteDepth);
          const fluxSrc = hs * hs * refCg(tp, srcDepth) * Math.cos(theta * DEG);
          const fluxSite = r.hs * r.hs * refCg(tp, siteDepth) * Math.cos(thetaSite);
          const snell = Math.abs(Math.sin(theta * DEG) / cSrc - Math.sin(thetaSite) / cSite);
          refracted++;
          return relClose(fluxSite, fluxSrc, 1e-9) && snell <= 1e-12 * (1 / cSrc + 1 / cSite);
        },
      ),
      { numRuns: 1500 },
    );
    expect(refracted).toBeGreaterThan(1000);
  });

  it('without a bearing: shoaling only, Kr = 1, direction kept, Hs^2 Cg conserved', () => {
    const r = viaArray({ hs: 1.2, tp: 12, dir: 123.4 }, { depthM: 80 }, { depthM: 6, shoreNormalDeg: null, breakerIndex: 0.6 });
    expect(r.kr).toBe(1);
    expect(r.dir).toBe(123.4);
    expect(r.hs * r.hs * refCg(12, 6)).toBeRelClose(1.2 * 1.2 * refCg(12, 80), 1e-10);
    // A direction is not needed without a bearing: NaN is fine and stays NaN.
    const noDir = viaArray({ hs: 1.2, tp: 12 }, { depthM: 80 }, { depthM: 6, shoreNormalDeg: null, breakerIndex: 0.6 });
    expect(noDir.flags).toBe(0);
    expect(Number.isNaN(noDir.dir)).toBe(true);
    expect(noDir.hs).toBe(r.hs);
  });

  it('Ks >= 0.91 from deep water (minimum of Ks is about 0.913, SPM 1984 Table C-1, from memory), Kr <= 1 toward shallower water', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.5, max: 500, noNaN: true }),
        fc.integer({ min: 5, max: 300 }).map((t) => t / 10),
        fc.double({ min: -89, max: 89, noNaN: true }),
        (siteDepth, tp, theta) => {
          const r = viaArray({ hs: 0.01, tp, dir: 200 + theta }, DEEP, { depthM: siteDepth, shoreNormalDeg: 200, breakerIndex: 0.6 });
          return r.ks >= 0.91 && r.kr <= 1 + 1e-7 && r.flags === 0;
        },
      ),
      { numRuns: 1000 },
    );
  });
});

describe('transform: docs/domain.md#convention-1 to #convention-4 (flags)', () => {
  const site: SiteGeometry = { depthM: 12, shoreNormalDeg: 270, breakerIndex: 0.6 };

  it('docs/domain.md#convention-2: |theta_src| >= 90 (90 included) is landward: Kr = 1, shoaling only, direction kept, flagged', () => {
    for (const dir of [0, 180, 90]) {
      // theta = 90 (Dir 0), -90 (Dir 180), 180 (Dir 90)
      const r = viaArray({ hs: 1, tp: 9, dir }, DEEP, site);
      expect(r.flags).toBe(LANDWARD);
      expect(r.kr).toBe(1);
      expect(r.dir).toBe(dir);
      expect(r.ks).toBeRelClose(Math.sqrt((G * 9) / (4 * Math.PI) / refCg(9, 12)), 1e-6);
    }
    const chain = transformOne({ hsM: 1, tpS: 9, dirDeg: 0 }, DEEP, site);
    expect(chain.thetaSrcDeg).toBe(90);
    expect(chain.flagNames).toEqual(['LANDWARD']);
    // Just inside 90 deg is refracted.
    expect(viaArray({ hs: 1, tp: 9, dir: 359.999 }, DEEP, site).flags).toBe(0);
    expect(viaArray({ hs: 1, tp: 9, dir: 180.001 }, DEEP, site).flags).toBe(0);
  });

  it('docs/domain.md#convention-2: site deeper than the data point and |sin(theta_site)| > 1: no refraction, Kr = 1, direction kept, flagged', () => {
    const source = { depthM: 5 };
    const deepSite: SiteGeometry = { depthM: 60, shoreNormalDeg: 270, breakerIndex: 0.6 };
    // Precondition by the oracle: C_site/C_src * sin(60 deg) > 1.
    expect((refC(8, 60) / refC(8, 5)) * Math.sin(60 * DEG)).toBeGreaterThan(1);
    const r = viaArray({ hs: 1, tp: 8, dir: 330 }, source, deepSite);
    expect(r.flags).toBe(REFRACTION_SKIPPED);
    expect(r.kr).toBe(1);
    expect(r.dir).toBe(330);
    expect(r.ks).toBeRelClose(Math.sqrt(refCg(8, 5) / refCg(8, 60)), 1e-6);
    expect(r.ks).toBeLessThan(1);
    // A small angle still refracts, away from the normal (the wave speeds up).
    const small = transformOne({ hsM: 1, tpS: 8, dirDeg: 280 }, source, deepSite);
    expect(small.flags).toBe(0);
    expect(small.thetaSiteDeg).toBeGreaterThan(10);
  });

  it('docs/domain.md#convention-4: the depth limit applies when Hs_site > gamma_b d strictly; equal is neither capped nor flagged', () => {
    // Same depth at both ends and no bearing: Ks = Kr = 1 exactly, so Hs_site = Hs_src.
    const same: SiteGeometry = { depthM: 10, shoreNormalDeg: null, breakerIndex: 0.5 };
    const equal = viaArray({ hs: 5, tp: 10 }, { depthM: 10 }, same);
    expect(equal.ks).toBe(1);
    expect(equal.hs).toBe(5);
    expect(equal.flags).toBe(0);
    const above = viaArray({ hs: 5.000001, tp: 10 }, { depthM: 10 }, same);
    expect(above.hs).toBe(5);
    expect(above.flags).toBe(DEPTH_LIMITED);
    // Bed velocities use the worksite Hs after the cap.
    expect(above.uLin).toBeCloseTo(bedVelocityLinear(5, 10, 10), 14);
    const chain = transformOne({ hsM: 7, tpS: 10 }, { depthM: 10 }, same);
    expect(chain.hsBeforeCapM).toBe(7);
    expect(chain.hsM).toBe(5);
    expect(chain.depthLimitM).toBe(5);
    // Flags combine: landward and depth-limited.
    const both = viaArray({ hs: 20, tp: 10, dir: 90 }, DEEP, site);
    expect(both.flags).toBe(LANDWARD | DEPTH_LIMITED);
    expect(both.hs).toBeCloseTo(0.6 * 12, 12);
  });

  it('docs/domain.md#convention-3: missing Tp makes Hs missing; with a bearing a missing direction does too; Hs missing stays missing', () => {
    const out = transformToSite(
      series([
        { hs: 2, tp: NaN, dir: 260 },
        { hs: NaN, tp: 10, dir: 260 },
        { hs: 2, tp: 10 },
        { hs: 2, tp: 0, dir: 260 },
        { hs: -1, tp: 10, dir: 260 },
        { hs: 2, tp: 10, dir: 260 },
      ]),
      DEEP,
      site,
    );
    for (let i = 0; i < 5; i++) {
      expect(out.flags[i]).toBe(MISSING_INPUT);
      expect(Number.isNaN(out.hsM[i])).toBe(true);
      expect(Number.isNaN(out.bedVelocityLinearMps[i])).toBe(true);
      expect(Number.isNaN(out.ks[i])).toBe(true);
    }
    expect(out.flags[5]).toBe(0);
    expect(Number.isFinite(out.hsM[5])).toBe(true);
    expect(transformOne({ hsM: 2, tpS: NaN, dirDeg: 260 }, DEEP, site).missing).toBe('tp');
    expect(transformOne({ hsM: 2, tpS: 10 }, DEEP, site).missing).toBe('dir');
    expect(transformOne({ hsM: NaN, tpS: 10 }, DEEP, site).missing).toBe('hs');
    expect(transformFlagNames(MISSING_INPUT)).toEqual(['MISSING_INPUT']);
  });

  it('docs/domain.md#convention-8: Soulsby bed velocity uses Tz from the record, else Tz = (Tz/Tp)(gamma 3.3) Tp', () => {
    const tzRatio = 0.6673 + 0.05037 * 3.3 - 0.00623 * 3.3 ** 2 + 0.0003341 * 3.3 ** 3; // DNV-RP-C205 (from memory)
    const out = transformToSite(
      series([
        { hs: 1.5, tp: 10, tz: 7.2, dir: 265 },
        { hs: 1.5, tp: 10, dir: 265 },
      ]),
      DEEP,
      site,
    );
    expect(out.bedVelocitySoulsbyMps[0]).toBeCloseTo(bedVelocitySoulsby(out.hsM[0], 7.2, 12), 14);
    expect(out.bedVelocitySoulsbyMps[1]).toBeCloseTo(bedVelocitySoulsby(out.hsM[1], 10 * tzRatio, 12), 12);
    expect(out.bedVelocityLinearMps[0]).toBeCloseTo(bedVelocityLinear(out.hsM[0], 10, 12), 14);
    expect(transformOne({ hsM: 1.5, tpS: 10, dirDeg: 265 }, DEEP, site).tzSource).toBe('tp');
  });
});

describe('transform: transfer tables (docs/domain.md#convention-17: half-open sectors and bands, nearest outside, direction kept)', () => {
  const table: TransferTable = {
    directionSectorsDeg: [
      [345, 15],
      [15, 90],
      [180, 270],
      [270, 345],
    ],
    tpBandsS: [
      [0, 6],
      [6, 10],
      [10, 14],
      [14, 30],
    ],
    factors: [
      [0.11, 0.12, 0.13, 0.14],
      [0.21, 0.22, 0.23, 0.24],
      [0.31, 0.32, 0.33, 0.34],
      [0.41, 0.42, 0.43, 0.44],
    ],
  };
  const site: SiteGeometry = { depthM: 15, shoreNormalDeg: 270, breakerIndex: 0.6, transferTable: table };
  const factorOf = (dir: number, tp: number) => transformOne({ hsM: 1, tpS: tp, dirDeg: dir }, DEEP, site).transferFactor;

  it('bands are [from, to): a period on an edge belongs to the upper band; outside, the nearest band', () => {
    expect(factorOf(200, 10)).toBe(0.33);
    expect(factorOf(200, 9.999)).toBe(0.32);
    expect(factorOf(200, 6)).toBe(0.32);
    expect(factorOf(200, 1)).toBe(0.31);
    expect(factorOf(200, 30)).toBe(0.34); // 30 is outside [14, 30): nearest is the last band
    expect(factorOf(200, 45)).toBe(0.34);
    const gappy: TransferTable = {
      directionSectorsDeg: [[0, 360]],
      tpBandsS: [
        [4, 6],
        [8, 10],
      ],
      factors: [[0.5, 0.7]],
    };
    const g = (tp: number) => transformOne({ hsM: 1, tpS: tp, dirDeg: 1 }, DEEP, { ...site, transferTable: gappy }).transferFactor;
    expect(g(6)).toBe(0.5); // on the open edge of [4, 6): outside, nearest is [4, 6)
    expect(g(6.9)).toBe(0.5);
    expect(g(7.1)).toBe(0.7);
    expect(g(2)).toBe(0.5);
  });

  it('sectors are [from, to), may wrap through north; outside, the sector with the nearest edge', () => {
    expect(factorOf(345, 8)).toBe(0.12);
    expect(factorOf(350, 8)).toBe(0.12);
    expect(factorOf(5, 8)).toBe(0.12);
    expect(factorOf(15, 8)).toBe(0.22);
    expect(factorOf(270, 8)).toBe(0.42);
    expect(factorOf(344.9, 8)).toBe(0.42);
    expect(factorOf(120, 8)).toBe(0.22); // 30 deg from 90, 60 deg from 180
    expect(factorOf(160, 8)).toBe(0.32); // 20 deg from 180
    expect(factorOf(-10, 8)).toBe(0.12); // -10 is 350
  });

  it('replaces refraction and shoaling, keeps the direction, flags TRANSFER_TABLE, and the depth limit still applies', () => {
    const r = viaArray({ hs: 3, tp: 11, dir: 300 }, DEEP, site);
    expect(r.flags).toBe(TRANSFER_TABLE);
    expect(r.hs).toBeCloseTo(3 * 0.43, 14);
    expect(r.ks).toBe(Math.fround(0.43));
    expect(r.kr).toBe(1);
    expect(r.dir).toBe(300);
    const capped = viaArray({ hs: 30, tp: 11, dir: 300 }, DEEP, site);
    expect(capped.flags).toBe(TRANSFER_TABLE | DEPTH_LIMITED);
    expect(capped.hs).toBeCloseTo(9, 12);
    // The table needs the direction: missing direction makes the record missing.
    expect(viaArray({ hs: 3, tp: 11 }, DEEP, { ...site, shoreNormalDeg: null }).flags).toBe(MISSING_INPUT);
  });

  it('rejects malformed tables with RangeError', () => {
    const bad = (t: Partial<TransferTable>) => () =>
      transformToSite(series([{ hs: 1, tp: 8, dir: 10 }]), DEEP, { ...site, transferTable: { ...table, ...t } });
    expect(bad({ factors: [[1, 2, 3, 4]] })).toThrow(RangeError);
    expect(bad({ tpBandsS: [[6, 4]] })).toThrow(RangeError);
    expect(bad({ directionSectorsDeg: [] })).toThrow(RangeError);
    expect(bad({ factors: table.factors.map((row) => row.map(() => -1)) })).toThrow(RangeError);
  });
});

describe('transform: the array path equals the single-record path', () => {
  const tableSite: SiteGeometry = {
    depthM: 9,
    shoreNormalDeg: 200,
    breakerIndex: 0.55,
    transferTable: {
      directionSectorsDeg: [[90, 270]],
      tpBandsS: [
        [0, 8],
        [8, 20],
      ],
      factors: [[0.9, 1.1]],
    },
  };
  const maybeNaN = (arb: fc.Arbitrary<number>) => fc.oneof({ weight: 1, arbitrary: fc.constant(NaN) }, { weight: 8, arbitrary: arb });
  const record = fc.record({
    hs: maybeNaN(fc.double({ min: 0, max: 12, noNaN: true })),
    tp: maybeNaN(fc.integer({ min: 10, max: 250 }).map((t) => t / 10)),
    tz: maybeNaN(fc.integer({ min: 10, max: 200 }).map((t) => t / 10)),
    dir: maybeNaN(fc.integer({ min: 0, max: 3599 }).map((d) => d / 10)),
  });

  it('bit for bit, for random records and sites (fast-check)', () => {
    fc.assert(
      fc.property(
        fc.array(record, { minLength: 1, maxLength: 60 }),
        fc.oneof(fc.constant(Infinity), fc.double({ min: 3, max: 300, noNaN: true })),
        fc.double({ min: 1, max: 80, noNaN: true }),
        fc.oneof(fc.constant(null), fc.double({ min: -720, max: 720, noNaN: true })),
        fc.boolean(),
        (recs, srcDepth, siteDepth, bearing, useTable) => {
          const site: SiteGeometry = useTable
            ? { ...tableSite, depthM: siteDepth }
            : { depthM: siteDepth, shoreNormalDeg: bearing, breakerIndex: 0.6 };
          const source = { depthM: srcDepth };
          const out = transformToSite(series(recs), source, site);
          return recs.every((rec, i) => {
            const one = transformOne({ hsM: rec.hs, tpS: rec.tp, tzS: rec.tz, dirDeg: rec.dir }, source, site);
            return (
              Object.is(out.hsM[i], one.hsM) &&
              Object.is(out.dirDeg[i], one.dirDeg) &&
              Object.is(out.ks[i], Math.fround(one.ks)) &&
              Object.is(out.kr[i], Math.fround(one.kr)) &&
              out.flags[i] === one.flags &&
              Object.is(out.bedVelocityLinearMps[i], one.bedVelocityLinearMps) &&
              Object.is(out.bedVelocitySoulsbyMps[i], one.bedVelocitySoulsbyMps) &&
              (one.flags & MISSING_INPUT ? true : relClose(one.hsBeforeCapM, rec.hs * one.ks * one.kr, 1e-15))
            );
          });
        },
      ),
      { numRuns: 400 },
    );
  });

  it('fills and returns `out` arrays and rejects arrays of the wrong length', () => {
    const input = series([
      { hs: 1, tp: 8, dir: 250 },
      { hs: 2, tp: 8, dir: 250 },
    ]);
    const site: SiteGeometry = { depthM: 10, shoreNormalDeg: 270, breakerIndex: 0.6 };
    const out = createSiteSeries(2);
    expect(transformToSite(input, DEEP, site, { out })).toBe(out);
    expect(out.hsM[1]).toBeCloseTo(2 * out.hsM[0], 14);
    expect(() => transformToSite(input, DEEP, site, { out: createSiteSeries(3) })).toThrow(RangeError);
    expect(() => transformToSite({ ...input, tzS: new Float64Array(1) }, DEEP, site)).toThrow(RangeError);
  });

  it('may write in place over the input Hs and direction arrays', () => {
    const recs: Rec[] = [
      { hs: 1, tp: 8, dir: 250 },
      { hs: NaN, tp: 8, dir: 250 },
      { hs: 3, tp: 12, dir: 300 },
    ];
    const site: SiteGeometry = { depthM: 10, shoreNormalDeg: 270, breakerIndex: 0.6 };
    const expected = transformToSite(series(recs), DEEP, site);
    const input = series(recs);
    const out = { ...createSiteSeries(3), hsM: input.hsM, dirDeg: input.dirDeg };
    transformToSite(input, DEEP, site, { out });
    expect(Array.from(out.hsM)).toEqual(Array.from(expected.hsM));
    expect(Array.from(out.dirDeg)).toEqual(Array.from(expected.dirDeg));
  });

  it('handles many distinct (unrounded) periods and directions (cache growth)', () => {
    const n = 5000;
    const recs: Rec[] = Array.from({ length: n }, (_, i) => ({ hs: 1 + (i % 7) * 0.1, tp: 4 + i * 0.0031, dir: 180 + i * 0.017 }));
    const site: SiteGeometry = { depthM: 8, shoreNormalDeg: 225, breakerIndex: 0.6 };
    const out = transformToSite(series(recs), DEEP, site);
    for (const i of [0, 1234, 4999]) {
      const one = transformOne({ hsM: recs[i].hs, tpS: recs[i].tp, dirDeg: recs[i].dir }, DEEP, site);
      expect(out.hsM[i]).toBe(one.hsM);
      expect(out.dirDeg[i]).toBe(one.dirDeg);
    }
  });
});

describe('transform: regressions', () => {
  it('2026-12-01: a bearing of -5e-324 wrapped to a negative angle (series and single paths then differed)', () => {
    // wrapDegrees360(-5e-324) returned -5e-324: -5e-324/360 underflows to -0, so floor gave no turn.
    expect(wrapDegrees360(-5e-324)).toBe(0);
    expect(wrapDegrees360(-1e-15)).toBe(0);
    const site: SiteGeometry = { depthM: 1, shoreNormalDeg: -5e-324, breakerIndex: 0.6 };
    const one = transformOne({ hsM: 0, tpS: 1, dirDeg: 0 }, DEEP, site);
    const arr = viaArray({ hs: 0, tp: 1, dir: 0 }, DEEP, site);
    expect(Object.is(arr.dir, one.dirDeg)).toBe(true);
    expect(one.dirDeg).toBeGreaterThanOrEqual(0);
    expect(one.dirDeg).toBeLessThan(360);
  });

  it('wrapDegrees360 is in [0, 360) and wrapDegrees180 in (-180, 180] for any finite angle (fast-check)', () => {
    fc.assert(
      fc.property(fc.double({ min: -1e6, max: 1e6, noNaN: true }), (deg) => {
        const a = wrapDegrees360(deg);
        const b = wrapDegrees180(deg);
        return a >= 0 && a < 360 && b > -180 && b <= 180 && Math.abs(angleDiff(a, deg)) < 1e-9 && Math.abs(angleDiff(b, deg)) < 1e-9;
      }),
      { numRuns: 3000 },
    );
  });
});

describe('transform: input checks', () => {
  const input = series([{ hs: 1, tp: 8, dir: 250 }]);
  const ok: SiteGeometry = { depthM: 10, shoreNormalDeg: 270, breakerIndex: 0.6 };
  it('throws RangeError for bad geometry or options', () => {
    expect(() => transformToSite(input, { depthM: NaN }, ok)).toThrow(RangeError);
    expect(() => transformToSite(input, { depthM: 0 }, ok)).toThrow(RangeError);
    expect(() => transformToSite(input, DEEP, { ...ok, depthM: Infinity })).toThrow(RangeError);
    expect(() => transformToSite(input, DEEP, { ...ok, depthM: -1 })).toThrow(RangeError);
    expect(() => transformToSite(input, DEEP, { ...ok, breakerIndex: 0 })).toThrow(RangeError);
    expect(() => transformToSite(input, DEEP, { ...ok, shoreNormalDeg: NaN })).toThrow(RangeError);
    expect(() => transformToSite(input, DEEP, ok, { gamma: 9 })).toThrow(RangeError);
    expect(() => transformOne({ hsM: 1, tpS: 8 }, DEEP, ok, { g: -1 })).toThrow(RangeError);
  });
});
