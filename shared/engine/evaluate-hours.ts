import { compileLimits } from './compiled-limits';
import { bandPeriodsAt, targetHsSeries } from './hs-targets';
import { curveAlpha, curveLimit, prepareCurve, type PreparedCurve } from './hs-tp-curve';
import { responseClass, responseLimitSeries } from './response-limits';
import { tideWindowMarginH } from './tide-window';
import { LIMIT, STATUS, type AlphaTable, type HourlyEvaluation, type OperationSpec, type SiteSeries } from './types';

/** Options of {@link evaluateHours}. */
export interface EvaluateOptions {
  /** Apply alpha (OPWF = alpha * OPLIM on the Hs limits). Default true; false plans on OPLIM (docs/domain.md#convention-14). */
  alpha?: boolean;
  /** The project's alpha table (see DEFAULT_ALPHA_TABLE). */
  alphaTable: AlphaTable;
  /** Buffers to write into (reused between calls); each must have the series' length. */
  out?: HourlyEvaluation;
}

/**
 * Checks that every array of a series has the length of its time axis.
 * @throws RangeError naming the first array of another length.
 */
export function assertSeriesLengths(series: SiteSeries): void {
  const n = series.timeMs.length;
  for (const key of ['hsM', 'tpS', 'bedVelocityLinearMps', 'bedVelocitySoulsbyMps', 'windMps'] as const) {
    if (series[key].length !== n) throw new RangeError(`series.${key} has ${series[key].length} values for ${n} times`);
  }
  for (const key of ['depthM', 'currentMps'] as const) {
    const a = series[key];
    if (a && a.length !== n) throw new RangeError(`series.${key} has ${a.length} values for ${n} times`);
  }
}

/**
 * Hourly go/no-go status of an operation for every record of a worksite series
 * (docs/domain.md#operations-and-limits, #convention-5 to #convention-7).
 *
 * Per record:
 * - no data (STATUS.NO_DATA) when any value the limits need is NaN (docs/domain.md#convention-7: Hs for Hs max,
 *   the curve and bed velocity; Tp for the curve, Tp limits, bands and bed velocity; the bed
 *   velocity of the limit's method; wind for a wind limit). No data wins over a broken limit.
 * - each limit is met (inclusive, docs/domain.md#convention-6), met at OPLIM only (Hs limits between
 *   alpha * OPLIM and OPLIM: marginal), or broken. Outside the Hs-Tp curve's closed Tp range the
 *   curve is broken; inside, its Hs limit is interpolated linearly and alpha is looked up at that
 *   value (docs/domain.md#convention-5). A Tp inside a closed excluded band, edges included, breaks the band.
 * - status: not workable if any limit is broken, else marginal if an Hs limit is met only at
 *   OPLIM, else workable.
 *
 * Relative margin per limit (dimensionless, negative when not met):
 * Hs max (OPWF - Hs)/OPWF; curve (OPWF(Tp) - Hs)/OPWF(Tp), or outside its Tp range minus the Tp
 * distance to the range over the nearest end's Tp; Tp min (Tp - min)/min; Tp max (max - Tp)/max;
 * bands (distance to the nearest edge)/edge, negative inside; bed velocity and wind (max - value)/max;
 * min depth (h - min)/min, max depth (max - h)/max, current (max - value)/max; tide window the hours
 * inside it (tideWindowMarginH) over its length before + after; Hs on a target (docs/domain.md#partitions)
 * (OPWF - value)/OPWF, the value from targetHsAt (unknown: no data). With `series.partitions`, the
 * bands also test every partition whose worksite Hs reaches the operation's threshold. Depth needs `series.depthM`, current
 * `series.currentMps`, the window `series.tide`: without them those limits find no data.
 * OPWF = OPLIM when alpha does not apply.
 *
 * Limiting factor: among the limits that decide the status (the broken ones for not workable, the
 * Hs limits missed at OPWF for marginal, all for workable), the one with the smallest relative
 * margin; ties go to the first in LIMIT order. LIMIT.NONE and NaN margin for no data.
 *
 * Cost: one pass, no allocation per record. 263k records take a few ms.
 *
 * @returns status (STATUS codes), limiting (LIMIT codes), marginRel (Float32) per record
 * @throws RangeError for invalid limits (see compileLimits), arrays of unequal length, or `out`
 *   buffers of the wrong length.
 */
export function evaluateHours(series: SiteSeries, op: OperationSpec, options: EvaluateOptions): HourlyEvaluation {
  assertSeriesLengths(series);
  const c = compileLimits(op, options.alphaTable, options.alpha !== false);
  const n = series.timeMs.length;
  const out = options.out ?? { status: new Uint8Array(n), limiting: new Uint8Array(n), marginRel: new Float32Array(n) };
  if (out.status.length !== n || out.limiting.length !== n || out.marginRel.length !== n) {
    throw new RangeError('evaluateHours: out buffers must have the series length');
  }
  const { status, limiting, marginRel } = out;
  // The exact limits of docs/domain.md#tide (alpha never applies): depth, current, tide window.
  const depthArr = series.depthM;
  const currentArr = series.currentMps;
  const hasMinDepth = c.minDepth === c.minDepth;
  const hasMaxDepth = c.maxDepth === c.maxDepth;
  const hasCurrent = c.needCurrent;
  const tideWindow = c.tideWindow;
  const tideSpanH = tideWindow ? tideWindow.before + tideWindow.after : NaN;
  const hsArr = series.hsM;
  const tpArr = series.tpS;
  const bedArr = c.bedSoulsby ? series.bedVelocitySoulsbyMps : series.bedVelocityLinearMps;
  const windArr = series.windMps;

  const { needHs, needTp, needBed, needWind, hsMax, hsMaxOpwf, tpMin, tpMax, bedMax, windMax } = c;
  const hasHs = hsMax === hsMax;
  const hasCurve = c.curveTp.length >= 2;
  const curve = hasCurve ? prepareCurve(c) : null;
  const curveTp0 = curve !== null ? curve.tp0 : NaN;
  const curveTpN = curve !== null ? curve.tpN : NaN;
  const hasTpMin = tpMin === tpMin;
  const hasTpMax = tpMax === tpMax;
  const hasBands = c.bandFrom.length > 0;
  const hasBed = needBed;
  const hasWind = needWind;
  // Reciprocals of the limits: one multiplication per record instead of a division.
  const invHs = 1 / hsMaxOpwf;
  const invCurve0 = 1 / curveTp0;
  const invCurveN = 1 / curveTpN;
  const invTpMin = 1 / tpMin;
  const invTpMax = 1 / tpMax;
  const invBed = 1 / bedMax;
  const invWind = 1 / windMax;
  const NO_DATA: number = STATUS.NO_DATA;
  const NONE: number = LIMIT.NONE;
  const CLASS_STATUS = Uint8Array.of(STATUS.WORKABLE, STATUS.MARGINAL, STATUS.NOT_WORKABLE);
  const bandFrom = c.bandFrom;
  const bandTo = c.bandTo;
  const nBands = bandFrom.length;
  // Hs on targets (docs/domain.md#partitions), and the partitions' periods for the bands.
  const targets = c.hsTargets;
  const nTargets = targets.length;
  const targetHs = targets.map((t) => targetHsSeries(series, t.target, t.minPeriodS));
  const bandTps = new Float64Array(4);
  const partitionBands = hasBands && series.partitions !== undefined;

  for (let i = 0; i < n; i++) {
    const hs = needHs ? hsArr[i] : 0;
    const tp = needTp ? tpArr[i] : 0;
    const bed = hasBed ? bedArr[i] : 0;
    const wind = hasWind ? windArr[i] : 0;
    const depth = c.needDepth ? (depthArr ? depthArr[i] : NaN) : 0;
    const current = hasCurrent ? (currentArr ? currentArr[i] : NaN) : 0;
    const tideH = tideWindow ? tideWindowMarginH(series.tide, tideWindow, series.timeMs[i]) : 0;
    let targetMissing = false;
    for (let t = 0; t < nTargets; t++) if (targetHs[t][i] !== targetHs[t][i]) targetMissing = true;
    if (
      hs !== hs ||
      tp !== tp ||
      bed !== bed ||
      wind !== wind ||
      depth !== depth ||
      current !== current ||
      tideH !== tideH ||
      targetMissing
    ) {
      status[i] = NO_DATA;
      limiting[i] = NONE;
      marginRel[i] = NaN;
      continue;
    }
    // Class: 0 met, 1 met at OPLIM only (marginal), 2 broken. Keep the highest class, and within
    // it the smallest relative margin; ties keep the earlier limit in LIMIT order.
    let bestCls = -1;
    let bestRel = Infinity;
    let bestLim = NONE;
    let cls: number;
    let rel: number;

    if (hasHs) {
      bestCls = (hs > hsMaxOpwf ? 1 : 0) + (hs > hsMax ? 1 : 0);
      bestRel = (hsMaxOpwf - hs) * invHs;
      bestLim = LIMIT.HS;
    }
    if (hasCurve) {
      if (tp < curveTp0) {
        cls = 2;
        rel = (tp - curveTp0) * invCurve0;
      } else if (tp > curveTpN) {
        cls = 2;
        rel = (curveTpN - tp) * invCurveN;
      } else {
        // Curve Hs limit at Tp, then alpha at that limit (hs-tp-curve.ts, as evaluateStatus).
        const lim = curveLimit(curve as PreparedCurve, tp);
        const alpha = curveAlpha(curve as PreparedCurve, lim);
        const opwf = lim * alpha;
        cls = (hs > opwf ? 1 : 0) + (hs > lim ? 1 : 0);
        rel = opwf > 0 ? (opwf - hs) / opwf : hs <= 0 ? 0 : -Infinity;
      }
      if (cls > bestCls || (cls === bestCls && rel < bestRel)) {
        bestCls = cls;
        bestRel = rel;
        bestLim = LIMIT.HS_TP_CURVE;
      }
    }
    if (hasTpMin) {
      cls = tp < tpMin ? 2 : 0;
      rel = (tp - tpMin) * invTpMin;
      if (cls > bestCls || (cls === bestCls && rel < bestRel)) {
        bestCls = cls;
        bestRel = rel;
        bestLim = LIMIT.TP_MIN;
      }
    }
    if (hasTpMax) {
      cls = tp > tpMax ? 2 : 0;
      rel = (tpMax - tp) * invTpMax;
      if (cls > bestCls || (cls === bestCls && rel < bestRel)) {
        bestCls = cls;
        bestRel = rel;
        bestLim = LIMIT.TP_MAX;
      }
    }
    if (hasBands) {
      // Closed bands (docs/domain.md#convention-6): inside, edges included, is broken; the relative margin is the
      // distance to the nearest edge over that edge's Tp, negative inside.
      // With partitions, every partition with enough worksite Hs is tested too (docs/domain.md#partitions).
      cls = 0;
      rel = Infinity;
      bandTps[0] = tp;
      const nTp = partitionBands ? bandPeriodsAt(series, i, c.bandMinHs, bandTps) : 1;
      for (let q = 0; q < nTp; q++) {
        const x = bandTps[q];
        for (let b = 0; b < nBands; b++) {
          const lo = bandFrom[b];
          const hi = bandTo[b];
          let r: number;
          if (x < lo) r = (lo - x) / lo;
          else if (x > hi) r = (x - hi) / hi;
          else {
            cls = 2;
            r = x - lo <= hi - x ? (lo - x) / lo : (x - hi) / hi;
          }
          if (r < rel) rel = r;
        }
      }
      if (cls > bestCls || (cls === bestCls && rel < bestRel)) {
        bestCls = cls;
        bestRel = rel;
        bestLim = LIMIT.TP_BAND;
      }
    }
    if (hasBed) {
      cls = bed > bedMax ? 2 : 0;
      rel = (bedMax - bed) * invBed;
      if (cls > bestCls || (cls === bestCls && rel < bestRel)) {
        bestCls = cls;
        bestRel = rel;
        bestLim = LIMIT.BED_VELOCITY;
      }
    }
    if (hasWind) {
      cls = wind > windMax ? 2 : 0;
      rel = (windMax - wind) * invWind;
      if (cls > bestCls || (cls === bestCls && rel < bestRel)) {
        bestCls = cls;
        bestRel = rel;
        bestLim = LIMIT.WIND;
      }
    }
    if (hasMinDepth) {
      cls = depth < c.minDepth ? 2 : 0;
      rel = (depth - c.minDepth) / c.minDepth;
      if (cls > bestCls || (cls === bestCls && rel < bestRel)) {
        bestCls = cls;
        bestRel = rel;
        bestLim = LIMIT.MIN_DEPTH;
      }
    }
    if (hasMaxDepth) {
      cls = depth > c.maxDepth ? 2 : 0;
      rel = (c.maxDepth - depth) / c.maxDepth;
      if (cls > bestCls || (cls === bestCls && rel < bestRel)) {
        bestCls = cls;
        bestRel = rel;
        bestLim = LIMIT.MAX_DEPTH;
      }
    }
    if (hasCurrent) {
      cls = current > c.currentMax ? 2 : 0;
      rel = (c.currentMax - current) / c.currentMax;
      if (cls > bestCls || (cls === bestCls && rel < bestRel)) {
        bestCls = cls;
        bestRel = rel;
        bestLim = LIMIT.CURRENT;
      }
    }
    if (tideWindow) {
      cls = tideH < 0 ? 2 : 0;
      rel = tideH / tideSpanH;
      if (cls > bestCls || (cls === bestCls && rel < bestRel)) {
        bestCls = cls;
        bestRel = rel;
        bestLim = LIMIT.TIDE_WINDOW;
      }
    }
    for (let t = 0; t < nTargets; t++) {
      const v = targetHs[t][i];
      const lim = targets[t];
      cls = (v > lim.opwf ? 1 : 0) + (v > lim.max ? 1 : 0);
      rel = (lim.opwf - v) / lim.opwf;
      if (cls > bestCls || (cls === bestCls && rel < bestRel)) {
        bestCls = cls;
        bestRel = rel;
        bestLim = LIMIT.HS_TARGET;
      }
    }
    // bestCls -1: only response limits are set; the pass below decides.
    status[i] = bestCls < 0 ? STATUS.WORKABLE : CLASS_STATUS[bestCls];
    limiting[i] = bestLim;
    marginRel[i] = bestRel;
  }
  if (c.responses.length > 0) {
    // Response limits (docs/domain.md#vessel-response) in a pass of their own: a missing value is no
    // data; else the class and relative margin (OPWF_R - R) / OPWF_R join the record's as above.
    const { values, hsTotal } = responseLimitSeries(series, op, c.responses);
    const tmp = new Float64Array(2);
    const statusClass = new Int8Array(4).fill(-1);
    statusClass[STATUS.WORKABLE] = 0;
    statusClass[STATUS.MARGINAL] = 1;
    statusClass[STATUS.NOT_WORKABLE] = 2;
    c.responses.forEach((l, r) => {
      const v = values[r];
      for (let i = 0; i < n; i++) {
        if (status[i] === NO_DATA) continue;
        if (v[i] !== v[i] || hsTotal[i] !== hsTotal[i]) {
          status[i] = NO_DATA;
          limiting[i] = NONE;
          marginRel[i] = NaN;
          continue;
        }
        const k = responseClass(c, v[i], l.max, hsTotal[i], tmp);
        const prev = statusClass[status[i]];
        // Only the limits that decide count (docs above): a worse class wins, an equal one by the smaller margin.
        if (k > prev || (k === prev && tmp[0] < marginRel[i])) {
          status[i] = CLASS_STATUS[k];
          limiting[i] = LIMIT.RESPONSE;
          marginRel[i] = tmp[0];
        }
      }
    });
  }
  return out;
}
