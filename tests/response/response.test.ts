import { describe, expect, it } from 'vitest';
import {
  DEFAULT_RESPONSE_SEA,
  dnvGamma,
  GRID_X_MAX,
  GRID_X_MIN,
  jonswapWeights,
  mostProbableMaximum,
  prepareRao,
  raoSquaredAt,
  responseMoments,
  significantAmplitude,
  spreadingBins,
  summariseResponse,
  type ResponseSeaSettings,
  type SeaPartition,
} from '../../shared/response';
import { DENSE_PERIODS, tableOf } from './raos';

const LONG: ResponseSeaSettings = { ...DEFAULT_RESPONSE_SEA, windSeaSpreading: 'long-crested', swellSpreading: 'long-crested' };
const wind = (hsM: number, tpS: number, dirDeg = 0): SeaPartition => ({ kind: 'windSea', hsM, tpS, dirDeg });
const swell = (hsM: number, tpS: number, dirDeg = 0): SeaPartition => ({ kind: 'swell', hsM, tpS, dirDeg });

/**
 * JONSWAP written again here, independently of shared/response (Hasselmann et al. 1973:
 * PM shape omega^-5 exp(-1.25 (omega/omega_p)^-4) times gamma^r, sigma 0.07 / 0.09), integrated by
 * composite Simpson's rule over [lo, hi] rad/s.
 */
function simpsonJonswapMoment(tpS: number, gamma: number, k: number, lo: number, hi: number): number {
  const wp = (2 * Math.PI) / tpS;
  const s = (w: number) => {
    const sigma = w <= wp ? 0.07 : 0.09;
    return (
      Math.pow(w, -5) * Math.exp(-1.25 * Math.pow(w / wp, -4)) * Math.pow(gamma, Math.exp(-((w - wp) ** 2) / (2 * sigma * sigma * wp * wp)))
    );
  };
  const n = 20000;
  const h = (hi - lo) / n;
  let acc = 0;
  for (let i = 0; i <= n; i++) {
    const w = lo + i * h;
    const c = i === 0 || i === n ? 1 : i % 2 ? 4 : 2;
    acc += c * Math.pow(w, k) * s(w);
  }
  return (acc * h) / 3;
}

describe('JONSWAP normalisation (docs/domain.md#vessel-response)', () => {
  it.each([1, 2, 3.3, 5, 7])('m0 = Hs^2/16 on the grid for gamma %s (definition of Hm0 = 4 sqrt(m0), DNV-RP-C205 from memory)', (gamma) => {
    const w = jonswapWeights(gamma);
    const sum = w.reduce((a, b) => a + b, 0);
    expect(sum * 2.5 ** 2).toBeCloseTo(2.5 ** 2 / 16, 12);
  });

  it('the DNV-RP-C205 gamma rule (from memory): 5 for Tp/sqrt(Hs) <= 3.6, exp(5.75 - 1.15 r) between, 1 from 5 on', () => {
    expect(dnvGamma(4, 7)).toBe(5); // r = 3.5
    expect(dnvGamma(4, 8.6)).toBeCloseTo(Math.exp(5.75 - 1.15 * 4.3), 12); // r = 4.3, by hand exp(0.805) = 2.2367
    expect(dnvGamma(4, 8.6)).toBeCloseTo(2.2367, 3);
    expect(dnvGamma(1, 6)).toBe(1);
  });
});

describe('spreading (docs/domain.md#vessel-response)', () => {
  it('cos^n bins of 5 deg sum to 1 and are symmetric; long-crested is one bin', () => {
    for (const n of [2, 8]) {
      const b = spreadingBins(n);
      expect(b.weights.reduce((a, c) => a + c, 0)).toBeCloseTo(1, 12);
      expect(b.offsetsDeg[1] - b.offsetsDeg[0]).toBe(5);
      expect(b.weights[0]).toBeCloseTo(b.weights[b.weights.length - 1], 15);
    }
    expect(Array.from(spreadingBins('long-crested').weights)).toEqual([1]);
  });
});

describe('response statistics (docs/domain.md#vessel-response)', () => {
  it('an RAO of 1 for heave at every period and heading gives R_s = Hs/2 exactly (heave follows the surface: m0_R = m0 = Hs^2/16)', () => {
    const table = tableOf('heave_m_per_m', [0, 90, 180], [2, 30], () => 1);
    const rao = prepareRao(table);
    for (const settings of [DEFAULT_RESPONSE_SEA, LONG]) {
      const m = responseMoments(rao, 'heave_m_per_m', 37, [wind(2.4, 7, 200)], settings);
      expect(significantAmplitude(m.m0)).toBeCloseTo(1.2, 12);
    }
    // Two partitions: energies add (m0 = sum of Hs_i^2/16), so R_s = sqrt(1.5^2 + 2^2)/2 = 1.25 by hand.
    const m = responseMoments(rao, 'heave_m_per_m', 0, [wind(1.5, 6, 10), swell(2, 14, 250)], DEFAULT_RESPONSE_SEA);
    expect(significantAmplitude(m.m0)).toBeCloseTo(1.25, 12);
  });

  it.each([
    [2, 6, 3.3],
    [1, 12, 5],
    [3, 9, 1],
  ])(
    'an RAO of omega (surface particle vertical velocity, deep water) gives m0_R = m2 of the spectrum: Hs %s m, Tp %s s, gamma %s',
    (hs, tp, gamma) => {
      // Linear wave theory (e.g. DNV-RP-C205, from memory): vertical velocity amplitude = omega * a.
      const table = tableOf('vel_z_m_s_per_m@deck', [0, 180], DENSE_PERIODS, (t) => (2 * Math.PI) / t);
      const m = responseMoments(prepareRao(table), 'vel_z_m_s_per_m@deck', 0, [swell(hs, tp, 0)], { ...LONG, swellGamma: gamma });
      const wp = (2 * Math.PI) / tp;
      const [lo, hi] = [GRID_X_MIN * wp, GRID_X_MAX * wp]; // the grid of docs/domain.md#vessel-response
      const m0 = simpsonJonswapMoment(tp, gamma, 0, lo, hi);
      const m2 = ((hs * hs) / 16) * (simpsonJonswapMoment(tp, gamma, 2, lo, hi) / m0);
      expect(m.m0).toBeRelClose(m2, 5e-3);
    },
  );

  it('long-crested head seas with a roll RAO of 0 at 0 deg give no roll; beam seas give the peak', () => {
    // Roll RAO: 0 in head and following seas, peaking at 9 s in beam seas (invented, a ~70 m vessel; common practice, no source).
    const roll = (t: number, h: number) => (6 * Math.abs(Math.sin((h * Math.PI) / 180))) / (1 + ((t - 9) / 1.2) ** 2);
    const rao = prepareRao(tableOf('roll_deg_per_m', [0, 30, 60, 90, 120, 150, 180], DENSE_PERIODS, roll));
    const head = responseMoments(rao, 'roll_deg_per_m', 120, [swell(2, 9, 120)], LONG);
    expect(head.m0).toBe(0);
    const beam = responseMoments(rao, 'roll_deg_per_m', 120, [swell(2, 9, 210)], LONG);
    const quartering = responseMoments(rao, 'roll_deg_per_m', 120, [swell(2, 9, 150)], LONG);
    expect(beam.m0).toBeGreaterThan(quartering.m0);
    // At the peak period with a narrow swell R_s is of the order of the RAO peak times Hs/2 = 6 deg (by hand); less, the spectrum is wider than the RAO peak.
    expect(significantAmplitude(beam.m0)).toBeGreaterThan(2);
    expect(significantAmplitude(beam.m0)).toBeLessThan(6);
    // A spread sea in head seas finds some roll (energy off the bow).
    expect(responseMoments(rao, 'roll_deg_per_m', 120, [swell(2, 9, 120)], DEFAULT_RESPONSE_SEA).m0).toBeGreaterThan(0);
  });

  it('R_mpm = sqrt(2 m0 ln(tau/Tz)) (Longuet-Higgins 1952, Rayleigh maxima): checked by hand', () => {
    // m0 = 1, m2 = 4 pi^2 / 100 -> Tz = 10 s; 3 h = 1080 cycles; sqrt(2 ln 1080) = sqrt(13.9694) = 3.7376
    expect(mostProbableMaximum(1, (4 * Math.PI ** 2) / 100, 3)).toBeCloseTo(Math.sqrt(2 * Math.log(1080)), 10);
    expect(Math.sqrt(2 * Math.log(1080))).toBeCloseTo(3.7376, 4);
  });

  it('a missing Hs, Tp or direction gives no data (NaN); Hs 0 adds nothing', () => {
    const rao = prepareRao(tableOf('heave_m_per_m', [0, 180], [2, 30], () => 1));
    expect(responseMoments(rao, 'heave_m_per_m', 0, [wind(NaN, 7)], DEFAULT_RESPONSE_SEA).m0).toBeNaN();
    expect(responseMoments(rao, 'heave_m_per_m', 0, [swell(1, 7, NaN)], DEFAULT_RESPONSE_SEA).m0).toBeNaN();
    expect(responseMoments(rao, 'heave_m_per_m', 0, [wind(0, NaN), wind(2, 7)], DEFAULT_RESPONSE_SEA).m0).toBeCloseTo(0.25, 12);
  });

  it('warns when more than 1 % of m0 comes from outside the table (end values held)', () => {
    const table = tableOf('heave_m_per_m', [0, 180], [8, 10], () => 1);
    const s = summariseResponse(table, 0, [wind(2, 9, 0)], DEFAULT_RESPONSE_SEA);
    expect(s.responses[0].significant).toBeCloseTo(1, 12); // held at 1 outside: still Hs/2
    expect(s.responses[0].outsideShare).toBeGreaterThan(0.01);
    expect(s.responses[0].warning).toMatch(/outside the RAO table/);
  });
});

describe('RAO interpolation (docs/domain.md#vessel-response)', () => {
  const table = {
    periodsS: [5, 10],
    headingsDeg: [0, 90, 180, 270],
    responses: {
      heave_m_per_m: [
        [1, 2],
        [3, 4],
        [5, 6],
        [7, 8],
      ],
    },
  };
  const amp = (t: number, h: number) => Math.sqrt(raoSquaredAt(prepareRao(table), 'heave_m_per_m', t, h));

  it('linear in period and heading between points (by hand)', () => {
    expect(amp(7.5, 0)).toBeCloseTo(1.5, 12);
    expect(amp(7.5, 45)).toBeCloseTo(2.5, 12);
    expect(amp(5, 135)).toBeCloseTo(4, 12);
  });
  it('heading periodic: between 270 and 360 = 0 deg, and negative or above 360 wrapped', () => {
    expect(amp(5, 315)).toBeCloseTo(4, 12); // halfway from 7 to 1
    expect(amp(5, -45)).toBeCloseTo(4, 12);
    expect(amp(5, 405)).toBeCloseTo(2, 12);
  });
  it('end values held outside the period range', () => {
    expect(amp(2, 0)).toBe(1);
    expect(amp(30, 90)).toBe(4);
  });
  it('a 0-180 deg table is mirrored: 270 deg reads 90 deg, 315 reads 45', () => {
    // Roll in beam seas (90 deg) only: 4 deg/m at 5 s, 8 deg/m at 10 s.
    const r = prepareRao(tableOf('roll_deg_per_m', [0, 90, 180], [5, 10], (t, h) => (h === 90 ? 0.8 * t : 0)));
    expect(Math.sqrt(raoSquaredAt(r, 'roll_deg_per_m', 5, 270))).toBeCloseTo(4, 12);
    expect(Math.sqrt(raoSquaredAt(r, 'roll_deg_per_m', 10, 315))).toBeCloseTo(4, 12);
  });
  it('a table with both 0 and 360 deg uses 0 deg once', () => {
    // Heave 1 m/m at 0 and 360 deg, 3 m/m at 180 deg.
    const full = tableOf('heave_m_per_m', [0, 180, 360], [5, 10], (_, h) => (h === 180 ? 3 : 1));
    expect(Math.sqrt(raoSquaredAt(prepareRao(full), 'heave_m_per_m', 5, 270))).toBeCloseTo(2, 12);
  });
});
