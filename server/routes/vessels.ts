import { Router, type Request, type Response } from 'express';
import multer from 'multer';
import { VesselInput } from '../../shared/schemas/vessel';
import type { AppDeps } from '../deps';
import { HttpError, parseInput } from '../http/errors';
import { requireCoordinator, requireProjectMember } from '../services/project-access';
import { createVessel, getVesselRaos, importVesselRaos, listVessels, vesselRow } from '../services/vessels';

/** Largest RAO file, bytes (a dense table of 20 000 rows is well under 2 MB). */
export const MAX_RAO_UPLOAD_BYTES = 2 * 1024 * 1024;

const upload = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: MAX_RAO_UPLOAD_BYTES, files: 1, fields: 5, fieldSize: 1024 },
  defParamCharset: 'utf8',
}).single('file');

/** The multipart file, in memory (small), after the role check. */
function receiveRaoFile(req: Request, res: Response): Promise<Express.Multer.File> {
  return new Promise((resolve, reject) =>
    upload(req, res, (err: unknown) => {
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE')
          return reject(new HttpError('too_large', `The RAO file is larger than ${MAX_RAO_UPLOAD_BYTES / 1024 / 1024} MB`));
        return reject(
          new HttpError('validation', `Upload refused: ${err.message}`, [{ field: err.field ?? 'file', message: err.message }]),
        );
      }
      if (err instanceof Error) {
        return reject(
          new HttpError('validation', `Upload refused: the body is not valid multipart/form-data (${err.message})`, [
            { field: 'file', message: err.message },
          ]),
        );
      }
      if (!req.file)
        return reject(
          new HttpError('validation', 'No file: send the RAO CSV as the form field "file"', [{ field: 'file', message: 'missing' }]),
        );
      resolve(req.file);
    }),
  );
}

/** Vessels and their RAO tables (docs/domain.md#vessel-response): any member reads, coordinators write. */
export function vesselsRoutes({ db }: AppDeps): Router {
  const router = Router();

  /** GET /api/projects/:projectId/vessels: the project's vessels by name. */
  router.get('/projects/:projectId/vessels', async (req, res) => {
    const access = await requireProjectMember(db, req, req.params.projectId);
    res.json(await listVessels(db, access.projectId));
  });

  /** POST /api/projects/:projectId/vessels: `{ name }` -> 201 with the vessel. */
  router.post('/projects/:projectId/vessels', async (req, res) => {
    const access = await requireCoordinator(db, req, req.params.projectId);
    const input = parseInput(VesselInput, req.body);
    res.status(201).json(await createVessel(db, access.projectId, access.user, input));
  });

  /** GET /api/projects/:projectId/vessels/:vesselId/raos: `{ periods, headings, responses }`. */
  router.get('/projects/:projectId/vessels/:vesselId/raos', async (req, res) => {
    const access = await requireProjectMember(db, req, req.params.projectId);
    res.json(await getVesselRaos(db, access.projectId, req.params.vesselId));
  });

  /** POST /api/projects/:projectId/vessels/:vesselId/raos: multipart `file` (CSV) -> the new table, or 400 with every problem. */
  router.post('/projects/:projectId/vessels/:vesselId/raos', async (req, res) => {
    const access = await requireCoordinator(db, req, req.params.projectId);
    await vesselRow(db, access.projectId, req.params.vesselId); // 404 before the upload is read
    const file = await receiveRaoFile(req, res);
    const text = new TextDecoder('utf-8', { fatal: false }).decode(file.buffer);
    res.json(await importVesselRaos(db, access.projectId, access.user, req.params.vesselId, file.originalname || 'raos.csv', text));
  });

  return router;
}
