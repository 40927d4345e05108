// The governing response per hour (shared/engine/response-limits.ts governingResponseSeries), as the
// conditions chart shows it (docs/domain.md#vessel-response). Hand-checkable tables: a heave RAO
// of 1 m/m gives R_s = Hs/2 exactly (the check named in docs/domain.md#vessel-response); a pitch
// RAO of 0 below 9 s and 3 deg/m from 10 s, so a short sea moves the vessel in heave only and a
// long one mostly in pitch.
import { describe, expect, it } from 'vitest';
import { compileLimits } from '../../shared/engine/compiled-limits';
import { DEFAULT_ALPHA_TABLE, type OperationSpec, type SiteSeries } from '../../shared/engine';
import { governingResponseSeries } from '../../shared/engine/response-limits';
import type { RaoTable } from '../../shared/response';
import { DENSE_PERIODS } from './raos';

const HEADINGS = [0, 90, 180, 270];
const TABLE: RaoTable = {
  periodsS: DENSE_PERIODS,
  headingsDeg: HEADINGS,
  responses: {
    heave_m_per_m: HEADINGS.map(() => DENSE_PERIODS.map(() => 1)),
    pitch_deg_per_m: HEADINGS.map(() => DENSE_PERIODS.map((t) => (t <= 9 ? 0 : t >= 10 ? 3 : 3 * (t - 9)))),
  },
};

const f = (xs: number[]) => Float64Array.from(xs);
const HS = [1, 2, NaN, 1.5];
const TP = [4, 4, 4, 20];

const series: SiteSeries = {
  timeMs: f([0, 1, 2, 3].map((h) => h * 3_600_000)),
  hsM: f(HS),
  tpS: f(TP),
  bedVelocityLinearMps: f([0, 0, 0, 0]),
  bedVelocitySoulsbyMps: f([0, 0, 0, 0]),
  windMps: f([5, 5, 5, 5]),
  responsePartitions: [{ kind: 'windSea', hsM: f(HS), tpS: f(TP), dirDeg: f([10, 10, 10, 10]) }],
};

// TPOP 6 h + TC 2 h: the first row of the alpha table (TPOP up to 12 h).
const op: OperationSpec = {
  tpopH: 6,
  tcH: 2,
  weatherRestricted: true,
  vessel: { raos: TABLE, headingDeg: 0 },
  limits: {
    responses: [
      { response: 'heave_m_per_m', statistic: 'significant', max: 2 },
      { response: 'pitch_deg_per_m', statistic: 'significant', max: 4 },
    ],
  },
};

describe('the governing response per hour', () => {
  const g = governingResponseSeries(series, op, compileLimits(op, DEFAULT_ALPHA_TABLE, true));

  it('is heave in a short sea, at R_s = Hs/2 exactly against its limit', () => {
    // Tp 4 s: the JONSWAP spectrum has practically no energy at periods of 9 s and more
    // (omega below 0.44 omega_p, where the Pierson-Moskowitz factor exp(-1.25 x^-4) is about e^-32), so pitch is nil.
    expect(g.governing[0]).toBe(0);
    expect(g.value[0]).toBeCloseTo(1 / 2, 9); // R_s = Hs/2 for an RAO of 1 (docs/domain.md#vessel-response)
    expect(g.ratio[0]).toBeCloseTo(0.5 / 2, 9);
    expect(g.governing[1]).toBe(0);
    expect(g.ratio[1]).toBeCloseTo(1 / 2, 9);
  });

  it('gives the forecast limit as alpha at the equivalent Hs limit Hs * R_lim / R', () => {
    // Hs_eq = 1 m * 2 m / 0.5 m = 4 m; the default table's first row at 4 m is 0.79
    // (DNV-ST-N001's base case for waves, from memory, as docs/domain.md#weather-restricted gives it).
    expect(g.forecastRatio[0]).toBeCloseTo(0.79, 9);
    // Hs 2 m: R = 1 m, Hs_eq = 4 m again (R scales with Hs).
    expect(g.forecastRatio[1]).toBeCloseTo(0.79, 9);
  });

  it('has no governing response where a needed value is missing', () => {
    expect(g.governing[2]).toBe(-1);
    expect(Number.isNaN(g.ratio[2])).toBe(true);
    expect(Number.isNaN(g.forecastRatio[2])).toBe(true);
  });

  it('is pitch in a long swell-like sea', () => {
    // Tp 20 s, Hs 1.5 m: heave R_s = 0.75 m (ratio 0.375); pitch at most 3 deg/m x Hs/2 = 2.25 deg
    // (ratio at most 0.5625), and most of the energy lies above 10 s, where the RAO is 3 deg/m
    // (the share of m0 below 10 s, omega above 2 omega_p, is a few per cent of a JONSWAP spectrum).
    expect(g.governing[3]).toBe(1);
    expect(g.value[3]).toBeLessThanOrEqual(2.25 + 1e-9);
    expect(g.value[3]).toBeGreaterThan(0.9 * 2.25);
    expect(g.ratio[3]).toBeCloseTo(g.value[3] / 4, 12);
  });
});
