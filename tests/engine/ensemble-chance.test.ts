// Ensemble chances (docs/domain.md#forecast-uncertainty) against a brute-force count written here:
// per hour the share of runs workable on OPLIM (no alpha), per go-start the share of runs in which
// [t, t + TR) is wholly workable. Limits are inclusive (docs/domain.md#hourly-status), an hourly
// series needs ceil(TR / dt) workable records from t (docs/domain.md#convention-10), and a run
// without a value counts as not workable there (a missing value is no data, never workable).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { DEFAULT_ALPHA_TABLE, ensembleChances, ensembleChancesMany, evaluateStatus, type OperationSpec } from '../../shared/engine';
import { HOUR, makeSeries } from './series-factory';

interface Op {
  hsMax: number;
  windMax: number;
  tpopH: number;
  tcH: number;
}

/** The brute force: plain loops over runs and hours, straight from the definitions above. */
function bruteForce(runs: { hs: number[]; wind: number[] }[], op: Op): { hour: number[]; start: number[] } {
  const n = runs[0].hs.length;
  const ok = (r: { hs: number[]; wind: number[] }, i: number) =>
    !Number.isNaN(r.hs[i]) && !Number.isNaN(r.wind[i]) && r.hs[i] <= op.hsMax && r.wind[i] <= op.windMax;
  const need = Math.ceil(op.tpopH + op.tcH); // hourly records
  const hour: number[] = [];
  const start: number[] = [];
  for (let i = 0; i < n; i++) {
    let w = 0;
    let s = 0;
    for (const r of runs) {
      if (ok(r, i)) w++;
      let all = i + need <= n;
      for (let k = i; all && k < i + need; k++) if (!ok(r, k)) all = false;
      if (all) s++;
    }
    hour.push(w / runs.length);
    start.push(s / runs.length);
  }
  return { hour, start };
}

const value = (lo: number, hi: number) =>
  fc.oneof(
    { weight: 12, arbitrary: fc.integer({ min: lo * 10, max: hi * 10 }).map((x) => x / 10) },
    { weight: 1, arbitrary: fc.constant(NaN) },
  );

const runsArb = fc.record({ n: fc.integer({ min: 1, max: 40 }), m: fc.integer({ min: 1, max: 21 }) }).chain(({ n, m }) =>
  fc.array(
    fc.record({ hs: fc.array(value(0, 4), { minLength: n, maxLength: n }), wind: fc.array(value(0, 20), { minLength: n, maxLength: n }) }),
    {
      minLength: m,
      maxLength: m,
    },
  ),
);

const opArb = fc.record({
  hsMax: fc.integer({ min: 5, max: 35 }).map((x) => x / 10),
  windMax: fc.integer({ min: 5, max: 18 }),
  tpopH: fc.integer({ min: 1, max: 8 }),
  tcH: fc.constantFrom(0, 0.5, 2),
});

const spec = (op: Op): OperationSpec => ({
  tpopH: op.tpopH,
  tcH: op.tcH,
  weatherRestricted: true,
  limits: { hsMax: op.hsMax, windMax: op.windMax },
});
/** Every run on one shared times array, as the plan passes them. */
function runSeries(runs: { hs: number[]; wind: number[] }[]) {
  const series = runs.map((r) => makeSeries({ hsM: r.hs, windMps: r.wind, tpS: r.hs.map(() => 8) }));
  for (const s of series) s.timeMs = series[0].timeMs;
  return series;
}

describe('ensemble chances', () => {
  it('per hour and per go-start equal a brute-force count over random member sets', () => {
    fc.assert(
      fc.property(runsArb, fc.array(opArb, { minLength: 1, maxLength: 4 }), (runs, ops) => {
        const series = runSeries(runs);
        const got = ensembleChancesMany(series, ops.map(spec), DEFAULT_ALPHA_TABLE, HOUR);
        ops.forEach((op, o) => {
          const want = bruteForce(runs, op);
          expect(Array.from(got[o].hour)).toEqual(want.hour.map((x) => expect.closeTo(x, 12)));
          expect(Array.from(got[o].start)).toEqual(want.start.map((x) => expect.closeTo(x, 12)));
        });
      }),
      { numRuns: 200 },
    );
  });

  it('judges members on OPLIM: an hour between alpha x OPLIM and OPLIM counts as workable', () => {
    // Hand case: OPLIM 2.0 m; the default alpha table's factors are below 1 (docs/domain.md#operations-and-limits),
    // so 1.95 m is marginal in the deterministic plan with alpha and workable on OPLIM.
    const op = spec({ hsMax: 2, windMax: 15, tpopH: 2, tcH: 0 });
    const runs = [
      { hs: [1.95, 1.95, 2.05], wind: [5, 5, 5] },
      { hs: [2.0, 2.2, 1.0], wind: [5, 5, 5] },
    ];
    const series = runSeries(runs);
    expect(evaluateStatus(series[0], op, { alpha: true, alphaTable: DEFAULT_ALPHA_TABLE })[0]).toBe(2); // MARGINAL with alpha
    const [c] = ensembleChancesMany(series, [op], DEFAULT_ALPHA_TABLE, HOUR);
    // Worked by hand: hour 0 both workable (1.95 and 2.0 <= 2.0, inclusive); hour 1 one of two; hour 2 one of two.
    expect(Array.from(c.hour)).toEqual([1, 0.5, 0.5]);
    // TR 2 h: run 0 holds [0, 2) only; run 1 holds nowhere two hours on end.
    expect(Array.from(c.start)).toEqual([0.5, 0, 0]);
  });

  it('refuses no runs and runs of another length', () => {
    const times = Float64Array.from([0, HOUR]);
    expect(() => ensembleChances(times, [], HOUR, 1)).toThrow(RangeError);
    expect(() => ensembleChances(times, [new Uint8Array(3)], HOUR, 1)).toThrow(/another length/);
  });
});
