// The real server (and the commands beside it) as child processes of a test: started with
// `node --import tsx` so the pid is the server's own (a SIGKILL reaches it, unlike the tsx command,
// which runs it in a grandchild), in the production mode, on a data folder the caller gives.
import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import { freePort } from '../../scripts/lib/free-port';

export { freePort };

export const ROOT = path.resolve(import.meta.dirname, '../..');

/**
 * The environment of a child: this process's plus `extra`, without a database URL or the
 * BASE_URL that Vite puts in the test process's environment (unless `extra` gives them).
 */
function childEnv(extra: Record<string, string>): NodeJS.ProcessEnv {
  const env: NodeJS.ProcessEnv = { ...process.env, NODE_ENV: 'production', ...extra };
  for (const key of ['DATABASE_URL', 'BASE_URL', 'PORT', 'SMTP_URL', 'FORECAST_URL']) if (!(key in extra)) delete env[key];
  return env;
}

export interface ChildServer {
  baseUrl: string;
  port: number;
  pid: number;
  child: ChildProcess;
  output(): string;
  /** Resolves when the process has exited (and was reaped). */
  exited: Promise<void>;
  /** SIGKILL now; resolves once the process is gone. */
  kill(): Promise<void>;
  /** SIGTERM (graceful close), SIGKILL after 15 s. */
  stop(): Promise<void>;
}

/**
 * Starts `node --import tsx server/index.ts` (the server is this very process, so a SIGKILL
 * reaches it, unlike the tsx command that runs it in a grandchild) and waits for /api/health
 * to answer without `demo: 'loading'`
 * (180 s unless `startTimeoutMs` says otherwise) on a free port or the one given.
 */
export async function startServer(
  dataDir: string,
  env: Record<string, string> = {},
  options: { port?: number; startTimeoutMs?: number } = {},
): Promise<ChildServer> {
  // A given port: a restarted instance behind a proxy comes back at the same address.
  const port = options.port ?? (await freePort());
  const baseUrl = `http://127.0.0.1:${port}`;
  let out = '';
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    cwd: ROOT,
    env: childEnv({
      PORT: String(port),
      HOST: '127.0.0.1',
      DATA_DIR: dataDir,
      BASE_URL: baseUrl,
      JOBS_ENABLED: 'false',
      DEMO_HINDCAST_YEARS: '1',
      ...env,
    }),
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  child.stdout!.on('data', (d) => (out += d));
  child.stderr!.on('data', (d) => (out += d));
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  const deadline = Date.now() + (options.startTimeoutMs ?? 180_000);
  for (;;) {
    if (child.exitCode !== null || child.signalCode !== null) throw new Error(`server exited early:\n${out}`);
    if (Date.now() > deadline) {
      child.kill('SIGKILL');
      throw new Error(`server did not start:\n${out}`);
    }
    // Up, and the demo's sea data loaded (a first start loads them after it listens).
    const ok = await fetch(`${baseUrl}/api/health`).then(
      async (r) => r.ok && ((await r.json()) as { demo?: string }).demo !== 'loading',
      () => false,
    );
    if (ok) break;
    await new Promise((r) => setTimeout(r, 200));
  }
  const gone = () => child.exitCode !== null || child.signalCode !== null;
  return {
    baseUrl,
    port,
    pid: child.pid!,
    child,
    output: () => out,
    exited,
    async kill() {
      if (!gone()) child.kill('SIGKILL');
      await exited;
    },
    async stop() {
      if (!gone()) {
        child.kill('SIGTERM');
        const timer = setTimeout(() => child.kill('SIGKILL'), 15_000);
        await exited;
        clearTimeout(timer);
      }
    },
  };
}

export interface ScriptRun {
  code: number | null;
  stdout: string;
  stderr: string;
}

/** Runs a TypeScript command (`scripts/...`) the way `npm run` does, from the repository root. */
export function runScript(script: string, args: string[], env: Record<string, string>): Promise<ScriptRun> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ['--import', 'tsx', script, ...args], {
      cwd: ROOT,
      env: childEnv(env),
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let stdout = '';
    let stderr = '';
    child.stdout.on('data', (d) => (stdout += d));
    child.stderr.on('data', (d) => (stderr += d));
    child.once('error', reject);
    child.once('exit', (code) => resolve({ code, stdout, stderr }));
  });
}

/** Signs in through the real auth route; returns the Cookie header for later requests. */
export async function signIn(baseUrl: string, email: string, password = 'lullwatch-demo'): Promise<string> {
  const res = await fetch(`${baseUrl}/api/auth/sign-in/email`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', origin: baseUrl },
    body: JSON.stringify({ email, password }),
  });
  if (!res.ok) throw new Error(`sign-in as ${email}: ${res.status} ${await res.text()}`);
  return res.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
}
