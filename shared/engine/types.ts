import type { RaoTable, SeaPartitionSeries, Spreading } from '../response';

/**
 * Types and codes of the go/no-go engine.
 *
 * The engine takes worksite series that are already transformed to the worksite depth (see
 * `shared/waves`) and tests every record against an operation's limits, as defined in docs/domain.md
 * (#operations-and-limits, #weather-windows, #hindcast-statistics, #convention-5 to #convention-16).
 */

/**
 * Worksite sea-state series, one entry per record, all arrays of the same length.
 * NaN marks a missing value. Times are UTC epoch milliseconds, strictly ascending.
 */
export interface SiteSeries {
  /** Record start times, UTC epoch ms, strictly ascending. Each record stands for [t, t + dt_i), dt_i its local step (record-steps.ts). */
  timeMs: Float64Array;
  /** Significant wave height Hm0 at the worksite, m. */
  hsM: Float64Array;
  /** Peak period, s. */
  tpS: Float64Array;
  /** Significant near-bed orbital velocity, linear method (pi*Hs/(Tp*sinh(k_p*d))), m/s. */
  bedVelocityLinearMps: Float64Array;
  /** Significant near-bed orbital velocity, Soulsby (2006) method, m/s. */
  bedVelocitySoulsbyMps: Float64Array;
  /** Wind speed at 10 m, m/s. */
  windMps: Float64Array;
  /**
   * Still-water depth at the worksite h(t) = chart depth + water level, m (docs/domain.md#tide);
   * only needed by depth limits (absent: a depth limit finds no data). A dry record has h <= 0.
   */
  depthM?: Float64Array;
  /** Current speed at the worksite, m/s (docs/domain.md#tide); only needed by a current limit. */
  currentMps?: Float64Array;
  /** Predicted high and low waters around the series (docs/domain.md#tide); only needed by a tide window. */
  tide?: TideExtremes;
  /**
   * Sea partitions at the worksite (docs/domain.md#vessel-response), each of the series' length;
   * only needed by response limits (absent: a response limit finds no data).
   */
  responsePartitions?: SeaPartitionSeries[];
  /**
   * The sea's partitions at the worksite (docs/domain.md#partitions), when the dataset gives them:
   * per record Hs (m; 0 = absent that hour, NaN = unknown) and Tp (s). Needed by Hs limits on a
   * target other than the total; excluded Tp bands test every partition with enough Hs.
   */
  partitions?: EnginePartitions;
}

/** Names of the partitions the engine reads (docs/domain.md#partitions). */
export type EnginePartitionName = 'windSea' | 'swell1' | 'swell2';

/** Worksite partitions as the engine reads them. */
export type EnginePartitions = Record<EnginePartitionName, { hsM: Float64Array; tpS: Float64Array }>;

/**
 * What an Hs limit is compared with (docs/domain.md#partitions): the total sea, all swell
 * partitions together, the wind sea, or the partitions whose Tp is at least T* (long-period),
 * each as sqrt(sum Hs_i^2) over the partitions it takes.
 */
export type HsTarget = 'total' | 'swell' | 'windSea' | 'longPeriod';

/** An Hs max on a target; alpha applies with the total's table (docs/domain.md#partitions). */
export interface HsTargetLimit {
  target: HsTarget;
  /** T*, s: the long-period target takes the partitions with Tp >= T*; only for 'longPeriod'. */
  minPeriodS?: number | null;
  /** Hs max at OPLIM, m. */
  max: number;
}

/**
 * Predicted high and low waters (the tide predictor's extremes) over a span that covers the
 * series with room to spare: a record outside [fromMs, toMs] has no tide data.
 */
export interface TideExtremes {
  /** Times of high water, UTC epoch ms, ascending. */
  highMs: Float64Array;
  /** Times of low water, UTC epoch ms, ascending. */
  lowMs: Float64Array;
  /** Span the extremes were predicted over, UTC epoch ms. */
  fromMs: number;
  toMs: number;
}

/** A tide window: only from `before` hours before to `after` hours after high (or low) water. */
export interface TideWindowLimit {
  reference: 'high' | 'low';
  /** Hours before the extreme, >= 0. */
  before: number;
  /** Hours after the extreme, >= 0. */
  after: number;
}

/**
 * A limit on a vessel response (docs/domain.md#vessel-response): the significant amplitude
 * R_s = 2 sqrt(m0), or the most probable maximum over `durationH` (default 3 h), at most `max` in
 * the response's unit (m, deg, m/s, m/s^2). Alpha applies through the equivalent Hs limit.
 */
export interface ResponseLimit {
  /** The RAO column, e.g. 'roll_deg_per_m' or 'acc_z_m_s2_per_m@crane_tip'. */
  response: string;
  statistic: 'significant' | 'mpm';
  durationH?: number | null;
  max: number;
}

/** How an operation shapes each partition's spectrum (defaults: DEFAULT_RESPONSE_SEA of shared/response). */
export interface ResponseSeaOptions {
  /** Wind-sea gamma; absent or null: the DNV-RP-C205 rule from Hs and Tp. */
  windSeaGamma?: number | null;
  swellGamma?: number | null;
  windSeaSpreading?: Spreading | null;
  swellSpreading?: Spreading | null;
}

/** The vessel an operation is done from, as the engine needs it: its RAOs and fixed heading. */
export interface OperationVessel {
  raos: RaoTable;
  /** Vessel heading, deg true. */
  headingDeg: number;
}

/** Near-bed orbital velocity method named by a bed-velocity limit. */
export type BedVelocityMethod = 'linear' | 'soulsby';

/**
 * Limits of one operation. Every limit is optional (absent, undefined or null), but at least one
 * must be set. All limits are inclusive (docs/domain.md#convention-6).
 */
export interface OperationLimits {
  /** Hs max at OPLIM, m. */
  hsMax?: number | null;
  /** Hs-Tp limit curve: points [Tp s, Hs max m], Tp strictly ascending, at least two points. */
  hsTpCurve?: [number, number][] | null;
  /** Tp min, s. */
  tpMin?: number | null;
  /** Tp max, s. */
  tpMax?: number | null;
  /** Excluded Tp bands [from s, to s], closed at both edges. */
  tpExcluded?: [number, number][] | null;
  /** Near-bed orbital velocity max, m/s. */
  bedVelocityMax?: number | null;
  /** Method of the bed velocity the limit is compared with; 'linear' when not given. */
  bedVelocityMethod?: BedVelocityMethod;
  /** Wind speed max at 10 m, m/s. */
  windMax?: number | null;
  /** Minimum still-water depth at the worksite, m (draught plus under-keel clearance); exact, no alpha. */
  minDepth?: number | null;
  /** How the minimum depth was entered: draught and under-keel clearance, m (their sum is minDepth). */
  minDepthParts?: { draught: number; clearance: number } | null;
  /** Maximum still-water depth at the worksite, m; exact, no alpha. */
  maxDepth?: number | null;
  /** Current speed max, m/s; exact, no alpha. */
  currentMax?: number | null;
  /** Tide window around the predicted high or low waters; exact, no alpha. */
  tideWindow?: TideWindowLimit | null;
  /** Vessel-response limits (need the operation's vessel); alpha through the equivalent Hs limit. */
  responses?: ResponseLimit[] | null;
  /** Spectrum shape options for the response limits. */
  responseSea?: ResponseSeaOptions | null;
  /** Hs max on a target other than (or beside) the total sea (docs/domain.md#partitions). */
  hsTargets?: HsTargetLimit[] | null;
  /**
   * Excluded Tp bands test every partition whose worksite Hs is at least this, m (default 0.2,
   * docs/domain.md#partitions), beside the worksite Tp.
   */
  tpExcludedMinHs?: number | null;
}

/** An operation as the engine needs it. */
export interface OperationSpec {
  /** Planned operation duration TPOP, h. */
  tpopH: number;
  /** Contingency time TC, h. The reference period is TR = TPOP + TC. */
  tcH: number;
  /** Weather-restricted operation (planned on a forecast with OPWF = alpha * OPLIM). */
  weatherRestricted: boolean;
  limits: OperationLimits;
  /** The vessel, needed by response limits (absent: they find no data). */
  vessel?: OperationVessel | null;
}

/**
 * Alpha-factor table: `values[row][column]` for the row's TPOP bound (h, ascending) and the
 * column's Hs limit (m, ascending).
 */
export interface AlphaTable {
  tpopBoundsH: number[];
  hsColumnsM: number[];
  values: number[][];
}

/** Hourly status codes (Uint8Array values). */
export const STATUS = { NO_DATA: 0, NOT_WORKABLE: 1, MARGINAL: 2, WORKABLE: 3 } as const;
export type StatusCode = (typeof STATUS)[keyof typeof STATUS];

/** Limiting-factor codes (Uint8Array values). NONE for no-data records. */
export const LIMIT = {
  NONE: 0,
  HS: 1,
  HS_TP_CURVE: 2,
  TP_MIN: 3,
  TP_MAX: 4,
  TP_BAND: 5,
  BED_VELOCITY: 6,
  WIND: 7,
  MIN_DEPTH: 8,
  MAX_DEPTH: 9,
  CURRENT: 10,
  TIDE_WINDOW: 11,
  HS_TARGET: 12,
  RESPONSE: 13,
} as const;
export type LimitCode = (typeof LIMIT)[keyof typeof LIMIT];

/** Names of the limits, in the order of their LIMIT codes (from LIMIT.HS). */
export const LIMIT_NAME_LIST = [
  'hs',
  'hsTpCurve',
  'tpMin',
  'tpMax',
  'tpBand',
  'bedVelocity',
  'wind',
  'minDepth',
  'maxDepth',
  'current',
  'tideWindow',
  'hsTarget',
  'response',
] as const;

/** Names of the limits, used as keys of per-limit margins. */
export type LimitName = (typeof LIMIT_NAME_LIST)[number];

/** Name of each limit code, indexed by code; `LIMIT_NAMES[LIMIT.NONE]` is null. */
export const LIMIT_NAMES: readonly (LimitName | null)[] = [null, ...LIMIT_NAME_LIST];

/** Hourly evaluation of one operation over a series. */
export interface HourlyEvaluation {
  /** STATUS code per record. */
  status: Uint8Array;
  /** LIMIT code of the limiting factor per record (LIMIT.NONE for no data). */
  limiting: Uint8Array;
  /**
   * Relative margin of the limiting factor per record (dimensionless; (limit - value) / limit,
   * negative when broken); NaN for no data.
   */
  marginRel: Float32Array;
}

/** Smallest margins of a window (docs/domain.md#convention-16). */
export interface WindowMargin {
  /** Per limit: min over the window of (limit - value) in the limit's unit (m, s, m/s). */
  perLimit: Partial<Record<LimitName, number>>;
  /** Min over the window and the limits of margin / limit (dimensionless). */
  relative: number;
}

/** A usable weather window (docs/domain.md#convention-10 and #convention-16). */
export interface UsableWindow {
  /** Index of the window's first record. */
  startIndex: number;
  /** Number of records in the window. */
  count: number;
  /** Start, UTC epoch ms (the first record's time). */
  startMs: number;
  /** Exclusive end, UTC epoch ms: start + the sum of the records' durations (count * dt with one step). */
  endMs: number;
  /** Length: the sum of the records' durations (local steps, record-steps.ts), h. */
  hours: number;
  minMargin: WindowMargin;
}

export { DEFAULT_ALPHA_TABLE } from './default-alpha-table';
