// `npm run db:restore <file>`: replaces the embedded database in DATA_DIR with a backup made by
// `npm run db:backup`. In order, and stopping at the first problem with nothing changed:
//   1. refuses while a server runs on DATA_DIR (only one process may open the database);
//   2. checks the file's structure: gzip intact, a PostgreSQL data folder inside;
//   3. writes the restored folder beside the current one under a temporary name, opens it, and
//      checks that every table (stored series included) reads and that this version knows every
//      migration in it; the current folder is not touched until this has passed;
//   4. moves the current folder aside (kept as DATA_DIR/db.before-restore-<UTC time>) and renames
//      the restored one into place.
// DATA_DIR/auth-secret is not part of the database and stays as it is.
// With DATABASE_URL (a PostgreSQL server) it prints the pg_restore command to use and exits with 2.
import fs from 'node:fs';
import path from 'node:path';
import type { PGlite } from '@electric-sql/pglite';
import { claimDataDir, releaseDataDir } from '../server/data-dir-claim';
import { BackupFileError, dbFolder, fail, formatSize, readBackupFile, runningServer, stamp, startDbCommand } from './db-common';

const { dataDir, given } = startDbCommand('restore');
if (!given) fail('Usage: npm run db:restore -- <backup file>   (a .tar.gz written by npm run db:backup)');
const file = path.resolve(given);

function refuseWhileServing(): void {
  const server = runningServer(dataDir);
  if (server) {
    fail(
      `A Lullwatch server (pid ${server.pid}, port ${server.port}) is running on ${dataDir}. Stop it first; nothing was changed.\n` +
        `(If no server runs there, ${path.join(dataDir, 'server.json')} is left over: delete it and run this again.)`,
      2,
    );
  }
}
refuseWhileServing();

const NOTHING_CHANGED = `Nothing was changed in ${dataDir}.`;

// 2. The file, before anything on disk is touched.
let bytes: Buffer;
let pgVersion: string;
try {
  ({ bytes, pgVersion } = readBackupFile(file));
} catch (err) {
  if (err instanceof BackupFileError) fail(`Refused: ${err.message}. ${NOTHING_CHANGED}`);
  throw err;
}

const { PGlite: PGliteClass } = await import('@electric-sql/pglite');
const { MIGRATIONS_FOLDER } = await import('../server/db/migrate');
const journal = JSON.parse(fs.readFileSync(path.join(MIGRATIONS_FOLDER, 'meta/_journal.json'), 'utf8')) as {
  entries: { when: number; tag: string }[];
};
const newestKnown = Math.max(...journal.entries.map((e) => e.when));

/** Every table readable (series bytes included), the migrations table present; returns a summary. */
async function checkDatabase(pg: PGlite): Promise<{ tables: number; migrations: number; datasets: number; projects: number }> {
  const tables = (
    await pg.query<{ schema: string; name: string }>(
      `select schemaname as schema, tablename as name from pg_tables where schemaname in ('public', 'drizzle') order by 1, 2`,
    )
  ).rows;
  for (const t of tables) await pg.query(`select count(*) from "${t.schema}"."${t.name}"`);
  const names = new Set(tables.map((t) => `${t.schema}.${t.name}`));
  for (const needed of ['drizzle.__drizzle_migrations', 'public.project', 'public.dataset', 'public.dataset_chunk', 'public.user']) {
    if (!names.has(needed)) throw new Error(`the table ${needed} is missing: not a Lullwatch database`);
  }
  // Reads every stored series value, so damaged long values show up here and not after the swap.
  await pg.query(
    `select sum(octet_length(time_ms) + octet_length(hs) + octet_length(tp) + octet_length(tz) + octet_length(te) + octet_length(dir) + octet_length(wind) + octet_length(wind_dir) + octet_length(given_periods)) from dataset_chunk`,
  );
  const migrations = (
    await pg.query<{ n: number; newest: string | null }>(
      `select count(*)::int as n, max(created_at)::text as newest from drizzle.__drizzle_migrations`,
    )
  ).rows[0];
  if (migrations.newest !== null && Number(migrations.newest) > newestKnown) {
    throw new Error('it was made by a newer Lullwatch (it holds migrations this version does not know); restore it with that version');
  }
  const count = async (table: string) => (await pg.query<{ n: number }>(`select count(*)::int as n from ${table}`)).rows[0].n;
  return { tables: tables.length, migrations: migrations.n, datasets: await count('dataset'), projects: await count('project') };
}

async function openAndCheck(folder: string): Promise<Awaited<ReturnType<typeof checkDatabase>>> {
  let pg: PGlite | undefined;
  try {
    pg = new PGliteClass({
      dataDir: folder,
      loadDataDir: new Blob([new Uint8Array(bytes.buffer as ArrayBuffer, bytes.byteOffset, bytes.byteLength)]),
    });
    await pg.waitReady;
    return await checkDatabase(pg);
  } finally {
    await pg?.close().catch(() => {});
  }
}

// 3. The restored folder, written beside the current one under a temporary name and checked there.
const current = dbFolder(dataDir);
const when = stamp();
const partial = path.join(dataDir, `.db.restore-${when}.partial`);
const createdDataDir = !fs.existsSync(dataDir);
fs.mkdirSync(dataDir, { recursive: true });
fs.rmSync(partial, { recursive: true, force: true });
let summary: Awaited<ReturnType<typeof checkDatabase>>;
try {
  summary = await openAndCheck(partial);
} catch (err) {
  fs.rmSync(partial, { recursive: true, force: true });
  if (createdDataDir) fs.rmSync(dataDir, { recursive: true, force: true });
  fail(
    `Refused: ${file} does not open as a Lullwatch database (PostgreSQL ${pgVersion} data folder): ${(err as Error).message}. ${NOTHING_CHANGED}`,
  );
}

// 4. Swap: the current folder is kept aside, the restored one takes its place. The data folder is
// claimed for the swap, so a server starting now waits for nothing and fails instead of opening it.
refuseWhileServing();
try {
  claimDataDir(dataDir, 'restore');
} catch (err) {
  fs.rmSync(partial, { recursive: true, force: true });
  fail(`${(err as Error).message} ${NOTHING_CHANGED}`, 2);
}
process.on('exit', () => releaseDataDir(dataDir));
let keptAs: string | null = null;
if (fs.existsSync(current)) {
  keptAs = path.join(dataDir, `db.before-restore-${when}`);
  fs.renameSync(current, keptAs);
}
try {
  fs.renameSync(partial, current);
} catch (err) {
  if (keptAs) fs.renameSync(keptAs, current);
  fs.rmSync(partial, { recursive: true, force: true });
  fail(`The restore failed while moving folders (${(err as Error).message}); the previous database is back in place.`);
}

console.log(`Restored ${file} (${formatSize(bytes.length)}) into ${current}:`);
console.log(
  `  ${summary.projects} project(s), ${summary.datasets} dataset(s), ${summary.tables} tables, ${summary.migrations} migration(s) applied.`,
);
if (keptAs) console.log(`The previous database is kept in ${keptAs} (delete it when you no longer need it).`);
console.log('Start the server as usual; it applies any migration newer than the backup.');
