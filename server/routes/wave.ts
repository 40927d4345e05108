import { Router, type RequestHandler } from 'express';
import type { z } from 'zod';
import { RegularWaveQuery, SeaStateQuery, WaveTableQuery } from '../../shared/schemas/wave';
import { ResponseQuery } from '../../shared/schemas/vessel';
import { requireProjectMember } from '../services/project-access';
import { vesselById, vesselResponseAnswer } from '../services/vessels';
import type { AppDeps } from '../deps';
import { requireUser } from '../http/context';
import { HttpError, parseInput } from '../http/errors';
import { regularWaveAnswer, regularWaveProfile, seaStateAnswer, waveTableAnswer } from '../services/wave-calculator';

/** Turns the physics core's RangeErrors into 400s naming what is out of range. */
function physics<T>(fn: () => T): T {
  try {
    return fn();
  } catch (err) {
    if (err instanceof RangeError) throw new HttpError('validation', err.message);
    throw err;
  }
}

/** A calculator route: any signed-in user; the query parsed by `schema`, answered by `answer`. */
function calculator<S extends z.ZodType>(schema: S, answer: (query: z.infer<S>) => unknown): RequestHandler {
  return (req, res) => {
    requireUser(req);
    const q = parseInput(schema, req.query, 'query');
    res.json(physics(() => answer(q)));
  };
}

export function waveRoutes({ db }: AppDeps): Router {
  const router = Router();

  /**
   * GET /api/wave/response?vesselId=&heading=&hs=&tp=&dir= (or &partitions=JSON): per response of
   * the vessel R_s, R_mpm over 3 h, Tz and the response spectrum (docs/domain.md#vessel-response).
   * Members of the vessel's project only (404 otherwise, as for an unknown vessel).
   */
  router.get('/wave/response', async (req, res) => {
    requireUser(req);
    const q = parseInput(ResponseQuery, req.query, 'query');
    const row = await vesselById(db, q.vesselId);
    await requireProjectMember(db, req, row.projectId);
    res.json(physics(() => vesselResponseAnswer(row, q)));
  });

  /** GET /api/wave/regular?period=&height=&depth=&z=: one regular wave by linear theory (SI units). */
  router.get('/wave/regular', calculator(RegularWaveQuery, regularWaveAnswer));

  /** GET /api/wave/profile?period=&height=&depth=: u(z), w(z), Kp(z) from the bed (or L/2) to the surface. */
  router.get('/wave/profile', calculator(RegularWaveQuery, regularWaveProfile));

  /** GET /api/wave/table?from=&to=&step=: wave table rows by d/L0 (at most 2,000). */
  router.get('/wave/table', calculator(WaveTableQuery, waveTableAnswer));

  /** GET /api/wave/sea-state?hs=&tp=&depth= (tz, te, gamma optional): periods, energy, power, bed velocity both ways. */
  router.get('/wave/sea-state', calculator(SeaStateQuery, seaStateAnswer));

  return router;
}
