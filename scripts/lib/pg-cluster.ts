// A throwaway PostgreSQL cluster (initdb in a temporary folder, loopback only, a free port, trust
// authentication for one local user, durability off) for `npm run test:postgres` and
// `npm run bench:cluster`, and the server programs' folder for the tests that run pg_dump.
//
// Needs PostgreSQL's server programs (Debian: `apt-get install postgresql`). PG_BIN may name their
// folder; otherwise the newest /usr/lib/postgresql/<version>/bin or `pg_config --bindir` is used.
// PostgreSQL refuses to run as root, so as root the cluster runs as the `postgres` user.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { spawnSync } from 'node:child_process';
import { freePort } from './free-port';

/** The folder of PostgreSQL's programs (initdb, pg_ctl, pg_dump, pg_restore), or null. */
export function findPgBin(): string | null {
  const candidates: string[] = [];
  if (process.env.PG_BIN) candidates.push(process.env.PG_BIN);
  const debianRoot = '/usr/lib/postgresql';
  if (fs.existsSync(debianRoot)) {
    const versions = fs
      .readdirSync(debianRoot)
      .filter((v) => /^\d+$/.test(v))
      .sort((a, b) => Number(b) - Number(a));
    candidates.push(...versions.map((v) => path.join(debianRoot, v, 'bin')));
  }
  const pgConfig = spawnSync('pg_config', ['--bindir'], { encoding: 'utf8' });
  if (pgConfig.status === 0) candidates.push(pgConfig.stdout.trim());
  return candidates.find((dir) => fs.existsSync(path.join(dir, 'initdb')) && fs.existsSync(path.join(dir, 'pg_ctl'))) ?? null;
}

const asRoot = process.getuid?.() === 0;

/** Runs a PostgreSQL server program, as the postgres user when we are root; throws with its output on failure. */
function pgRun(bin: string, program: string, args: string[]): void {
  const exe = path.join(bin, program);
  const [cmd, cmdArgs] = asRoot ? ['runuser', ['-u', 'postgres', '--', exe, ...args]] : [exe, args];
  const result = spawnSync(cmd, cmdArgs, { encoding: 'utf8' });
  if (result.status !== 0) {
    throw new Error(`${program} ${args.join(' ')} failed (exit ${result.status}):\n${result.stdout}${result.stderr}`);
  }
}

export interface ThrowawayCluster {
  /** postgres://user@127.0.0.1:port/postgres (the maintenance database). */
  url: string;
  port: number;
  bin: string;
  /** The PostgreSQL major version (the name of the bin folder's parent on Debian). */
  version: string;
  /** The server log's last lines (for error reports). */
  logTail(): string;
  /** Stops the cluster and removes its folder; safe to call twice. */
  stop(): void;
}

/** Starts a throwaway cluster; throws with a clear message when the server programs are missing. */
export async function startThrowawayCluster(options: { user?: string; maxConnections?: number } = {}): Promise<ThrowawayCluster> {
  const bin = findPgBin();
  if (!bin) {
    throw new Error(
      'PostgreSQL server programs not found. Install them (Debian: apt-get install postgresql) or set PG_BIN to the folder holding initdb and pg_ctl.',
    );
  }
  const workDir = fs.mkdtempSync(path.join(os.tmpdir(), 'lullwatch-pg-'));
  const dataDir = path.join(workDir, 'data');
  const logFile = path.join(workDir, 'server.log');
  let started = false;
  const stop = () => {
    if (started) {
      started = false;
      try {
        pgRun(bin, 'pg_ctl', ['stop', '-D', dataDir, '-m', 'fast', '-w']);
      } catch (e) {
        console.error(String(e));
      }
    }
    fs.rmSync(workDir, { recursive: true, force: true });
  };
  const logTail = () => (fs.existsSync(logFile) ? fs.readFileSync(logFile, 'utf8').slice(-4000) : '');
  try {
    if (asRoot) {
      const ids = spawnSync('id', ['-u', 'postgres'], { encoding: 'utf8' });
      const gids = spawnSync('id', ['-g', 'postgres'], { encoding: 'utf8' });
      if (ids.status !== 0) throw new Error('running as root but there is no `postgres` user to run the cluster as.');
      fs.chownSync(workDir, Number(ids.stdout), Number(gids.stdout));
    }
    fs.chmodSync(workDir, 0o700);
    const port = await freePort();
    const user = options.user ?? 'lullwatch_test';
    pgRun(bin, 'initdb', ['-D', dataDir, '-U', user, '--auth=trust', '--encoding=UTF8', '--locale=C', '--no-sync']);
    // Loopback only; durability is not needed for a throwaway cluster.
    const serverOptions = `-p ${port} -k ${workDir} -c listen_addresses=127.0.0.1 -c fsync=off -c synchronous_commit=off -c full_page_writes=off -c max_connections=${options.maxConnections ?? 200}`;
    pgRun(bin, 'pg_ctl', ['start', '-D', dataDir, '-l', logFile, '-w', '-t', '60', '-o', serverOptions]);
    started = true;
    return { url: `postgres://${user}@127.0.0.1:${port}/postgres`, port, bin, version: path.basename(path.dirname(bin)), logTail, stop };
  } catch (e) {
    const tail = logTail();
    stop();
    throw new Error(`${e instanceof Error ? e.message : String(e)}${tail ? `\n${tail}` : ''}`, { cause: e });
  }
}
