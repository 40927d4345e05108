// evaluateStatusMany (the one-pass path over several operations) against evaluateStatus (the general
// path, itself checked against a naive implementation of docs/domain.md#hourly-status in
// status-property.test.ts): the same status for every operation and record, hence the same usable
// windows and hindcast statistics, on random series and random limits drawn on the limits' edges.
// No outside figures here: the reference is the general path of this engine.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  DEFAULT_ALPHA_TABLE,
  calendarIndex,
  createStatusManyScratch,
  evaluateStatus,
  evaluateStatusMany,
  goStarts,
  monthlyStatistics,
  statusFastPathKnows,
  usableWindows,
  type OperationSpec,
  type SiteSeries,
} from '../../shared/engine';
import { HOUR, T0, makeSeries } from './series-factory';
import { aroundEdges as around, limitsArb, operationArb, round2, velocityArb as vel } from './limit-arbitraries';

const opArb = operationArb([0, 1, 6, 24]);

/** Values on the operations' own edges, next to them, anywhere, or missing. */
function seriesArb(ops: OperationSpec[]): fc.Arbitrary<SiteSeries> {
  const hsEdges = ops.flatMap((op) => [op.limits.hsMax ?? 1, ...(op.limits.hsTpCurve ?? []).map((p) => p[1])]);
  const tpEdges = ops.flatMap((op) => [
    op.limits.tpMin ?? 6,
    op.limits.tpMax ?? 12,
    ...(op.limits.hsTpCurve ?? []).map((p) => p[0]),
    ...(op.limits.tpExcluded ?? []).flat(),
  ]);
  const wind = fc.oneof(fc.constantFrom(8, 12, 15), fc.double({ min: 0, max: 20, noNaN: true }), fc.constant(NaN));
  return fc
    .array(fc.record({ hs: around(hsEdges, 0, 7), tp: around(tpEdges, 2, 22), lin: vel, soul: vel, wind }), {
      minLength: 1,
      maxLength: 120,
    })
    .map((recs) =>
      makeSeries({
        hsM: recs.map((r) => r.hs),
        tpS: recs.map((r) => r.tp),
        bedVelocityLinearMps: recs.map((r) => r.lin),
        bedVelocitySoulsbyMps: recs.map((r) => r.soul),
        windMps: recs.map((r) => r.wind),
      }),
    );
}

describe('evaluateStatusMany equals the general path, evaluateStatus', () => {
  it('statuses of every operation, with and without alpha, on random series and limits', () => {
    fc.assert(
      fc.property(
        fc.array(opArb, { minLength: 1, maxLength: 12 }).chain((ops) => fc.tuple(fc.constant(ops), seriesArb(ops), fc.boolean())),
        ([ops, series, alpha]) => {
          const many = evaluateStatusMany(series, ops, { alpha, alphaTable: DEFAULT_ALPHA_TABLE });
          expect(many).toHaveLength(ops.length);
          ops.forEach((op, o) => {
            expect(Array.from(many[o])).toEqual(Array.from(evaluateStatus(series, op, { alpha, alphaTable: DEFAULT_ALPHA_TABLE })));
          });
        },
      ),
      { numRuns: 400 },
    );
  });

  it('more than 32 operations (two groups of bit masks), written into reused buffers', () => {
    fc.assert(
      fc.property(
        fc.array(opArb, { minLength: 33, maxLength: 70 }).chain((ops) => fc.tuple(fc.constant(ops), seriesArb(ops))),
        ([ops, series]) => {
          const n = series.timeMs.length;
          const out = ops.map(() => new Uint8Array(n + 3).fill(9));
          const many = evaluateStatusMany(series, ops, { alphaTable: DEFAULT_ALPHA_TABLE, out, scratch: createStatusManyScratch(n) });
          ops.forEach((op, o) => {
            expect(many[o].buffer).toBe(out[o].buffer);
            expect(Array.from(many[o])).toEqual(Array.from(evaluateStatus(series, op, { alphaTable: DEFAULT_ALPHA_TABLE })));
            expect(out[o][n]).toBe(9); // nothing written past the series
          });
        },
      ),
      { numRuns: 40 },
    );
  });

  it('series longer than one step of the two passes (several chunks of records and a tail), with and without distinct Tp', () => {
    fc.assert(
      fc.property(
        fc
          .array(opArb, { minLength: 1, maxLength: 10 })
          .chain((ops) => fc.tuple(fc.constant(ops), seriesArb(ops), fc.integer({ min: 8192, max: 13000 }), fc.boolean())),
        ([ops, short, n, distinct]) => {
          // The random records repeated to n (more than two chunks of 4096, any tail length).
          const m = short.timeMs.length;
          const tile = (a: Float64Array) => Array.from({ length: n }, (_, i) => a[i % m]);
          const series = makeSeries({
            hsM: tile(short.hsM),
            tpS: tile(short.tpS),
            bedVelocityLinearMps: tile(short.bedVelocityLinearMps),
            bedVelocitySoulsbyMps: tile(short.bedVelocitySoulsbyMps),
            windMps: tile(short.windMps),
          });
          const keys = Array.from(new Set(Array.from(series.tpS).filter((t) => t === t)));
          const ids = Int32Array.from(series.tpS, (t) => keys.indexOf(t));
          const tpDistinct = distinct ? { ids, keys: Float64Array.from(keys) } : undefined;
          const many = evaluateStatusMany(series, ops, {
            alphaTable: DEFAULT_ALPHA_TABLE,
            tpDistinct,
            scratch: createStatusManyScratch(n),
          });
          ops.forEach((op, o) => {
            expect(Array.from(many[o])).toEqual(Array.from(evaluateStatus(series, op, { alphaTable: DEFAULT_ALPHA_TABLE })));
          });
        },
      ),
      { numRuns: 25 },
    );
  });

  it('out buffers that do not start on a 4-byte boundary (codes written one byte at a time)', () => {
    fc.assert(
      fc.property(
        fc
          .array(opArb, { minLength: 1, maxLength: 8 })
          .chain((ops) => fc.tuple(fc.constant(ops), seriesArb(ops), fc.integer({ min: 1, max: 3 }))),
        ([ops, series, shift]) => {
          const n = series.timeMs.length;
          const out = ops.map(() => new Uint8Array(n + shift).fill(9).subarray(shift));
          const many = evaluateStatusMany(series, ops, { alphaTable: DEFAULT_ALPHA_TABLE, out });
          ops.forEach((op, o) => {
            expect(many[o].byteOffset).toBe(shift);
            expect(Array.from(many[o])).toEqual(Array.from(evaluateStatus(series, op, { alphaTable: DEFAULT_ALPHA_TABLE })));
          });
        },
      ),
      { numRuns: 60 },
    );
  });

  it("Hs-Tp curves by the series' distinct Tp values (tpDistinct), also with indices that do not fit the records", () => {
    fc.assert(
      fc.property(
        fc
          .array(opArb, { minLength: 1, maxLength: 8 })
          .chain((ops) => fc.tuple(fc.constant(ops), seriesArb(ops), fc.array(fc.integer({ min: -1, max: 5 }), { maxLength: 8 }))),
        ([ops, series, wrong]) => {
          // Distinct values first seen first; -1 for a missing Tp. Then a few indices spoilt.
          const keys: number[] = [];
          const ids = Int32Array.from(series.tpS, (t) => {
            if (t !== t) return -1;
            const k = keys.indexOf(t);
            return k >= 0 ? k : keys.push(t) - 1;
          });
          wrong.forEach((id, j) => {
            if (j < ids.length) ids[(j * 7) % ids.length] = Math.min(id, keys.length - 1);
          });
          const tpDistinct = { ids, keys: Float64Array.from(keys) };
          const many = evaluateStatusMany(series, ops, { alphaTable: DEFAULT_ALPHA_TABLE, tpDistinct });
          ops.forEach((op, o) => {
            expect(Array.from(many[o])).toEqual(Array.from(evaluateStatus(series, op, { alphaTable: DEFAULT_ALPHA_TABLE })));
          });
        },
      ),
      { numRuns: 200 },
    );
  });

  it('Hs-Tp curves and Tp limits by distinct Tp on a grid of every edge: curve points, between them, outside, at OPWF and OPLIM', () => {
    fc.assert(
      fc.property(limitsArb, fc.boolean(), fc.constantFrom(3, 12, 36, 72), (limits, alpha, tpopH) => {
        const op: OperationSpec = { tpopH, tcH: 6, weatherRestricted: true, limits };
        const curve = limits.hsTpCurve ?? [];
        const tpGrid = [
          ...curve.flatMap(([t], k) => [t, t - 0.01, t + 0.01, k > 0 ? (t + curve[k - 1][0]) / 2 : t - 1]),
          ...(limits.tpExcluded ?? []).flat(),
          limits.tpMin ?? 4,
          limits.tpMax ?? 14,
          2,
          25,
          NaN,
        ];
        // Hs at each curve point, a hair either side, at its OPWF for every alpha row, and beyond.
        const hsGrid = [
          ...curve.flatMap(([, h]) => [h, h - 1e-9, h + 1e-9, h * 0.6, h * 0.65, h * 0.7, h * 0.76, h * 0.8]),
          limits.hsMax ?? 1,
          0.05,
          9,
          NaN,
        ];
        const cells = tpGrid.flatMap((tp) => hsGrid.map((hs) => ({ tp, hs })));
        const series = makeSeries({ hsM: cells.map((c) => c.hs), tpS: cells.map((c) => c.tp), windMps: cells.map(() => 5) });
        const keys = [...new Set(tpGrid.filter((t) => t === t))];
        const tpDistinct = { ids: Int32Array.from(series.tpS, (t) => keys.indexOf(t)), keys: Float64Array.from(keys) };
        const [many] = evaluateStatusMany(series, [op], { alpha, alphaTable: DEFAULT_ALPHA_TABLE, tpDistinct });
        expect(Array.from(many)).toEqual(Array.from(evaluateStatus(series, op, { alpha, alphaTable: DEFAULT_ALPHA_TABLE })));
      }),
      { numRuns: 300 },
    );
  });

  it('the same usable windows and hindcast statistics over a long series with gaps', () => {
    fc.assert(
      fc.property(fc.array(opArb, { minLength: 1, maxLength: 6 }), fc.integer({ min: 1, max: 1_000_000 }), (ops, seed) => {
        // Three months hourly with a few missing hours, values from a small deterministic generator.
        let x = seed;
        const rnd = () => (x = (x * 1103515245 + 12345) % 2147483648) / 2147483648;
        const times: number[] = [];
        for (let h = 0; h < 24 * 92; h++) if (rnd() > 0.01) times.push(T0 + h * HOUR);
        const col = (lo: number, hi: number) => times.map(() => (rnd() < 0.02 ? NaN : round2(lo + (hi - lo) * rnd())));
        const series = makeSeries({
          timeMs: times,
          hsM: col(0, 4),
          tpS: col(3, 16),
          bedVelocityLinearMps: col(0, 0.8),
          bedVelocitySoulsbyMps: col(0, 0.8),
          windMps: col(0, 18),
        });
        const calendar = calendarIndex(series.timeMs, 'UTC');
        const many = evaluateStatusMany(series, ops, { alphaTable: DEFAULT_ALPHA_TABLE });
        ops.forEach((op, o) => {
          const general = evaluateStatus(series, op, { alphaTable: DEFAULT_ALPHA_TABLE });
          const tr = op.tpopH + op.tcH;
          const stats = (st: Uint8Array) => monthlyStatistics(series.timeMs, st, goStarts(series.timeMs, st, HOUR, tr), HOUR, calendar, tr);
          const windows = (st: Uint8Array) => usableWindows(series, op, st, HOUR, { alphaTable: DEFAULT_ALPHA_TABLE });
          expect(stats(many[o])).toEqual(stats(general));
          expect(windows(many[o])).toEqual(windows(general));
        });
      }),
      { numRuns: 30 },
    );
  });
});

describe('evaluateStatusMany falls back to the general path for limit kinds it does not know', () => {
  it('an operation with another limit kind set goes to evaluateStatus; null or absent kinds do not count', () => {
    const known: OperationSpec = { tpopH: 6, tcH: 2, weatherRestricted: true, limits: { hsMax: 1.5, windMax: 12 } };
    const withOther = { ...known, limits: { ...known.limits, someLaterKind: 3 } } as unknown as OperationSpec;
    const withNullOther = { ...known, limits: { ...known.limits, someLaterKind: null } } as unknown as OperationSpec;
    expect(statusFastPathKnows(known)).toBe(true);
    expect(statusFastPathKnows(withOther)).toBe(false);
    expect(statusFastPathKnows(withNullOther)).toBe(true);
    // A field beside the limits (a later rule could put one there) sends it to the general path too.
    expect(statusFastPathKnows({ ...known, someLaterField: { from: 1 } } as unknown as OperationSpec)).toBe(false);
    const series = makeSeries({ hsM: [0.5, 1.2, 1.6, NaN], tpS: [8, 8, 8, 8], windMps: [5, 5, 5, 5] });
    const [a, b] = evaluateStatusMany(series, [known, withOther], { alphaTable: DEFAULT_ALPHA_TABLE });
    expect(Array.from(a)).toEqual(Array.from(evaluateStatus(series, known, { alphaTable: DEFAULT_ALPHA_TABLE })));
    expect(Array.from(b)).toEqual(Array.from(evaluateStatus(series, withOther, { alphaTable: DEFAULT_ALPHA_TABLE })));
  });

  it('invalid limits are refused as evaluateStatus refuses them', () => {
    const series = makeSeries({ hsM: [1], tpS: [8] });
    const bad: OperationSpec = { tpopH: 6, tcH: 2, weatherRestricted: true, limits: { hsMax: -1 } };
    expect(() => evaluateStatusMany(series, [bad], { alphaTable: DEFAULT_ALPHA_TABLE })).toThrow(/Hs max must be positive/);
    expect(() =>
      evaluateStatusMany(series, [{ ...bad, limits: { hsMax: 1 } }], { alphaTable: DEFAULT_ALPHA_TABLE, out: [new Uint8Array(0)] }),
    ).toThrow(RangeError);
  });
});
