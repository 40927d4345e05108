// The peer bench's threaded run (bench/peer-engine.ts: threads that split each worksite's records
// for the transform and the status, and hand out its operations for the statistics) against the
// same work on this thread: every (worksite, operation) figure must be the same, on the first run
// and on a run over the input the threads keep. No outside figures here: the reference is the
// one-thread path of the same code. Invented input (a smooth sea with a few missing records).
import { afterAll, describe, expect, it } from 'vitest';
import type { OperationSpec } from '../../shared/engine';
import { EnginePool, runHindcastAllSites, shareRange, type HindcastInput } from '../../bench/peer-engine';

function inventedInput(): HindcastInput {
  const n = 2 * 8760 + 5; // two years hourly, not a multiple of 64
  const t0 = Date.UTC(2011, 0, 1);
  const timeMs = Float64Array.from({ length: n }, (_, i) => t0 + i * 3_600_000);
  const round = (x: number, d: number) => Math.round(x * d) / d;
  const hs = Float64Array.from({ length: n }, (_, i) =>
    i % 997 === 3 ? NaN : round(1.4 + Math.sin(i / 53) + 0.4 * Math.sin(i / 7.3), 100),
  );
  const tp = Float64Array.from({ length: n }, (_, i) => round(8.5 + 3 * Math.sin(i / 97) + Math.sin(i / 11), 100));
  const dir = Float64Array.from({ length: n }, (_, i) => round(255 + 50 * Math.sin(i / 41), 10));
  const wind = Float64Array.from({ length: n }, (_, i) => (i % 1301 === 7 ? NaN : round(9 + 6 * Math.sin(i / 23), 10)));
  const op = (tpopH: number, limits: Partial<OperationSpec['limits']>): OperationSpec => ({
    tpopH,
    tcH: 2,
    weatherRestricted: true,
    limits: {
      hsMax: null,
      tpMin: null,
      tpMax: null,
      tpExcluded: null,
      hsTpCurve: null,
      bedVelocityMax: null,
      bedVelocityMethod: 'linear',
      windMax: null,
      ...limits,
    },
  });
  const operations = [
    op(4, { hsMax: 1.2 }),
    op(12, { hsMax: 2, tpExcluded: [[7, 9]] }),
    op(6, {
      hsTpCurve: [
        [4, 1],
        [8, 2.2],
        [13, 1.1],
      ],
    }),
    op(8, { bedVelocityMax: 0.4 }),
    op(10, { bedVelocityMax: 0.5, bedVelocityMethod: 'soulsby' }),
    op(24, { hsMax: 2.5, windMax: 12, tpMin: 5, tpMax: 12 }),
    op(48, { windMax: 15 }),
  ];
  const sites = [
    { depthM: 4, shoreNormalDeg: 250, breakerIndex: 0.6 },
    { depthM: 12, shoreNormalDeg: 230, breakerIndex: 0.6 },
    { depthM: 30, shoreNormalDeg: null, breakerIndex: 0.6 },
  ];
  return { timeMs, hs, tp, dir, wind, sourceDepthM: 50, sites, operations };
}

let pool: EnginePool | null = null;
afterAll(() => pool?.close());

describe('bench:peer on worker threads', () => {
  it('shares of records start on 64-record boundaries and cover the series once', () => {
    for (const [n, workers] of [
      [17525, 2],
      [17525, 3],
      [100, 5],
      [0, 2],
    ]) {
      let next = 0;
      for (let w = 0; w < workers; w++) {
        const [lo, hi] = shareRange(n, w, workers);
        expect(lo).toBe(next);
        expect(lo % 64 === 0 || lo === n).toBe(true);
        next = hi;
      }
      expect(next).toBe(n);
    }
  });

  it('gives every (worksite, operation) figure of the one-thread run, on two and three threads, also on a run over the input they keep', async () => {
    const input = inventedInput();
    const here = runHindcastAllSites(input);
    expect(here.sums).toHaveLength(input.sites.length * input.operations.length);
    expect(here.sums.every((x) => Number.isFinite(x) && x > 0)).toBe(true);
    for (const threads of [2, 3]) {
      pool = await EnginePool.start(threads);
      const first = await pool.run(input);
      const again = await pool.run(input);
      expect(first.sums).toEqual(here.sums);
      expect(again.sums).toEqual(here.sums);
      expect(again.checksum).toBe(here.checksum);
      await pool.close();
      pool = null;
    }
  }, 120_000);
});
