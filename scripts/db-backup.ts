// `npm run db:backup [file]`: writes a copy of the embedded database (a gzip tar of its data
// folder) to `file`, by default backups/lullwatch-<UTC time>.tar.gz. Only one process may open the
// embedded database: when a server holds DATA_DIR, this asks that server for the copy (with the
// token it wrote to DATA_DIR/server.json); otherwise it opens the database itself. The file is
// written under a temporary name and renamed, so a backup file is never half written.
// With DATABASE_URL (a PostgreSQL server) it prints the pg_dump command to use and exits with 2.
import fs from 'node:fs';
import path from 'node:path';
import { claimDataDir, releaseDataDir } from '../server/data-dir-claim';
import { dbFolder, fail, formatSize, readBackupFile, runningServer, stamp, startDbCommand, writeAtomically } from './db-common';

const { env, dataDir, given } = startDbCommand('backup');
let target: string;
if (given) {
  target = path.resolve(given);
  if (fs.existsSync(target)) fail(`${target} already exists: choose another file name (a backup is never overwritten)`);
} else {
  const base = path.resolve('backups', `lullwatch-${stamp()}`);
  target = `${base}.tar.gz`;
  for (let n = 2; fs.existsSync(target); n++) target = `${base}-${n}.tar.gz`;
}

const server = runningServer(dataDir);
let size: number;
if (server && server.port === null) {
  fail(`A Lullwatch server (pid ${server.pid}) is starting on ${dataDir} (migrations or the demo seed): run this again once it is up.`, 2);
}
if (server) {
  const res = await fetch(`http://127.0.0.1:${server.port}/api/internal/backup`, {
    method: 'POST',
    headers: { 'x-lullwatch-job-token': server.jobToken },
  }).catch((err: Error) =>
    fail(
      `A Lullwatch server (pid ${server.pid}) holds ${dataDir} but did not answer: ${err.message}. Refusing to open the database a second time.\n` +
        `(If no server runs there, ${path.join(dataDir, 'server.json')} is left over: delete it and run this again.)`,
      2,
    ),
  );
  if (!res.ok || !res.body) fail(`The running server refused the backup (${res.status}): ${await res.text()}`, 2);
  const expected = Number(res.headers.get('content-length'));
  const body = res.body as unknown as AsyncIterable<Uint8Array>;
  // Every byte the server announced, or no file at all (checked before the rename).
  async function* complete() {
    let n = 0;
    for await (const chunk of body) {
      n += chunk.byteLength;
      yield chunk;
    }
    if (Number.isFinite(expected) && expected > 0 && n !== expected) throw new Error(`cut short (${n} of ${expected} bytes)`);
  }
  try {
    size = await writeAtomically(target, complete());
  } catch (err) {
    fail(`The backup from the server did not arrive whole (${(err as Error).message}); no file was written.`);
  }
  console.log(`Asked the running server (pid ${server.pid}) for the copy.`);
} else {
  const folder = dbFolder(dataDir);
  if (!fs.existsSync(path.join(folder, 'PG_VERSION'))) fail(`No embedded database in ${folder} (DATA_DIR=${env.DATA_DIR}).`);
  const { openDatabase } = await import('../server/db/client');
  const { dumpEmbeddedDatabase } = await import('../server/routes/internal-backup');
  // Claimed while open, so no server starts on the folder meanwhile (server/data-dir-claim.ts).
  try {
    claimDataDir(dataDir, 'backup');
  } catch (err) {
    fail((err as Error).message, 2);
  }
  try {
    const database = await openDatabase({ dataDir: folder });
    try {
      size = await writeAtomically(target, await dumpEmbeddedDatabase(database.pglite!));
    } finally {
      await database.close();
    }
  } finally {
    releaseDataDir(dataDir);
  }
}

// A cheap check of what was written: gzip intact and a PostgreSQL data folder inside.
// `npm run db:restore` checks more (it opens the copy) before it replaces anything.
try {
  readBackupFile(target);
} catch (err) {
  fs.rmSync(target, { force: true });
  fail(`The backup did not pass its check and was removed: ${(err as Error).message}`);
}
console.log(`Backup written: ${target} (${formatSize(size)})`);
