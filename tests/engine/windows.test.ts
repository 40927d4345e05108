import { describe, expect, it } from 'vitest';
import {
  DEFAULT_ALPHA_TABLE,
  STATUS,
  detectStepMs,
  goStarts,
  nextGoStartIndex,
  planOperation,
  recordsForTr,
  usableWindows,
  workableRuns,
  type OperationSpec,
} from '../../shared/engine';
import { HOUR, T0, hoursAt, makeSeries } from './series-factory';

const W = STATUS.WORKABLE;
const N = STATUS.NOT_WORKABLE;
const M = STATUS.MARGINAL;
const D = STATUS.NO_DATA;

const flags = (a: Uint8Array): number[] => Array.from(a);

describe('detectStepMs: median spacing (docs/domain.md#convention-9)', () => {
  it('a regular series with a gap keeps its step', () => {
    expect(detectStepMs(Float64Array.from(hoursAt([0, 1, 2, 3, 5])))).toBe(HOUR);
  });
  it('without a majority, the median of the spacings: 1, 2, 3, 4 h -> 2.5 h', () => {
    expect(detectStepMs(Float64Array.from(hoursAt([0, 1, 3, 6, 10])))).toBe(2.5 * HOUR);
  });
  it('odd count without a majority: 1, 3, 10 h -> 3 h', () => {
    expect(detectStepMs(Float64Array.from(hoursAt([0, 1, 4, 14])))).toBe(3 * HOUR);
  });
  it('rejects fewer than two records and times that do not ascend', () => {
    expect(() => detectStepMs(Float64Array.of(T0))).toThrow(RangeError);
    expect(() => detectStepMs(Float64Array.from(hoursAt([0, 2, 1])))).toThrow(RangeError);
    expect(() => detectStepMs(Float64Array.from(hoursAt([0, 1, 1])))).toThrow(RangeError);
  });
});

describe('recordsForTr: ceil(TR / dt) (docs/domain.md#convention-10)', () => {
  it('hand cases', () => {
    expect(recordsForTr(12, HOUR)).toBe(12);
    expect(recordsForTr(12.5, HOUR)).toBe(13);
    expect(recordsForTr(0.25, 10 * 60_000)).toBe(2); // 15 min over 10-min steps
    expect(recordsForTr(4, 3 * HOUR)).toBe(2);
    expect(recordsForTr(0.1, HOUR)).toBe(1);
    expect(recordsForTr(0.7, 7 * 60_000)).toBe(6); // 42 min / 7 min exactly, despite 0.7 * 3.6e6 rounding
  });
});

describe('go-starts and windows (docs/domain.md#weather-windows, #convention-9 to #convention-10)', () => {
  const times = Float64Array.from(hoursAt([0, 1, 2, 3, 4, 5, 6, 7, 8, 9]));

  it('a run exactly TR long is a usable window with one go-start at its first record', () => {
    // Records 2-6 workable: 5 records = 5 h = TR.
    const status = Uint8Array.from([N, N, W, W, W, W, W, N, N, N]);
    expect(flags(goStarts(times, status, HOUR, 5))).toEqual([0, 0, 1, 0, 0, 0, 0, 0, 0, 0]);
    const runs = workableRuns(times, status, HOUR);
    expect(runs).toEqual([{ startIndex: 2, count: 5, startMs: T0 + 2 * HOUR, endMs: T0 + 7 * HOUR, hours: 5 }]);
  });

  it('a run one hour short of TR gives no go-start and no window', () => {
    const status = Uint8Array.from([N, N, W, W, W, W, N, N, N, N]);
    expect(flags(goStarts(times, status, HOUR, 5))).toEqual([0, 0, 0, 0, 0, 0, 0, 0, 0, 0]);
    const series = makeSeries({ timeMs: Array.from(times), hsM: [9, 9, 1, 1, 1, 1, 9, 9, 9, 9] });
    const op: OperationSpec = { tpopH: 5, tcH: 0, weatherRestricted: false, limits: { hsMax: 2 } };
    expect(usableWindows(series, op, status, HOUR, { alphaTable: DEFAULT_ALPHA_TABLE })).toEqual([]);
  });

  it('a longer run has go-starts at every record that leaves TR before its end', () => {
    const status = Uint8Array.from([W, W, W, W, W, W, W, N, W, W]);
    // TR 3 h: starts 0-4 (record 4 + 3 records = 4, 5, 6); record 8 has only 2 left.
    expect(flags(goStarts(times, status, HOUR, 3))).toEqual([1, 1, 1, 1, 1, 0, 0, 0, 0, 0]);
    // TR 2.5 h needs ceil(2.5) = 3 records too.
    expect(flags(goStarts(times, status, HOUR, 2.5))).toEqual([1, 1, 1, 1, 1, 0, 0, 0, 0, 0]);
  });

  it('marginal and no data break runs; only workable counts', () => {
    const status = Uint8Array.from([W, W, M, W, W, D, W, W, W, N]);
    expect(flags(goStarts(times, status, HOUR, 2))).toEqual([1, 0, 0, 1, 0, 0, 1, 1, 0, 0]);
    expect(workableRuns(times, status, HOUR).map((r) => [r.startIndex, r.count])).toEqual([
      [0, 2],
      [3, 2],
      [6, 3],
    ]);
  });

  it('a gap longer than 1.5 dt breaks a run; 1.5 dt exactly does not', () => {
    // Hourly records with one 2-h gap (3 -> 5) and one 1.5-h spacing (7 -> 8.5).
    const t = Float64Array.from(hoursAt([0, 1, 2, 3, 5, 6, 7, 8.5, 9.5, 10.5]));
    const status = new Uint8Array(10).fill(W);
    expect(detectStepMs(t)).toBe(HOUR);
    expect(workableRuns(t, status, HOUR).map((r) => [r.startIndex, r.count])).toEqual([
      [0, 4],
      [4, 6],
    ]);
    // TR 4 h: [0..3] is one go-start; from 5: records 5,6,7,8.5 etc.
    expect(flags(goStarts(t, status, HOUR, 4))).toEqual([1, 0, 0, 0, 1, 1, 1, 0, 0, 0]);
  });

  it('no go-start in the last TR - dt of a series', () => {
    const status = new Uint8Array(10).fill(W);
    // TR 4 h: the last 3 records (7, 8, 9) cannot start.
    expect(flags(goStarts(times, status, HOUR, 4))).toEqual([1, 1, 1, 1, 1, 1, 1, 0, 0, 0]);
  });

  it('10-min and 3-h steps', () => {
    const t10 = Float64Array.from({ length: 6 }, (_, i) => T0 + i * 600_000);
    const s10 = Uint8Array.from([W, W, N, W, W, W]);
    // TR 0.25 h = 15 min -> 2 records of 10 min.
    expect(flags(goStarts(t10, s10, 600_000, 0.25))).toEqual([1, 0, 0, 1, 1, 0]);
    const t3 = Float64Array.from(hoursAt([0, 3, 6, 9, 15, 18]));
    const s3 = new Uint8Array(6).fill(W);
    // TR 4 h -> 2 records; 9 -> 15 is a 6-h gap (> 4.5 h).
    expect(flags(goStarts(t3, s3, 3 * HOUR, 4))).toEqual([1, 1, 1, 0, 1, 0]);
  });

  it('nextGoStartIndex points at the next go-start, -1 after the last', () => {
    expect(Array.from(nextGoStartIndex(Uint8Array.from([0, 1, 0, 0, 1, 0])))).toEqual([1, 1, 4, 4, 4, -1]);
  });
});

describe('usableWindows: smallest margins (docs/domain.md#convention-16)', () => {
  it('per limit in the limit unit, Hs against OPWF, bands to the nearest edge, plus the relative figure', () => {
    // Not weather-restricted -> alpha 1. Window = records 1-3 (TR 3 h).
    const op: OperationSpec = {
      tpopH: 2,
      tcH: 1,
      weatherRestricted: false,
      limits: { hsMax: 2, tpMin: 5, tpExcluded: [[8, 9]], windMax: 12 },
    };
    const series = makeSeries({
      hsM: [3, 1.0, 1.5, 1.2, 3],
      tpS: [6, 6, 7.5, 10, 6],
      windMps: [5, 5, 8, 11, 5],
    });
    const status = Uint8Array.from([N, W, W, W, N]);
    const [w, ...rest] = usableWindows(series, op, status, HOUR, { alphaTable: DEFAULT_ALPHA_TABLE });
    expect(rest).toEqual([]);
    expect(w.startMs).toBe(T0 + HOUR);
    expect(w.endMs).toBe(T0 + 4 * HOUR);
    expect(w.hours).toBe(3);
    // hs: min(2 - 1.0, 2 - 1.5, 2 - 1.2) = 0.5 m; tpMin: min(6 - 5, 7.5 - 5, 10 - 5) = 1 s;
    // band [8, 9]: min(8 - 6, 8 - 7.5, 10 - 9) = 0.5 s; wind: min(7, 4, 1) = 1 m/s.
    expect(w.minMargin.perLimit.hs).toBeCloseTo(0.5, 12);
    expect(w.minMargin.perLimit.tpMin).toBeCloseTo(1, 12);
    expect(w.minMargin.perLimit.tpBand).toBeCloseTo(0.5, 12);
    expect(w.minMargin.perLimit.wind).toBeCloseTo(1, 12);
    expect(Object.keys(w.minMargin.perLimit).sort()).toEqual(['hs', 'tpBand', 'tpMin', 'wind']);
    // Relative: hs 0.5/2 = 0.25, tpMin 1/5 = 0.2, band 0.5/8 = 0.0625 (Tp 7.5 to edge 8), wind 1/12.
    expect(w.minMargin.relative).toBeCloseTo(0.0625, 12);
  });

  it('the Hs margin is against OPWF when alpha applies', () => {
    // TPOP 12 h, TC 0, weather-restricted, Hs max 2 m: alpha 0.76 (row 12 h, 2 m), OPWF 1.52 m.
    const op: OperationSpec = { tpopH: 12, tcH: 0, weatherRestricted: true, limits: { hsMax: 2 } };
    const series = makeSeries({ hsM: new Array(12).fill(1.02) });
    const status = new Uint8Array(12).fill(W);
    const [w] = usableWindows(series, op, status, HOUR, { alphaTable: DEFAULT_ALPHA_TABLE });
    expect(w.minMargin.perLimit.hs).toBeCloseTo(0.5, 12);
    expect(w.minMargin.relative).toBeCloseTo(0.5 / 1.52, 12);
  });
});

describe('planOperation: earliest go-start and "may start now"', () => {
  // Hs max 2 m, weather-restricted (alpha 0.76: OPWF 1.52 m), TR = 3 h. Hourly: records 0-1 rough,
  // 2-6 calm, 7 rough, 8-9 calm.
  const op: OperationSpec = { tpopH: 2, tcH: 1, weatherRestricted: true, limits: { hsMax: 2 } };
  const series = makeSeries({ hsM: [3, 3, 1, 1, 1, 1, 1, 3, 1, 1] });

  it('before the window: not now, earliest start at record 2', () => {
    const plan = planOperation(series, op, DEFAULT_ALPHA_TABLE, T0 + 0.5 * HOUR);
    expect(plan.startNow).toBe(false);
    expect(plan.earliestStartMs).toBe(T0 + 2 * HOUR);
    expect(plan.windows.map((w) => [w.startMs, w.endMs])).toEqual([[T0 + 2 * HOUR, T0 + 7 * HOUR]]);
    expect(plan.stepMs).toBe(HOUR);
  });

  it('inside a go-start record: may start now, earliest start is that record', () => {
    const plan = planOperation(series, op, DEFAULT_ALPHA_TABLE, T0 + 3.5 * HOUR);
    expect(plan.startNow).toBe(true);
    expect(plan.earliestStartMs).toBe(T0 + 3 * HOUR);
  });

  it('late in the window (record 5: only 2 h left): not now, and no later go-start', () => {
    const plan = planOperation(series, op, DEFAULT_ALPHA_TABLE, T0 + 5 * HOUR);
    expect(plan.startNow).toBe(false);
    expect(plan.earliestStartMs).toBe(null);
    expect(plan.windows).toHaveLength(1); // ongoing window still listed
  });

  it('after the series: nothing', () => {
    const plan = planOperation(series, op, DEFAULT_ALPHA_TABLE, T0 + 20 * HOUR);
    expect(plan.startNow).toBe(false);
    expect(plan.earliestStartMs).toBe(null);
    expect(plan.windows).toEqual([]);
  });

  it('not weather-restricted (docs/domain.md#convention-5): statuses at OPLIM for information, never a go-start, window or start now', () => {
    for (const other of [
      { ...op, weatherRestricted: false },
      { ...op, tpopH: 73, tcH: 0 },
      { ...op, tpopH: 24, tcH: 73 },
    ]) {
      const plan = planOperation(series, other, DEFAULT_ALPHA_TABLE, T0 + 3.5 * HOUR);
      expect(plan.informationOnly).toBe(true);
      expect(Array.from(plan.status)).toEqual([N, N, W, W, W, W, W, N, W, W]);
      expect(Array.from(plan.goStart).every((g) => g === 0)).toBe(true);
      expect(plan.windows).toEqual([]);
      expect(plan.earliestStartMs).toBe(null);
      expect(plan.startNow).toBe(false);
    }
    expect(planOperation(series, { ...op, tpopH: 72, tcH: 24 }, DEFAULT_ALPHA_TABLE, T0).informationOnly).toBe(false);
  });

  it('alpha: false plans on OPLIM', () => {
    const wr: OperationSpec = { tpopH: 2, tcH: 1, weatherRestricted: true, limits: { hsMax: 2 } };
    const s = makeSeries({ hsM: [1.9, 1.9, 1.9, 1.9] });
    expect(Array.from(planOperation(s, wr, DEFAULT_ALPHA_TABLE, T0).status)).toEqual([M, M, M, M]);
    const plan = planOperation(s, wr, DEFAULT_ALPHA_TABLE, T0, { alpha: false });
    expect(Array.from(plan.status)).toEqual([W, W, W, W]);
    expect(plan.startNow).toBe(true);
  });
});
