import { detectStepMs } from './detect-step';
import { evaluateHours } from './evaluate-hours';
import { goStarts } from './go-starts';
import type { AlphaTable, OperationSpec, SiteSeries, UsableWindow } from './types';
import { usableWindows } from './usable-windows';
import { assertStep } from './workable-runs';

/** Options of {@link planOperation}. */
export interface PlanOptions {
  /** Apply alpha (OPWF) to the Hs limits. Default true; false plans on OPLIM. */
  alpha?: boolean;
  /** Time step dt, ms; default: the median spacing of the series (docs/domain.md#convention-9). */
  stepMs?: number;
}

/** The forecast plan of one operation at one worksite. */
export interface OperationPlan {
  /** Record times, UTC epoch ms (the series' own array, not a copy). */
  times: Float64Array;
  /** dt used, ms. */
  stepMs: number;
  /** STATUS code per record. */
  status: Uint8Array;
  /** LIMIT code of the limiting factor per record. */
  limiting: Uint8Array;
  /** Relative margin of the limiting factor per record (NaN for no data). */
  marginRel: Float32Array;
  /** Go-start flags per record. */
  goStart: Uint8Array;
  /** Usable windows that end after nowMs (ongoing and later ones), in time order. */
  windows: UsableWindow[];
  /** Earliest go-start at or after the record covering nowMs, UTC epoch ms, or null. */
  earliestStartMs: number | null;
  /** The operation may start now: the record covering nowMs, [t, t + dt), is a go-start. */
  startNow: boolean;
}

/**
 * Plans one operation at one worksite on a forecast (docs/domain.md#weather-windows: hourly status
 * with the limiting factor and margin, go-starts for TR, usable windows with their smallest
 * margins, the earliest go-start and whether the operation may start now.
 *
 * Decisions (docs/domain.md leaves them open):
 * - "May start now" means the record whose interval [t, t + dt) holds nowMs is a go-start. When
 *   nowMs falls in a gap or outside the series, no record covers it and startNow is false.
 * - The earliest go-start is the first go-start whose record covers nowMs or starts after it; it
 *   can lie up to dt before nowMs when the current record is a go-start.
 * - Windows already over (end <= nowMs) are left out; an ongoing window is listed whole.
 *
 * @param series worksite series (UTC epoch ms, NaN = missing)
 * @param op operation
 * @param alphaTable the project's alpha table
 * @param nowMs the current time, UTC epoch ms
 * @throws RangeError for invalid limits, fewer than two records without `stepMs`, or times that
 *   do not ascend.
 */
export function planOperation(series: SiteSeries, op: OperationSpec, alphaTable: AlphaTable, nowMs: number, options: PlanOptions = {}): OperationPlan {
  const alpha = options.alpha !== false;
  const stepMs = options.stepMs ?? detectStepMs(series.timeMs);
  assertStep(stepMs);
  const { status, limiting, marginRel } = evaluateHours(series, op, { alpha, alphaTable });
  const times = series.timeMs;
  const goStart = goStarts(times, status, stepMs, op.tpopH + op.tcH);
  const windows = usableWindows(series, op, status, stepMs, { alpha, alphaTable }).filter((w) => w.endMs > nowMs);

  // First record whose interval ends after now: t + dt > nowMs.
  let lo = 0;
  let hi = times.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (times[mid] + stepMs > nowMs) hi = mid;
    else lo = mid + 1;
  }
  const covering = lo < times.length && times[lo] <= nowMs ? lo : -1;
  const startNow = covering >= 0 && goStart[covering] === 1;
  let earliestStartMs: number | null = null;
  for (let i = lo; i < times.length; i++) {
    if (goStart[i] === 1) {
      earliestStartMs = times[i];
      break;
    }
  }
  return { times, stepMs, status, limiting, marginRel, goStart, windows, earliestStartMs, startNow };
}
