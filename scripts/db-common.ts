// Shared by `npm run db:backup` and `npm run db:restore`: where the embedded database lives, whether
// a server holds it, the PostgreSQL-server advice, and the checks a backup file must pass.
import fs from 'node:fs';
import path from 'node:path';
import zlib from 'node:zlib';
import { liveClaim, type ServerClaim } from '../server/data-dir-claim';
import { loadEnv, type Env } from '../server/env';

/** Prints `message` on stderr and ends the command with exit code `code`. */
export function fail(message: string, code = 1): never {
  console.error(message);
  process.exit(code);
}

/**
 * The start of `npm run db:<what>`: with DATABASE_URL (a PostgreSQL server) only the advice
 * matters, so it is checked before the rest of the environment (exit 2); otherwise the
 * environment, DATA_DIR as an absolute path and the file named on the command line, if any.
 */
export function startDbCommand(what: 'backup' | 'restore'): { env: Env; dataDir: string; given: string | undefined } {
  if (process.env.DATABASE_URL) fail(postgresAdvice(what), 2);
  const env = loadEnv();
  return { env, dataDir: path.resolve(env.DATA_DIR), given: process.argv.slice(2).find((a) => !a.startsWith('--')) };
}

/** What a running server writes to DATA_DIR/server.json (server/data-dir-claim.ts). */
export type ServerInfo = ServerClaim;

/** The embedded database's folder inside DATA_DIR (server/composition-root.ts opens the same one). */
export const dbFolder = (dataDir: string) => path.join(path.resolve(dataDir), 'db');

/** The server holding DATA_DIR, or null when none runs (a server.json left by a killed server is ignored). */
export const runningServer = (dataDir: string): ServerInfo | null => liveClaim(dataDir);

/** UTC time as 20261202T004512Z, for file and folder names. */
export function stamp(date = new Date()): string {
  return date
    .toISOString()
    .replace(/[-:]/g, '')
    .replace(/\.\d{3}Z$/, 'Z');
}

export function formatSize(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`;
  if (bytes < 1024 * 1024) return `${(bytes / 1024).toFixed(1)} kB`;
  return `${(bytes / 1024 / 1024).toFixed(1)} MB`;
}

/** Prints what to run instead on a PostgreSQL server (DATABASE_URL set). */
export function postgresAdvice(what: 'backup' | 'restore'): string {
  const lines = [
    `DATABASE_URL is set: the data is on a PostgreSQL server, and 'npm run db:${what}' works on the embedded database only.`,
    'Use the PostgreSQL tools of the same major version as the server instead:',
    '  backup:  pg_dump --format=custom --no-owner --file=lullwatch-$(date -u +%Y%m%dT%H%M%SZ).dump "$DATABASE_URL"',
    '  restore: pg_restore --clean --if-exists --no-owner --single-transaction --dbname="$DATABASE_URL" <file>.dump',
    'Stop every Lullwatch instance before a restore; start them again afterwards (they apply any newer migration).',
  ];
  return lines.join('\n');
}

export class BackupFileError extends Error {}

/**
 * Reads a backup file and checks its structure without starting a database: gzip intact, a tar
 * archive holding a PostgreSQL data directory (PG_VERSION and global/pg_control). Returns the
 * compressed bytes and the PostgreSQL major version the archive was made with.
 */
export function readBackupFile(file: string): { bytes: Buffer; pgVersion: string } {
  if (!fs.existsSync(file)) throw new BackupFileError(`No such file: ${file}`);
  if (!fs.statSync(file).isFile()) throw new BackupFileError(`Not a file: ${file}`);
  const bytes = fs.readFileSync(file);
  let tar: Buffer;
  try {
    tar = zlib.gunzipSync(bytes);
  } catch (err) {
    throw new BackupFileError(
      `${file} is not an intact gzip file (${(err as Error).message}); it may be truncated or not a Lullwatch backup`,
    );
  }
  const entries = tarEntries(tar);
  const version = entries.get('PG_VERSION');
  if (version === undefined || !entries.has('global/pg_control')) {
    throw new BackupFileError(`${file} is not a backup of an embedded Lullwatch database (no PostgreSQL data directory inside)`);
  }
  return { bytes, pgVersion: version.toString('utf8').trim() };
}

/** Regular files of a ustar archive: name (without a leading slash) to content. */
function tarEntries(tar: Buffer): Map<string, Buffer> {
  const out = new Map<string, Buffer>();
  let at = 0;
  while (at + 512 <= tar.length) {
    const header = tar.subarray(at, at + 512);
    if (header.every((b) => b === 0)) break;
    const field = (from: number, to: number) => header.subarray(from, to).toString('utf8').replace(/\0.*$/s, '');
    const name = field(0, 100);
    const prefix = header.subarray(257, 262).toString('latin1') === 'ustar' ? field(345, 500) : '';
    const size = parseInt(field(124, 136).trim() || '0', 8);
    const type = field(156, 157);
    if (!Number.isFinite(size) || size < 0) throw new BackupFileError('The archive inside the backup file is damaged (bad tar header)');
    const full = (prefix ? `${prefix}/${name}` : name).replace(/^\/+/, '').replace(/^\.\//, '');
    const start = at + 512;
    if (start + size > tar.length) throw new BackupFileError('The archive inside the backup file is cut short');
    if (type === '0' || type === '') out.set(full, tar.subarray(start, start + size));
    at = start + Math.ceil(size / 512) * 512;
  }
  return out;
}

/** Writes `data` to `file` through a temporary file in the same folder and a rename: never a half-written file. */
export async function writeAtomically(file: string, data: Uint8Array | AsyncIterable<Uint8Array>): Promise<number> {
  const dir = path.dirname(file);
  fs.mkdirSync(dir, { recursive: true });
  const tmp = path.join(dir, `.${path.basename(file)}.${process.pid}.partial`);
  let size = 0;
  const handle = await fs.promises.open(tmp, 'wx', 0o600);
  try {
    if (data instanceof Uint8Array) {
      await handle.write(data);
      size = data.byteLength;
    } else {
      for await (const chunk of data) {
        await handle.write(chunk);
        size += chunk.byteLength;
      }
    }
    await handle.sync();
    await handle.close();
    fs.renameSync(tmp, file);
  } catch (err) {
    await handle.close().catch(() => {});
    fs.rmSync(tmp, { force: true });
    throw err;
  }
  // Make the rename itself durable (best effort: some file systems refuse to sync a folder).
  try {
    const folder = fs.openSync(dir, 'r');
    fs.fsyncSync(folder);
    fs.closeSync(folder);
  } catch {
    /* not supported here */
  }
  return size;
}
