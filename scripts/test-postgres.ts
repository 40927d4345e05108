// `npm run test:postgres`: runs the API and planning-job test suites a second time against a real
// PostgreSQL server through node-postgres. It starts a throwaway cluster (initdb in a temporary
// directory, loopback only, a free port, trust authentication for the one local test user), points
// TEST_DATABASE_URL at it, runs Vitest, then stops the cluster and removes the directory.
//
// Needs PostgreSQL's server programs (Debian: `apt-get install postgresql`). PG_BIN may name their
// folder; otherwise the newest /usr/lib/postgresql/<version>/bin or `pg_config --bindir` is used.
// PostgreSQL refuses to run as root, so as root the cluster runs as the `postgres` user.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { spawn, spawnSync } from 'node:child_process';
import { freePort } from './lib/free-port';

const ROOT = path.resolve(import.meta.dirname, '..');
/** The suites that touch the database through the API and the jobs. */
const SUITES = process.argv.slice(2).length > 0 ? process.argv.slice(2) : ['tests/api'];

function findPgBin(): string | null {
  const candidates: string[] = [];
  if (process.env.PG_BIN) candidates.push(process.env.PG_BIN);
  const debianRoot = '/usr/lib/postgresql';
  if (fs.existsSync(debianRoot)) {
    const versions = fs.readdirSync(debianRoot).filter((v) => /^\d+$/.test(v)).sort((a, b) => Number(b) - Number(a));
    candidates.push(...versions.map((v) => path.join(debianRoot, v, 'bin')));
  }
  const pgConfig = spawnSync('pg_config', ['--bindir'], { encoding: 'utf8' });
  if (pgConfig.status === 0) candidates.push(pgConfig.stdout.trim());
  return candidates.find((dir) => fs.existsSync(path.join(dir, 'initdb')) && fs.existsSync(path.join(dir, 'pg_ctl'))) ?? null;
}

const asRoot = process.getuid?.() === 0;

/** Runs a PostgreSQL program, as the postgres user when we are root; throws with its output on failure. */
function pgRun(bin: string, program: string, args: string[]): void {
  const exe = path.join(bin, program);
  const [cmd, cmdArgs] = asRoot ? ['runuser', ['-u', 'postgres', '--', exe, ...args]] : [exe, args];
  const result = spawnSync(cmd, cmdArgs, { encoding: 'utf8' });
  if (result.status !== 0) {
    throw new Error(`${program} ${args.join(' ')} failed (exit ${result.status}):\n${result.stdout}${result.stderr}`);
  }
}

const bin = findPgBin();
if (!bin) {
  console.error(
    '[test:postgres] PostgreSQL server programs not found. Install them (Debian: apt-get install postgresql) ' +
      'or set PG_BIN to the folder holding initdb and pg_ctl.',
  );
  process.exit(1);
}

const workDir = fs.mkdtempSync(path.join(os.tmpdir(), 'lullwatch-pg-'));
const dataDir = path.join(workDir, 'data');
const logFile = path.join(workDir, 'server.log');
if (asRoot) {
  const ids = spawnSync('id', ['-u', 'postgres'], { encoding: 'utf8' });
  const gids = spawnSync('id', ['-g', 'postgres'], { encoding: 'utf8' });
  if (ids.status !== 0) {
    console.error('[test:postgres] running as root but there is no `postgres` user to run the cluster as.');
    process.exit(1);
  }
  fs.chownSync(workDir, Number(ids.stdout), Number(gids.stdout));
}
fs.chmodSync(workDir, 0o700);

let started = false;
function stopCluster(): void {
  if (started) {
    try {
      pgRun(bin!, 'pg_ctl', ['stop', '-D', dataDir, '-m', 'fast', '-w']);
    } catch (e) {
      console.error(String(e));
    }
    started = false;
  }
  fs.rmSync(workDir, { recursive: true, force: true });
}

let exitCode = 1;
try {
  const port = await freePort();
  const user = 'lullwatch_test';
  pgRun(bin, 'initdb', ['-D', dataDir, '-U', user, '--auth=trust', '--encoding=UTF8', '--locale=C', '--no-sync']);
  // Loopback only; durability is not needed for a throwaway test cluster.
  const serverOptions = `-p ${port} -k ${workDir} -c listen_addresses=127.0.0.1 -c fsync=off -c synchronous_commit=off -c full_page_writes=off -c max_connections=200`;
  pgRun(bin, 'pg_ctl', ['start', '-D', dataDir, '-l', logFile, '-w', '-t', '60', '-o', serverOptions]);
  started = true;
  for (const signal of ['SIGINT', 'SIGTERM'] as const) {
    process.on(signal, () => {
      stopCluster();
      process.exit(130);
    });
  }
  const url = `postgres://${user}@127.0.0.1:${port}/postgres`;
  console.log(`[test:postgres] PostgreSQL (${path.basename(path.dirname(bin))}) on 127.0.0.1:${port}; running ${SUITES.join(' ')}`);
  exitCode = await new Promise<number>((resolve) => {
    const child = spawn(process.execPath, [path.join(ROOT, 'node_modules/vitest/vitest.mjs'), 'run', ...SUITES], {
      cwd: ROOT,
      stdio: 'inherit',
      env: { ...process.env, TEST_DATABASE_URL: url },
    });
    child.on('exit', (code, signal) => resolve(code ?? (signal ? 1 : 0)));
  });
} catch (e) {
  console.error(`[test:postgres] ${e instanceof Error ? e.message : String(e)}`);
  if (fs.existsSync(logFile)) console.error(fs.readFileSync(logFile, 'utf8').slice(-4000));
} finally {
  stopCluster();
}
process.exit(exitCode);
