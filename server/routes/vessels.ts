import { Router, type Request, type Response } from 'express';
import multer from 'multer';
import { VesselInput } from '../../shared/schemas/vessel';
import type { AppDeps } from '../deps';
import { HttpError, parseInput } from '../http/errors';
import { projectRoutes } from './project-collection';
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
  const project = projectRoutes(router, db);

  /** GET /api/projects/:projectId/vessels: the project's vessels by name. */
  project.get('vessels', 'member', (a) => listVessels(db, a.projectId));

  /** POST /api/projects/:projectId/vessels: `{ name }` -> 201 with the vessel. */
  project.create('vessels', 'coordinator', (a, req) => createVessel(db, a.projectId, a.user, parseInput(VesselInput, req.body)));

  /** GET /api/projects/:projectId/vessels/:vesselId/raos: `{ periods, headings, responses }`. */
  project.get('vessels/:vesselId/raos', 'member', (a, req) => getVesselRaos(db, a.projectId, req.params.vesselId));

  /** POST /api/projects/:projectId/vessels/:vesselId/raos: multipart `file` (CSV) -> the new table, or 400 with every problem. */
  project.post('vessels/:vesselId/raos', 'coordinator', async (a, req, res) => {
    await vesselRow(db, a.projectId, req.params.vesselId); // 404 before the upload is read
    const file = await receiveRaoFile(req, res);
    const text = new TextDecoder('utf-8', { fatal: false }).decode(file.buffer);
    return importVesselRaos(db, a.projectId, a.user, req.params.vesselId, file.originalname || 'raos.csv', text);
  });

  return router;
}
