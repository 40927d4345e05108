// transformToSite's fast options against its default path: `fields: 'engine'` (only Hs and the bed
// velocities) and `prepared` (the data point's distinct values found once for every worksite) must
// give the same values bit for bit. No outside figures: the reference is the default path, whose
// physics transform.test.ts checks against published dispersion values.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  createSiteSeries,
  prepareSeaInput,
  transformToSite,
  type SeaSeriesInput,
  type SiteGeometry,
  type TransferTable,
} from '../../shared/waves';

const table: TransferTable = {
  directionSectorsDeg: [
    [345, 15],
    [15, 180],
    [180, 345],
  ],
  tpBandsS: [
    [0, 8],
    [8, 30],
  ],
  factors: [
    [0.5, 0.6],
    [0.7, 0.8],
    [0.9, 1.1],
  ],
};

const siteArb: fc.Arbitrary<SiteGeometry> = fc.record({
  depthM: fc.constantFrom(2, 3, 8, 15, 30, 50, 80),
  shoreNormalDeg: fc.oneof(fc.constant(null), fc.constantFrom(0, 90, 230, 250, 270, 359.5)),
  breakerIndex: fc.constantFrom(0.6, 0.78),
  transferTable: fc.oneof({ weight: 4, arbitrary: fc.constant(null) }, { weight: 1, arbitrary: fc.constant(table) }),
});

/** Periods rounded as data are, and unrounded as forecasts are; missing and invalid values too. */
const num = (lo: number, hi: number) =>
  fc.oneof(
    { weight: 5, arbitrary: fc.double({ min: lo, max: hi, noNaN: true }).map((x) => Math.round(x * 100) / 100) },
    { weight: 3, arbitrary: fc.double({ min: lo, max: hi, noNaN: true }) },
    { weight: 1, arbitrary: fc.constantFrom(NaN, -1, 0, Infinity) },
  );

const inputArb: fc.Arbitrary<SeaSeriesInput> = fc
  .array(
    fc.record({ hs: num(0, 8), tp: num(2, 20), tz: fc.oneof(fc.constant(NaN), num(2, 14)), dir: fc.oneof(num(0, 360), num(-400, 800)) }),
    { minLength: 1, maxLength: 200 },
  )
  .map((recs) => ({
    hsM: Float64Array.from(recs, (r) => r.hs),
    tpS: Float64Array.from(recs, (r) => r.tp),
    tzS: Float64Array.from(recs, (r) => r.tz),
    dirDeg: Float64Array.from(recs, (r) => r.dir),
  }));

const same = (a: Float64Array, b: Float64Array) => expect(Array.from(a, (x, i) => Object.is(x, b[i]))).not.toContain(false);

describe("transformToSite: fields 'engine' and a prepared input give the default path's values bit for bit", () => {
  it('Hs and both bed velocities, at several worksites from one prepared input, and all fields with `prepared` alone', () => {
    fc.assert(
      fc.property(
        inputArb,
        fc.array(siteArb, { minLength: 1, maxLength: 4 }),
        fc.constantFrom(60, 20, Infinity),
        (input, sites, srcDepth) => {
          // Into buffers longer than the series, filled with junk first: the same ids and keys.
          const n = input.hsM.length;
          const buffers = { tpIds: new Int32Array(n + 5).fill(77), dirIds: new Int32Array(n + 5).fill(77) };
          const prepared = prepareSeaInput(input, buffers);
          const fresh = prepareSeaInput(input);
          expect(Array.from(prepared.tpIds)).toEqual(Array.from(fresh.tpIds));
          expect(Array.from(prepared.dirIds)).toEqual(Array.from(fresh.dirIds));
          expect(Array.from(prepared.tpKeys)).toEqual(Array.from(fresh.tpKeys));
          expect(prepared.tpIds.buffer).toBe(buffers.tpIds.buffer);
          for (const site of sites) {
            const want = transformToSite(input, { depthM: srcDepth }, site);
            const fast = transformToSite(input, { depthM: srcDepth }, site, {
              fields: 'engine',
              prepared,
              out: createSiteSeries(input.hsM.length),
            });
            same(fast.hsM, want.hsM);
            same(fast.bedVelocityLinearMps, want.bedVelocityLinearMps);
            same(fast.bedVelocitySoulsbyMps, want.bedVelocitySoulsbyMps);
            const full = transformToSite(input, { depthM: srcDepth }, site, { prepared });
            for (const key of ['hsM', 'dirDeg', 'bedVelocityLinearMps', 'bedVelocitySoulsbyMps'] as const) same(full[key], want[key]);
            expect(Array.from(full.flags)).toEqual(Array.from(want.flags));
            expect(Array.from(full.ks, (x, i) => Object.is(x, want.ks[i]))).not.toContain(false);
            expect(Array.from(full.kr, (x, i) => Object.is(x, want.kr[i]))).not.toContain(false);
          }
        },
      ),
      { numRuns: 300 },
    );
  });

  it('buffers shorter than the series are refused', () => {
    const a: SeaSeriesInput = {
      hsM: Float64Array.of(1, 2),
      tpS: Float64Array.of(8, 9),
      tzS: Float64Array.of(NaN, NaN),
      dirDeg: Float64Array.of(250, 260),
    };
    expect(() => prepareSeaInput(a, { tpIds: new Int32Array(1), dirIds: new Int32Array(2) })).toThrow(/buffers shorter than the series/);
  });

  it('a prepared input of another series is refused', () => {
    const a: SeaSeriesInput = { hsM: Float64Array.of(1), tpS: Float64Array.of(8), tzS: Float64Array.of(NaN), dirDeg: Float64Array.of(250) };
    const b: SeaSeriesInput = { ...a, tpS: Float64Array.of(9) };
    const site: SiteGeometry = { depthM: 10, shoreNormalDeg: 250, breakerIndex: 0.6 };
    expect(() => transformToSite(b, { depthM: 60 }, site, { prepared: prepareSeaInput(a) })).toThrow(
      /prepared was made from another input/,
    );
  });
});
