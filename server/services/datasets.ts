import { and, desc, eq } from 'drizzle-orm';
import type { DatasetDetail, DatasetSummary, MonthlySummaryRow, RecordsAnswer } from '../../shared/api-types-datasets';
import type { Db } from '../db/client';
import { dataset, project } from '../db/schema';
import type { SessionUser } from '../http/context';
import { HttpError } from '../http/errors';
import { recordAudit } from './audit';
import { idParam } from '../../shared/schemas/common';
import { quantileR7Sorted } from '../../shared/engine/quantile-r7';
import { EXTRA_COLUMN_UNITS, presentExtraColumns } from '../../shared/seadata/extra-columns';
import { describeSeries } from './sea-series';
import { readSeries, writeSeries, type SeaSeries } from './series-store';
import { writeMembers, type MemberColumns } from './ensemble-store';

export interface DatasetMeta {
  projectId: string;
  createdBy: string | null;
  name: string;
  kind: 'hindcast' | 'forecast' | 'observation';
  dataPointName: string;
  dataPointLatitude: number | null;
  dataPointLongitude: number | null;
  dataPointDepthM: number | null;
  sourceKind: 'upload' | 'service';
  originalFileName?: string | null;
  format?: string | null;
  issuedAt?: Date | null;
  /** Anemometer height, m (10 = already at 10 m), and the power-law exponent used; null when not stated. */
  anemometerHeightM?: number | null;
  windExponent?: number | null;
}

/**
 * Stores a dataset and its series in one transaction: either all of it is saved or nothing. An
 * ensemble forecast's members beside the control (`series`) are stored with it (ensemble-store.ts).
 */
export async function createDataset(
  db: Db,
  meta: DatasetMeta,
  series: SeaSeries,
  importReport: Record<string, unknown>,
  members: readonly MemberColumns[] = [],
) {
  if (series.timeMs.length === 0) throw new HttpError('bad_file', 'The file holds no usable record');
  const info = describeSeries(series);
  return db.transaction(async (tx) => {
    const [row] = await tx
      .insert(dataset)
      .values({
        ...meta,
        originalFileName: meta.originalFileName ?? null,
        format: meta.format ?? null,
        issuedAt: meta.issuedAt ?? null,
        anemometerHeightM: meta.anemometerHeightM ?? null,
        windExponent: meta.windExponent ?? null,
        stepMinutes: info.stepMinutes,
        startAt: new Date(series.timeMs[0]),
        endAt: new Date(series.timeMs[series.timeMs.length - 1]),
        recordCount: info.records,
        variables: info.variables,
        missing: info.missing,
        derived: info.derived,
        ensembleMembers: members.length,
        importReport,
      })
      .returning();
    await writeSeries(tx as unknown as Db, row.id, series);
    if (members.length > 0) await writeMembers(tx as unknown as Db, row.id, series.timeMs.length, members);
    return row;
  });
}

type DatasetRow = typeof dataset.$inferSelect;

/**
 * Records a regular series of step dt would hold from the first to the last record, and how many
 * of them are absent (rows not in the file at all, as opposed to rows with a missing value). An
 * irregular series can hold more records than the grid: then nothing counts as absent.
 */
export function expectedRecords(
  startMs: number,
  endMs: number,
  stepMinutes: number,
  records: number,
): { expected: number; absent: number } {
  const expected = stepMinutes > 0 ? Math.floor((endMs - startMs) / (stepMinutes * 60_000)) + 1 : records;
  return { expected: Math.max(expected, records), absent: Math.max(0, expected - records) };
}

export function toSummary(r: DatasetRow): DatasetSummary {
  const grid = expectedRecords(r.startAt.getTime(), r.endAt.getTime(), r.stepMinutes, r.recordCount);
  const hsMissing = r.missing.hs ?? r.recordCount;
  return {
    id: r.id,
    name: r.name,
    kind: r.kind,
    dataPoint: { name: r.dataPointName, latitude: r.dataPointLatitude, longitude: r.dataPointLongitude, depthM: r.dataPointDepthM },
    source: { kind: r.sourceKind, fileName: r.originalFileName, format: r.format, issuedAt: r.issuedAt?.toISOString() ?? null },
    stepMinutes: r.stepMinutes,
    start: r.startAt.toISOString(),
    end: r.endAt.toISOString(),
    records: r.recordCount,
    variables: r.variables,
    missing: r.missing,
    derived: r.derived,
    missingShare: r.recordCount ? (r.missing.hs ?? 0) / r.recordCount : 0,
    wind: { anemometerHeightM: r.anemometerHeightM, exponent: r.windExponent },
    expectedRecords: grid.expected,
    absentRecords: grid.absent,
    hsGapShare: grid.expected ? (hsMissing + grid.absent) / grid.expected : 0,
    ensembleMembers: r.ensembleMembers,
    createdAt: r.createdAt.toISOString(),
  };
}

export async function listDatasets(db: Db, projectId: string): Promise<DatasetSummary[]> {
  const rows = await db.select().from(dataset).where(eq(dataset.projectId, projectId)).orderBy(desc(dataset.createdAt));
  const def = await defaultHindcast(db, projectId);
  return rows.map((r) => ({ ...toSummary(r), statisticsDefault: r.id === def?.id }));
}

/** A span shorter than this is too short for statistics by calendar month (every month once). */
const YEAR_MS = 365 * 86_400_000;

/**
 * The project's default dataset for statistics: the hindcast (or observation record) the
 * coordinator chose, else the newest hindcast; null when there is none.
 */
export async function defaultHindcast(db: Db, projectId: string): Promise<DatasetRow | null> {
  const [p] = await db.select({ id: project.defaultHindcastId }).from(project).where(eq(project.id, projectId));
  if (p?.id) {
    const [row] = await db
      .select()
      .from(dataset)
      .where(and(eq(dataset.id, p.id), eq(dataset.projectId, projectId)));
    if (row && row.kind !== 'forecast') return row;
  }
  return latestDataset(db, projectId, 'hindcast');
}

/** A warning when a dataset spanning less than a year is (or becomes) the default for statistics. */
export function shortDefaultWarning(row: Pick<DatasetRow, 'name' | 'startAt' | 'endAt' | 'stepMinutes'>, chosen: boolean): string | null {
  const spanMs = row.endAt.getTime() + row.stepMinutes * 60_000 - row.startAt.getTime();
  if (spanMs >= YEAR_MS) return null;
  const days = Math.round(spanMs / 86_400_000);
  return `${row.name} spans ${days} day${days === 1 ? '' : 's'}, less than a year, and ${chosen ? 'is now' : 'became'} the default for every statistic of this project: months it does not cover have no expected downtime and the others rest on one short sample.${chosen ? '' : ' Choose the default hindcast on the Sea data page.'}`;
}

/**
 * Sets (or with null clears) the project's default dataset for statistics: a hindcast or an
 * observation record of the project, not a forecast. Audited.
 * @returns the warning for a span under a year, else null
 */
export async function setDefaultHindcast(
  db: Db,
  projectId: string,
  user: SessionUser,
  datasetId: string | null,
): Promise<{ datasetId: string | null; warning: string | null }> {
  return db.transaction(async (tx) => {
    const [p] = await tx.select().from(project).where(eq(project.id, projectId));
    if (!p) throw new HttpError('not_found', 'Project not found');
    let row: DatasetRow | null = null;
    if (datasetId !== null) {
      row = await getDatasetRow(tx, projectId, datasetId);
      if (row.kind === 'forecast') {
        throw new HttpError('validation', 'Statistics need a hindcast (or a long observation record), not a forecast', [
          { field: 'datasetId', message: 'is a forecast' },
        ]);
      }
    }
    await tx.update(project).set({ defaultHindcastId: datasetId, updatedAt: new Date() }).where(eq(project.id, projectId));
    await recordAudit(tx, {
      projectId,
      user,
      entity: 'project',
      entityId: projectId,
      entityName: p.name,
      action: 'update',
      before: { defaultHindcastId: p.defaultHindcastId },
      after: { defaultHindcastId: datasetId, defaultHindcastName: row?.name ?? null },
    });
    return { datasetId, warning: row ? shortDefaultWarning(row, true) : null };
  });
}

/** The dataset, only when it belongs to the project (else 404). */
export async function getDatasetRow(db: Db, projectId: string, datasetId: string): Promise<DatasetRow> {
  if (!idParam.safeParse(datasetId).success) throw new HttpError('not_found', 'Dataset not found');
  const [row] = await db
    .select()
    .from(dataset)
    .where(and(eq(dataset.id, datasetId), eq(dataset.projectId, projectId)));
  if (!row) throw new HttpError('not_found', 'Dataset not found');
  return row;
}

export async function getDataset(db: Db, projectId: string, datasetId: string): Promise<DatasetDetail> {
  const row = await getDatasetRow(db, projectId, datasetId);
  return { ...toSummary(row), importReport: row.importReport };
}

export async function deleteDataset(db: Db, projectId: string, datasetId: string): Promise<DatasetRow> {
  const row = await getDatasetRow(db, projectId, datasetId);
  await db.delete(dataset).where(eq(dataset.id, row.id));
  return row;
}

/** The newest dataset of a kind (forecasts: by issue time), or null. */
export async function latestDataset(db: Db, projectId: string, kind: DatasetRow['kind'], skip = 0): Promise<DatasetRow | null> {
  const rows = await db
    .select()
    .from(dataset)
    .where(and(eq(dataset.projectId, projectId), eq(dataset.kind, kind)))
    .orderBy(desc(dataset.issuedAt), desc(dataset.createdAt))
    .limit(1)
    .offset(skip);
  return rows[0] ?? null;
}

export const readDatasetSeries = readSeries;

const n2 = (x: number) => (Number.isNaN(x) ? null : x);

export function toRecordsAnswer(s: SeaSeries): RecordsAnswer {
  const n = s.timeMs.length;
  const time = new Array<string>(n);
  for (let i = 0; i < n; i++) time[i] = new Date(s.timeMs[i]).toISOString();
  const col = (a: Float64Array) => Array.from(a, n2);
  return {
    time,
    hs: col(s.hs),
    tp: col(s.tp),
    tz: col(s.tz),
    te: col(s.te),
    dir: col(s.dir),
    wind: col(s.wind),
    windDir: col(s.windDir),
    given: {
      tp: Array.from(s.givenPeriods, (g) => (g & 1) !== 0),
      tz: Array.from(s.givenPeriods, (g) => (g & 2) !== 0),
      te: Array.from(s.givenPeriods, (g) => (g & 4) !== 0),
    },
  };
}

/** CSV of a series (UTC ISO times, SI units), for download. */
export function* seriesCsv(s: SeaSeries): Generator<string> {
  // Optional columns follow, named `<column>_<unit>` (e.g. `waterLevel_m`, `swell1.tp_s`).
  const extras = presentExtraColumns(s.extra).map((c) => ({
    values: s.extra[c]!,
    header: `${c}_${EXTRA_COLUMN_UNITS[c].replace('/', 'p')}`,
  }));
  const extraHeader = extras.map((e) => `,${e.header}`).join('');
  yield `time_utc,hs_m,tp_s,tz_s,te_s,dir_deg,wind_mps,wind_dir_deg,tp_given,tz_given,te_given${extraHeader}\n`;
  const f = (x: number, d: number) => (Number.isNaN(x) ? '' : x.toFixed(d));
  let buf = '';
  for (let i = 0; i < s.timeMs.length; i++) {
    const g = s.givenPeriods[i];
    let extraCells = '';
    for (const e of extras) extraCells += `,${f(e.values[i], 3)}`;
    buf += `${new Date(s.timeMs[i]).toISOString()},${f(s.hs[i], 3)},${f(s.tp[i], 2)},${f(s.tz[i], 2)},${f(s.te[i], 2)},${f(s.dir[i], 1)},${f(s.wind[i], 2)},${f(s.windDir[i], 1)},${g & 1 ? 1 : 0},${g & 2 ? 1 : 0},${g & 4 ? 1 : 0}${extraCells}\n`;
    if (buf.length > 64_000) {
      yield buf;
      buf = '';
    }
  }
  if (buf) yield buf;
}

/** Mean and 90th percentile Hs and data coverage per calendar month (UTC). */
export function monthlySummary(s: SeaSeries, stepMinutes: number): MonthlySummaryRow[] {
  const groups = new Map<number, number[]>();
  const counts = new Map<number, number>();
  for (let i = 0; i < s.timeMs.length; i++) {
    const d = new Date(s.timeMs[i]);
    const key = d.getUTCFullYear() * 12 + d.getUTCMonth();
    counts.set(key, (counts.get(key) ?? 0) + 1);
    if (!Number.isNaN(s.hs[i])) {
      let g = groups.get(key);
      if (!g) groups.set(key, (g = []));
      g.push(s.hs[i]);
    }
  }
  const rows: MonthlySummaryRow[] = [];
  for (const key of [...counts.keys()].sort((a, b) => a - b)) {
    const year = Math.floor(key / 12);
    const month = (key % 12) + 1;
    const hs = (groups.get(key) ?? []).sort((a, b) => a - b);
    const expected = (new Date(Date.UTC(year, month, 1)).getTime() - Date.UTC(year, month - 1, 1)) / 60_000 / stepMinutes;
    const mean = hs.length ? hs.reduce((a, b) => a + b, 0) / hs.length : null;
    const p90 = hs.length ? quantileR7Sorted(hs, 0.9) : null;
    rows.push({ year, month, records: counts.get(key)!, coverage: Math.min(1, hs.length / expected), hsMean: mean, hsP90: p90 });
  }
  return rows;
}
