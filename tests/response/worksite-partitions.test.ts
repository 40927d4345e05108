// The sea partitions response limits read at a worksite (server/services/site-context.ts,
// docs/domain.md#vessel-response and #partitions): a dataset's wind sea and swells reach the
// response engine each with its own Hs, Tp and direction; a record not combined from its
// partitions, and a dataset without partitions, stand on the total sea as one wind sea.
// The worksite is in deep water with no shore normal, so the transformation leaves Hs, Tp and
// direction unchanged there (no shoaling or refraction in deep water: common practice, no source).
import { describe, expect, it } from 'vitest';
import { responseLimitSeries } from '../../shared/engine/response-limits';
import type { OperationSpec } from '../../shared/engine';
import type { ExtraSeries } from '../../shared/seadata/extra-columns';
import { transformForSite, type WorksiteRow } from '../../server/services/site-context';
import type { SeaSeries } from '../../server/services/series-store';
import { DENSE_PERIODS, tableOf } from './raos';

const f = (xs: number[]) => Float64Array.from(xs);
const N = 3;

function seaSeries(extra: ExtraSeries): SeaSeries {
  return {
    timeMs: f([0, 3_600_000, 7_200_000]),
    hs: f([Math.hypot(1.2, 0.8), 1.5, 2]),
    tp: f([6, 9, 8]),
    tz: f([NaN, NaN, NaN]),
    te: f([NaN, NaN, NaN]),
    dir: f([30, 200, 100]),
    wind: f([5, 5, 5]),
    windDir: f([0, 0, 0]),
    givenPeriods: Uint8Array.of(1, 1, 1),
    extra,
  };
}

// Record 0: wind sea 1.2 m / 6 s from 30°, swell 0.8 m / 13 s from 250°, no second swell (Hs 0).
// Record 1: the swell's Hs is missing, so the record cannot be combined from its partitions.
// Record 2: wind sea only.
const PARTITIONED: ExtraSeries = {
  'windSea.hs': f([1.2, 1, 2]),
  'windSea.tp': f([6, 6, 8]),
  'windSea.dir': f([30, 30, 100]),
  'swell1.hs': f([0.8, NaN, 0]),
  'swell1.tp': f([13, 13, NaN]),
  'swell1.dir': f([250, 250, NaN]),
  'swell2.hs': f([0, 0, 0]),
};

const SITE = {
  id: 'site',
  depthM: 4000,
  shoreNormalDeg: null,
  breakerIndex: 0.78,
  transferTable: null,
  tide: null,
  latitude: null,
  longitude: null,
} as unknown as WorksiteRow;

/** Heave RAO of 1 m/m at every period and heading: the heave spectrum is the wave spectrum. */
const HEAVE_ONE = tableOf('heave_m_per_m', [0, 90, 180, 270], DENSE_PERIODS, () => 1);

const op: OperationSpec = {
  tpopH: 6,
  tcH: 2,
  weatherRestricted: true,
  limits: { responses: [{ response: 'heave_m_per_m', statistic: 'significant', max: 5 }] },
  vessel: { raos: HEAVE_ONE, headingDeg: 0 },
};

describe('worksite partitions for response limits', () => {
  it('take the wind sea and both swells of a partitioned dataset, each with its own Tp and direction', () => {
    const parts = transformForSite(seaSeries(PARTITIONED), null, SITE).engine.responsePartitions!;
    expect(parts.map((p) => p.kind)).toEqual(['windSea', 'swell', 'swell']);
    const [wind, swell1, swell2] = parts;
    // Record 0: the dataset's values (deep water to deep water).
    expect(wind.hsM[0]).toBeCloseTo(1.2, 6);
    expect(wind.tpS[0]).toBe(6);
    expect(wind.dirDeg[0]).toBeCloseTo(30, 6);
    expect(swell1.hsM[0]).toBeCloseTo(0.8, 6);
    expect(swell1.tpS[0]).toBe(13);
    expect(swell1.dirDeg[0]).toBeCloseTo(250, 6);
    expect(swell2.hsM[0]).toBe(0);
    // Record 1 is not combined from partitions: the total sea (1.5 m, 9 s, from 200°) as one wind sea.
    expect(wind.hsM[1]).toBeCloseTo(1.5, 6);
    expect(wind.tpS[1]).toBe(9);
    expect(wind.dirDeg[1]).toBeCloseTo(200, 6);
    expect(swell1.hsM[1]).toBe(0);
    expect(swell2.hsM[1]).toBe(0);
    // Record 2: the wind sea alone.
    expect(wind.hsM[2]).toBeCloseTo(2, 6);
    expect(swell1.hsM[2]).toBe(0);
  });

  it('energies add in the response: R_s = 2 sqrt(m0) = sqrt(sum Hs_i^2)/2 for a heave RAO of 1', () => {
    const engine = transformForSite(seaSeries(PARTITIONED), null, SITE).engine;
    const { values, hsTotal } = responseLimitSeries(engine, op, op.limits.responses!);
    // m0 of a JONSWAP partition is Hs^2/16 (docs/domain.md#vessel-response), so R_s = 2 sqrt(sum Hs_i^2/16), by hand.
    expect(values[0][0]).toBeCloseTo(Math.sqrt(1.2 ** 2 + 0.8 ** 2) / 2, 3);
    expect(hsTotal[0]).toBeCloseTo(Math.sqrt(1.2 ** 2 + 0.8 ** 2), 6);
    expect(values[0][1]).toBeCloseTo(1.5 / 2, 3);
    expect(values[0][2]).toBeCloseTo(2 / 2, 3);
  });

  it('a dataset without partitions stands on the total sea as one wind sea', () => {
    const parts = transformForSite(seaSeries({}), null, SITE).engine.responsePartitions!;
    expect(parts.map((p) => p.kind)).toEqual(['windSea']);
    expect(Array.from(parts[0].hsM, (x) => Math.round(x * 1e6) / 1e6)).toEqual([Math.round(Math.hypot(1.2, 0.8) * 1e6) / 1e6, 1.5, 2]);
    expect(Array.from(parts[0].tpS)).toEqual([6, 9, 8]);
    expect(Array.from(parts[0].dirDeg, (x) => Math.round(x * 1e6) / 1e6)).toEqual([30, 200, 100]);
    expect(parts[0].hsM.length).toBe(N);
  });
});
