import { alphaAt, bandDistance, compileLimits, curveHsAt } from './compiled-limits';
import { assertSeriesLengths } from './evaluate-hours';
import { bandPeriodsAt, targetHsAt } from './hs-targets';
import { tideWindowMarginH } from './tide-window';
import type { AlphaTable, LimitName, OperationSpec, SiteSeries, UsableWindow } from './types';
import { recordSteps } from './record-steps';
import { MS_PER_HOUR, runRemaining, sumDurations, trThresholdMs } from './workable-runs';

/** Options of {@link usableWindows}: the same as were used for the statuses. */
export interface WindowOptions {
  /** Alpha applied when the statuses were computed. Default true. */
  alpha?: boolean;
  alphaTable: AlphaTable;
}

/**
 * Usable weather windows: workable runs at least TR long in time, the sum of their records'
 * durations (docs/domain.md#weather-windows; docs/domain.md#convention-9 to #convention-10: ceil(TR / dt) records with one step;
 * a run continues across a change of step, see record-steps.ts), each with its smallest margins
 * (docs/domain.md#convention-16).
 *
 * Margins, per limit, the minimum over the window's records of (limit - value) in the limit's
 * unit: Hs max and curve against OPWF, m; Tp min (Tp - min) and Tp max (max - Tp), s; excluded
 * bands, the distance to the nearest band edge, s; bed velocity, m/s; wind, m/s. `relative` is the
 * minimum over the records and limits of margin / limit (dimensionless; for a band, over its
 * nearest edge's Tp), the same figure as evaluateHours' marginRel. Depth limits in m, current in
 * m/s, the tide window in hours inside it (docs/domain.md#tide).
 *
 * @param series the worksite series the statuses were computed from
 * @param op the operation
 * @param status STATUS codes from evaluateHours with the same alpha option
 * @param stepMs fallback dt, ms (a series without any stretch of equal spacings)
 * @returns windows in time order; end exclusive (start + the sum of durations)
 * @throws RangeError as evaluateHours and goStarts do.
 */
export function usableWindows(
  series: SiteSeries,
  op: OperationSpec,
  status: Uint8Array,
  stepMs: number,
  options: WindowOptions,
): UsableWindow[] {
  assertSeriesLengths(series);
  const c = compileLimits(op, options.alphaTable, options.alpha !== false);
  const trMs = trThresholdMs(c.trH);
  const timeMs = series.timeMs;
  const rem = runRemaining(timeMs, status, stepMs);
  const dur = recordSteps(timeMs, stepMs).durationMs;
  const bedArr = c.bedSoulsby ? series.bedVelocitySoulsbyMps : series.bedVelocityLinearMps;
  const relOut = new Float64Array(1);
  const bandTps = new Float64Array(4);
  const windows: UsableWindow[] = [];

  for (let i = 0; i < rem.length;) {
    const count = rem[i];
    if (count === 0) {
      i++;
      continue;
    }
    const lengthMs = sumDurations(dur, i, i + count);
    if (lengthMs >= trMs) {
      const perLimit: Partial<Record<LimitName, number>> = {};
      let relative = Infinity;
      const low = (name: LimitName, margin: number, rel: number): void => {
        const prev = perLimit[name];
        if (prev === undefined || margin < prev) perLimit[name] = margin;
        if (rel < relative) relative = rel;
      };
      for (let k = i; k < i + count; k++) {
        const hs = series.hsM[k];
        const tp = series.tpS[k];
        for (const t of c.hsTargets) {
          const v = targetHsAt(series.hsM, series.partitions, k, t.target, t.minPeriodS);
          low('hsTarget', t.opwf - v, (t.opwf - v) / t.opwf);
        }
        if (c.hsMax === c.hsMax) low('hs', c.hsMaxOpwf - hs, (c.hsMaxOpwf - hs) / c.hsMaxOpwf);
        if (c.curveTp.length >= 2) {
          const lim = curveHsAt(c, tp);
          const opwf = lim * alphaAt(c, lim);
          low('hsTpCurve', opwf - hs, opwf > 0 ? (opwf - hs) / opwf : 0);
        }
        if (c.tpMin === c.tpMin) low('tpMin', tp - c.tpMin, (tp - c.tpMin) / c.tpMin);
        if (c.tpMax === c.tpMax) low('tpMax', c.tpMax - tp, (c.tpMax - tp) / c.tpMax);
        if (c.bandFrom.length > 0) {
          // The worksite Tp and every partition with enough Hs (docs/domain.md#partitions).
          const nTp = bandPeriodsAt(series, k, c.bandMinHs, bandTps);
          for (let q = 0; q < nTp; q++) {
            const d = bandDistance(c, bandTps[q], relOut);
            low('tpBand', d, relOut[0]);
          }
        }
        if (c.needBed) low('bedVelocity', c.bedMax - bedArr[k], (c.bedMax - bedArr[k]) / c.bedMax);
        if (c.needWind) low('wind', c.windMax - series.windMps[k], (c.windMax - series.windMps[k]) / c.windMax);
        const h = series.depthM ? series.depthM[k] : NaN;
        if (c.minDepth === c.minDepth) low('minDepth', h - c.minDepth, (h - c.minDepth) / c.minDepth);
        if (c.maxDepth === c.maxDepth) low('maxDepth', c.maxDepth - h, (c.maxDepth - h) / c.maxDepth);
        if (c.needCurrent) {
          const u = series.currentMps ? series.currentMps[k] : NaN;
          low('current', c.currentMax - u, (c.currentMax - u) / c.currentMax);
        }
        if (c.tideWindow) {
          const m = tideWindowMarginH(series.tide, c.tideWindow, timeMs[k]);
          low('tideWindow', m, m / (c.tideWindow.before + c.tideWindow.after));
        }
      }
      const startMs = timeMs[i];
      windows.push({
        startIndex: i,
        count,
        startMs,
        endMs: startMs + lengthMs,
        hours: lengthMs / MS_PER_HOUR,
        minMargin: { perLimit, relative },
      });
    }
    i += count;
  }
  return windows;
}
