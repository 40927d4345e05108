// `npm run test:postgres`: runs the API and planning-job test suites a second time against a real
// PostgreSQL server through node-postgres, and the PostgreSQL-only tests (tests/postgres: a
// pg_dump taken under load and restored). It starts a throwaway cluster (scripts/lib/pg-cluster.ts:
// initdb in a temporary directory, loopback only, a free port, trust authentication for the one
// local test user), points TEST_DATABASE_URL (and PG_BIN, for pg_dump) at it, runs Vitest, then
// stops the cluster and removes the directory.
//
// Needs PostgreSQL's server programs (Debian: `apt-get install postgresql`). PG_BIN may name their
// folder; otherwise the newest /usr/lib/postgresql/<version>/bin or `pg_config --bindir` is used.
// PostgreSQL refuses to run as root, so as root the cluster runs as the `postgres` user.
import path from 'node:path';
import { spawn } from 'node:child_process';
import { startThrowawayCluster, type ThrowawayCluster } from './lib/pg-cluster';

const ROOT = path.resolve(import.meta.dirname, '..');
/** The suites that touch the database through the API and the jobs, and the PostgreSQL-only ones. */
const SUITES = process.argv.slice(2).length > 0 ? process.argv.slice(2) : ['tests/api', 'tests/postgres'];

let cluster: ThrowawayCluster | null = null;
let exitCode = 1;
try {
  cluster = await startThrowawayCluster();
  for (const signal of ['SIGINT', 'SIGTERM'] as const) {
    process.on(signal, () => {
      cluster?.stop();
      process.exit(130);
    });
  }
  console.log(`[test:postgres] PostgreSQL (${cluster.version}) on 127.0.0.1:${cluster.port}; running ${SUITES.join(' ')}`);
  const url = cluster.url;
  const bin = cluster.bin;
  exitCode = await new Promise<number>((resolve) => {
    const child = spawn(process.execPath, [path.join(ROOT, 'node_modules/vitest/vitest.mjs'), 'run', ...SUITES], {
      cwd: ROOT,
      stdio: 'inherit',
      env: { ...process.env, TEST_DATABASE_URL: url, PG_BIN: bin },
    });
    child.on('exit', (code, signal) => resolve(code ?? (signal ? 1 : 0)));
  });
} catch (e) {
  console.error(`[test:postgres] ${e instanceof Error ? e.message : String(e)}`);
  if (cluster) console.error(cluster.logTail());
} finally {
  cluster?.stop();
}
process.exit(exitCode);
