import { Router } from 'express';
import type { PGlite } from '@electric-sql/pglite';
import type { AppDeps } from '../deps';
import { HttpError } from '../http/errors';
import { sameSecret } from '../http/same-secret';

/**
 * A gzip tar of the embedded database's data folder, taken while no other statement or
 * transaction of this process runs (PGlite's transaction lock), after a checkpoint so that little
 * WAL needs replaying when the copy is opened.
 */
export async function dumpEmbeddedDatabase(pglite: PGlite): Promise<Buffer> {
  await pglite.exec('CHECKPOINT');
  const blob = await pglite._runExclusiveTransaction(() => pglite.dumpDataDir('gzip'));
  return Buffer.from(await blob.arrayBuffer());
}

export function internalBackupRoutes(deps: AppDeps): Router {
  const router = Router();

  /**
   * POST /api/internal/backup with header x-lullwatch-job-token: how `npm run db:backup` asks the
   * running server for a copy of the embedded database, since only one process may open it.
   * Answers application/gzip (a tar of the data folder); unknown without the token.
   */
  router.post('/internal/backup', async (req, res) => {
    if (!sameSecret(req.headers['x-lullwatch-job-token'], deps.config.jobToken)) {
      throw new HttpError('not_found', 'No API route POST /api/internal/backup');
    }
    const pglite = deps.database.pglite;
    if (deps.database.kind !== 'pglite' || !pglite) {
      throw new HttpError('conflict', 'This server runs on a PostgreSQL server: back it up with pg_dump');
    }
    const dump = await dumpEmbeddedDatabase(pglite);
    res.setHeader('content-type', 'application/gzip');
    res.setHeader('content-length', String(dump.byteLength));
    res.setHeader('cache-control', 'no-store');
    res.end(dump);
  });

  return router;
}
