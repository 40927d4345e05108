/**
 * Columnar sea-state records: the result of every importer (CSV, NDBC, forecast service).
 *
 * One record is one time with the sea state of docs/domain.md#sea-states: significant wave height,
 * the periods that were given, mean wave direction, and the wind at 10 m. Long series are kept as
 * one Float64Array per variable ("columnar"), so 30 years of hourly records (about 263,000) cost
 * about 17 MB and read back without per-record objects.
 *
 * Units (SI, docs/domain.md#units):
 * - `timeMs`: UTC instant in milliseconds since 1970-01-01T00:00Z (as `Date.getTime()`).
 * - `hs`: significant wave height Hm0, m.
 * - `tp`: peak period, s. `tz`: mean zero-crossing period, s. `te`: energy period Tm-1,0, s.
 * - `dir`: mean wave direction, degrees clockwise from true north, coming from, in [0, 360).
 * - `wind`: wind speed at 10 m above sea level, m/s. `windDir`: wind direction, coming from,
 *   degrees in [0, 360).
 *
 * NaN means missing. The importers never derive a missing period: a NaN in `tp`, `tz` or `te`
 * means "not given in the file" (see {@link givenPeriodFlags}); the import service derives them
 * with the wave-physics conversions and marks them as derived.
 */

import type { ExtraColumn, ExtraSeries } from './extra-columns';

/** The sea-state variables of a record, in storage order. */
export const SEA_VARIABLES = ['hs', 'tp', 'tz', 'te', 'dir', 'wind', 'windDir'] as const;

/** One of {@link SEA_VARIABLES}. */
export type SeaVariable = (typeof SEA_VARIABLES)[number];

/** Unit of each variable, for reports and headers. */
export const SEA_VARIABLE_UNITS: Readonly<Record<SeaVariable, string>> = {
  hs: 'm',
  tp: 's',
  tz: 's',
  te: 's',
  dir: 'deg',
  wind: 'm/s',
  windDir: 'deg',
};

/**
 * Sea-state records in columns of equal length, sorted by strictly increasing `timeMs`.
 * Units are listed in the module comment; NaN = missing.
 */
export interface SeaRecords {
  timeMs: Float64Array;
  hs: Float64Array;
  tp: Float64Array;
  tz: Float64Array;
  te: Float64Array;
  dir: Float64Array;
  wind: Float64Array;
  windDir: Float64Array;
  /** Optional columns the source had (water level, current, partitions), same length. */
  extra?: ExtraSeries;
}

/** One record to append. Omitted or NaN values are missing. Units as {@link SeaRecords}. */
export interface SeaRecordInput {
  timeMs: number;
  hs?: number;
  tp?: number;
  tz?: number;
  te?: number;
  dir?: number;
  wind?: number;
  windDir?: number;
}

const MIN_CAPACITY = 64;

/**
 * Growable columnar buffer for {@link SeaRecords}: appends in amortised O(1) (capacity doubles),
 * and {@link SeaRecordBuilder.finish} returns trimmed copies.
 *
 * The builder does not check order or plausibility; that is the validator's job
 * (`SeaRowValidator` in validate.ts).
 *
 * @example
 * const b = new SeaRecordBuilder();
 * b.push({ timeMs: Date.UTC(2016, 0, 1), hs: 1.2, tp: 11 });
 * b.finish().tp[0]; // 11
 */
export class SeaRecordBuilder {
  private capacity: number;
  private count = 0;
  private cols: Float64Array[];
  /** Optional columns switched on with {@link SeaRecordBuilder.withExtra}, same capacity as `cols`. */
  private extraCols = new Map<ExtraColumn, Float64Array>();

  /** @param initialCapacity records to reserve (a hint; grows as needed). */
  constructor(initialCapacity = 1024) {
    this.capacity = Math.max(MIN_CAPACITY, Math.floor(Number.isFinite(initialCapacity) ? initialCapacity : 0));
    // Column 0 is time, then SEA_VARIABLES in order.
    this.cols = Array.from({ length: SEA_VARIABLES.length + 1 }, () => new Float64Array(this.capacity));
  }

  /** Number of records appended so far. */
  get length(): number {
    return this.count;
  }

  /** Appends one record (missing values: omit them or pass NaN). */
  push(r: SeaRecordInput): void {
    this.pushValues(r.timeMs, r.hs ?? NaN, r.tp ?? NaN, r.tz ?? NaN, r.te ?? NaN, r.dir ?? NaN, r.wind ?? NaN, r.windDir ?? NaN);
  }

  /**
   * Appends one record from positional values (the importers' fast path: no object per row).
   * Argument order is time, then {@link SEA_VARIABLES}.
   */
  pushValues(timeMs: number, hs: number, tp: number, tz: number, te: number, dir: number, wind: number, windDir: number): void {
    if (this.count === this.capacity) this.grow();
    const i = this.count++;
    const c = this.cols;
    c[0][i] = timeMs;
    c[1][i] = hs;
    c[2][i] = tp;
    c[3][i] = tz;
    c[4][i] = te;
    c[5][i] = dir;
    c[6][i] = wind;
    c[7][i] = windDir;
  }

  /**
   * Switches on optional columns (docs/domain.md#tide, docs/domain.md#partitions); records
   * appended before or without a value stay NaN (missing). Call before the first push.
   */
  withExtra(columns: readonly ExtraColumn[]): this {
    for (const c of columns) if (!this.extraCols.has(c)) this.extraCols.set(c, new Float64Array(this.capacity).fill(NaN));
    return this;
  }

  /** Sets an optional column's value of the record appended last (the column must be switched on). */
  setExtra(column: ExtraColumn, value: number): void {
    const col = this.extraCols.get(column);
    if (!col) throw new Error(`optional column ${column} was not switched on (withExtra)`);
    if (this.count === 0) throw new Error('setExtra needs a record: push one first');
    col[this.count - 1] = value;
  }

  /** Reverses the records appended so far in place (for newest-first files). */
  reverse(): void {
    for (const col of this.cols) col.subarray(0, this.count).reverse();
    for (const col of this.extraCols.values()) col.subarray(0, this.count).reverse();
  }

  /** Returns trimmed copies of the columns; the builder stays usable. */
  finish(): SeaRecords {
    const n = this.count;
    const c = this.cols.map((col) => col.slice(0, n));
    const out: SeaRecords = { timeMs: c[0], hs: c[1], tp: c[2], tz: c[3], te: c[4], dir: c[5], wind: c[6], windDir: c[7] };
    if (this.extraCols.size > 0) {
      const extra: ExtraSeries = {};
      for (const [name, col] of this.extraCols) extra[name] = col.slice(0, n);
      out.extra = extra;
    }
    return out;
  }

  private grow(): void {
    this.capacity *= 2;
    const grown = (old: Float64Array, fill: number) => {
      const next = new Float64Array(this.capacity).fill(fill, old.length);
      next.set(old);
      return next;
    };
    this.cols = this.cols.map((old) => grown(old, 0));
    for (const [name, old] of this.extraCols) this.extraCols.set(name, grown(old, NaN));
  }
}

/** An empty {@link SeaRecords}. */
export function emptySeaRecords(): SeaRecords {
  return new SeaRecordBuilder(0).finish();
}

/**
 * Time step of a series: the median spacing of consecutive records (docs/domain.md#convention-9),
 * in minutes. For an even number of spacings the two middle values are averaged.
 *
 * @param timeMs record times, UTC ms, sorted ascending (NaN entries are skipped).
 * @returns the step in minutes (may be fractional), or NaN with fewer than two valid times.
 * @example detectStepMinutes(Float64Array.of(0, 3.6e6, 7.2e6, 1.44e7)) // 60
 */
export function detectStepMinutes(timeMs: Float64Array): number {
  const diffs: number[] = [];
  let prev = NaN;
  for (let i = 0; i < timeMs.length; i++) {
    const t = timeMs[i];
    if (Number.isNaN(t)) continue;
    if (!Number.isNaN(prev)) diffs.push(t - prev);
    prev = t;
  }
  if (diffs.length === 0) return NaN;
  const sorted = Float64Array.from(diffs).sort();
  const mid = sorted.length >> 1;
  const medianMs = sorted.length % 2 === 1 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
  return medianMs / 60_000;
}

/** Coverage summary of a record set, as stored with a dataset and answered by the import API. */
export interface SeaRecordsSummary {
  /** Number of records. */
  records: number;
  /** First record time, UTC ms (NaN when empty). */
  startMs: number;
  /** Last record time, UTC ms (NaN when empty). */
  endMs: number;
  /** Median spacing, minutes (docs/domain.md#convention-9); NaN with fewer than two records. */
  stepMinutes: number;
  /** Variables present (not NaN) in at least one record, in {@link SEA_VARIABLES} order. */
  variables: SeaVariable[];
  /** Per variable, the number of records where it is missing (NaN). */
  missing: Record<SeaVariable, number>;
}

/** Summarises coverage, step, variables present and missing counts of `records`. */
export function summarise(records: SeaRecords): SeaRecordsSummary {
  const n = records.timeMs.length;
  const missing = {} as Record<SeaVariable, number>;
  const variables: SeaVariable[] = [];
  for (const v of SEA_VARIABLES) {
    const col = records[v];
    let m = 0;
    for (let i = 0; i < n; i++) if (Number.isNaN(col[i])) m++;
    missing[v] = m;
    if (m < n) variables.push(v);
  }
  return {
    records: n,
    startMs: n > 0 ? records.timeMs[0] : NaN,
    endMs: n > 0 ? records.timeMs[n - 1] : NaN,
    stepMinutes: detectStepMinutes(records.timeMs),
    variables,
    missing,
  };
}

/** Bit flags of {@link givenPeriodFlags}. */
export const GIVEN_TP = 1;
export const GIVEN_TZ = 2;
export const GIVEN_TE = 4;

/**
 * Which periods each record carried in the source (docs/domain.md#sea-states: each record
 * remembers which periods came from the source). The importers never derive periods, so a period
 * is "given" exactly when it is not NaN at import time. Compute this before any derivation.
 *
 * @returns one byte per record: GIVEN_TP | GIVEN_TZ | GIVEN_TE bits.
 */
export function givenPeriodFlags(records: SeaRecords): Uint8Array {
  const n = records.timeMs.length;
  const flags = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    flags[i] =
      (Number.isNaN(records.tp[i]) ? 0 : GIVEN_TP) |
      (Number.isNaN(records.tz[i]) ? 0 : GIVEN_TZ) |
      (Number.isNaN(records.te[i]) ? 0 : GIVEN_TE);
  }
  return flags;
}
