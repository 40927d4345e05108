import os from 'node:os';
import path from 'node:path';
import fs from 'node:fs';
import { Router, type Request, type Response } from 'express';
import multer from 'multer';
import { z } from 'zod';
import type { AppDeps } from '../deps';
import { HttpError, parseInput } from '../http/errors';
import { requireCoordinator, requireProjectMember } from '../services/project-access';
import {
  deleteDataset,
  getDataset,
  getDatasetRow,
  listDatasets,
  monthlySummary,
  readDatasetSeries,
  seriesCsv,
  setDefaultHindcast,
  toRecordsAnswer,
} from '../services/datasets';

const DefaultHindcastInput = z.object({ datasetId: z.uuid('must be a dataset id').nullable() });
import { importUploadedFile, MAX_NETCDF_UPLOAD_BYTES, MAX_UPLOAD_BYTES, safeFileName } from '../services/dataset-import';
import { ensurePrivateDir, privateDiskStorage, uploadLimitHit } from '../http/private-uploads';
import { netcdfKind } from '../services/netcdf-file';
import { describeNetcdfUpload } from '../services/netcdf-import';
import { project } from '../db/schema';
import { eq } from 'drizzle-orm';
import { ImportFormSchema } from '../../shared/seadata';
import { Limiter } from '../http/limiter';

export const UPLOAD_DIR = path.join(os.tmpdir(), 'lullwatch-uploads');

/**
 * Imports parse and store on this process's one thread: at most IMPORTS_AT_ONCE run at once in a
 * process (three 28 MB imports side by side stalled everyone for seconds), a few more wait, and
 * beyond that the uploader is asked to try again shortly (429).
 */
export const IMPORTS_AT_ONCE = 1;
export const IMPORTS_WAITING = 4;
export const importLimiter = new Limiter({
  concurrency: IMPORTS_AT_ONCE,
  queue: IMPORTS_WAITING,
  busyMessage: 'Several imports are running: try again in a minute',
});

/** Longest form field (the column mapping and units are small JSON texts). */
const MAX_FIELD_BYTES = 64 * 1024;

const upload = multer({
  // Stored under a random name in UPLOAD_DIR (0700, files 0600): the client's file name never
  // becomes a path.
  // NetCDF files (known by their first bytes) may reach 2 GB; every other upload 100 MB.
  storage: privateDiskStorage(UPLOAD_DIR, (first) => (netcdfKind(first) ? MAX_NETCDF_UPLOAD_BYTES : MAX_UPLOAD_BYTES)),
  limits: { fileSize: MAX_NETCDF_UPLOAD_BYTES, files: 1, fields: 20, fieldSize: MAX_FIELD_BYTES },
  // Browsers send the file name as raw UTF-8 in the part header; busboy's default reads it as
  // Latin-1 ('Ålesund.csv' came back as 'Ã\x85lesund.csv').
  defParamCharset: 'utf8',
}).single('file');

/**
 * Largest multipart body that can hold a file within the NetCDF limit: the file, every form field
 * at its limit, and a little for the part headers and boundaries.
 */
export const MAX_UPLOAD_BODY_BYTES = MAX_NETCDF_UPLOAD_BYTES + 20 * (MAX_FIELD_BYTES + 1024) + 64 * 1024;

/**
 * Runs multer after the role check, so refused callers never send their file to disk. A body that
 * declares a length over any file's limit is answered 413 before a byte of it is read (the
 * connection is then closed, so the rest is never received); a body without a length (chunked)
 * is cut off by the storage once its file passes the limit its first bytes call for.
 */
function receiveUpload(req: Request, res: Response): Promise<void> {
  const declared = Number(req.headers['content-length']);
  if (Number.isFinite(declared) && declared > MAX_UPLOAD_BODY_BYTES) {
    res.setHeader('Connection', 'close');
    return Promise.reject(
      new HttpError(
        'too_large',
        `The upload declares ${(declared / 1024 ** 3).toFixed(2)} GB: larger than the NetCDF upload limit of ${MAX_NETCDF_UPLOAD_BYTES / 1024 ** 3} GB (other files: ${MAX_UPLOAD_BYTES / 1024 / 1024} MB)`,
      ),
    );
  }
  ensurePrivateDir(UPLOAD_DIR);
  return new Promise((resolve, reject) =>
    upload(req, res, (err: unknown) => {
      if (!err) return resolve();
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE') {
          const hit = uploadLimitHit.get(req);
          return reject(
            new HttpError(
              'too_large',
              hit === undefined || hit >= MAX_NETCDF_UPLOAD_BYTES
                ? `The file is larger than the NetCDF upload limit of ${MAX_NETCDF_UPLOAD_BYTES / 1024 ** 3} GB`
                : `The file is larger than the upload limit of ${MAX_UPLOAD_BYTES / 1024 / 1024} MB (NetCDF files: ${MAX_NETCDF_UPLOAD_BYTES / 1024 ** 3} GB)`,
            ),
          );
        }
        if (err.code === 'LIMIT_FIELD_VALUE' || err.code === 'LIMIT_FIELD_KEY') {
          const message = `Form field ${err.field ?? ''} is longer than the limit of ${MAX_FIELD_BYTES / 1024} kB`;
          return reject(new HttpError('too_large', message, [{ field: err.field ?? '(form)', message: 'too long' }]));
        }
        return reject(
          new HttpError('validation', `Upload refused: ${err.message}`, [{ field: err.field ?? 'file', message: err.message }]),
        );
      }
      // A body that is not well-formed multipart (no boundary, cut short, a malformed part
      // header) is the client's error; system errors (a full disk) stay 500s.
      if (err instanceof Error && !('code' in err && typeof err.code === 'string' && err.code.startsWith('E'))) {
        return reject(
          new HttpError('validation', `Upload refused: the body is not valid multipart/form-data (${err.message})`, [
            { field: 'file', message: err.message },
          ]),
        );
      }
      reject(err);
    }),
  );
}

/**
 * Receives the upload ({@link receiveUpload}), refuses a request without a file (400 naming the
 * field), runs `work` with the file and removes it afterwards, whatever happened.
 */
async function withUploadedFile(req: Request, res: Response, work: (file: Express.Multer.File) => Promise<void>): Promise<void> {
  await receiveUpload(req, res);
  const file = req.file;
  try {
    if (!file) {
      throw new HttpError('validation', 'Send the file as multipart/form-data in the field "file"', [
        { field: 'file', message: 'is required' },
      ]);
    }
    await work(file);
  } finally {
    if (file) fs.rm(file.path, { force: true }, () => {});
  }
}

const RecordsQuery = z.object({
  from: z.iso.datetime({ offset: true }).optional(),
  to: z.iso.datetime({ offset: true }).optional(),
});

/** Longest stretch one records answer covers (a year of hourly records is about 2 MB of JSON). */
export const MAX_RECORDS_DAYS = 366;
const DAY_MS = 86_400_000;

/**
 * An upload's temporary file is removed when its request ends; a process killed mid-upload leaves
 * its file behind. Files older than a day are such leftovers (no upload takes that long, and
 * another instance's upload in progress is younger), removed when the routes are built at start.
 */
const STALE_UPLOAD_MS = 24 * 3_600_000;
function sweepStaleUploads(nowMs = Date.now()): void {
  let names: string[];
  try {
    names = fs.readdirSync(UPLOAD_DIR);
  } catch {
    return; // no folder yet
  }
  for (const name of names) {
    const file = path.join(UPLOAD_DIR, name);
    try {
      if (nowMs - fs.statSync(file).mtimeMs > STALE_UPLOAD_MS) fs.rmSync(file, { force: true });
    } catch {
      /* removed meanwhile */
    }
  }
}

export function datasetsRoutes({ db }: AppDeps): Router {
  const router = Router();
  sweepStaleUploads();

  /** GET /api/projects/:projectId/datasets: every dataset of the project, newest first. */
  router.get('/projects/:projectId/datasets', async (req, res) => {
    const access = await requireProjectMember(db, req, req.params.projectId);
    res.json(await listDatasets(db, access.projectId));
  });

  /**
   * POST /api/projects/:projectId/datasets (multipart: file, name, kind, format, dataPointDepth,
   * timeZone?, onBadRows?, columns?, units?, missingCodes?...): imports a file all-or-nothing.
   * With `Accept: application/x-ndjson` the answer streams progress lines, then the result.
   */
  router.post('/projects/:projectId/datasets', async (req, res) => {
    const access = await requireCoordinator(db, req, req.params.projectId);
    await withUploadedFile(req, res, async (file) => {
      const streamProgress = (req.headers.accept ?? '').includes('application/x-ndjson');
      const args = {
        projectId: access.projectId,
        userId: access.user.id,
        file: { path: file.path, originalName: safeFileName(file.originalname), size: file.size },
        fields: req.body ?? {},
      };
      const release = await importLimiter.acquire('process');
      res.once('close', release);
      if (!streamProgress) {
        try {
          res.status(201).json(await importUploadedFile(db, args));
        } finally {
          release();
        }
        return;
      }
      res.status(200).setHeader('content-type', 'application/x-ndjson');
      const line = (o: unknown) => res.write(`${JSON.stringify(o)}\n`);
      try {
        const result = await importUploadedFile(db, { ...args, onProgress: (p) => line({ progress: p }) });
        line({ status: 201, result });
      } catch (err) {
        const e = err instanceof HttpError ? err : new HttpError('internal', 'Internal server error');
        line({ status: e.status, error: { code: e.code, message: e.message, details: e.details ?? null } });
      } finally {
        release();
      }
      res.end();
    });
  });

  /**
   * POST /api/projects/:projectId/datasets/netcdf-points (coordinators; multipart `file`,
   * `variables?`): the points of a NetCDF file with their position, missing share and distance to
   * the data point, the sea point nearest it, the variables found and the time span. Nothing is
   * stored; the import then names the point as `gridPoint`.
   */
  router.post('/projects/:projectId/datasets/netcdf-points', async (req, res) => {
    const access = await requireCoordinator(db, req, req.params.projectId);
    await withUploadedFile(req, res, async (file) => {
      const head = Buffer.alloc(8);
      const fd = fs.openSync(file.path, 'r');
      try {
        fs.readSync(fd, head, 0, 8, 0);
      } finally {
        fs.closeSync(fd);
      }
      if (!netcdfKind(head))
        throw new HttpError(
          'bad_file',
          'This is not a NetCDF file: it does not start with the NetCDF classic (CDF) or NetCDF-4 (HDF5) signature',
        );
      const fields = parseInput(ImportFormSchema.pick({ variables: true }), req.body ?? {}, 'form');
      const [p] = await db.select().from(project).where(eq(project.id, access.projectId));
      const release = await importLimiter.acquire('process');
      try {
        // On a worker thread stopped after a time limit (a damaged file can make the HDF5 reader loop).
        const answer = await describeNetcdfUpload(
          file,
          { name: p.dataPointName, lat: p.dataPointLatitude, lon: p.dataPointLongitude },
          fields.variables ?? {},
        );
        res.json(answer);
      } finally {
        release();
      }
    });
  });

  /**
   * PUT /api/projects/:projectId/default-hindcast `{ datasetId: uuid | null }` (coordinators): the
   * dataset statistics use when none is named; null = the newest hindcast again. A forecast is
   * refused (400). → `{ datasetId, warning }`, the warning set for a span under a year.
   */
  router.put('/projects/:projectId/default-hindcast', async (req, res) => {
    const access = await requireCoordinator(db, req, req.params.projectId);
    const body = parseInput(DefaultHindcastInput, req.body ?? {});
    res.json(await setDefaultHindcast(db, access.projectId, access.user, body.datasetId));
  });

  /** GET /api/projects/:projectId/datasets/:datasetId: metadata, coverage and the import report. */
  router.get('/projects/:projectId/datasets/:datasetId', async (req, res) => {
    const access = await requireProjectMember(db, req, req.params.projectId);
    res.json(await getDataset(db, access.projectId, req.params.datasetId));
  });

  /** GET .../datasets/:datasetId/records?from=&to=: columnar arrays (ISO UTC times, SI units, null = missing). */
  router.get('/projects/:projectId/datasets/:datasetId/records', async (req, res) => {
    const access = await requireProjectMember(db, req, req.params.projectId);
    const q = parseInput(RecordsQuery, req.query, 'query');
    const row = await getDatasetRow(db, access.projectId, req.params.datasetId);
    const fromMs = q.from ? Date.parse(q.from) : row.startAt.getTime();
    const toMs = q.to ? Date.parse(q.to) : row.endAt.getTime();
    if (Math.min(toMs, row.endAt.getTime()) - Math.max(fromMs, row.startAt.getTime()) > MAX_RECORDS_DAYS * DAY_MS) {
      const message = `a records answer covers at most ${MAX_RECORDS_DAYS} days: give from and to closer together (the monthly summary covers the whole dataset)`;
      throw new HttpError('validation', `Invalid query: to: ${message}`, [{ field: 'to', message }]);
    }
    const series = await readDatasetSeries(db, row.id, { fromMs, toMs });
    res.json(toRecordsAnswer(series));
  });

  /** GET .../datasets/:datasetId/monthly: mean and 90th percentile Hs and coverage per month (UTC). */
  router.get('/projects/:projectId/datasets/:datasetId/monthly', async (req, res) => {
    const access = await requireProjectMember(db, req, req.params.projectId);
    const row = await getDatasetRow(db, access.projectId, req.params.datasetId);
    res.json(monthlySummary(await readDatasetSeries(db, row.id), row.stepMinutes));
  });

  /** GET .../datasets/:datasetId/csv: the records as a CSV download (UTC, SI units). */
  router.get('/projects/:projectId/datasets/:datasetId/csv', async (req, res) => {
    const access = await requireProjectMember(db, req, req.params.projectId);
    const row = await getDatasetRow(db, access.projectId, req.params.datasetId);
    const series = await readDatasetSeries(db, row.id);
    const name = row.name.replace(/[^A-Za-z0-9._-]+/g, '-').slice(0, 80) || 'dataset';
    res.setHeader('content-type', 'text/csv; charset=utf-8');
    res.setHeader('content-disposition', `attachment; filename="${name}.csv"`);
    for (const part of seriesCsv(series)) res.write(part);
    res.end();
  });

  /** DELETE .../datasets/:datasetId (coordinators). */
  router.delete('/projects/:projectId/datasets/:datasetId', async (req, res) => {
    const access = await requireCoordinator(db, req, req.params.projectId);
    await deleteDataset(db, access.projectId, req.params.datasetId);
    res.status(204).end();
  });

  return router;
}
