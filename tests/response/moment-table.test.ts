/**
 * The per-unit-Hs moment tables (shared/response/moment-table.ts) against the direct integration
 * they stand in for (shared/response/response.ts responseMoments). docs/domain.md#vessel-response
 * allows responses per unit Hs tabulated on a (Tp, relative direction) grid per vessel, spreading
 * and gamma only if the interpolation error stays below 0.5 % against direct integration; that
 * bound is the check here. Seas are drawn with a fixed seed over the demo's invented vessels, every
 * response, both partition kinds, the DNV gamma over its whole range (1-5), Tp across and beyond
 * the RAO tables' periods (3-20 s) and the tables' own range (1-40 s), and the relative direction
 * all round, the wrap at 360 deg included.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  createMomentTable,
  DEFAULT_RESPONSE_SEA,
  dnvGamma,
  MOMENT_GRID,
  momentTableLookup,
  prepareRao,
  responseMoments,
  tabulatedMomentSeries,
  tabulatedResponseMoments,
  type MomentGrid,
  type PreparedRao,
  type ResponseMoments,
  type SeaPartition,
  type SeaPartitionSeries,
} from '../../shared/response';
import { DEMO_VESSELS } from '../../seed/demo-vessels';

/** The bound of docs/domain.md#vessel-response. */
const BOUND = 0.005;

/**
 * Hs of a wind sea whose DNV-RP-C205 gamma (shared/response/jonswap.ts dnvGamma, from memory) is
 * `gamma` at this Tp: gamma = exp(5.75 - 1.15 Tp / sqrt(Hs)) solved for Hs; gamma 5 (1) at the ends
 * of the rule's band, r = 3.6 (5).
 */
function hsForGamma(tpS: number, gamma: number): number {
  const r = gamma >= 5 ? 3.6 : gamma <= 1 ? 5 : (5.75 - Math.log(gamma)) / 1.15;
  return (tpS / r) ** 2;
}

interface Sea {
  vessel: number;
  kind: SeaPartition['kind'];
  gamma: number;
  tpS: number;
  thetaDeg: number;
  headingDeg: number;
}

const sea = fc.record({
  vessel: fc.integer({ min: 0, max: DEMO_VESSELS.length - 1 }),
  kind: fc.constantFrom<SeaPartition['kind']>('windSea', 'swell'),
  // The whole DNV band, its ends held with their own weight (gamma exactly 1 or 5).
  gamma: fc.oneof(fc.double({ min: 1, max: 5, noNaN: true }), fc.constantFrom(1, 5)),
  // Across and beyond the RAO tables' 3-20 s, and past the moment tables' 40 s (direct there).
  tpS: fc.oneof(fc.double({ min: 1, max: 45, noNaN: true }), fc.double({ min: 2.5, max: 22, noNaN: true })),
  // Relative directions all round, with extra weight just either side of the wrap at 360.
  thetaDeg: fc.oneof(fc.double({ min: 0, max: 359.999, noNaN: true }), fc.double({ min: 358.5, max: 361.5, noNaN: true })),
  headingDeg: fc.double({ min: 0, max: 359.999, noNaN: true }),
});

const SEAS: Sea[] = fc.sample(sea, { numRuns: 600, seed: 20261204 });

/** The sea's partition: its direction from the vessel heading and the relative direction. */
function partitionOf(s: Sea): SeaPartition {
  const tpS = s.tpS;
  const hsM = s.kind === 'windSea' ? hsForGamma(tpS, s.gamma) : 1.5;
  return { kind: s.kind, hsM, tpS, dirDeg: (s.headingDeg + s.thetaDeg) % 360 };
}

/**
 * Relative error of a tabulated m0 and m2 against the direct ones, judged on the response's own
 * size with a floor of 0.01 % of the largest m0 (m2) the sea could give through this RAO
 * (Hs^2/16 times max |RAO|^2; the frequency grid reaches 6 omega_p), as the spread-table test does:
 * near a zero of the RAO the response itself is negligible.
 */
function relativeError(rao: PreparedRao, name: string, p: SeaPartition, tab: ResponseMoments, direct: ResponseMoments): number {
  const maxAmp2 = Math.max(...rao.amplitudes[name]) ** 2;
  const m0Max = ((p.hsM * p.hsM) / 16) * maxAmp2;
  const m2Max = m0Max * ((12 * Math.PI) / p.tpS) ** 2;
  const e0 = Math.abs(tab.m0 - direct.m0) / Math.max(direct.m0, 1e-4 * m0Max);
  const e2 = Math.abs(tab.m2 - direct.m2) / Math.max(direct.m2, 1e-4 * m2Max);
  return Math.max(e0, e2);
}

/** Largest relative error over the seas of a tabulation `tab` (null: not tabulated, skipped). */
function maxError(tab: (rao: PreparedRao, name: string, p: SeaPartition, headingDeg: number) => ResponseMoments | null): {
  max: number;
  compared: number;
} {
  let max = 0;
  let compared = 0;
  for (const s of SEAS) {
    const rao = prepareRao(DEMO_VESSELS[s.vessel].raos);
    const p = partitionOf(s);
    for (const name of rao.names) {
      const t = tab(rao, name, p, s.headingDeg);
      if (!t) continue;
      const direct = responseMoments(rao, name, s.headingDeg, [p], DEFAULT_RESPONSE_SEA);
      max = Math.max(max, relativeError(rao, name, p, t, direct));
      compared++;
    }
  }
  return { max, compared };
}

/** Moments from a table of the given grid (wind sea: the DNV layers; swell: gamma 5), null outside it. */
function fromGrid(grid: MomentGrid) {
  const tables = new Map<string, ReturnType<typeof createMomentTable>>();
  const unit = new Float64Array(2);
  return (rao: PreparedRao, name: string, p: SeaPartition, headingDeg: number): ResponseMoments | null => {
    const spreading = p.kind === 'swell' ? DEFAULT_RESPONSE_SEA.swellSpreading : DEFAULT_RESPONSE_SEA.windSeaSpreading;
    const key = `${rao.names.join()}|${name}|${p.kind}`;
    let t = tables.get(key);
    if (!t) tables.set(key, (t = createMomentTable(rao, name, spreading, p.kind === 'swell' ? 5 : 'dnv', grid)));
    const gamma = p.kind === 'swell' ? 5 : dnvGamma(p.hsM, p.tpS);
    if (!momentTableLookup(t, p.tpS, p.dirDeg - headingDeg, gamma, unit)) return null;
    const wp2 = ((2 * Math.PI) / p.tpS) ** 2;
    return { m0: p.hsM * p.hsM * unit[0], m2: p.hsM * p.hsM * wp2 * unit[1], m0Outside: 0 };
  };
}

describe('per-unit-Hs moment tables', () => {
  it('the seas reach the DNV band ends and the wrap at 360 deg (the sample covers what it claims)', () => {
    const gammas = SEAS.filter((s) => s.kind === 'windSea').map((s) => dnvGamma(partitionOf(s).hsM, s.tpS));
    expect(Math.min(...gammas)).toBe(1);
    // The rule steps from exp(5.75 - 1.15 * 3.6) = 5.003 down to 5 at r = 3.6.
    expect(Math.max(...gammas)).toBeGreaterThanOrEqual(5);
    expect(gammas.filter((g) => g === 5).length).toBeGreaterThan(0);
    expect(gammas.some((g) => g > 1.5 && g < 4.5)).toBe(true);
    expect(SEAS.some((s) => s.thetaDeg > 359.5 && s.thetaDeg < 360)).toBe(true);
    expect(SEAS.some((s) => s.thetaDeg >= 360 && s.thetaDeg < 360.5)).toBe(true);
    expect(SEAS.some((s) => s.tpS < 3) && SEAS.some((s) => s.tpS > 20 && s.tpS < 40) && SEAS.some((s) => s.tpS > 40)).toBe(true);
  });

  it('keeps m0 and m2 within 0.5 % of the direct integration (the engine path, tabulatedResponseMoments)', () => {
    const { max, compared } = maxError((rao, name, p, headingDeg) =>
      tabulatedResponseMoments(rao, name, headingDeg, [p], DEFAULT_RESPONSE_SEA),
    );
    expect(compared).toBe(SEAS.length * 4);
    // A real, computed bound: the tables are not the direct integration, so the error is above 0.
    expect(max).toBeGreaterThan(0);
    expect(max).toBeLessThan(BOUND);
  });

  it('keeps m0 and m2 within 0.5 % from the table alone (no direct fallback), and a coarse table would not', () => {
    const fine = maxError(fromGrid(MOMENT_GRID));
    expect(fine.compared).toBeGreaterThan(SEAS.length * 3);
    expect(fine.max).toBeGreaterThan(0);
    expect(fine.max).toBeLessThan(BOUND);
    // 10 % steps in Tp, 15 deg in theta and gamma linear between 1 and 5: well past the bound.
    const coarse = maxError(fromGrid({ lnTpStep: 0.1, thetaStepDeg: 15, gammaNodes: 2 }));
    expect(coarse.max).toBeGreaterThan(BOUND);
  });

  it('interpolates the DNV gamma within 0.05 % of a table worked at that very gamma', () => {
    const rao = prepareRao(DEMO_VESSELS[1].raos);
    const dnv = createMomentTable(rao, 'roll_deg_per_m', 2, 'dnv');
    const a = new Float64Array(2);
    const b = new Float64Array(2);
    let max = 0;
    for (const gamma of [1.1, 1.7, 2.3, 3.3, 4.2, 4.9]) {
      const fixed = createMomentTable(rao, 'roll_deg_per_m', 2, gamma);
      for (const tp of [4, 6.5, 9, 13]) {
        for (const theta of [10, 75, 190]) {
          expect(momentTableLookup(dnv, tp, theta, gamma, a)).toBe(true);
          expect(momentTableLookup(fixed, tp, theta, gamma, b)).toBe(true);
          max = Math.max(max, Math.abs(a[0] - b[0]) / b[0], Math.abs(a[1] - b[1]) / b[1]);
        }
      }
    }
    expect(max).toBeGreaterThan(0);
    expect(max).toBeLessThan(5e-4);
  });

  it('refuses what it cannot tabulate: a gamma outside the layers, a Tp outside the table, a bad grid', () => {
    const rao = prepareRao(DEMO_VESSELS[0].raos);
    const t = createMomentTable(rao, 'roll_deg_per_m', 2, 'dnv');
    const out = new Float64Array(2);
    expect(momentTableLookup(t, 8, 30, 6, out)).toBe(false);
    expect(momentTableLookup(t, 0.5, 30, 3, out)).toBe(false);
    expect(momentTableLookup(t, 50, 30, 3, out)).toBe(false);
    expect(() => createMomentTable(rao, 'roll_deg_per_m', 2, 'dnv', { lnTpStep: 0.01, thetaStepDeg: 7, gammaNodes: 6 })).toThrow(
      /theta step 7/,
    );
    expect(() => createMomentTable(rao, 'no_such', 2, 5)).toThrow(/no RAO for no_such/);
  });
});

describe('the series path of the moment tables', () => {
  /**
   * tabulatedMomentSeries (the engine's path for long series) must give what the record path
   * tabulatedResponseMoments gives record by record: the same tables and arithmetic, only
   * arranged for speed (an internal consistency check; the record path is held to the direct
   * integration above). The series mixes what the fast path must step aside for: Hs 0, missing
   * values, Tp outside the tables, the DNV gamma at both ends of its band and inside it, and
   * relative directions either side of the wrap at 360 deg.
   */
  it('equals the record path record by record, across both partition kinds and gamma rules', () => {
    const n = 4000;
    const rnd = fc.sample(fc.double({ min: 0, max: 1, noNaN: true }), { numRuns: n * 6, seed: 7 });
    let at = 0;
    const next = () => rnd[at++ % rnd.length];
    const series = (kind: SeaPartition['kind']): SeaPartitionSeries => {
      const s = { kind, hsM: new Float64Array(n), tpS: new Float64Array(n), dirDeg: new Float64Array(n) };
      for (let i = 0; i < n; i++) {
        const u = next();
        s.hsM[i] = i % 97 === 0 ? 0 : i % 89 === 0 ? NaN : 0.05 + 4 * next();
        s.tpS[i] = i % 83 === 0 ? 0.5 + 0.4 * u : i % 79 === 0 ? 45 : 2 + 18 * u;
        s.dirDeg[i] = i % 73 === 0 ? NaN : 360 * next();
      }
      return s;
    };
    const parts = [series('windSea'), series('swell')];
    for (const settings of [DEFAULT_RESPONSE_SEA, { ...DEFAULT_RESPONSE_SEA, windSeaGamma: 2.5 }]) {
      for (const [v, name, heading] of [
        [0, 'roll_deg_per_m', 0],
        [1, 'pitch_deg_per_m', 359.5],
        [1, 'roll_deg_per_m', 181],
      ] as const) {
        const rao = prepareRao(DEMO_VESSELS[v].raos);
        const m0 = new Float64Array(n);
        const m2 = new Float64Array(n);
        tabulatedMomentSeries(rao, name, heading, parts, settings, m0, m2);
        let compared = 0;
        for (let i = 0; i < n; i++) {
          const rec = parts.map((p) => ({ kind: p.kind, hsM: p.hsM[i], tpS: p.tpS[i], dirDeg: p.dirDeg[i] }));
          const one = tabulatedResponseMoments(rao, name, heading, rec, settings);
          if (one.m0 !== one.m0) {
            expect(m0[i]).toBeNaN();
            expect(m2[i]).toBeNaN();
            continue;
          }
          expect(Math.abs(m0[i] - one.m0)).toBeLessThanOrEqual(1e-9 * one.m0);
          expect(Math.abs(m2[i] - one.m2)).toBeLessThanOrEqual(1e-9 * one.m2);
          compared++;
        }
        expect(compared).toBeGreaterThan(n * 0.9);
      }
    }
  });
});
