import { and, asc, eq, gte, lte } from 'drizzle-orm';
import { EXTRA_COLUMNS, isExtraColumn, presentExtraColumns, sliceExtra, type ExtraSeries } from '../../shared/seadata/extra-columns';
import type { Db } from '../db/client';
import { dataset, datasetChunk } from '../db/schema';
import type { SeaRecords } from '../../shared/seadata/records';
import type { WaterLevelReference } from '../../shared/seadata/water-level';

/** Records per stored chunk: about one year of hourly records. */
export const CHUNK_RECORDS = 8784;

/** A sea-state series in memory: UTC ms and SI values, NaN = missing. */
export interface SeaSeries extends Omit<SeaRecords, 'extra'> {
  /** Bit 1: Tp given, 2: Tz given, 4: Te given (the rest derived or missing). */
  givenPeriods: Uint8Array;
  /** Optional columns the dataset has (water level, current, partitions); see extra-columns.ts. */
  extra: ExtraSeries;
  /**
   * What `extra.waterLevel` holds (docs/domain.md#tide): m above the worksite's chart datum, or a
   * residual added to the predicted tide; set by `readSeries` from the dataset when it has one.
   */
  waterLevelReference?: WaterLevelReference;
}

export const VALUE_COLUMNS = ['hs', 'tp', 'tz', 'te', 'dir', 'wind', 'windDir'] as const;

// Typed arrays are stored in the machine's byte order, which is little-endian on every platform
// Node.js supports in practice (x86-64, arm64); a big-endian host would need a byte swap here.
const bytesOf = (a: Float64Array | Uint8Array) => new Uint8Array(a.buffer, a.byteOffset, a.byteLength);

/** Copies stored bytes into an aligned buffer (drivers may hand back unaligned views). */
function aligned(bytes: Uint8Array): ArrayBuffer {
  const copy = new Uint8Array(bytes.byteLength);
  copy.set(bytes);
  return copy.buffer;
}

/** Writes a series as chunks; call inside the import's transaction. */
export async function writeSeries(tx: Db, datasetId: string, s: SeaSeries): Promise<void> {
  const n = s.timeMs.length;
  const extraColumns = presentExtraColumns(s.extra);
  const rows: (typeof datasetChunk.$inferInsert)[] = [];
  for (let seq = 0, i = 0; i < n; seq++, i += CHUNK_RECORDS) {
    const j = Math.min(n, i + CHUNK_RECORDS);
    // Values stay Float64: Float32 would turn 1.1 m into 1.1000000238 m and flip inclusive limits.
    const f64 = (a: Float64Array) => bytesOf(a.slice(i, j));
    rows.push({
      datasetId,
      seq,
      startAt: new Date(s.timeMs[i]),
      endAt: new Date(s.timeMs[j - 1]),
      count: j - i,
      timeMs: bytesOf(s.timeMs.slice(i, j)),
      hs: f64(s.hs),
      tp: f64(s.tp),
      tz: f64(s.tz),
      te: f64(s.te),
      dir: f64(s.dir),
      wind: f64(s.wind),
      windDir: f64(s.windDir),
      givenPeriods: s.givenPeriods.slice(i, j),
      extraColumns,
      extra: extraColumns.length > 0 ? packExtra(s.extra, extraColumns, i, j) : null,
    });
  }
  // A few chunks per statement keeps each statement small on both drivers.
  for (let k = 0; k < rows.length; k += 8) await tx.insert(datasetChunk).values(rows.slice(k, k + 8));
}

/** Reads a series back into typed arrays, optionally limited to [fromMs, toMs]. */
export async function readSeries(db: Db, datasetId: string, range: { fromMs?: number; toMs?: number } = {}): Promise<SeaSeries> {
  const conditions = [eq(datasetChunk.datasetId, datasetId)];
  if (range.fromMs !== undefined) conditions.push(gte(datasetChunk.endAt, new Date(range.fromMs)));
  if (range.toMs !== undefined) conditions.push(lte(datasetChunk.startAt, new Date(range.toMs)));
  const chunks = await db
    .select()
    .from(datasetChunk)
    .where(and(...conditions))
    .orderBy(asc(datasetChunk.seq));
  const total = chunks.reduce((sum, c) => sum + c.count, 0);
  const out: SeaSeries = {
    timeMs: new Float64Array(total),
    hs: new Float64Array(total),
    tp: new Float64Array(total),
    tz: new Float64Array(total),
    te: new Float64Array(total),
    dir: new Float64Array(total),
    wind: new Float64Array(total),
    windDir: new Float64Array(total),
    givenPeriods: new Uint8Array(total),
    extra: {},
  };
  // Every chunk of a dataset carries the same optional columns (written together above).
  const extraColumns = (chunks[0]?.extraColumns ?? []).filter(isExtraColumn);
  for (const name of extraColumns) out.extra[name] = new Float64Array(total);
  let offset = 0;
  for (const c of chunks) {
    out.timeMs.set(new Float64Array(aligned(c.timeMs)), offset);
    for (const col of VALUE_COLUMNS) out[col].set(new Float64Array(aligned(c[col])), offset);
    out.givenPeriods.set(c.givenPeriods, offset);
    if (extraColumns.length > 0) {
      const packed = new Float64Array(aligned(c.extra!));
      extraColumns.forEach((name, k) => out.extra[name]!.set(packed.subarray(k * c.count, (k + 1) * c.count), offset));
    }
    offset += c.count;
  }
  if (out.extra.waterLevel) {
    const [meta] = await db.select({ ref: dataset.waterLevelReference }).from(dataset).where(eq(dataset.id, datasetId));
    if (meta?.ref) out.waterLevelReference = meta.ref;
  }
  if (range.fromMs === undefined && range.toMs === undefined) return out;
  let lo = 0;
  let hi = total;
  while (lo < total && out.timeMs[lo] < (range.fromMs ?? -Infinity)) lo++;
  while (hi > lo && out.timeMs[hi - 1] > (range.toMs ?? Infinity)) hi--;
  return sliceSeries(out, lo, hi);
}

export function sliceSeries(s: SeaSeries, lo: number, hi: number): SeaSeries {
  return {
    timeMs: s.timeMs.slice(lo, hi),
    hs: s.hs.slice(lo, hi),
    tp: s.tp.slice(lo, hi),
    tz: s.tz.slice(lo, hi),
    te: s.te.slice(lo, hi),
    dir: s.dir.slice(lo, hi),
    wind: s.wind.slice(lo, hi),
    windDir: s.windDir.slice(lo, hi),
    givenPeriods: s.givenPeriods.slice(lo, hi),
    extra: sliceExtra(s.extra, lo, hi),
    ...(s.waterLevelReference ? { waterLevelReference: s.waterLevelReference } : {}),
  };
}

/** The optional columns' records i..j-1, one column after the other, as stored bytes. */
function packExtra(extra: ExtraSeries, columns: readonly (typeof EXTRA_COLUMNS)[number][], i: number, j: number): Uint8Array {
  const packed = new Float64Array(columns.length * (j - i));
  columns.forEach((name, k) => packed.set(extra[name]!.subarray(i, j), k * (j - i)));
  return bytesOf(packed);
}
