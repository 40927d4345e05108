// The project Overview: today's picture of a project for the person looking at it.
import type { HourStatus } from './api-types-plan';
import type { ProjectAccessRole } from './api-types';

/** One operation at one of its worksites, as the Overview says it in one line. */
export interface OverviewLine {
  operationId: string;
  operationName: string;
  siteId: string;
  siteName: string;
  /** IANA zone of the worksite; every time of the line is read in it. */
  timeZone: string;
  /** Operation reference period TR, h. */
  tr: number;
  /** Planned duration TPOP, h (the planned finish is the go-start + TPOP). */
  tpop: number;
  /** Not weather-restricted (docs/domain.md#convention-5): statuses are for information only, never a go-start. */
  informationOnly: boolean;
  /** The caller is one of the operation's skippers. */
  mine: boolean;
  startNow: boolean;
  /** The plan's earliest go-start (the same instant as the plan answer's `earliestStart`). */
  earliestStart: string | null;
  /** Length of the usable window that holds the go-start (now, or the earliest start), h. */
  windowHours: number | null;
  /** The limit that decides most hours before the go-start, or over the forecast when there is none. */
  limiting: string | null;
  /**
   * Chance of the go-start from an ensemble forecast, 0-1 (docs/domain.md#forecast-uncertainty).
   * The share of runs (control and members) in which [go-start, go-start + TR) is wholly workable on
   * OPLIM; null without an ensemble or without a go-start.
   */
  chance: number | null;
  /** The next 48 hours from the current hour: ISO UTC record starts and their statuses. */
  next: { times: string[]; status: HourStatus[] };
}

/**
 * What the planning job's latest run changed for one operation at one worksite, against the run
 * before: how many changes of each kind (window_opened, window_lost, earliest_moved,
 * start_now_changed, occurrence_no_go). The Alerts page lists each with its times.
 */
export interface OverviewChange {
  operationId: string;
  operationName: string;
  siteId: string;
  siteName: string;
  counts: Partial<Record<string, number>>;
}

/** One operation at a worksite this month: confirmed downtime against the hindcast expectation. */
export interface OverviewMonthRow {
  operationId: string;
  operationName: string;
  siteId: string;
  siteName: string;
  /** YYYY-MM in the worksite's zone. */
  month: string;
  /** Days of the month so far (over in the worksite's zone) and how many of them are confirmed. */
  daysOver: number;
  confirmedDays: number;
  confirmedLostHours: number;
  /** P50 and P90 of the whole calendar month's lost hours over the hindcast years (null without a hindcast). */
  expectedP50Hours: number | null;
  expectedP90Hours: number | null;
  hindcastYears: number;
}

/** GET /api/projects/:projectId/overview */
export interface OverviewAnswer {
  generatedAt: string;
  role: ProjectAccessRole;
  /** The forecast planned on (the project's newest), or null when there is none. */
  forecast: { id: string; name: string; issuedAt: string | null; start: string; end: string } | null;
  /** Sea state at the data point at the current hour of the forecast (direction "coming from", degrees). */
  dataPointNow: { time: string; hs: number | null; tp: number | null; dir: number | null } | null;
  /** The planning job's latest good run and the changes it found against the one before, per operation and worksite. */
  lastPlan: { at: string; changes: OverviewChange[] } | null;
  /**
   * The planning job's latest failed run when it came after the latest good one (the plan and its
   * alerts are then older than they should be), else null; `error` for coordinators and
   * administrators only (null for others).
   */
  failedPlan: { at: string; error: string | null } | null;
  lines: OverviewLine[];
  /** Coordinators and administrators only. */
  coordinator: {
    /** Ledger days proposed and not yet confirmed, and the oldest of them. */
    ledgerDaysWaiting: number;
    oldestWaitingDay: string | null;
    /** Alert e-mails that gave up after their last attempt. */
    failedEmails: number;
    datasetsWithWarnings: { id: string; name: string; warnings: string[] }[];
    /** What the project has of what planning needs (the Overview's set-up steps while one is missing). */
    setup: OverviewSetup;
  } | null;
  /** Clients, coordinators and administrators: this month's confirmed downtime against expectation. */
  month: { hindcast: { id: string; name: string } | null; rows: OverviewMonthRow[] } | null;
}

/** Counts behind the Overview's set-up steps (coordinators and administrators). */
export interface OverviewSetup {
  worksites: number;
  operations: number;
  /** The offshore data point has a position (its depth may be deep water). */
  dataPointPlaced: boolean;
  /** Hindcasts and observation records: what downtime statistics and campaign durations read. */
  statisticsDatasets: number;
  forecasts: number;
  forecastSource: 'service' | 'uploads';
}

/** GET /api/map-style: the tile style set for production (MAP_STYLE_URL), else null (the built-in coastline). */
export interface MapStyleAnswer {
  styleUrl: string | null;
  attribution: string | null;
}
