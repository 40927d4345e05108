import { and, asc, eq, gte, lte } from 'drizzle-orm';
import type { Db } from '../db/client';
import { datasetChunk, forecastMember } from '../db/schema';
import { toSeaSeries } from './sea-series';
import { CHUNK_RECORDS, type SeaSeries } from './series-store';

/**
 * Ensemble members beside a forecast's control (docs/domain.md#forecast-uncertainty), stored
 * columnar like the control's own series: chunks of the same CHUNK_RECORDS records as
 * dataset_chunk, aligned with its times (which are not stored again).
 */

/** The stored values of one member, aligned with the control's times; NaN = missing. */
export interface MemberColumns {
  /** 1..N (0 is the control, the dataset's own series). */
  member: number;
  hs: Float64Array;
  tp: Float64Array;
  dir: Float64Array;
  wind: Float64Array;
  windDir: Float64Array;
}

export const MEMBER_COLUMNS = ['hs', 'tp', 'dir', 'wind', 'windDir'] as const;

const bytesOf = (a: Float64Array) => new Uint8Array(a.buffer, a.byteOffset, a.byteLength);

function aligned(bytes: Uint8Array): ArrayBuffer {
  const copy = new Uint8Array(bytes.byteLength);
  copy.set(bytes);
  return copy.buffer;
}

/**
 * Writes the members of a dataset whose control has `records` records; call inside the transaction
 * that stores the dataset.
 * @throws RangeError for a member not aligned with the control or a member number below 1 or repeated
 */
export async function writeMembers(tx: Db, datasetId: string, records: number, members: readonly MemberColumns[]): Promise<void> {
  const seen = new Set<number>();
  const rows: (typeof forecastMember.$inferInsert)[] = [];
  for (const m of members) {
    if (!(Number.isInteger(m.member) && m.member >= 1) || seen.has(m.member))
      throw new RangeError(`member numbers must be distinct integers from 1, got ${m.member}`);
    seen.add(m.member);
    for (const col of MEMBER_COLUMNS) {
      if (m[col].length !== records) throw new RangeError(`member ${m.member}: ${col} has ${m[col].length} values, the control ${records}`);
    }
    for (let seq = 0, i = 0; i < records; seq++, i += CHUNK_RECORDS) {
      const j = Math.min(records, i + CHUNK_RECORDS);
      const f64 = (a: Float64Array) => bytesOf(a.slice(i, j));
      rows.push({
        datasetId,
        member: m.member,
        seq,
        count: j - i,
        hs: f64(m.hs),
        tp: f64(m.tp),
        dir: f64(m.dir),
        wind: f64(m.wind),
        windDir: f64(m.windDir),
      });
    }
  }
  for (let k = 0; k < rows.length; k += 16) await tx.insert(forecastMember).values(rows.slice(k, k + 16));
}

/**
 * Reads a dataset's members for the stretch of `control` (a series read with readSeries, whole or
 * limited to a range), each as a sea series on the control's times with its periods completed as
 * the control's are (docs/domain.md#sea-states). Empty without an ensemble.
 */
export async function readMembers(db: Db, datasetId: string, control: SeaSeries): Promise<(SeaSeries & { member: number })[]> {
  const n = control.timeMs.length;
  if (n === 0) return [];
  const fromMs = control.timeMs[0];
  const toMs = control.timeMs[n - 1];
  // The chunks that hold the stretch, with the control's times of each, to find where it starts.
  const rows = await db
    .select({
      member: forecastMember.member,
      seq: forecastMember.seq,
      count: forecastMember.count,
      hs: forecastMember.hs,
      tp: forecastMember.tp,
      dir: forecastMember.dir,
      wind: forecastMember.wind,
      windDir: forecastMember.windDir,
      timeMs: datasetChunk.timeMs,
    })
    .from(forecastMember)
    .innerJoin(datasetChunk, and(eq(datasetChunk.datasetId, forecastMember.datasetId), eq(datasetChunk.seq, forecastMember.seq)))
    .where(
      and(eq(forecastMember.datasetId, datasetId), gte(datasetChunk.endAt, new Date(fromMs)), lte(datasetChunk.startAt, new Date(toMs))),
    )
    .orderBy(asc(forecastMember.member), asc(forecastMember.seq));
  if (rows.length === 0) return [];
  const byMember = new Map<number, typeof rows>();
  for (const r of rows) {
    const list = byMember.get(r.member);
    if (list) list.push(r);
    else byMember.set(r.member, [r]);
  }
  // Offset of the stretch inside the chunks read: the first record at or after its first time.
  const first = byMember.values().next().value!;
  const total = first.reduce((sum, c) => sum + c.count, 0);
  const times = new Float64Array(total);
  let offset = 0;
  for (const c of first) {
    times.set(new Float64Array(aligned(c.timeMs)), offset);
    offset += c.count;
  }
  let lo = 0;
  while (lo < total && times[lo] < fromMs) lo++;
  const out: (SeaSeries & { member: number })[] = [];
  for (const [member, chunks] of byMember) {
    const full: Record<(typeof MEMBER_COLUMNS)[number], Float64Array> = {
      hs: new Float64Array(total),
      tp: new Float64Array(total),
      dir: new Float64Array(total),
      wind: new Float64Array(total),
      windDir: new Float64Array(total),
    };
    let at = 0;
    for (const c of chunks) {
      for (const col of MEMBER_COLUMNS) full[col].set(new Float64Array(aligned(c[col])), at);
      at += c.count;
    }
    const part = (a: Float64Array) => a.slice(lo, lo + n);
    const series = toSeaSeries({
      timeMs: control.timeMs,
      hs: part(full.hs),
      tp: part(full.tp),
      dir: part(full.dir),
      wind: part(full.wind),
      windDir: part(full.windDir),
    });
    out.push({ ...series, member });
  }
  return out;
}
