import { describe, expect, it } from 'vitest';
import { DEFAULT_ALPHA_TABLE, LIMIT, STATUS, evaluateHours, type OperationLimits, type OperationSpec } from '../../shared/engine';
import { explainHour } from '../../shared/engine/explain-hour';
import { makeSeries, type Columns } from './series-factory';

const { NO_DATA, NOT_WORKABLE, MARGINAL, WORKABLE } = STATUS;

/** Not weather-restricted: alpha = 1, so the limits apply as given (docs/domain.md#convention-5). */
function oplim(limits: OperationLimits): OperationSpec {
  return { tpopH: 6, tcH: 0, weatherRestricted: false, limits };
}

/** An operation limited by an Hs-Tp curve through these points (Tp s, Hs m) alone. */
const curveOp = (...points: [number, number][]) => oplim({ hsTpCurve: points });

function statuses(cols: Columns, op: OperationSpec, alpha = true): number[] {
  return Array.from(evaluateHours(makeSeries(cols), op, { alpha, alphaTable: DEFAULT_ALPHA_TABLE }).status);
}

describe('evaluateHours: each limit alone, inclusive (docs/domain.md#convention-6)', () => {
  it('Hs max: equal meets, above breaks, missing Hs is no data', () => {
    const op = oplim({ hsMax: 2 });
    expect(statuses({ hsM: [0, 1.99, 2, 2.01, NaN] }, op)).toEqual([WORKABLE, WORKABLE, WORKABLE, NOT_WORKABLE, NO_DATA]);
  });

  it('Hs max does not need Tp or wind', () => {
    const op = oplim({ hsMax: 2 });
    expect(statuses({ hsM: [1], tpS: [NaN], windMps: [NaN], bedVelocityLinearMps: [NaN] }, op)).toEqual([WORKABLE]);
  });

  it('Tp min and Tp max: edges meet', () => {
    expect(statuses({ tpS: [4.99, 5, 12] }, oplim({ tpMin: 5 }))).toEqual([NOT_WORKABLE, WORKABLE, WORKABLE]);
    expect(statuses({ tpS: [5, 12, 12.01, NaN] }, oplim({ tpMax: 12 }))).toEqual([WORKABLE, WORKABLE, NOT_WORKABLE, NO_DATA]);
  });

  it('excluded Tp bands are closed: both edges excluded', () => {
    const op = oplim({
      tpExcluded: [
        [8, 9],
        [13, 14],
      ],
    });
    expect(statuses({ tpS: [7.99, 8, 8.5, 9, 9.01, 12.99, 13, 14, 14.01, NaN] }, op)).toEqual([
      WORKABLE,
      NOT_WORKABLE,
      NOT_WORKABLE,
      NOT_WORKABLE,
      WORKABLE,
      WORKABLE,
      NOT_WORKABLE,
      NOT_WORKABLE,
      WORKABLE,
      NO_DATA,
    ]);
  });

  it('bed velocity: the limit method picks the series; Hs and Tp are needed too (docs/domain.md#convention-7)', () => {
    const cols: Columns = {
      hsM: [1, 1, 1, NaN, 1],
      tpS: [8, 8, 8, 8, NaN],
      bedVelocityLinearMps: [0.5, 0.51, 0.1, 0.1, 0.1],
      bedVelocitySoulsbyMps: [0.9, 0.1, 0.5, 0.1, 0.1],
    };
    expect(statuses(cols, oplim({ bedVelocityMax: 0.5 }))).toEqual([WORKABLE, NOT_WORKABLE, WORKABLE, NO_DATA, NO_DATA]);
    expect(statuses(cols, oplim({ bedVelocityMax: 0.5, bedVelocityMethod: 'linear' }))).toEqual([
      WORKABLE,
      NOT_WORKABLE,
      WORKABLE,
      NO_DATA,
      NO_DATA,
    ]);
    expect(statuses(cols, oplim({ bedVelocityMax: 0.5, bedVelocityMethod: 'soulsby' }))).toEqual([
      NOT_WORKABLE,
      WORKABLE,
      WORKABLE,
      NO_DATA,
      NO_DATA,
    ]);
  });

  it('wind max: equal meets; needs only wind', () => {
    const op = oplim({ windMax: 12 });
    expect(statuses({ windMps: [11, 12, 12.1, NaN], hsM: [NaN, NaN, NaN, 1] }, op)).toEqual([WORKABLE, WORKABLE, NOT_WORKABLE, NO_DATA]);
  });
});

describe('evaluateHours: Hs-Tp curve (docs/domain.md#convention-6: range closed, outside not workable)', () => {
  // Curve points (Tp s, Hs m): (4, 1.0), (8, 2.0), (12, 1.5).
  const op = curveOp([4, 1], [8, 2], [12, 1.5]);

  it('exactly on the edges of the Tp range is inside; just outside is not workable even in calm seas', () => {
    expect(statuses({ tpS: [4, 12, 3.99, 12.01], hsM: [1, 1.5, 0, 0] }, op)).toEqual([WORKABLE, WORKABLE, NOT_WORKABLE, NOT_WORKABLE]);
  });

  it('interpolates linearly between points: Tp 6 s gives 1.5 m, Tp 10 s gives 1.75 m', () => {
    expect(statuses({ tpS: [6, 6, 10, 10], hsM: [1.5, 1.51, 1.75, 1.76] }, op)).toEqual([WORKABLE, NOT_WORKABLE, WORKABLE, NOT_WORKABLE]);
  });

  it('missing Tp or Hs is no data', () => {
    expect(statuses({ tpS: [NaN, 6], hsM: [1, NaN] }, op)).toEqual([NO_DATA, NO_DATA]);
  });

  it('outside the range the limiting factor is the curve with a negative relative margin in Tp', () => {
    const ev = evaluateHours(makeSeries({ tpS: [3], hsM: [0.5] }), op, { alphaTable: DEFAULT_ALPHA_TABLE });
    expect(ev.limiting[0]).toBe(LIMIT.HS_TP_CURVE);
    // (4 - 3) / 4 below the range's first Tp.
    expect(ev.marginRel[0]).toBeCloseTo(-0.25, 6);
  });
});

describe('evaluateHours: alpha and the marginal status (docs/domain.md#convention-5; table in docs/domain.md#weather-restricted, from memory of DNV-ST-N001)', () => {
  // TPOP 24 h, TC 6 h (TR 30 h), weather-restricted, Hs max 2 m: alpha = 0.73 (row 24 h, column 2 m),
  // OPWF = 1.46 m.
  const op: OperationSpec = { tpopH: 24, tcH: 6, weatherRestricted: true, limits: { hsMax: 2 } };

  it('Hs at or below OPWF is workable, between OPWF and OPLIM marginal, above OPLIM not workable', () => {
    expect(statuses({ hsM: [1.46, 1.47, 2, 2.01] }, op)).toEqual([WORKABLE, MARGINAL, MARGINAL, NOT_WORKABLE]);
  });

  it('without alpha the same hours are workable up to OPLIM (docs/domain.md#convention-14)', () => {
    expect(statuses({ hsM: [1.46, 1.47, 2, 2.01] }, op, false)).toEqual([WORKABLE, WORKABLE, WORKABLE, NOT_WORKABLE]);
  });

  it('not weather-restricted: alpha = 1', () => {
    expect(statuses({ hsM: [1.47, 2] }, { ...op, weatherRestricted: false })).toEqual([WORKABLE, WORKABLE]);
  });

  it('TR 96 h exactly is still weather-restricted (DNV-ST-N001 / DNV-OS-H101, from memory: bounds included); above it, OPLIM', () => {
    // TPOP 24 h, TC 72 h: TR 96 h, alpha 0.73 as above.
    expect(statuses({ hsM: [1.46, 1.47, 2] }, { ...op, tcH: 72 })).toEqual([WORKABLE, MARGINAL, MARGINAL]);
    // TC 72.5 h: TR 96.5 h, not weather-restricted: at OPLIM (for information only in a forecast plan).
    expect(statuses({ hsM: [1.47, 2] }, { ...op, tcH: 72.5 })).toEqual([WORKABLE, WORKABLE]);
  });

  it('the curve takes alpha at the curve value for the record Tp', () => {
    // TPOP 12 h (row 12 h). Tp 6 s: curve 1.5 m, alpha = 0.65 + 0.5 * (0.76 - 0.65) = 0.705,
    // OPWF = 1.0575 m. Tp 8 s: curve 2.0 m, alpha 0.76, OPWF 1.52 m.
    const restricted: OperationSpec = { ...curveOp([4, 1], [8, 2], [12, 1.5]), tpopH: 12, weatherRestricted: true };
    expect(statuses({ tpS: [6, 6, 6, 6, 8, 8], hsM: [1.05, 1.06, 1.5, 1.51, 1.52, 1.53] }, restricted)).toEqual([
      WORKABLE,
      MARGINAL,
      MARGINAL,
      NOT_WORKABLE,
      WORKABLE,
      MARGINAL,
    ]);
  });

  it('alpha never touches Tp, bed velocity or wind limits', () => {
    const mixed: OperationSpec = { tpopH: 24, tcH: 0, weatherRestricted: true, limits: { tpMax: 10, windMax: 10, bedVelocityMax: 0.3 } };
    expect(statuses({ hsM: [1], tpS: [10], windMps: [10], bedVelocityLinearMps: [0.3] }, mixed)).toEqual([WORKABLE]);
  });

  it('marginal comes only from Hs: a broken wind limit makes the hour not workable, limited by wind', () => {
    const both: OperationSpec = { ...op, limits: { hsMax: 2, windMax: 10 } };
    const ev = evaluateHours(makeSeries({ hsM: [1.8, 1.8], windMps: [9, 10.5] }), both, { alphaTable: DEFAULT_ALPHA_TABLE });
    expect(Array.from(ev.status)).toEqual([MARGINAL, NOT_WORKABLE]);
    expect(Array.from(ev.limiting)).toEqual([LIMIT.HS, LIMIT.WIND]);
    // Hs margin against OPWF: (1.46 - 1.8) / 1.46; wind (10 - 10.5) / 10.
    expect(ev.marginRel[0]).toBeCloseTo((1.46 - 1.8) / 1.46, 6);
    expect(ev.marginRel[1]).toBeCloseTo(-0.05, 6);
  });
});

describe('evaluateHours: no data wins, limiting factor and margins', () => {
  it('a missing value makes the hour no data even when another limit is already broken (docs/domain.md#convention-7)', () => {
    const op = oplim({ hsMax: 2, windMax: 10 });
    const ev = evaluateHours(makeSeries({ hsM: [5], windMps: [NaN] }), op, { alphaTable: DEFAULT_ALPHA_TABLE });
    expect(ev.status[0]).toBe(NO_DATA);
    expect(ev.limiting[0]).toBe(LIMIT.NONE);
    expect(Number.isNaN(ev.marginRel[0])).toBe(true);
  });

  it('workable hours: the limit with the smallest relative margin limits', () => {
    const op = oplim({ hsMax: 2, windMax: 10 });
    // Hs 1 m: (2 - 1) / 2 = 0.5; wind 8 m/s: (10 - 8) / 10 = 0.2 -> wind.
    // Hs 1.8 m: 0.1; wind 5 m/s: 0.5 -> Hs.
    const ev = evaluateHours(makeSeries({ hsM: [1, 1.8], windMps: [8, 5] }), op, { alphaTable: DEFAULT_ALPHA_TABLE });
    expect(Array.from(ev.limiting)).toEqual([LIMIT.WIND, LIMIT.HS]);
    expect(ev.marginRel[0]).toBeCloseTo(0.2, 6);
    expect(ev.marginRel[1]).toBeCloseTo(0.1, 6);
  });

  it('not workable hours: the broken limit with the most negative margin limits', () => {
    const op = oplim({ hsMax: 2, windMax: 10, tpMin: 5 });
    // Hs 3 m: -0.5; wind 11 m/s: -0.1; Tp 6 s met (0.2) -> Hs.
    // Hs 1 m met (0.5); wind 12 m/s: -0.2; Tp 4.5 s: -0.1 -> wind.
    const ev = evaluateHours(makeSeries({ hsM: [3, 1], windMps: [11, 12], tpS: [6, 4.5] }), op, { alphaTable: DEFAULT_ALPHA_TABLE });
    expect(Array.from(ev.status)).toEqual([NOT_WORKABLE, NOT_WORKABLE]);
    expect(Array.from(ev.limiting)).toEqual([LIMIT.HS, LIMIT.WIND]);
    expect(ev.marginRel[0]).toBeCloseTo(-0.5, 6);
    expect(ev.marginRel[1]).toBeCloseTo(-0.2, 6);
  });

  it('a Tp on a band edge is broken with margin 0 and limits even when other margins are smaller', () => {
    const op = oplim({ tpExcluded: [[8, 9]], windMax: 10 });
    const ev = evaluateHours(makeSeries({ tpS: [8], windMps: [10] }), op, { alphaTable: DEFAULT_ALPHA_TABLE });
    expect(ev.status[0]).toBe(NOT_WORKABLE);
    expect(ev.limiting[0]).toBe(LIMIT.TP_BAND);
    expect(Math.abs(ev.marginRel[0])).toBe(0);
  });

  it('writes into given buffers and rejects wrong lengths', () => {
    const series = makeSeries({ hsM: [1, 3] });
    const out = { status: new Uint8Array(2), limiting: new Uint8Array(2), marginRel: new Float32Array(2) };
    const ev = evaluateHours(series, oplim({ hsMax: 2 }), { alphaTable: DEFAULT_ALPHA_TABLE, out });
    expect(ev.status).toBe(out.status);
    expect(Array.from(out.status)).toEqual([WORKABLE, NOT_WORKABLE]);
    expect(() =>
      evaluateHours(series, oplim({ hsMax: 2 }), { alphaTable: DEFAULT_ALPHA_TABLE, out: { ...out, status: new Uint8Array(3) } }),
    ).toThrow(RangeError);
  });

  it('rejects an operation without limits and a malformed curve', () => {
    const series = makeSeries({ hsM: [1] });
    expect(() => evaluateHours(series, oplim({}), { alphaTable: DEFAULT_ALPHA_TABLE })).toThrow(RangeError);
    expect(() => evaluateHours(series, curveOp([8, 1], [6, 2]), { alphaTable: DEFAULT_ALPHA_TABLE })).toThrow(RangeError);
    expect(() => evaluateHours(series, oplim({ tpExcluded: [[9, 8]] }), { alphaTable: DEFAULT_ALPHA_TABLE })).toThrow(RangeError);
  });
});

// Issue 22: the hour chain said "outside the curve" without saying why.
describe('the hour chain says why the Hs-Tp curve failed', () => {
  const op = curveOp([6, 1.2], [10, 2], [14, 1.5]);
  const hour = (hsM: number, tpS: number) => ({ hsM, tpS, bedVelocityLinearMps: NaN, bedVelocitySoulsbyMps: NaN, windMps: NaN });
  const curveCheck = (hsM: number, tpS: number) => explainHour(hour(hsM, tpS), op, DEFAULT_ALPHA_TABLE).checks[0];

  it('names the curve end a Tp is beyond, the first point a Tp is below, and the Hs above the curve', () => {
    expect(curveCheck(0.5, 14.73)).toMatchObject({ met: false, reason: "Tp 14.7 s is beyond the curve's last point at 14 s" });
    expect(curveCheck(0.5, 5.2)).toMatchObject({ met: false, reason: "Tp 5.2 s is below the curve's first point at 6 s" });
    // At Tp 8 s the curve is 1.2 + (2 - 1.2) * 2 / 4 = 1.6 m (linear between its points; hand-computed).
    expect(curveCheck(1.75, 8)).toMatchObject({ met: false, reason: "Hs 1.8 m is above the curve's 1.6 m (OPLIM) at Tp 8 s" });
    expect(curveCheck(1.5, 8).reason).toBeUndefined();
  });
});
