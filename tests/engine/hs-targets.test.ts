// Hs limits on a target (total, swell, wind sea, long-period) and excluded Tp bands over partitions
// (docs/domain.md#partitions), against a brute-force evaluation written here from the definitions:
// each target is sqrt(sum Hs_i^2) over the partitions it takes (energies add: common practice, no
// source); an unknown partition value is "no data" (docs/domain.md#convention-7); limits are
// inclusive and bands closed (docs/domain.md#convention-6); a band tests the worksite Tp and every
// partition whose Hs is at least the threshold (default 0.2 m). Alpha on a target uses the total's
// table (docs/domain.md#partitions), checked by hand against the default table (from memory of
// DNV-ST-N001's base case, as docs/domain.md#weather-restricted gives it).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  DEFAULT_ALPHA_TABLE,
  STATUS,
  evaluateHours,
  evaluateStatus,
  evaluateStatusMany,
  operationLimitsSchema,
  type HsTarget,
  type OperationSpec,
  type SiteSeries,
} from '../../shared/engine';
import { explainHour } from '../../shared/engine/explain-hour';
import { HOUR, T0 } from './series-factory';

type Part = { hs: number; tp: number };
interface Rec {
  hs: number;
  tp: number;
  parts: { windSea: Part; swell1: Part; swell2: Part };
}

const NAMES = ['windSea', 'swell1', 'swell2'] as const;

function toSeries(recs: Rec[]): SiteSeries {
  const col = (g: (r: Rec) => number) => Float64Array.from(recs.map(g));
  const part = (k: (typeof NAMES)[number]) => ({ hsM: col((r) => r.parts[k].hs), tpS: col((r) => r.parts[k].tp) });
  return {
    timeMs: Float64Array.from(recs.map((_, i) => T0 + i * HOUR)),
    hsM: col((r) => r.hs),
    tpS: col((r) => r.tp),
    bedVelocityLinearMps: new Float64Array(recs.length),
    bedVelocitySoulsbyMps: new Float64Array(recs.length),
    windMps: new Float64Array(recs.length),
    partitions: { windSea: part('windSea'), swell1: part('swell1'), swell2: part('swell2') },
  };
}

/** The value a target takes, by the definition; null = unknown. */
function bruteTarget(r: Rec, target: HsTarget, tStar: number): number | null {
  if (target === 'total') return Number.isNaN(r.hs) ? null : r.hs;
  const takes = target === 'swell' ? ['swell1', 'swell2'] : target === 'windSea' ? ['windSea'] : [...NAMES];
  let sum = 0;
  for (const k of takes as (typeof NAMES)[number][]) {
    const p = r.parts[k];
    if (Number.isNaN(p.hs)) return null;
    if (p.hs === 0) continue;
    if (target === 'longPeriod') {
      if (Number.isNaN(p.tp)) return null;
      if (p.tp < tStar) continue;
    }
    sum += p.hs * p.hs;
  }
  return Math.sqrt(sum);
}

/** Status at OPLIM (no alpha) by the definitions, one limit at a time. */
function bruteStatus(r: Rec, op: OperationSpec): number {
  const l = op.limits;
  let missing = false;
  let broken = false;
  if (l.hsMax != null) {
    if (Number.isNaN(r.hs)) missing = true;
    else if (r.hs > l.hsMax) broken = true;
  }
  for (const t of l.hsTargets ?? []) {
    const v = bruteTarget(r, t.target, t.minPeriodS ?? NaN);
    if (v === null) missing = true;
    else if (v > t.max) broken = true;
  }
  const thr = l.tpExcludedMinHs ?? 0.2;
  for (const [from, to] of l.tpExcluded ?? []) {
    if (Number.isNaN(r.tp)) missing = true;
    const tps = [r.tp, ...NAMES.filter((k) => r.parts[k].hs >= thr && r.parts[k].hs > 0).map((k) => r.parts[k].tp)];
    if (tps.some((tp) => tp >= from && tp <= to)) broken = true;
  }
  if (missing) return STATUS.NO_DATA;
  return broken ? STATUS.NOT_WORKABLE : STATUS.WORKABLE;
}

const hsArb = fc.oneof(
  { weight: 6, arbitrary: fc.constantFrom(0.3, 0.8, 1, 1.2, 1.5, 2).map((x) => x) },
  { weight: 2, arbitrary: fc.constant(0) },
  { weight: 1, arbitrary: fc.constant(NaN) },
  { weight: 3, arbitrary: fc.double({ min: 0.05, max: 3, noNaN: true }) },
);
const tpArb = fc.oneof(fc.constantFrom(6, 8, 10, 12, 14), fc.double({ min: 3, max: 18, noNaN: true }));
const partArb = fc.record({ hs: hsArb, tp: tpArb });
const recArb: fc.Arbitrary<Rec> = fc.record({ windSea: partArb, swell1: partArb, swell2: partArb }).map((parts) => {
  const known = NAMES.every((k) => !Number.isNaN(parts[k].hs));
  const hs = known ? Math.hypot(parts.windSea.hs, parts.swell1.hs, parts.swell2.hs) : 1.1;
  const best = NAMES.reduce((a, k) => (parts[k].hs > parts[a].hs ? k : a), 'windSea' as (typeof NAMES)[number]);
  return { hs, tp: parts[best].tp, parts };
});

const targetArb = fc.oneof(
  fc.record({ target: fc.constantFrom('total' as const, 'swell' as const, 'windSea' as const), max: fc.constantFrom(0.8, 1, 1.5, 2) }),
  fc.record({ target: fc.constant('longPeriod' as const), minPeriodS: fc.constantFrom(8, 10, 12), max: fc.constantFrom(0.8, 1, 1.5) }),
);
const opArb: fc.Arbitrary<OperationSpec> = fc.record({
  tpopH: fc.constantFrom(6, 12, 24),
  tcH: fc.constantFrom(0, 6),
  weatherRestricted: fc.boolean(),
  limits: fc
    .record(
      {
        hsMax: fc.constantFrom(1.5, 2.5),
        hsTargets: fc.array(targetArb, { minLength: 1, maxLength: 3 }),
        tpExcluded: fc.array(fc.constantFrom<[number, number]>([7, 9], [11, 13], [13.5, 16]), { minLength: 1, maxLength: 2 }),
        tpExcludedMinHs: fc.constantFrom(0.2, 0.5, 1),
      },
      { requiredKeys: ['hsTargets'] },
    )
    .map((l) => l),
});

describe('Hs limits on targets and bands over partitions, against a brute-force evaluation', () => {
  it('every path gives the brute-force status at OPLIM', () => {
    fc.assert(
      fc.property(fc.array(recArb, { minLength: 1, maxLength: 40 }), fc.array(opArb, { minLength: 1, maxLength: 4 }), (recs, ops) => {
        const series = toSeries(recs);
        const opts = { alpha: false, alphaTable: DEFAULT_ALPHA_TABLE };
        const many = evaluateStatusMany(series, ops, opts);
        ops.forEach((op, o) => {
          expect(operationLimitsSchema.safeParse(op.limits).success).toBe(true);
          const expected = recs.map((r) => bruteStatus(r, op));
          expect(Array.from(evaluateStatus(series, op, opts))).toEqual(expected);
          expect(Array.from(evaluateHours(series, op, opts).status)).toEqual(expected);
          expect(Array.from(many[o])).toEqual(expected);
          recs.forEach((r, i) => {
            const words = {
              no_data: STATUS.NO_DATA,
              not_workable: STATUS.NOT_WORKABLE,
              marginal: STATUS.MARGINAL,
              workable: STATUS.WORKABLE,
            };
            const hour = explainHour(
              {
                hsM: r.hs,
                tpS: r.tp,
                bedVelocityLinearMps: 0,
                bedVelocitySoulsbyMps: 0,
                windMps: 0,
                partitions: {
                  windSea: { hsM: r.parts.windSea.hs, tpS: r.parts.windSea.tp },
                  swell1: { hsM: r.parts.swell1.hs, tpS: r.parts.swell1.tp },
                  swell2: { hsM: r.parts.swell2.hs, tpS: r.parts.swell2.tp },
                },
              },
              op,
              DEFAULT_ALPHA_TABLE,
              { alpha: false },
            );
            expect(words[hour.status]).toBe(expected[i]);
          });
        });
      }),
      { numRuns: 150 },
    );
  });

  it('a target limit on a series without partitions is no data', () => {
    const series = toSeries([
      { hs: 1, tp: 10, parts: { windSea: { hs: 1, tp: 10 }, swell1: { hs: 0, tp: NaN }, swell2: { hs: 0, tp: NaN } } },
    ]);
    delete series.partitions;
    const op: OperationSpec = { tpopH: 12, tcH: 0, weatherRestricted: true, limits: { hsTargets: [{ target: 'swell', max: 1 }] } };
    expect(Array.from(evaluateStatus(series, op, { alphaTable: DEFAULT_ALPHA_TABLE }))).toEqual([STATUS.NO_DATA]);
  });

  it('alpha applies to a swell limit with the total table (hand calculation)', () => {
    // TPOP 12 h, Hs limit 1.5 m: alpha between the 1 m (0.65) and 2 m (0.76) columns = 0.705;
    // OPWF = 1.5 * 0.705 = 1.0575 m (default table, from memory of DNV-ST-N001).
    const op: OperationSpec = { tpopH: 12, tcH: 0, weatherRestricted: true, limits: { hsTargets: [{ target: 'swell', max: 1.5 }] } };
    const swell = (hs: number): Rec => ({
      hs: Math.hypot(hs, 2),
      tp: 6,
      parts: { windSea: { hs: 2, tp: 6 }, swell1: { hs, tp: 14 }, swell2: { hs: 0, tp: NaN } },
    });
    const series = toSeries([swell(1.05), swell(1.06), swell(1.5), swell(1.51)]);
    const status = evaluateStatus(series, op, { alphaTable: DEFAULT_ALPHA_TABLE });
    expect(Array.from(status)).toEqual([STATUS.WORKABLE, STATUS.MARGINAL, STATUS.MARGINAL, STATUS.NOT_WORKABLE]);
    const check = explainHour(
      {
        hsM: series.hsM[1],
        tpS: 6,
        bedVelocityLinearMps: 0,
        bedVelocitySoulsbyMps: 0,
        windMps: 0,
        partitions: { windSea: { hsM: 2, tpS: 6 }, swell1: { hsM: 1.06, tpS: 14 }, swell2: { hsM: 0, tpS: NaN } },
      },
      op,
      DEFAULT_ALPHA_TABLE,
    ).checks[0];
    expect(check.opwf).toBeCloseTo(1.0575, 12);
    expect(check.drivenBy).toBe('swell1');
    expect(check.label).toContain('swell');
  });

  it('a resonant swell under a larger wind sea breaks an excluded band (docs/domain.md#partitions)', () => {
    const rec: Rec = {
      hs: Math.hypot(1.5, 0.4),
      tp: 6,
      parts: { windSea: { hs: 1.5, tp: 6 }, swell1: { hs: 0.4, tp: 12 }, swell2: { hs: 0, tp: NaN } },
    };
    const series = toSeries([rec]);
    const op = (minHs: number): OperationSpec => ({
      tpopH: 12,
      tcH: 0,
      weatherRestricted: true,
      limits: { tpExcluded: [[11, 13]], tpExcludedMinHs: minHs },
    });
    expect(evaluateStatus(series, op(0.2), { alphaTable: DEFAULT_ALPHA_TABLE })[0]).toBe(STATUS.NOT_WORKABLE);
    expect(evaluateStatus(series, op(0.5), { alphaTable: DEFAULT_ALPHA_TABLE })[0]).toBe(STATUS.WORKABLE);
    const ev = evaluateHours(series, op(0.2), { alphaTable: DEFAULT_ALPHA_TABLE });
    expect(ev.limiting[0]).toBe(5); // LIMIT.TP_BAND
  });

  it('the schema refuses a long-period limit without T* and T* on another target', () => {
    const bad1 = operationLimitsSchema.safeParse({ hsTargets: [{ target: 'longPeriod', max: 1 }] });
    expect(bad1.success).toBe(false);
    expect(JSON.stringify(bad1.error?.issues)).toContain('T*');
    const bad2 = operationLimitsSchema.safeParse({ hsTargets: [{ target: 'swell', minPeriodS: 10, max: 1 }] });
    expect(bad2.success).toBe(false);
    expect(operationLimitsSchema.safeParse({ hsTargets: [{ target: 'longPeriod', minPeriodS: 10, max: 1 }] }).success).toBe(true);
  });
});
