/** The forecast module's interfaces: records, issues, providers and provider adapters. */
import type { ExchangeSeriesKey, RequiredKey } from './forecast-schema';

/**
 * Forecast records in columns: the valid times and one column per variable of the exchange
 * (`EXCHANGE_SERIES` in forecast-schema.ts: hs in m, tp in s, dir and windDir in deg coming-from
 * within [0, 360), wind at 10 m in m/s, ...). NaN marks a value the service left out; an optional
 * member the answer left out (the partitions) has no column.
 */
export type ForecastRecords = {
  /** Valid times, ms since 1970-01-01T00:00Z, strictly increasing. */
  timeMs: Float64Array;
} & Record<RequiredKey, Float64Array> &
  Partial<Record<Exclude<ExchangeSeriesKey, RequiredKey>, Float64Array>>;

/** One forecast issue, validated and converted. */
export interface ForecastIssue {
  /** Issue (analysis) time of the forecast, ms since 1970-01-01T00:00Z. */
  issuedAtMs: number;
  /** Position the service answered for (it may snap to its model grid), deg north. */
  latitude: number;
  /** Position the service answered for, deg east in [-180, 180]. */
  longitude: number;
  records: ForecastRecords;
  /**
   * Ensemble members beside the control (`records` is the control, member 0), each aligned with
   * the control's times (the same `timeMs` array); absent or empty without an ensemble.
   */
  members?: { member: number; records: ForecastRecords }[];
}

export interface ForecastQuery {
  /** Data point latitude, deg north, -90..90. */
  latitude: number;
  /** Data point longitude, deg east, -180..180. */
  longitude: number;
  /** Ensemble members to ask for beside the control (0 or absent: none). A service without ensembles answers none. */
  members?: number;
  /** Cancels the request; the promise then rejects with the signal's reason (not a ForecastServiceError). */
  signal?: AbortSignal;
}

export interface ForecastProvider {
  /** Short name of the source, stored with each forecast dataset. */
  readonly name: string;
  /**
   * Latest forecast issue for a position.
   * @throws ForecastServiceError when the service fails (timeout, HTTP error, malformed answer,
   *   network); RangeError for an invalid position
   */
  fetchLatest(query: ForecastQuery): Promise<ForecastIssue>;
}

/**
 * What differs between forecast providers over HTTP: where to ask, and how to read the answer.
 * The transport (time limit, size limit, key, error messages) is shared: HttpForecastProvider in provider.ts.
 */
export interface ForecastAdapter {
  /** The request for a position, below the configured base URL (which ends with '/'). */
  requestUrl(base: URL, position: { latitude: number; longitude: number; members?: number }): URL;
  /**
   * Validates a JSON answer and converts it.
   * @throws ForecastServiceError('malformed') naming the first problems
   */
  toIssue(json: unknown): ForecastIssue;
}
