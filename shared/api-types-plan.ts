import type { CurrentSource, WaterLevelSource } from './seadata/water-level';
import type { CurrentStationInfo } from './api-types-sites';
import type { SeaStateColumns } from './api-types-datasets';
// Plan answers shared by the API and the client.
import type { HourStatus, LimitCheck } from './engine/explain-hour';
import type { TransformChain } from './waves';

export type { HourStatus, LimitCheck };

export interface PlanWindow {
  start: string;
  end: string;
  hours: number;
  minMargin: { perLimit: Record<string, number>; relative: number };
  /**
   * Ensemble chance that [start, start + TR) is wholly workable: the share of runs (control and
   * members, on OPLIM) with a go-start at the window's start; null without an ensemble
   * (docs/domain.md#forecast-uncertainty).
   */
  chance: number | null;
}

export interface OperationSitePlan {
  operationId: string;
  operationName: string;
  siteId: string;
  siteName: string;
  timeZone: string;
  tpop: number;
  tc: number;
  tr: number;
  weatherRestricted: boolean;
  /**
   * Not weather-restricted (not marked so, TPOP above 72 h or TR above 96 h; docs/domain.md#convention-5): the
   * statuses are against OPLIM for information only, labelled "not weather-restricted"; there are
   * never windows, an earliest start or "may start now".
   */
  informationOnly: boolean;
  skipperIds: string[];
  windows: PlanWindow[];
  earliestStart: string | null;
  startNow: boolean;
  /** Hourly statuses from `times[0]`; `times` are ISO UTC record starts. */
  times: string[];
  status: HourStatus[];
  /** The deciding limit per hour (null when none, e.g. no limit broken and margins equal). */
  limiting: (string | null)[];
  /** Smallest relative margin per hour (limit - value)/limit; null = no data. */
  marginRel: (number | null)[];
  /**
   * Ensemble chance of workable per hour (0-1: the share of runs, control and members, workable on
   * OPLIM), null without an ensemble (docs/domain.md#forecast-uncertainty).
   */
  chance: number[] | null;
  /**
   * Per hour, the ensemble chance that [t, t + TR) is wholly workable (the share of runs with a
   * go-start there); null without an ensemble or for an operation that is not weather-restricted.
   */
  startChance: number[] | null;
  /** Occurrences of a recurring operation in the horizon, judged on [start, start + TR). */
  occurrences: { start: string; status: OccurrenceStatus }[];
}

/** An occurrence's judgement; "information" for an operation that is not weather-restricted (never go). */
export type OccurrenceStatus = 'go' | 'marginal' | 'no_go' | 'no_data' | 'information';

export interface PlanAnswer {
  dataset: { id: string; name: string; kind: string; issuedAt: string | null; start: string; end: string } | null;
  generatedAt: string;
  /** The stretch planned (at most 31 days) and the time it is planned as at ("now" for a forecast). */
  span?: { from: string; to: string; asAt: string };
  alpha: boolean;
  stepMinutes: number;
  /** Runs of the ensemble behind the chances (control + members), null for a single forecast. */
  ensemble?: { runs: number } | null;
  plans: OperationSitePlan[];
}

export interface HourChainAnswer {
  time: string;
  operationId: string;
  siteId: string;
  dataPoint: { depthM: number | null; hs: number | null; tp: number | null; tz: number | null; dir: number | null; wind: number | null };
  transform: TransformChain;
  /**
   * depthM: the chart depth; waterLevel: m above chart datum (null without a tide); depth: the
   * still-water depth h = depthM + waterLevel the chain used (docs/domain.md#tide); waterLevelSource:
   * where the water level came from; current: m/s or null, the dataset's (surface or depth-averaged,
   * as it gives it) or else the predicted tidal current of the worksite's current station;
   * currentDir: degrees the water flows towards (oceanographic convention), or null; currentSource:
   * where the current came from; currentStation: the station's name when the current was predicted.
   */
  site: {
    depthM: number;
    waterLevel: number | null;
    waterLevelSource: WaterLevelSource;
    depth: number;
    current: number | null;
    currentDir: number | null;
    currentSource: CurrentSource;
    currentStation: string | null;
    hs: number | null;
    bedVelocityLinear: number | null;
    bedVelocitySoulsby: number | null;
    wind: number | null;
    /** Worksite Tp: the most energetic partition's when the hour is combined from partitions (docs/domain.md#partitions). */
    tp?: number | null;
    dir?: number | null;
  };
  /**
   * The sea's partitions at the data point and at the worksite (docs/domain.md#partitions), when
   * the dataset gives them and this hour is combined from them; absent otherwise. Hs 0 = absent.
   */
  partitions?: {
    name: 'windSea' | 'swell1' | 'swell2';
    dataPoint: { hs: number | null; tp: number | null; dir: number | null };
    site: { hs: number | null; tp: number | null; dir: number | null };
  }[];
  status: HourStatus;
  checks: LimitCheck[];
  /** The operation is not weather-restricted: the hour is shown against OPLIM for information only. */
  informationOnly: boolean;
  /**
   * The ensemble's spread at the worksite in this hour (docs/domain.md#forecast-uncertainty): Hs of
   * every run (control and members) through the same chain, min, P10, P50, P90 (type 7
   * quantiles), max, m; `withData` runs had a value. Null for a forecast without members.
   */
  ensemble: {
    runs: number;
    withData: number;
    hs: { min: number | null; p10: number | null; p50: number | null; p90: number | null; max: number | null };
  } | null;
}

export interface ConditionsAnswer extends SeaStateColumns {
  siteId: string;
  timeZone: string;
  times: string[];
  bedVelocityLinear: (number | null)[];
  bedVelocitySoulsby: (number | null)[];
  flags: number[];
  /** Water level above chart datum, m (null without a tide), and the still-water depth h, m (docs/domain.md#tide). */
  waterLevel: (number | null)[];
  /** Where each record's water level came from (docs/domain.md#tide). */
  waterLevelSource: WaterLevelSource[];
  depth: (number | null)[];
  /**
   * Current speed, m/s (null where unknown): the dataset's where it has one, else the predicted
   * tidal current of the worksite's current station (docs/domain.md#tide).
   */
  current: (number | null)[];
  /** Where each record's current came from. */
  currentSource: CurrentSource[];
  /** The worksite's current station (null: none chosen) and the cautions shown with a predicted current. */
  currentStation: CurrentStationInfo | null;
  currentCautions: readonly string[];
  /**
   * Worksite Hs of the swell (both swells together) and of the wind sea, m, where the dataset gives
   * partitions (docs/domain.md#partitions); absent otherwise, null where unknown.
   */
  swellHs?: (number | null)[];
  windSeaHs?: (number | null)[];
  /** Current direction, degrees the water flows towards (oceanographic convention; null where unknown). */
  currentDir: (number | null)[];
  operations: {
    id: string;
    name: string;
    hsMax: number | null;
    hsMaxForecast: number | null;
    windMax: number | null;
    bedVelocityMax: number | null;
    bedVelocityMethod: string | null;
    minDepth?: number | null;
    maxDepth?: number | null;
    currentMax?: number | null;
    /**
     * Vessel-response limits (docs/domain.md#vessel-response), present only for an operation that
     * has them: per hour the governing response (index into `limits`, null: no data), its R / R_lim
     * (1 = the operation limit), its R, and its forecast limit as a ratio of R_lim (alpha at the
     * equivalent Hs limit).
     */
    responses?: {
      limits: { response: string; label: string; unit: string; statistic: 'significant' | 'mpm'; durationH: number; max: number }[];
      governing: (number | null)[];
      ratio: (number | null)[];
      value: (number | null)[];
      forecastRatio: (number | null)[];
    };
  }[];
}
