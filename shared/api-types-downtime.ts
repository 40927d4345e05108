// Answers of the downtime-schedule routes (workability, campaigns, ledger), shared by the API and
// the client. Shares are fractions 0-1, durations in hours, times ISO 8601 UTC with `Z`, days
// YYYY-MM-DD in the worksite's time zone.
import type { CampaignMonthResult } from './engine/campaign';
import type { MonthStatisticsBase } from './engine/monthly-statistics';
import type { LedgerLimiting } from './schemas/downtime';

export type { LedgerLimiting };

/**
 * Statistics of one calendar month over the hindcast years (docs/domain.md#hindcast-statistics):
 * the engine's own fields, answered as they are.
 */
export type WorkabilityMonth = MonthStatisticsBase;

/** A calendar month over all years: also how many years have records in it. */
export interface WorkabilityCalendarMonth extends WorkabilityMonth {
  years: number;
}

/** One year and month (for the year-by-year heat map); windowsPerMonth equals windows. */
export interface WorkabilityYearMonth extends WorkabilityMonth {
  year: number;
}

/** GET /api/projects/:projectId/workability: one entry per operation at each of its worksites. */
export interface WorkabilityEntry {
  operationId: string;
  operationName: string;
  siteId: string;
  siteName: string;
  /** IANA zone the months are taken in (the worksite's). */
  timeZone: string;
  /** TPOP and TC, h; TR = TPOP + TC sets go-starts and usable windows. */
  tpopHours: number;
  tcHours: number;
  /** Twelve entries, January to December. */
  months: WorkabilityCalendarMonth[];
  /** Every year-month with records, in order. */
  yearMonths: WorkabilityYearMonth[];
}

/** A campaign: ordered steps, each an operation at one of its worksites. */
export interface CampaignResponse {
  id: string;
  name: string;
  steps: { operationId: string; siteId: string }[];
  /** Planned start, ISO UTC; null = none (the finish estimates then start from today). */
  plannedStart: string | null;
  /** Zone of the simulated start dates (the 1st at 00:00). */
  timeZone: string;
  /** The finish date promised in the plan, ISO UTC; null = none. Drawn on the outlook chart. */
  plannedFinish: string | null;
  /** Progress of each step, one entry per step, in order. */
  progress: CampaignStepProgressAnswer[];
  createdAt: string;
  updatedAt: string;
}

/** Progress of one campaign step. */
export interface CampaignStepProgressAnswer {
  /** 0-based step index. */
  index: number;
  status: 'planned' | 'started' | 'done';
  /** Actual start and end, ISO UTC; null when not known or not yet. */
  startedAt: string | null;
  doneAt: string | null;
  /** Where the done time came from: given by hand, or taken from the confirmed ledger days. */
  source: 'hand' | 'ledger' | null;
}

/** Type-7 percentiles of a finish date, ISO UTC; null when every sample is censored. */
export interface OutlookFinish {
  p10: string | null;
  p50: string | null;
  p90: string | null;
}

/** GET /api/projects/:projectId/campaigns/:campaignId/outlook */
export interface CampaignOutlookAnswer {
  campaignId: string;
  /** The clock time the outlook is computed for, ISO UTC. */
  asOf: string;
  /** Issue time of the forecast used, ISO UTC; null without a forecast. */
  forecastIssuedAt: string | null;
  alpha: boolean;
  /** Every step is done: `finish` is the actual end and there are no samples. */
  complete: boolean;
  /** Where the remaining work starts (now, or the end of a step under way), ISO UTC. */
  startFrom: string;
  /** (forecast member or control) x (hindcast year) pairs. */
  samples: number;
  /** Samples that reached the hindcast's end before finishing (left out of the percentiles). */
  censored: number;
  finish: OutlookFinish;
  /** Remaining waiting on weather: finish - startFrom - sum of the remaining TPOP, h. */
  remainingWowHours: { p50: number | null; p90: number | null };
  /** Each remaining step's start (over the samples that reached it). */
  steps: { index: number; p50Start: string | null; p90Start: string | null }[];
  /** The forecast part; null without a forecast. */
  forecast: {
    datasetId: string;
    issuedAt: string | null;
    /** End of the forecast (last record + dt), ISO UTC. */
    end: string;
    /** Samples the forecast gives before the hindcast years: 1 for a deterministic forecast (with alpha), one per member for an ensemble. */
    members: number;
    ensemble: boolean;
    /** Remaining steps that start inside the forecast (the same in every sample of a member; the smallest over members). */
    stepsStartedInForecast: number;
    /** The forecast alone finishes the campaign (every hindcast year then gives the same date). */
    finishedInForecast: boolean;
  } | null;
  /** The hindcast-only outlook from the same start (no forecast): how much the forecast moved the date. */
  hindcast: {
    datasetId: string;
    name: string;
    /** Hindcast years that give a sample. */
    years: number;
    samples: number;
    censored: number;
    finish: OutlookFinish;
    remainingWowHours: { p50: number | null; p90: number | null };
  };
  /** Outlook P50 / P90 finish minus the hindcast-only P50 / P90, h (positive: the forecast delays the finish). */
  forecastShiftHours: { p50: number | null; p90: number | null };
  plannedFinish: string | null;
}

/** GET /api/projects/:projectId/campaigns/:campaignId/outlook/history: one entry per stored outlook, oldest first. */
export interface OutlookHistoryPoint {
  at: string;
  p50: string | null;
  p90: string | null;
  forecastIssuedAt: string | null;
}

/**
 * Simulated duration for one start month (docs/domain.md#hindcast-statistics, #convention-15): the
 * engine's percentiles of duration and waiting on weather (without the year-by-year runs), with the
 * next start date and the finish dates from it.
 */
export interface CampaignMonthAnswer extends Omit<CampaignMonthResult, 'runs'> {
  /** The next start date for this month (the 1st at 00:00 in the campaign's zone, on or after the planned start or today), ISO UTC. */
  startDate: string;
  /** startDate + P50 / P90 duration, ISO UTC; null with no percentile. */
  p50Finish: string | null;
  p90Finish: string | null;
}

/** POST /api/projects/:projectId/campaigns/:campaignId/simulate */
export interface CampaignSimulation {
  campaignId: string;
  dataset: { id: string; name: string; start: string; end: string };
  alpha: boolean;
  timeZone: string;
  /** Sum of the steps' TPOP, h: the duration of a campaign that never waits. */
  sumTpopHours: number;
  /** The steps in order, with how many hours of the hindcast allow a start of each (0: it never finds a window). */
  steps: { operationName: string; siteName: string; trHours: number; goStartHours: number }[];
  /** In words, when a step never finds a window in the whole hindcast (the campaign can never finish); else null. */
  neverStarts: string | null;
  months: CampaignMonthAnswer[];
}

/** One day of one operation at one worksite in the downtime ledger. */
export interface LedgerEntry {
  id: string;
  operationId: string;
  operationName: string;
  siteId: string;
  siteName: string;
  /** Calendar day in the worksite's time zone. */
  day: string;
  /** Hours planned: the day's real length in the worksite's zone (24 h; 23 or 25 h on clock-change days). */
  plannedHours: number;
  /** As proposed from the data: planned hours not workable at OPLIM (no data counts as lost); null for clients. */
  proposedLostHours: number | null;
  proposedLimiting: LedgerLimiting | null;
  /** As confirmed (or corrected) by the coordinator; null while proposed. */
  lostHours: number | null;
  limiting: LedgerLimiting | null;
  note: string;
  /** Where the proposal came from: an observation dataset, else the forecast issues that covered the day (`datasetId`: the one that decided most of it). */
  source: 'observation' | 'forecast';
  datasetId: string | null;
  datasetName: string | null;
  status: 'proposed' | 'confirmed';
  confirmedBy: string | null;
  confirmedAt: string | null;
}

/** POST /api/projects/:projectId/ledger/propose */
export interface LedgerProposeAnswer {
  /** Rows written or updated (proposed ones only). */
  written: number;
  /** Confirmed rows left untouched. */
  keptConfirmed: number;
  /** Days (per worksite) that no observation or forecast dataset covered: nothing proposed. */
  uncovered: { siteId: string; days: string[] }[];
  /** Days (per worksite) not over yet in the worksite's time zone: not proposed. */
  notOver: { siteId: string; days: string[] }[];
  /** Datasets the proposals came from. */
  sources: { id: string; name: string; kind: 'observation' | 'forecast' }[];
}

/** GET /api/projects/:projectId/ledger/monthly: one row per month and operation at a worksite. */
export interface LedgerMonthRow {
  /** YYYY-MM in the worksite's time zone. */
  month: string;
  operationId: string;
  operationName: string;
  siteId: string;
  siteName: string;
  /** Ledger days in the month, and how many of them are confirmed. */
  days: number;
  confirmedDays: number;
  /** Planned and lost hours over the confirmed days. */
  confirmedPlannedHours: number;
  confirmedLostHours: number;
  /** Lost hours still only proposed (not shown to clients). */
  proposedLostHours: number | null;
  /** Hours in the whole calendar month in the worksite's zone. */
  monthHours: number;
  /**
   * Hindcast expectation for this calendar month: P50 and P90 (type 7) over the hindcast years of
   * the month's lost hours (hours not workable at OPLIM); null without a hindcast.
   */
  expectedP50Hours: number | null;
  expectedP90Hours: number | null;
  /** Hindcast years the expectation is taken over. */
  hindcastYears: number;
}

/** GET /api/projects/:projectId/ledger/monthly */
export interface LedgerMonthlyAnswer {
  hindcast: { id: string; name: string } | null;
  /** The expectation's basis: at the forecast limits (true) or at OPLIM (false), as asked. */
  alpha: boolean;
  rows: LedgerMonthRow[];
}
