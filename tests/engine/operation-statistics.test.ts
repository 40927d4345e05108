import { describe, expect, it } from 'vitest';
import {
  DEFAULT_ALPHA_TABLE,
  STATUS,
  calendarIndex,
  createEngineWorkspace,
  evaluateHours,
  goStarts,
  monthlyStatistics,
  operationStatistics,
  type OperationSpec,
  type SiteSeries,
} from '../../shared/engine';

const HOUR = 3_600_000;

/** A deterministic 2-year hourly series with a gap and missing values. */
function series(seed: number, years = 2): SiteSeries {
  let x = seed;
  const rnd = () => (x = (x * 1103515245 + 12345) % 2147483648) / 2147483648;
  const t0 = Date.UTC(2010, 0, 1);
  const times: number[] = [];
  for (let h = 0; h < years * 8760; h++) if (h < 5000 || h > 5100) times.push(t0 + h * HOUR);
  const n = times.length;
  const hs = Float64Array.from({ length: n }, (_, i) => (rnd() < 0.01 ? NaN : 1 + Math.sin(i / 300) + 0.5 * rnd()));
  const tp = Float64Array.from(hs, (h) => 5 + 2 * h);
  return {
    timeMs: Float64Array.from(times),
    hsM: hs,
    tpS: tp,
    bedVelocityLinearMps: Float64Array.from(hs, (h) => 0.2 * h),
    bedVelocitySoulsbyMps: Float64Array.from(hs, (h) => 0.18 * h),
    windMps: Float64Array.from(hs, (h) => 4 * h),
  };
}

describe('operationStatistics composes evaluateHours, goStarts and monthlyStatistics', () => {
  const ops: OperationSpec[] = [
    { tpopH: 12, tcH: 6, weatherRestricted: true, limits: { hsMax: 1.8 } },
    {
      tpopH: 6,
      tcH: 0,
      weatherRestricted: true,
      limits: {
        hsTpCurve: [
          [5, 1.2],
          [8, 2],
          [10, 1.7],
        ],
        windMax: 9,
      },
    },
  ];

  it('gives the same statuses, go-starts and statistics, with and without alpha, with one workspace for two series', () => {
    const workspace = createEngineWorkspace(2 * 8760);
    for (const s of [series(1), series(2, 1)]) {
      const calendar = calendarIndex(s.timeMs, 'Europe/Oslo');
      for (const op of ops) {
        for (const alpha of [true, false]) {
          const ev = evaluateHours(s, op, { alpha, alphaTable: DEFAULT_ALPHA_TABLE });
          const gs = goStarts(s.timeMs, ev.status, HOUR, op.tpopH + op.tcH);
          const want = monthlyStatistics(s.timeMs, ev.status, gs, HOUR, calendar, op.tpopH + op.tcH);
          const got = operationStatistics(s, op, calendar, { alpha, alphaTable: DEFAULT_ALPHA_TABLE, workspace });
          expect(got.stepMs).toBe(HOUR);
          // Byte-wise comparison (fast for long arrays).
          expect(Buffer.compare(Buffer.from(got.status), Buffer.from(ev.status))).toBe(0);
          expect(Buffer.compare(Buffer.from(got.goStart), Buffer.from(gs))).toBe(0);
          expect(got.statistics).toEqual(want);
        }
      }
    }
  });

  it('workability without alpha is at least that with alpha (marginal hours count at OPLIM)', () => {
    const s = series(3);
    const calendar = calendarIndex(s.timeMs, 'UTC');
    const withA = operationStatistics(s, ops[0], calendar, { alphaTable: DEFAULT_ALPHA_TABLE });
    const without = operationStatistics(s, ops[0], calendar, { alpha: false, alphaTable: DEFAULT_ALPHA_TABLE });
    expect(withA.status.some((st) => st === STATUS.MARGINAL)).toBe(true);
    withA.statistics.months.forEach((m, i) =>
      expect(without.statistics.months[i].workability as number).toBeGreaterThanOrEqual(m.workability as number),
    );
  });

  it('rejects a workspace that is too small', () => {
    const s = series(4);
    expect(() =>
      operationStatistics(s, ops[0], calendarIndex(s.timeMs, 'UTC'), {
        alphaTable: DEFAULT_ALPHA_TABLE,
        workspace: createEngineWorkspace(10),
      }),
    ).toThrow(RangeError);
  });
});
