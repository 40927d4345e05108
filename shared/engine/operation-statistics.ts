import type { CalendarIndex } from './calendar-index';
import { detectStepMs } from './detect-step';
import { evaluateStatus } from './evaluate-status';
import {
  createStatisticsScratch,
  monthlyStatisticsWithGoStarts,
  type MonthlyStatistics,
  type StatisticsScratch,
} from './monthly-statistics';
import type { AlphaTable, OperationSpec, SiteSeries } from './types';

/** Reusable buffers for {@link operationStatistics}, for series of up to `capacity` records. */
export interface EngineWorkspace {
  capacity: number;
  status: Uint8Array;
  goStart: Uint8Array;
  scratch: StatisticsScratch;
}

/** Buffers for series of up to `capacity` records (one workspace serves every worksite and operation). */
export function createEngineWorkspace(capacity: number): EngineWorkspace {
  return { capacity, status: new Uint8Array(capacity), goStart: new Uint8Array(capacity), scratch: createStatisticsScratch(capacity) };
}

/** Options of {@link operationStatistics}. */
export interface OperationStatisticsOptions {
  /** Apply alpha; default true. false gives the statistics "without alpha" (docs/domain.md#convention-14). */
  alpha?: boolean;
  alphaTable: AlphaTable;
  /** dt, ms; default the series' median spacing. */
  stepMs?: number;
  /**
   * Buffers to reuse. The returned status and go-start flags are then views of the workspace,
   * overwritten by the next call: copy them (`slice()`) to keep them, e.g. for a campaign.
   */
  workspace?: EngineWorkspace;
}

/** Result of {@link operationStatistics}. */
export interface OperationStatisticsResult {
  statistics: MonthlyStatistics;
  /** STATUS code per record. */
  status: Uint8Array;
  /** Go-start flags for TR = TPOP + TC per record. */
  goStart: Uint8Array;
  /** dt used, ms. */
  stepMs: number;
}

/**
 * Hindcast statistics of one operation at one worksite (docs/domain.md#hindcast-statistics:
 * evaluateStatus, then monthlyStatistics with the go-starts for TR = TPOP + TC found in the same
 * backward pass (the same flags as goStarts gives, returned for campaigns).
 *
 * @param series worksite series
 * @param op operation
 * @param calendar calendarIndex of the series' times in the worksite's time zone (compute it once
 *   per worksite and reuse it for every operation: its grouping is cached)
 * @throws RangeError as the steps do, or when the workspace is too small.
 */
export function operationStatistics(
  series: SiteSeries,
  op: OperationSpec,
  calendar: CalendarIndex,
  options: OperationStatisticsOptions,
): OperationStatisticsResult {
  const n = series.timeMs.length;
  const stepMs = options.stepMs ?? detectStepMs(series.timeMs);
  const ws = options.workspace;
  if (ws && ws.capacity < n) throw new RangeError(`workspace for ${ws.capacity} records, series has ${n}`);
  const status = evaluateStatus(series, op, { alpha: options.alpha, alphaTable: options.alphaTable, out: ws?.status });
  const trH = op.tpopH + op.tcH;
  const goStart = ws ? ws.goStart.subarray(0, n) : new Uint8Array(n);
  // Go-starts are found in the statistics' own backward pass (same result as goStarts).
  const statistics = monthlyStatisticsWithGoStarts(series.timeMs, status, goStart, stepMs, calendar, trH, ws?.scratch);
  return { statistics, status, goStart, stepMs };
}
