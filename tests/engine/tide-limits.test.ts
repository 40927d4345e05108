/**
 * The exact limits of docs/domain.md#tide (min and max depth, current max, tide window) in
 * evaluateHours, evaluateStatus, explainHour, usableWindows and planOperation, each checked against
 * a brute-force evaluation written here: a naive loop over the hours and over every predicted high
 * or low water, with no shared code from the engine. Alpha never applies to them.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  DEFAULT_ALPHA_TABLE,
  STATUS,
  LIMIT,
  evaluateHours,
  evaluateStatus,
  planOperation,
  type OperationSpec,
  type SiteSeries,
  type TideExtremes,
} from '../../shared/engine';
import { explainHour } from '../../shared/engine/explain-hour';

const HOUR = 3_600_000;
const T0 = Date.UTC(2026, 11, 1);
// M2 period (Schureman 1958: 28.9841042 deg/h).
const M2_MS = (360 / 28.9841042) * HOUR;

function series(n: number, depth: number[] | null, current: number[] | null, tide: TideExtremes | undefined, hs = 0.5): SiteSeries {
  const fill = (v: number) => new Float64Array(n).fill(v);
  return {
    timeMs: Float64Array.from({ length: n }, (_, i) => T0 + i * HOUR),
    hsM: fill(hs),
    tpS: fill(8),
    bedVelocityLinearMps: fill(0.1),
    bedVelocitySoulsbyMps: fill(0.1),
    windMps: fill(5),
    ...(depth ? { depthM: Float64Array.from(depth) } : {}),
    ...(current ? { currentMps: Float64Array.from(current) } : {}),
    ...(tide ? { tide } : {}),
  };
}

/** Brute force: is time t inside [E - before, E + after] for any listed extreme E? (closed, docs/domain.md#convention-6). */
function naiveInWindow(t: number, extremes: number[], before: number, after: number): boolean {
  for (const e of extremes) if (t >= e - before * HOUR && t <= e + after * HOUR) return true;
  return false;
}

const op = (limits: OperationSpec['limits'], tpopH = 4, tcH = 2): OperationSpec => ({ tpopH, tcH, weatherRestricted: true, limits });

describe('tide window limit', () => {
  const highs = Array.from({ length: 8 }, (_, k) => T0 + 3.2 * HOUR + k * M2_MS);
  const lows = highs.map((h) => h + M2_MS / 2);
  const tide: TideExtremes = {
    highMs: Float64Array.from(highs),
    lowMs: Float64Array.from(lows),
    fromMs: T0 - 24 * HOUR,
    toMs: T0 + 96 * HOUR,
  };

  it('matches a brute-force evaluation hour by hour, for high and low water and random windows', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 8 }), fc.integer({ min: 0, max: 8 }), fc.boolean(), (before, after, high) => {
        fc.pre(before + after > 0);
        const n = 90;
        const s = series(n, null, null, tide);
        const spec = op({ tideWindow: { reference: high ? 'high' : 'low', before, after } });
        const ev = evaluateHours(s, spec, { alphaTable: DEFAULT_ALPHA_TABLE });
        const st = evaluateStatus(s, spec, { alphaTable: DEFAULT_ALPHA_TABLE });
        for (let i = 0; i < n; i++) {
          const t = T0 + i * HOUR;
          const inside = naiveInWindow(t, high ? highs : lows, before, after);
          const expected = inside ? STATUS.WORKABLE : STATUS.NOT_WORKABLE;
          expect(ev.status[i]).toBe(expected);
          expect(st[i]).toBe(expected);
          if (!inside) expect(ev.limiting[i]).toBe(LIMIT.TIDE_WINDOW);
          const ex = explainHour(
            { hsM: 0.5, tpS: 8, bedVelocityLinearMps: 0.1, bedVelocitySoulsbyMps: 0.1, windMps: 5, timeMs: t, tide },
            spec,
            DEFAULT_ALPHA_TABLE,
          );
          expect(ex.status).toBe(inside ? 'workable' : 'not_workable');
        }
      }),
      { numRuns: 60 },
    );
  });

  it('is no data without predicted extremes or outside the span they cover, and no data wins', () => {
    const spec = op({ tideWindow: { reference: 'high', before: 2, after: 2 }, hsMax: 0.1 });
    const without = evaluateHours(series(4, null, null, undefined), spec, { alphaTable: DEFAULT_ALPHA_TABLE });
    expect([...without.status]).toEqual([0, 0, 0, 0]);
    const short: TideExtremes = { ...tide, toMs: T0 + 1 * HOUR };
    const st = evaluateStatus(series(4, null, null, short), spec, { alphaTable: DEFAULT_ALPHA_TABLE });
    // Hours 0 and 1 are covered (and broken by Hs 0.5 > 0.1); 2 and 3 are past the span: no data.
    expect([...st]).toEqual([STATUS.NOT_WORKABLE, STATUS.NOT_WORKABLE, STATUS.NO_DATA, STATUS.NO_DATA]);
  });

  it('gives go-starts only where TR fits inside one window (brute force over the starts)', () => {
    const spec = op({ tideWindow: { reference: 'high', before: 3, after: 3 } }, 3, 1); // TR = 4 h
    const s = series(90, null, null, tide);
    const plan = planOperation(s, spec, DEFAULT_ALPHA_TABLE, T0, { stepMs: HOUR });
    for (let i = 0; i + 4 <= 90; i++) {
      let all = true;
      for (let k = i; k < i + 4; k++) if (!naiveInWindow(T0 + k * HOUR, highs, 3, 3)) all = false;
      expect(plan.goStart[i], `start ${i}`).toBe(all ? 1 : 0);
    }
    // Each window of 7 h around a high holds 6 or 7 whole hours: every usable window is at most 7 h and shows its margin in hours.
    expect(plan.windows.length).toBeGreaterThan(3);
    for (const w of plan.windows) {
      expect(w.hours).toBeLessThanOrEqual(7);
      expect(w.minMargin.perLimit.tideWindow).toBeGreaterThanOrEqual(0);
    }
  });
});

describe('depth and current limits', () => {
  it('min depth (draught + clearance) and max depth match a brute-force evaluation, alpha never applied', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -1, max: 8, noNaN: true }), { minLength: 5, maxLength: 40 }),
        fc.double({ min: 0.5, max: 3, noNaN: true }),
        fc.double({ min: 0, max: 1.5, noNaN: true }),
        (depths, draught, clearance) => {
          const minDepth = draught + clearance;
          const maxDepth = 6;
          const s = series(depths.length, depths, null, undefined);
          const spec = op({ minDepth, minDepthParts: { draught, clearance }, maxDepth });
          const ev = evaluateHours(s, spec, { alphaTable: DEFAULT_ALPHA_TABLE });
          const st = evaluateStatus(s, spec, { alphaTable: DEFAULT_ALPHA_TABLE });
          depths.forEach((h, i) => {
            // Inclusive limits (docs/domain.md#convention-6); never marginal (no alpha on exact limits).
            const expected = h >= minDepth && h <= maxDepth ? STATUS.WORKABLE : STATUS.NOT_WORKABLE;
            expect(ev.status[i]).toBe(expected);
            expect(st[i]).toBe(expected);
          });
        },
      ),
      { numRuns: 100 },
    );
  });

  it('a depth of exactly the minimum meets it; a dry hour breaks it; no depth is no data', () => {
    const spec = op({ minDepth: 2.5, minDepthParts: { draught: 2, clearance: 0.5 } });
    const s = series(3, [2.5, 2.4999, -0.3], null, undefined);
    expect([...evaluateHours(s, spec, { alphaTable: DEFAULT_ALPHA_TABLE }).status]).toEqual([
      STATUS.WORKABLE,
      STATUS.NOT_WORKABLE,
      STATUS.NOT_WORKABLE,
    ]);
    expect([...evaluateStatus(series(2, null, null, undefined), spec, { alphaTable: DEFAULT_ALPHA_TABLE })]).toEqual([
      STATUS.NO_DATA,
      STATUS.NO_DATA,
    ]);
    const ex = explainHour(
      { hsM: 0.5, tpS: 8, bedVelocityLinearMps: 0.1, bedVelocitySoulsbyMps: 0.1, windMps: 5, depthM: 2.4 },
      spec,
      DEFAULT_ALPHA_TABLE,
    );
    expect(ex.checks[0]).toMatchObject({ limit: 'minDepth', value: 2.4, oplim: 2.5, opwf: null, alpha: null, met: false });
    expect(ex.checks[0].label).toMatch(/draught 2 m \+ clearance 0.5 m/);
  });

  it('current max matches a brute-force evaluation', () => {
    const cur = [0, 0.3, 0.75, 0.76, 1.2, Number.NaN];
    const spec = op({ currentMax: 0.75, hsMax: 2 });
    const s = series(cur.length, null, cur, undefined);
    const ev = evaluateHours(s, spec, { alphaTable: DEFAULT_ALPHA_TABLE });
    const st = evaluateStatus(s, spec, { alphaTable: DEFAULT_ALPHA_TABLE });
    cur.forEach((u, i) => {
      const expected = Number.isNaN(u) ? STATUS.NO_DATA : u <= 0.75 ? STATUS.WORKABLE : STATUS.NOT_WORKABLE;
      expect(ev.status[i]).toBe(expected);
      expect(st[i]).toBe(expected);
    });
    expect(ev.limiting[4]).toBe(LIMIT.CURRENT);
  });
});
