import fs from 'node:fs';
import { eq } from 'drizzle-orm';
import {
  CsvTextParser,
  ImportError,
  ImportFormSchema,
  NdbcParser,
  binaryMark,
  csvOptionsFromForm,
  detectFormat,
  ndbcOptionsFromForm,
  anemometerHeightOf,
  DEFAULT_WIND_EXPONENT,
  WIND_REFERENCE_HEIGHT_M,
  windHeightFactor,
  EXTRA_COLUMN_UNITS,
  type ExtraColumn,
  type ImportResult,
} from '../../shared/seadata';
import type { ImportAnswer } from '../../shared/api-types-datasets';
import type { Db } from '../db/client';
import { project } from '../db/schema';
import { HttpError, parseInput } from '../http/errors';
import { createDataset, defaultHindcast, shortDefaultWarning } from './datasets';
import { toSeaSeries } from './sea-series';
import { netcdfKind } from './netcdf-file';
import { readNetcdfPointUpload } from './netcdf-import';
import { memberColumnOf, readEnsembleCsv } from './ensemble-csv';
import type { MemberColumns } from './ensemble-store';

export const MAX_UPLOAD_BYTES = 100 * 1024 * 1024;
/** NetCDF uploads may be larger: only the chosen point's series is read from them. */
export const MAX_NETCDF_UPLOAD_BYTES = 2 * 1024 * 1024 * 1024;

export interface UploadedFile {
  path: string;
  originalName: string;
  size: number;
}

export interface ImportProgress {
  phase: 'parsing' | 'saving';
  bytesRead: number;
  totalBytes: number;
  rows: number;
}

/** Longest file name kept, in code points. */
const MAX_FILE_NAME = 200;

/**
 * A file name as shown back to users (it is never used as a path: multer stores the upload under
 * a random name). The last segment after '/' or '\\' only, without a Windows drive prefix ('C:');
 * without control characters (C0, DEL, C1) and without the bidirectional overrides and isolates
 * (U+202A-U+202E, U+2066-U+2069) that can make 'gpj.exe' look like 'exe.jpg' (the "Trojan
 * Source" class of spoofing); lone surrogates as U+FFFD; at most 200 code points; '.', '..' and
 * an empty result become 'upload'.
 */
export function safeFileName(name: string): string {
  const base = (name.split(/[\\/]/).pop() ?? '').replace(/^[A-Za-z]:/, '');
  const clean = base
    // eslint-disable-next-line no-control-regex
    .replace(/[\u0000-\u001f\u007f-\u009f\u202a-\u202e\u2066-\u2069]/g, '')
    .replace(/[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g, '\uFFFD')
    .trim();
  const kept = Array.from(clean).slice(0, MAX_FILE_NAME).join('').trim();
  return kept === '' || kept === '.' || kept === '..' ? 'upload' : kept;
}

/** A reader's refusal as the API's error: the file's issues (line, column, value, reason), or the options'. */
function asHttpError(err: unknown): unknown {
  if (err instanceof ImportError) return new HttpError('bad_file', `${err.message}`, err.issues);
  if (err instanceof RangeError) return new HttpError('validation', err.message);
  return err;
}

/**
 * Imports an uploaded sea-state file: validates the form, streams the file through the CSV or
 * NDBC reader (never one string in memory), derives missing periods, and stores the dataset in
 * one transaction. A bad file throws a 400 listing line, column, value and reason; nothing is
 * stored unless everything is.
 */
export async function importUploadedFile(
  db: Db,
  args: { projectId: string; userId: string; file: UploadedFile; fields: unknown; onProgress?: (p: ImportProgress) => void },
): Promise<ImportAnswer> {
  const form = parseInput(ImportFormSchema, args.fields, 'form');
  const [p] = await db.select().from(project).where(eq(project.id, args.projectId));
  if (!p) throw new HttpError('not_found', 'Project not found');

  const headBytes = await readHeadBytes(args.file.path, 64 * 1024);
  const ncKind = netcdfKind(headBytes);
  if (ncKind !== null) {
    if (form.format !== 'auto' && form.format !== 'netcdf') {
      throw new HttpError(
        'bad_file',
        `This is a NetCDF file (${ncKind === 'classic' ? 'classic' : 'NetCDF-4/HDF5'}), not ${form.format.toUpperCase()}: choose the format NetCDF or auto`,
      );
    }
    return importNetcdfUpload(db, p, form, args);
  }
  if (form.format === 'netcdf') {
    throw new HttpError(
      'bad_file',
      'This is not a NetCDF file: it does not start with the NetCDF classic (CDF) or NetCDF-4 (HDF5) signature',
    );
  }
  if (args.file.size > MAX_UPLOAD_BYTES) {
    throw new HttpError(
      'too_large',
      `The file is larger than the upload limit of ${MAX_UPLOAD_BYTES / 1024 / 1024} MB (NetCDF files: ${MAX_NETCDF_UPLOAD_BYTES / 1024 ** 3} GB)`,
    );
  }
  const head = headBytes.toString('utf8');
  const mark = binaryMark(head);
  if (mark !== null) {
    const code = `U+${mark.code.toString(16).toUpperCase().padStart(4, '0')}`;
    throw new HttpError(
      'bad_file',
      `This is not a text file: it holds binary data (control character ${code} at line ${mark.line}, column ${mark.column}). Upload CSV or NDBC text, or a NetCDF file.`,
      [{ line: mark.line, column: String(mark.column), value: '', reason: `binary content (control character ${code})` }],
    );
  }
  const format = form.format === 'auto' ? detectFormat(head) : form.format;
  // An ensemble forecast in CSV: a `member` column numbers the runs (docs/domain.md#forecast-uncertainty).
  const memberColumn = format === 'csv' ? memberColumnOf(head) : null;
  if (memberColumn && form.kind !== 'forecast') {
    throw new HttpError('bad_file', `The column "${memberColumn.name}" numbers ensemble members: import this file as a forecast`, [
      { line: 1, column: memberColumn.name, value: '', reason: 'a member column is only for an ensemble forecast (kind forecast)' },
    ]);
  }
  let members: MemberColumns[] = [];
  let result: ImportResult;
  if (memberColumn) {
    try {
      const ensemble = readEnsembleCsv(await fs.promises.readFile(args.file.path, 'utf8'), memberColumn, csvOptionsFromForm(form));
      result = ensemble.control;
      members = ensemble.members;
    } catch (err) {
      throw asHttpError(err);
    }
  } else {
    const parser = format === 'ndbc' ? new NdbcParser(ndbcOptionsFromForm(form)) : new CsvTextParser(csvOptionsFromForm(form));

    try {
      let bytesRead = 0;
      let lastReport = 0;
      const stream = fs.createReadStream(args.file.path, { encoding: 'utf8', highWaterMark: 1 << 20 });
      for await (const chunk of stream as AsyncIterable<string>) {
        bytesRead += Buffer.byteLength(chunk, 'utf8');
        parser.push(chunk);
        // Refused as a whole (a line or row over the limits, no time column): the rest is not read.
        if (parser.failed) break;
        if (args.onProgress && bytesRead - lastReport > 2 << 20) {
          lastReport = bytesRead;
          args.onProgress({ phase: 'parsing', bytesRead, totalBytes: args.file.size, rows: linesOf(parser) });
        }
      }
      result = parser.end();
    } catch (err) {
      throw asHttpError(err);
    }
  }

  // Limits are for wind at 10 m; NDBC buoys measure it at about 4-5 m: the height must be stated.
  const givenHeight = anemometerHeightOf(form);
  if (format === 'ndbc' && givenHeight === undefined && result.records.wind.some((w) => w === w)) {
    throw new HttpError(
      'validation',
      'This NDBC file has wind speeds: give the anemometer height (m above the sea; 10 when the wind is already at 10 m) so the wind can be brought to 10 m, where limits are stated',
      [{ field: 'anemometerHeight', message: 'is required for an NDBC file with wind' }],
    );
  }
  const windHeight = format === 'ndbc' ? (givenHeight ?? null) : (givenHeight ?? WIND_REFERENCE_HEIGHT_M);
  const windExponent = windHeight === null ? null : (form.windExponent ?? DEFAULT_WIND_EXPONENT);
  args.onProgress?.({ phase: 'saving', bytesRead: args.file.size, totalBytes: args.file.size, rows: result.report.rowsRead });
  const series = toSeaSeries(result.records);
  const row = await createDataset(
    db,
    {
      ...uploadColumns(p, form, args),
      dataPointLatitude: p.dataPointLatitude,
      dataPointLongitude: p.dataPointLongitude,
      dataPointDepthM: formDepth(form),
      format,
      issuedAt: form.kind === 'forecast' ? new Date(result.records.timeMs[0]) : null,
      anemometerHeightM: windHeight,
      windExponent,
      waterLevelReference: form.waterLevelReference ?? null,
    },
    series,
    {
      ...result.report,
      timeZone: form.timeZone ?? 'UTC',
      originalFileName: safeFileName(args.file.originalName),
      anemometerHeightM: windHeight,
      windExponent,
      ...(format === 'csv' ? { directionConvention: form.directionConvention } : {}),
      ...(series.extra.waterLevel ? { waterLevelReference: form.waterLevelReference } : {}),
      ...(series.extra.currentDir ? { currentDirConvention: form.currentDirConvention } : {}),
      ...(members.length > 0 ? { ensembleMembers: members.length } : {}),
    },
    members,
  );
  return importAnswer(db, args.projectId, row, result.report.rowsSkipped);
}

type ImportForm = ReturnType<typeof ImportFormSchema.parse>;

/** The columns of an uploaded dataset that every format fills alike: the project, who, the name and kind, the file. */
function uploadColumns(p: typeof project.$inferSelect, form: ImportForm, args: { projectId: string; userId: string; file: UploadedFile }) {
  return {
    projectId: args.projectId,
    createdBy: args.userId,
    name: form.name,
    kind: form.kind,
    dataPointName: p.dataPointName,
    sourceKind: 'upload' as const,
    originalFileName: safeFileName(args.file.originalName),
  };
}

/** The data point's depth the form states (null: deep water). */
const formDepth = (form: ImportForm): number | null => (form.dataPointDepth === 'deep' ? null : form.dataPointDepth);

/**
 * The answer of an import: the stored dataset's figures, and a warning when a hindcast shorter than a
 * year is now the default for statistics (no default chosen, and it is the newest), since that changes
 * every figure of the project.
 */
async function importAnswer(
  db: Db,
  projectId: string,
  row: Awaited<ReturnType<typeof createDataset>>,
  skipped: number,
): Promise<ImportAnswer> {
  let warning: string | null = null;
  if (row.kind === 'hindcast') {
    const def = await defaultHindcast(db, projectId);
    if (def?.id === row.id) warning = shortDefaultWarning(row, false);
  }
  return {
    warning,
    id: row.id,
    records: row.recordCount,
    start: row.startAt.toISOString(),
    end: row.endAt.toISOString(),
    stepMinutes: row.stepMinutes,
    variables: row.variables,
    missing: row.missing,
    skipped,
    wind: { anemometerHeightM: row.anemometerHeightM, exponent: row.windExponent },
  };
}

function linesOf(parser: CsvTextParser | NdbcParser): number {
  const maybe = parser as unknown as { linesRead?: number };
  return typeof maybe.linesRead === 'number' ? maybe.linesRead : 0;
}

async function readHeadBytes(path: string, bytes: number): Promise<Buffer> {
  const handle = await fs.promises.open(path, 'r');
  try {
    const buf = Buffer.alloc(bytes);
    const { bytesRead } = await handle.read(buf, 0, bytes, 0);
    return buf.subarray(0, bytesRead);
  } finally {
    await handle.close();
  }
}

/**
 * A NetCDF upload (docs/domain.md#netcdf): the chosen point's series only, then stored like any
 * other import (one transaction). Wind is taken as given at 10 m unless an anemometer height is
 * stated; a forecast's issue time is its forecast_reference_time, else its first time.
 */
async function importNetcdfUpload(
  db: Db,
  p: typeof project.$inferSelect,
  form: ImportForm,
  args: { projectId: string; userId: string; file: UploadedFile; onProgress?: (p: ImportProgress) => void },
): Promise<ImportAnswer> {
  // On a worker thread stopped after a time limit (a damaged file can make the HDF5 reader loop).
  const { result, extra, info } = await readNetcdfPointUpload(args.file, {
    dataPoint: { lat: p.dataPointLatitude, lon: p.dataPointLongitude },
    gridPoint: form.gridPoint,
    columns: form.variables,
    waterLevelOffsetM: form.waterLevelOffset,
    // Progress as the share of the chosen variables read, in records of the point's series.
    onVariable: (done, total, n) =>
      args.onProgress?.({
        phase: 'parsing',
        bytesRead: Math.round((args.file.size * done) / total),
        totalBytes: args.file.size,
        rows: Math.round((n * done) / total),
      }),
  });
  const records = result.records;
  let usable = 0;
  for (let i = 0; i < records.hs.length; i++) if (records.hs[i] === records.hs[i]) usable++;
  if (usable === 0)
    throw new HttpError('bad_file', 'The chosen point has no wave height at any time (all values missing): choose another point');
  const givenHeight = anemometerHeightOf(form);
  const windHeight = givenHeight ?? WIND_REFERENCE_HEIGHT_M;
  const windExponent = form.windExponent ?? DEFAULT_WIND_EXPONENT;
  if (givenHeight !== undefined && givenHeight !== WIND_REFERENCE_HEIGHT_M) {
    const factor = windHeightFactor(givenHeight, windExponent);
    for (let i = 0; i < records.wind.length; i++) records.wind[i] *= factor;
  }
  args.onProgress?.({ phase: 'saving', bytesRead: args.file.size, totalBytes: args.file.size, rows: records.timeMs.length });
  const series = toSeaSeries({ ...records, extra });
  const row = await createDataset(
    db,
    {
      ...uploadColumns(p, form, args),
      dataPointLatitude: info.point.lat ?? p.dataPointLatitude,
      dataPointLongitude: info.point.lon ?? p.dataPointLongitude,
      // The model's depth at the point sets the data point's depth when the file gives it.
      dataPointDepthM: info.depthM ?? formDepth(form),
      format: 'netcdf',
      issuedAt: form.kind === 'forecast' ? new Date(result.forecastReferenceMs ?? records.timeMs[0]) : null,
      anemometerHeightM: windHeight,
      windExponent,
    },
    series,
    {
      format: 'netcdf',
      mode: 'refuse',
      rowsRead: records.timeMs.length,
      records: records.timeMs.length,
      rowsSkipped: 0,
      newestFirst: false,
      issues: [],
      issueCount: 0,
      notes: [
        `NetCDF point ${info.point.index.length ? `[${info.point.index.join(', ')}]` : '(single point)'} at ${info.point.lat ?? '?'}, ${info.point.lon ?? '?'}${info.point.distanceKm !== null ? `, ${info.point.distanceKm} km from the data point` : ''} (${info.point.chosen === 'nearest' ? 'nearest sea point' : info.point.chosen === 'given' ? 'chosen by the coordinator' : "the file's one point"})`,
        ...(info.extraStored.length > 0
          ? [
              `stored beside the total sea state: ${info.extraStored.map((c) => `${c} (${EXTRA_COLUMN_UNITS[c as ExtraColumn]})`).join(', ')}`,
            ]
          : []),
        ...info.notStored,
        ...info.notes,
        ...(givenHeight === undefined ? ['wind taken as given at 10 m above the sea (no anemometer height stated)'] : []),
        ...(info.depthM !== null && formDepth(form) !== info.depthM
          ? [`data point depth set to the file's model depth of ${info.depthM} m (the form said ${form.dataPointDepth})`]
          : []),
      ],
      netcdf: info,
      timeZone: 'UTC',
      originalFileName: safeFileName(args.file.originalName),
      anemometerHeightM: windHeight,
      windExponent,
    },
  );
  return { ...(await importAnswer(db, args.projectId, row, 0)), netcdf: info };
}
