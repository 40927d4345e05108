import { isWeatherRestricted } from './alpha-factor';
import { detectStepMs } from './detect-step';
import { evaluateHours } from './evaluate-hours';
import { goStarts } from './go-starts';
import type { AlphaTable, OperationSpec, SiteSeries, UsableWindow } from './types';
import { recordSteps } from './record-steps';
import { usableWindows } from './usable-windows';
import { assertStep } from './workable-runs';

/** Options of {@link planOperation}. */
export interface PlanOptions {
  /** Apply alpha (OPWF) to the Hs limits. Default true; false plans on OPLIM. */
  alpha?: boolean;
  /**
   * Fallback time step dt, ms, for a series without any stretch of equal spacings; default: the
   * median spacing (docs/domain.md#convention-9). Elsewhere each record's own local step applies (record-steps.ts).
   */
  stepMs?: number;
}

/** The forecast plan of one operation at one worksite. */
export interface OperationPlan {
  /** Record times, UTC epoch ms (the series' own array, not a copy). */
  times: Float64Array;
  /** Fallback dt used, ms (record durations are the local steps). */
  stepMs: number;
  /** Duration of each record (its local step), ms. */
  durationMs: Float64Array;
  /**
   * The operation is not weather-restricted (docs/domain.md#convention-5): statuses are at OPLIM for information
   * only; goStart is all 0, there are no windows, no earliest start and startNow is false.
   */
  informationOnly: boolean;
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
  /** The operation may start now: the record covering nowMs, [t, t + dt_i), is a go-start. */
  startNow: boolean;
}

/**
 * Plans one operation at one worksite on a forecast (docs/domain.md#weather-windows): hourly status
 * with the limiting factor and margin, go-starts for TR, usable windows with their smallest
 * margins, the earliest go-start and whether the operation may start now.
 *
 * An operation that is not weather-restricted (isWeatherRestricted: not marked so, TPOP above 72 h or
 * TR above 96 h) gets its statuses at OPLIM for information only and never a go-start, a window,
 * an earliest start or "may start now" (docs/domain.md#convention-5).
 *
 * Records have their local step (record-steps.ts): runs, go-starts and windows continue across a
 * change of step, and TR is measured in time.
 *
 * Decisions (docs/domain.md is silent):
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
export function planOperation(
  series: SiteSeries,
  op: OperationSpec,
  alphaTable: AlphaTable,
  nowMs: number,
  options: PlanOptions = {},
): OperationPlan {
  const alpha = options.alpha !== false;
  const stepMs = options.stepMs ?? detectStepMs(series.timeMs);
  assertStep(stepMs);
  const { status, limiting, marginRel } = evaluateHours(series, op, { alpha, alphaTable });
  const times = series.timeMs;
  const durationMs = recordSteps(times, stepMs).durationMs;
  const informationOnly = !isWeatherRestricted(op);
  if (informationOnly) {
    const none = new Uint8Array(times.length);
    return {
      times,
      stepMs,
      durationMs,
      informationOnly,
      status,
      limiting,
      marginRel,
      goStart: none,
      windows: [],
      earliestStartMs: null,
      startNow: false,
    };
  }
  const goStart = goStarts(times, status, stepMs, op.tpopH + op.tcH);
  const windows = usableWindows(series, op, status, stepMs, { alpha, alphaTable }).filter((w) => w.endMs > nowMs);

  // First record whose interval ends after now: t + dt_i > nowMs (record ends ascend: each record
  // ends at or before the next one starts, except where jitter overlaps, which the search tolerates).
  let lo = 0;
  let hi = times.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (times[mid] + durationMs[mid] > nowMs) hi = mid;
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
  return { times, stepMs, durationMs, informationOnly, status, limiting, marginRel, goStart, windows, earliestStartMs, startNow };
}
