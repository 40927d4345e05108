// Go/no-go engine: hourly status, weather windows, hindcast statistics, campaigns.

// Types and codes
export * from './types';
export { DEFAULT_ALPHA_TABLE, defaultAlphaTable } from './default-alpha-table';
export * from './schemas';

// Limits and hourly status
export {
  WEATHER_RESTRICTED_MAX_TPOP_H,
  WEATHER_RESTRICTED_MAX_TR_H,
  alphaTableCoverageProblem,
  isWeatherRestricted,
  alphaFactor,
  alphaFor,
  alphaInRow,
  alphaRowIndex,
  assertAlphaTable,
} from './alpha-factor';
export { evaluateHours, assertSeriesLengths, type EvaluateOptions } from './evaluate-hours';
export { evaluateStatus, type EvaluateStatusOptions } from './evaluate-status';
export {
  evaluateStatusMany,
  createStatusManyScratch,
  statusFastPathKnows,
  type EvaluateStatusManyOptions,
  type StatusManyScratch,
  type DistinctTp,
} from './evaluate-status-many';

export { DEFAULT_BAND_MIN_HS_M, bandPeriodsAt, targetHsAt, targetHsSeries } from './hs-targets';

// Weather windows and the forecast plan
export { detectStepMs } from './detect-step';
export { recordSteps, type RecordSteps } from './record-steps';
export { MS_PER_HOUR, recordsForTr, runRemaining, sumDurations, trThresholdMs, workableRuns, type WorkableRun } from './workable-runs';
export { goStarts, nextGoStartIndex } from './go-starts';
export { usableWindows, type WindowOptions } from './usable-windows';
export { planOperation, type OperationPlan, type PlanOptions } from './plan-operation';
export { ensembleChances, ensembleChancesMany, type EnsembleChances, type EnsembleScratch } from './ensemble-chance';

// Calendar and hindcast statistics
export { calendarIndex, zonedMonthStartMs, zoneOffsetMs, type CalendarIndex } from './calendar-index';
export { quantileR7, quantileR7Sorted } from './quantile-r7';
export {
  monthlyStatistics,
  monthlyStatisticsWithGoStarts,
  createStatisticsScratch,
  type MonthlyStatistics,
  type MonthStatistics,
  type MonthStatisticsBase,
  type YearMonthStatistics,
  type StatisticsScratch,
} from './monthly-statistics';
export {
  operationStatistics,
  createEngineWorkspace,
  type EngineWorkspace,
  type OperationStatisticsOptions,
  type OperationStatisticsResult,
} from './operation-statistics';
export { simulateCampaign, type CampaignMonthResult, type CampaignOptions, type CampaignRun, type CampaignStep } from './campaign';
export {
  simulateOutlook,
  outlookPercentiles,
  outlookStart,
  hindcastYearShifts,
  type OutlookForecastMember,
  type OutlookHindcast,
  type OutlookInput,
  type OutlookSample,
  type OutlookPercentiles,
  type StepProgress,
} from './campaign-outlook';
