import { compileLimits, type CompiledLimits } from './compiled-limits';
import { assertSeriesLengths } from './evaluate-hours';
import { curveAlpha, curveLimit, prepareCurve } from './hs-tp-curve';
import { targetHsSeries } from './hs-targets';
import { raiseResponseClasses } from './response-limits';
import { tideWindowMarginH } from './tide-window';
import { STATUS, type AlphaTable, type OperationSpec, type SiteSeries } from './types';

/** Options of {@link evaluateStatus}. */
export interface EvaluateStatusOptions {
  /** Apply alpha (OPWF = alpha * OPLIM on the Hs limits). Default true; false plans on OPLIM (docs/domain.md#convention-14). */
  alpha?: boolean;
  alphaTable: AlphaTable;
  /** Buffer to write into, at least as long as the series (its first n entries are written). */
  out?: Uint8Array;
}

/** Class codes while the passes run: 0 met, 1 met at OPLIM only, 2 broken, NO_DATA_CLASS no data. */
const NO_DATA_CLASS = 255;

/** Class -> STATUS code. */
const CLASS_TO_STATUS = (() => {
  const map = new Uint8Array(256);
  map[0] = STATUS.WORKABLE;
  map[1] = STATUS.MARGINAL;
  map[2] = STATUS.NOT_WORKABLE;
  map[NO_DATA_CLASS] = STATUS.NO_DATA;
  return map;
})();

/**
 * Hourly status only (no limiting factor, no margin): the same status as evaluateHours
 * (docs/domain.md#operations-and-limits, #convention-5 to #convention-7), faster, for hindcast statistics where
 * only workable / marginal / not workable / no data counts.
 *
 * Method: one small pass over the records per limit, each raising a per-record class (0 met,
 * 1 marginal, 2 broken) in the output buffer, after a pass that marks records missing a needed
 * value (docs/domain.md#convention-7, no data wins); a last pass maps classes to STATUS codes. Every pass is a
 * short loop of one kind, so the JIT compiles each once for all operations (one loop with a branch
 * per limit type is recompiled whenever an operation with a new mix of limits comes along).
 *
 * @returns STATUS code per record (the `out` buffer, or a view of its first n entries, when given)
 * @throws RangeError for invalid limits, arrays of unequal length or a short `out` buffer.
 */
export function evaluateStatus(series: SiteSeries, op: OperationSpec, options: EvaluateStatusOptions): Uint8Array {
  assertSeriesLengths(series);
  const c = compileLimits(op, options.alphaTable, options.alpha !== false);
  const n = series.timeMs.length;
  const out = options.out ?? new Uint8Array(n);
  if (out.length < n) throw new RangeError('evaluateStatus: out buffer shorter than the series');
  const cls = out.length === n ? out : out.subarray(0, n);
  const bed = c.bedSoulsby ? series.bedVelocitySoulsbyMps : series.bedVelocityLinearMps;

  cls.fill(0);
  if (c.needHs) markMissing(series.hsM, cls);
  if (c.needTp) markMissing(series.tpS, cls);
  if (c.needBed) markMissing(bed, cls);
  if (c.needWind) markMissing(series.windMps, cls);
  // Exact limits of docs/domain.md#tide: a missing array means no data for every record.
  if (c.needDepth) {
    if (series.depthM) markMissing(series.depthM, cls);
    else cls.fill(NO_DATA_CLASS);
  }
  if (c.needCurrent) {
    if (series.currentMps) markMissing(series.currentMps, cls);
    else cls.fill(NO_DATA_CLASS);
  }
  if (c.tideWindow) raiseTideWindow(series, c, cls);
  // Hs on a target (docs/domain.md#partitions): an unknown partition value is no data.
  const targetHs = c.hsTargets.map((t) => targetHsSeries(series, t.target, t.minPeriodS));
  for (const v of targetHs) markMissing(v, cls);

  if (c.hsMax === c.hsMax) raiseHs(series.hsM, c.hsMaxOpwf, c.hsMax, cls);
  if (c.curveTp.length >= 2) raiseCurve(series.hsM, series.tpS, c, cls);
  if (c.tpMin === c.tpMin) breakBelow(series.tpS, c.tpMin, cls);
  if (c.tpMax === c.tpMax) breakAbove(series.tpS, c.tpMax, cls);
  for (let b = 0; b < c.bandFrom.length; b++) breakInside(series.tpS, c.bandFrom[b], c.bandTo[b], cls);
  if (c.bandFrom.length > 0 && series.partitions) {
    // Every partition with enough worksite Hs is tested too (docs/domain.md#partitions).
    for (const p of [series.partitions.windSea, series.partitions.swell1, series.partitions.swell2]) {
      for (let b = 0; b < c.bandFrom.length; b++) breakInsideWhere(p.tpS, p.hsM, c.bandMinHs, c.bandFrom[b], c.bandTo[b], cls);
    }
  }
  c.hsTargets.forEach((t, k) => raiseHs(targetHs[k], t.opwf, t.max, cls));
  if (c.needBed) breakAbove(bed, c.bedMax, cls);
  if (c.needWind) breakAbove(series.windMps, c.windMax, cls);
  if (c.minDepth === c.minDepth && series.depthM) breakBelow(series.depthM, c.minDepth, cls);
  if (c.maxDepth === c.maxDepth && series.depthM) breakAbove(series.depthM, c.maxDepth, cls);
  if (c.needCurrent && series.currentMps) breakAbove(series.currentMps, c.currentMax, cls);
  if (c.responses.length > 0) raiseResponseClasses(series, op, c, cls, NO_DATA_CLASS);

  for (let i = 0; i < n; i++) cls[i] = CLASS_TO_STATUS[cls[i]];
  return cls;
}

/** Tide window: outside it broken, no extremes for the record no data (tideWindowMarginH). */
function raiseTideWindow(series: SiteSeries, c: CompiledLimits, cls: Uint8Array): void {
  const limit = c.tideWindow!;
  for (let i = 0; i < cls.length; i++) {
    const m = tideWindowMarginH(series.tide, limit, series.timeMs[i]);
    if (m !== m) cls[i] = NO_DATA_CLASS;
    else if (m < 0 && cls[i] < 2) cls[i] = 2;
  }
}

/** No data: a needed value is NaN. */
function markMissing(v: Float64Array, cls: Uint8Array): void {
  for (let i = 0; i < cls.length; i++) if (v[i] !== v[i]) cls[i] = NO_DATA_CLASS;
}

/** Hs max: above OPWF marginal, above OPLIM broken (inclusive limits). */
function raiseHs(hs: Float64Array, opwf: number, oplim: number, cls: Uint8Array): void {
  for (let i = 0; i < cls.length; i++) {
    const h = hs[i];
    const k = (h > opwf ? 1 : 0) + (h > oplim ? 1 : 0);
    if (k > cls[i]) cls[i] = k;
  }
}

/** A maximum: above it broken. NaN never compares, and no data (255) stays. */
function breakAbove(v: Float64Array, max: number, cls: Uint8Array): void {
  for (let i = 0; i < cls.length; i++) if (v[i] > max && cls[i] < 2) cls[i] = 2;
}

/** A minimum: below it broken. */
function breakBelow(v: Float64Array, min: number, cls: Uint8Array): void {
  for (let i = 0; i < cls.length; i++) if (v[i] < min && cls[i] < 2) cls[i] = 2;
}

/** A closed excluded band [from, to]: inside, edges included, broken (docs/domain.md#convention-6). */
function breakInside(v: Float64Array, from: number, to: number, cls: Uint8Array): void {
  for (let i = 0; i < cls.length; i++) {
    const x = v[i];
    if (x >= from && x <= to && cls[i] < 2) cls[i] = 2;
  }
}

/** A closed excluded band tested on a partition's Tp where its Hs is at least `minHs` (and above 0). */
function breakInsideWhere(tp: Float64Array, hs: Float64Array, minHs: number, from: number, to: number, cls: Uint8Array): void {
  for (let i = 0; i < cls.length; i++) {
    const x = tp[i];
    const h = hs[i];
    if (h >= minHs && h > 0 && x >= from && x <= to && cls[i] < 2) cls[i] = 2;
  }
}

/**
 * Hs-Tp curve: outside its closed Tp range broken; inside, OPLIM by linear interpolation and
 * OPWF = alpha(OPLIM) * OPLIM (docs/domain.md#convention-5). Hs at or below (lowest curve Hs) * (lowest alpha)
 * meets OPWF anywhere and Hs above the highest curve Hs breaks OPLIM anywhere, so only the records
 * in between need the interpolation.
 */
function raiseCurve(hs: Float64Array, tp: Float64Array, c: CompiledLimits, cls: Uint8Array): void {
  const curve = prepareCurve(c);
  // curveClass (hs-tp-curve.ts) with the bounds held here: the interpolation only in between.
  const { tp0, tpN, hsMax, sureOk } = curve;
  for (let i = 0; i < cls.length; i++) {
    const h = hs[i];
    const t = tp[i];
    let k: number;
    if (t < tp0 || t > tpN || h > hsMax) k = 2;
    else if (h <= sureOk) k = 0;
    else {
      const lim = curveLimit(curve, t);
      k = (h > lim * curveAlpha(curve, lim) ? 1 : 0) + (h > lim ? 1 : 0);
    }
    if (k > cls[i]) cls[i] = k;
  }
}
