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
  type ImportResult,
} from '../../shared/seadata';
import type { ImportAnswer } from '../../shared/api-types-datasets';
import type { Db } from '../db/client';
import { project } from '../db/schema';
import { HttpError, parseInput } from '../http/errors';
import { createDataset, defaultHindcast, shortDefaultWarning } from './datasets';
import { toSeaSeries } from './sea-series';

export const MAX_UPLOAD_BYTES = 100 * 1024 * 1024;

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

  const head = await readHead(args.file.path, 64 * 1024);
  const mark = binaryMark(head);
  if (mark !== null) {
    const code = `U+${mark.code.toString(16).toUpperCase().padStart(4, '0')}`;
    throw new HttpError(
      'bad_file',
      `This is not a text file: it holds binary data (control character ${code} at line ${mark.line}, column ${mark.column}). Upload CSV or NDBC text.`,
      [{ line: mark.line, column: String(mark.column), value: '', reason: `binary content (control character ${code})` }],
    );
  }
  const format = form.format === 'auto' ? detectFormat(head) : form.format;
  const parser = format === 'ndbc' ? new NdbcParser(ndbcOptionsFromForm(form)) : new CsvTextParser(csvOptionsFromForm(form));

  let result: ImportResult;
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
    if (err instanceof ImportError) {
      throw new HttpError('bad_file', `${err.message}`, err.issues);
    }
    if (err instanceof RangeError) throw new HttpError('validation', err.message);
    throw err;
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
      projectId: args.projectId,
      createdBy: args.userId,
      name: form.name,
      kind: form.kind,
      dataPointName: p.dataPointName,
      dataPointLatitude: p.dataPointLatitude,
      dataPointLongitude: p.dataPointLongitude,
      dataPointDepthM: form.dataPointDepth === 'deep' ? null : form.dataPointDepth,
      sourceKind: 'upload',
      originalFileName: safeFileName(args.file.originalName),
      format,
      issuedAt: form.kind === 'forecast' ? new Date(result.records.timeMs[0]) : null,
      anemometerHeightM: windHeight,
      windExponent,
    },
    series,
    {
      ...result.report,
      timeZone: form.timeZone ?? 'UTC',
      originalFileName: safeFileName(args.file.originalName),
      anemometerHeightM: windHeight,
      windExponent,
      ...(format === 'csv' ? { directionConvention: form.directionConvention } : {}),
    },
  );
  // A hindcast shorter than a year that is now the default for statistics (no default chosen, and
  // it is the newest) changes every figure of the project: say so.
  let warning: string | null = null;
  if (row.kind === 'hindcast') {
    const def = await defaultHindcast(db, args.projectId);
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
    skipped: result.report.rowsSkipped,
    wind: { anemometerHeightM: row.anemometerHeightM, exponent: row.windExponent },
  };
}

function linesOf(parser: CsvTextParser | NdbcParser): number {
  const maybe = parser as unknown as { linesRead?: number };
  return typeof maybe.linesRead === 'number' ? maybe.linesRead : 0;
}

async function readHead(path: string, bytes: number): Promise<string> {
  const handle = await fs.promises.open(path, 'r');
  try {
    const buf = Buffer.alloc(bytes);
    const { bytesRead } = await handle.read(buf, 0, bytes, 0);
    return buf.subarray(0, bytesRead).toString('utf8');
  } finally {
    await handle.close();
  }
}
