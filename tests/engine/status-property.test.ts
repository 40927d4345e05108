// evaluateHours and evaluateStatus against a naive per-record implementation written here from
// docs/domain.md#operations-and-limits, #convention-5 to #convention-7), over random limits and random records,
// with values drawn on the limits themselves to hit the inclusive edges.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { DEFAULT_ALPHA_TABLE, STATUS, evaluateHours, evaluateStatus, type AlphaTable, type OperationSpec } from '../../shared/engine';
import { makeSeries } from './series-factory';
import { aroundEdges as around, operationArb, velocityArb as vel } from './limit-arbitraries';

/** Alpha by the rule of docs/domain.md#convention-5, looked up naively. */
function naiveAlpha(table: AlphaTable, op: OperationSpec, hsLimit: number, useAlpha: boolean): number {
  const tr = op.tpopH + op.tcH;
  // Weather-restricted range TPOP <= 72 h, TR <= 96 h (DNV-ST-N001 / DNV-OS-H101, from memory).
  if (!useAlpha || !op.weatherRestricted || tr > 96 || op.tpopH > 72) return 1;
  const row = table.tpopBoundsH.findIndex((b) => op.tpopH <= b);
  if (row < 0) return 1;
  const cols = table.hsColumnsM;
  const vals = table.values[row];
  if (hsLimit <= cols[0]) return vals[0];
  if (hsLimit >= cols[cols.length - 1]) return vals[vals.length - 1];
  for (let j = 1; j < cols.length; j++) {
    if (hsLimit <= cols[j]) return vals[j - 1] + ((vals[j] - vals[j - 1]) * (hsLimit - cols[j - 1])) / (cols[j] - cols[j - 1]);
  }
  throw new Error('unreachable');
}

interface Rec {
  hs: number;
  tp: number;
  lin: number;
  soul: number;
  wind: number;
}

function naiveStatus(r: Rec, op: OperationSpec, useAlpha: boolean): number {
  const L = op.limits;
  const curve = L.hsTpCurve ?? [];
  const bands = L.tpExcluded ?? [];
  const bedV = L.bedVelocityMethod === 'soulsby' ? r.soul : r.lin;
  const needHs = L.hsMax != null || curve.length > 0 || L.bedVelocityMax != null;
  const needTp = curve.length > 0 || L.tpMin != null || L.tpMax != null || bands.length > 0 || L.bedVelocityMax != null;
  if ((needHs && Number.isNaN(r.hs)) || (needTp && Number.isNaN(r.tp))) return STATUS.NO_DATA;
  if (L.bedVelocityMax != null && Number.isNaN(bedV)) return STATUS.NO_DATA;
  if (L.windMax != null && Number.isNaN(r.wind)) return STATUS.NO_DATA;
  let broken = false;
  let marginal = false;
  const hsCheck = (limit: number) => {
    const opwf = limit * naiveAlpha(DEFAULT_ALPHA_TABLE, op, limit, useAlpha);
    if (r.hs > limit) broken = true;
    else if (r.hs > opwf) marginal = true;
  };
  if (L.hsMax != null) hsCheck(L.hsMax);
  if (curve.length > 0) {
    if (r.tp < curve[0][0] || r.tp > curve[curve.length - 1][0]) broken = true;
    else {
      let j = 1;
      while (curve[j][0] < r.tp) j++;
      const [t0, h0] = curve[j - 1];
      const [t1, h1] = curve[j];
      // At a curve point its own Hs, exactly (docs/domain.md#convention-6: inclusive limits).
      hsCheck(r.tp === t1 ? h1 : h0 + ((h1 - h0) * (r.tp - t0)) / (t1 - t0));
    }
  }
  if (L.tpMin != null && r.tp < L.tpMin) broken = true;
  if (L.tpMax != null && r.tp > L.tpMax) broken = true;
  for (const [a, b] of bands) if (r.tp >= a && r.tp <= b) broken = true;
  if (L.bedVelocityMax != null && bedV > L.bedVelocityMax) broken = true;
  if (L.windMax != null && r.wind > L.windMax) broken = true;
  return broken ? STATUS.NOT_WORKABLE : marginal ? STATUS.MARGINAL : STATUS.WORKABLE;
}

const opArb = operationArb([0, 6, 24]);

/** Records with values drawn from the limits themselves (edges), near them, anywhere, or missing. */
function recordsArb(op: OperationSpec): fc.Arbitrary<Rec[]> {
  const L = op.limits;
  const hsEdges = [L.hsMax ?? 1, ...(L.hsTpCurve ?? []).map((p) => p[1])];
  const tpEdges = [L.tpMin ?? 6, L.tpMax ?? 12, ...(L.hsTpCurve ?? []).map((p) => p[0]), ...(L.tpExcluded ?? []).flat()];
  return fc.array(
    fc.record({
      hs: around(hsEdges, 0, 7),
      tp: around(tpEdges, 2, 22),
      lin: vel,
      soul: vel,
      wind: fc.oneof(fc.constantFrom(8, 12, 15), fc.double({ min: 0, max: 20, noNaN: true }), fc.constant(NaN)),
    }),
    { minLength: 1, maxLength: 60 },
  );
}

describe('hourly status against a naive implementation of docs/domain.md#hourly-status', () => {
  it('evaluateHours and evaluateStatus, with and without alpha', () => {
    fc.assert(
      fc.property(
        opArb.chain((op) => fc.tuple(fc.constant(op), recordsArb(op), fc.boolean())),
        ([op, recs, useAlpha]) => {
          const series = makeSeries({
            hsM: recs.map((r) => r.hs),
            tpS: recs.map((r) => r.tp),
            bedVelocityLinearMps: recs.map((r) => r.lin),
            bedVelocitySoulsbyMps: recs.map((r) => r.soul),
            windMps: recs.map((r) => r.wind),
          });
          const want = recs.map((r) => naiveStatus(r, op, useAlpha));
          const full = evaluateHours(series, op, { alpha: useAlpha, alphaTable: DEFAULT_ALPHA_TABLE });
          expect(Array.from(full.status)).toEqual(want);
          expect(Array.from(evaluateStatus(series, op, { alpha: useAlpha, alphaTable: DEFAULT_ALPHA_TABLE }))).toEqual(want);
          // Limiting factor present exactly when there is data; margin negative exactly when not workable
          // at OPWF, i.e. for marginal and not workable hours (an Hs-band edge can give -0).
          full.status.forEach((st, i) => {
            expect(full.limiting[i] === 0).toBe(st === STATUS.NO_DATA);
            if (st === STATUS.WORKABLE) expect(full.marginRel[i]).toBeGreaterThanOrEqual(0);
            if (st === STATUS.MARGINAL) expect(full.marginRel[i]).toBeLessThan(0);
          });
        },
      ),
      { numRuns: 600 },
    );
  });
});
