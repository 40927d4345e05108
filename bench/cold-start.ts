// Cold start of the demo: the server as `npm start` runs it (production, embedded database, the
// bundled server on plain Node) on an empty temporary data folder, timed from the spawn to the
// first answer of /api/health (migrations, the demo's accounts, projects and operations, then
// listening: the demo accounts sign in from then on), and on to the answer without
// `demo: 'loading'` (the demo's hindcast, outlooks and forecasts, loaded after listening). Prints
// the time at which each line of the server's log arrived, so the phases show. The client build is not part of it (npm start
// builds only when dist/ is stale; the bench builds first when needed), and neither are the migrated
// empty database template and the server bundle that `npm run build` makes (made here first when
// missing or stale).
//
// Run alone: `npx tsx bench/cold-start.ts [--years N]`; `npm run bench` runs it too.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { spawn } from 'node:child_process';
import { pathToFileURL } from 'node:url';
import { freePort } from '../scripts/lib/free-port';
import { ensureDatabaseTemplate } from '../server/db/template';
import { buildServerBundleIfStale } from '../scripts/lib/server-bundle';

const ROOT = path.resolve(import.meta.dirname, '..');
/** Aim: the demo answers within 15 s of the first start on an empty folder. */
export const AIM_COLD_START_S = 15;

export interface ColdStartResult {
  /** To the first answer of /api/health: the demo accounts sign in from then on. */
  seconds: number;
  /** CPU time of the server process (all its threads) up to the first answer, s; null where /proc is missing. */
  cpuSeconds: number | null;
  /** To the answer without `demo: 'loading'`: the demo's sea data (loaded after listening) are in too. */
  loadedSeconds: number;
  loadedCpuSeconds: number | null;
  /** Seconds at which each log line arrived. */
  lines: { at: number; text: string }[];
}

/** Starts the server on an empty folder, waits for /api/health and then for the demo's sea data, stops it (by pid) and removes the folder. */
export async function measureColdStart(years?: number): Promise<ColdStartResult> {
  // Made at build time (`npm run build`), as the client is; not part of the start.
  await ensureDatabaseTemplate((m) => console.log(m));
  const bundle = await buildServerBundleIfStale(ROOT);
  const port = await freePort();
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'lullwatch-cold-'));
  const env: NodeJS.ProcessEnv = { ...process.env };
  for (const key of [
    'DATABASE_URL',
    'FORECAST_URL',
    'FORECAST_API_KEY',
    'SMTP_URL',
    'BETTER_AUTH_SECRET',
    'PLAN_CRON',
    'DEMO_HINDCAST_YEARS',
  ])
    delete env[key];
  Object.assign(env, {
    NODE_ENV: 'production',
    PORT: String(port),
    HOST: '127.0.0.1',
    DATA_DIR: dataDir,
    JOBS_ENABLED: 'false',
    SEED_DEMO: 'true',
  });
  if (years !== undefined) env.DEMO_HINDCAST_YEARS = String(years);
  const t0 = performance.now();
  const child = spawn(process.execPath, [bundle.entry], { cwd: ROOT, env, stdio: ['ignore', 'pipe', 'pipe'] });
  const lines: { at: number; text: string }[] = [];
  const onData = (d: Buffer) => {
    for (const text of String(d).split('\n')) if (text.trim()) lines.push({ at: (performance.now() - t0) / 1000, text: text.trim() });
  };
  child.stdout.on('data', onData);
  child.stderr.on('data', onData);
  const cpu = () => (child.pid === undefined ? null : processCpuSeconds(child.pid));
  try {
    let ready: { seconds: number; cpuSeconds: number | null } | null = null;
    for (;;) {
      if (child.exitCode !== null || child.signalCode !== null)
        throw new Error(`the server exited during start:\n${lines.map((l) => l.text).join('\n')}`);
      if (performance.now() - t0 > 10 * 60_000) throw new Error('the server did not answer within 10 minutes');
      try {
        const res = await fetch(`http://127.0.0.1:${port}/api/health`);
        if (res.ok) {
          const loading = ((await res.json()) as { demo?: string }).demo === 'loading';
          const at = { seconds: (performance.now() - t0) / 1000, cpuSeconds: cpu() };
          ready ??= at;
          if (!loading) return { ...ready, loadedSeconds: at.seconds, loadedCpuSeconds: at.cpuSeconds, lines };
        }
      } catch {
        /* not listening yet */
      }
      await new Promise((r) => setTimeout(r, 100));
    }
  } finally {
    if (child.exitCode === null && child.signalCode === null && child.pid !== undefined) {
      const exited = new Promise((r) => child.once('exit', r));
      process.kill(child.pid, 'SIGTERM');
      await Promise.race([exited, new Promise((r) => setTimeout(r, 10_000))]);
      if (child.exitCode === null && child.signalCode === null) process.kill(child.pid, 'SIGKILL');
    }
    fs.rmSync(dataDir, { recursive: true, force: true });
  }
}

/** User + system CPU time of a process from /proc (Linux; clock ticks of 100 per second), s. */
function processCpuSeconds(pid: number): number | null {
  try {
    const stat = fs.readFileSync(`/proc/${pid}/stat`, 'utf8');
    const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
    return (Number(fields[11]) + Number(fields[12])) / 100;
  } catch {
    return null;
  }
}

/** Prints the figure, the log's timeline and whether the aim is met. */
export function describeColdStart(r: ColdStartResult): string {
  const timeline = r.lines.map((l) => `  ${l.at.toFixed(1).padStart(6)} s  ${l.text.slice(0, 140)}`).join('\n');
  const verdict = r.seconds < AIM_COLD_START_S ? 'met' : 'NOT met';
  const cpu = r.cpuSeconds === null ? '' : ` (server CPU time ${r.cpuSeconds.toFixed(1)} s: on a busy machine the wall time is longer)`;
  const loadedCpu = r.loadedCpuSeconds === null ? '' : ` (CPU ${r.loadedCpuSeconds.toFixed(1)} s)`;
  return (
    `cold start of the demo (empty data folder to the first answer, the demo accounts signing in): ${r.seconds.toFixed(1)} s${cpu}; aim under ${AIM_COLD_START_S} s: ${verdict}\n` +
    `  the demo's sea data (hindcast, outlooks, forecasts, loaded after listening) in after ${r.loadedSeconds.toFixed(1)} s${loadedCpu}\n${timeline}`
  );
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  const i = process.argv.indexOf('--years');
  const years = i > 0 ? Number(process.argv[i + 1]) : undefined;
  measureColdStart(years)
    .then((r) => console.log(describeColdStart(r)))
    .catch((err: unknown) => {
      console.error(err);
      process.exitCode = 1;
    });
}
