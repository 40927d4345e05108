// `npm run bench:load`: the production server under the load of many signed-in users opening the
// watch board and the downtime page. Starts the built app as a child process on a free loopback
// port with a temporary data folder and the demo seed, creates users through the admin API, signs
// each one in, then runs autocannon with one connection per user (each with its own session
// cookie) while reading the server's resident memory every second. Prints the figures and whether
// the aims are met; the exit code is 0 whatever the figures (it is a measurement), 1 when the run
// itself failed.
//
// Options: --years N (demo hindcast length, default 20), --duration S (measured run, default 30),
// --warmup S (unmeasured run before it, default 30: long enough for V8's first full garbage
// collection under this load, so the RSS after it is the heap's working size and not the low point
// before that collection), --connections N (= users, default 50),
// --page-every S (the paced run's pace, default 10), --profile DIR (the server writes a V8 CPU
// profile of the whole run into DIR when it stops; open it in Chromium's DevTools).
//
// Three measured runs: a closed loop (every connection sends its next request as soon as the last
// one is answered: the most the server can take), a paced run (each user opens both pages once
// every --page-every seconds, a busy office's pace, the users' visits spread over that period;
// then the same rate as autocannon's overallRate makes it, one burst a second, for comparison),
// and a heavy run: the users ask for /api/me once a second each (their seconds spread) while a
// coordinator keeps changing a limit and asking for the workability table and the campaign
// simulation again, so each is computed cold over the whole hindcast.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { spawn, type ChildProcess } from 'node:child_process';
import { monitorEventLoopDelay } from 'node:perf_hooks';
import autocannon from 'autocannon';
import { buildClientIfStale } from '../scripts/lib/client-build';
import { buildServerBundleIfStale } from '../scripts/lib/server-bundle';
import { freePort } from '../scripts/lib/free-port';
import {
  createUsers,
  call,
  expectOk,
  ms,
  pageRequests,
  percentile,
  ROLES,
  runCannon,
  runPaced,
  intOption,
  loadSettings,
  loadOptions,
  machineLine,
  signIn,
  sleep,
  type EndpointStats,
  type LoadUser,
  type PageRequest,
  type PacedResult,
} from './lib/load-common';

const ROOT = path.resolve(import.meta.dirname, '..');

const DEMO_PASSWORD = 'lullwatch-demo';
const ADMIN_EMAIL = 'admin@example.com';

/** Aims: 99th percentile under 250 ms (closed loop), under 100 ms (paced, and /api/me beside heavy work), no errors or non-2xx answers, memory steady. */
const AIM_P99_MS = 250;
const AIM_PACED_P99_MS = 100;
const AIM_HEAVY_ME_P99_MS = 100;
/**
 * "Steady" memory: the server's RSS at the end of the measured run is within this share of its RSS
 * right after the warm-up run (caches filled, code compiled). A leak per request grows RSS with
 * the number of requests; a working set that is only touched once does not.
 */
const STEADY_SHARE = 0.1;

const { values: args } = parseArgs({
  options: {
    ...loadOptions('30', '30'),
    profile: { type: 'string' },
  },
});

const DURATION_S = intOption('duration', args.duration, 1, 3600);
/** Paced run: each user opens the board and the downtime page once every PAGE_EVERY_S seconds. */
const { years: YEARS, warmupS: WARMUP_S, connections: CONNECTIONS, pageEveryS: PAGE_EVERY_S } = loadSettings(args);

// ---------------------------------------------------------------------------------------------
// The server as a child process

interface Server {
  child: ChildProcess;
  pid: number;
  baseUrl: string;
  output: () => string;
}

let server: Server | null = null;
let dataDir: string | null = null;
let cannon: autocannon.Instance | null = null;
/** The shared runner's hooks: keep the running instance in `cannon` so a stop signal ends it. */
const keepCannon = { onStart: (i: autocannon.Instance) => (cannon = i) };

async function startServer(): Promise<Server> {
  const port = await freePort();
  dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'lullwatch-load-'));
  const baseUrl = `http://127.0.0.1:${port}`;
  // Only what this run sets: no database server, forecast service, SMTP or secret from the caller.
  const env: NodeJS.ProcessEnv = { ...process.env };
  for (const key of ['DATABASE_URL', 'FORECAST_URL', 'FORECAST_API_KEY', 'SMTP_URL', 'BETTER_AUTH_SECRET', 'PLAN_CRON']) delete env[key];
  Object.assign(env, {
    NODE_ENV: 'production',
    PORT: String(port),
    HOST: '127.0.0.1',
    BASE_URL: baseUrl,
    DATA_DIR: dataDir,
    JOBS_ENABLED: 'false',
    SEED_DEMO: 'true',
    DEMO_HINDCAST_YEARS: String(YEARS),
    // The bench stands in for a reverse proxy on loopback: each user signs in from its own
    // address (X-Forwarded-For), so the per-address sign-in limit stays as in production.
    TRUST_PROXY: 'loopback',
  });
  // The bundled server on Node, as `npm start` runs it (the pid is the server's).
  const profile = args.profile ? ['--cpu-prof', '--cpu-prof-dir', path.resolve(args.profile)] : [];
  const bundle = await buildServerBundleIfStale(ROOT);
  const child = spawn(process.execPath, [...profile, bundle.entry], {
    cwd: ROOT,
    env,
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  if (child.pid === undefined) throw new Error('the server did not start');
  let out = '';
  child.stdout!.on('data', (d) => (out += d));
  child.stderr!.on('data', (d) => (out += d));
  const started: Server = { child, pid: child.pid, baseUrl, output: () => out };
  server = started;

  const t0 = Date.now();
  const deadline = t0 + 15 * 60_000;
  for (;;) {
    if (child.exitCode !== null || child.signalCode !== null) throw new Error(`the server exited during start:\n${out}`);
    if (Date.now() > deadline) throw new Error(`the server did not answer within 15 minutes:\n${out}`);
    try {
      // Ready when the demo's sea data have loaded too (they load after the server listens).
      const res = await fetch(`${baseUrl}/api/health`);
      if (res.ok && ((await res.json()) as { demo?: string }).demo !== 'loading') break;
    } catch {
      /* not listening yet */
    }
    await sleep(500);
  }
  console.log(`Server pid ${started.pid} at ${baseUrl}, ready after ${((Date.now() - t0) / 1000).toFixed(1)} s (migrations and demo seed)`);
  return started;
}

let cleaning: Promise<void> | null = null;

/** Stops the server by its pid (SIGTERM, SIGKILL after 10 s) and removes the temporary folder. */
function cleanup(): Promise<void> {
  cleaning ??= (async () => {
    cannon?.stop();
    const s = server;
    if (s && s.child.exitCode === null && s.child.signalCode === null) {
      const exited = new Promise((resolve) => s.child.once('exit', resolve));
      process.kill(s.pid, 'SIGTERM');
      await Promise.race([exited, sleep(10_000)]);
      if (s.child.exitCode === null && s.child.signalCode === null) process.kill(s.pid, 'SIGKILL');
    }
    if (dataDir) fs.rmSync(dataDir, { recursive: true, force: true });
  })();
  return cleaning;
}

for (const signal of ['SIGINT', 'SIGTERM'] as const) {
  process.on(signal, () => {
    console.error(`\n${signal}: stopping the server and removing the temporary data`);
    void cleanup().finally(() => process.exit(130));
  });
}

// ---------------------------------------------------------------------------------------------
// Memory

/** The server's resident set size in MiB from /proc (Linux), or null elsewhere. */
function rssMiB(pid: number): number | null {
  try {
    const status = fs.readFileSync(`/proc/${pid}/status`, 'utf8');
    const m = /^VmRSS:\s+(\d+)\s+kB/m.exec(status);
    return m ? Number(m[1]) / 1024 : null;
  } catch {
    return null;
  }
}

const mib = (x: number | null) => (x === null ? 'n/a' : `${x.toFixed(0)} MiB`);

// ---------------------------------------------------------------------------------------------

async function main(): Promise<void> {
  console.log(machineLine('load'));
  console.log(`Demo hindcast ${YEARS} years; ${CONNECTIONS} users and connections; warm-up ${WARMUP_S} s; measured ${DURATION_S} s\n`);

  buildClientIfStale(ROOT);
  const s = await startServer();

  const adminCookie = await signIn(s.baseUrl, ADMIN_EMAIL, DEMO_PASSWORD, '198.51.100.254');
  const projects = await expectOk<{ id: string; name: string }[]>(s.baseUrl, 'GET', '/api/projects', { cookie: adminCookie });
  const demo = projects.find((p) => /Varrow Reach/.test(p.name)) ?? projects[0];
  if (!demo) throw new Error('no demo project');
  const t0 = Date.now();
  const users = await createUsers(s.baseUrl, demo.id, adminCookie, CONNECTIONS);
  const byRole = ROLES.filter((r, i) => ROLES.indexOf(r) === i).map((r) => `${users.filter((u) => u.role === r).length} ${r}s`);
  console.log(
    `Created ${users.length} users in "${demo.name}" (${byRole.join(', ')}) and signed each in, ${((Date.now() - t0) / 1000).toFixed(1)} s`,
  );

  const requests = await pageRequests(s.baseUrl, demo.id, users[0].cookie);
  console.log(`Each connection loops over ${requests.length} requests:`);
  for (const r of requests) console.log(`  ${r.method} ${r.path}`);

  // One pass a request at a time first: the first workability, ledger expectation and campaign
  // simulation on a hindcast compute and cache their answers, which the load then reads.
  console.log('\nFirst pass, one request at a time (cold caches):');
  const width = Math.max(...requests.map((r) => r.name.length));
  for (const r of requests) {
    const t = performance.now();
    const { res } = await call<unknown>(s.baseUrl, r.method, r.path, { cookie: users[0].cookie });
    console.log(`  ${r.name.padEnd(width)}  ${res.status}  ${ms(performance.now() - t)}`);
    if (!res.ok) throw new Error(`${r.method} ${r.path} answered ${res.status}`);
  }

  const rssBeforeWarmup = rssMiB(s.pid);
  if (WARMUP_S > 0) {
    console.log(`\nWarm-up: ${WARMUP_S} s, ${users.length} connections (not measured)...`);
    await runCannon(s.baseUrl, users, requests, WARMUP_S, null, undefined, keepCannon);
    // The server finishes the requests the stopped connections left behind before the measured
    // run starts: its answers queue behind them.
    for (let i = 0; i < 3; i++) await call(s.baseUrl, 'GET', '/api/health');
  }

  const rssAfterWarmup = rssMiB(s.pid);
  const samples: number[] = [];
  const sampler = setInterval(() => {
    const v = rssMiB(s.pid);
    if (v !== null) samples.push(v);
  }, 1000);
  const stats = new Map<string, EndpointStats>();
  console.log(`Measured run: ${DURATION_S} s...`);
  const loadAtStart = os.loadavg()[0];
  let result: autocannon.Result;
  try {
    result = await runCannon(s.baseUrl, users, requests, DURATION_S, stats, undefined, keepCannon);
  } finally {
    clearInterval(sampler);
  }
  const rssEnd = rssMiB(s.pid);
  if (rssEnd !== null) samples.push(rssEnd);
  const loadAtEnd = os.loadavg()[0];

  const peak = samples.length ? Math.max(...samples) : null;
  const p99 = result.latency.p99;
  const failures = result.errors + result.non2xx;
  const p99Met = p99 < AIM_P99_MS;
  const errorsMet = failures === 0;
  const steady = rssAfterWarmup !== null && rssEnd !== null ? rssEnd <= rssAfterWarmup * (1 + STEADY_SHARE) : null;

  console.log('\nResults (measured run)');
  console.log(
    `  requests/s      mean ${result.requests.average.toFixed(1)} (total ${result.requests.total} in ${result.duration.toFixed(1)} s)`,
  );
  console.log(
    `  latency         p50 ${ms(result.latency.p50)}, p97.5 ${ms(result.latency.p97_5)}, p99 ${ms(p99)}, max ${ms(result.latency.max)}, mean ${result.latency.average.toFixed(1)} ms`,
  );
  console.log(`  errors          ${result.errors} (timeouts ${result.timeouts}), non-2xx ${result.non2xx}`);
  console.log(
    `  server RSS      before warm-up ${mib(rssBeforeWarmup)}, after warm-up ${mib(rssAfterWarmup)}, peak ${mib(peak)}, end ${mib(rssEnd)}`,
  );
  // The highest RSS of each tenth of the run: a leak shows as a rise from tenth to tenth, the
  // garbage collector's saw as ups and downs.
  const tenths = Array.from({ length: 10 }, (_, k) =>
    samples.slice(Math.floor((k * samples.length) / 10), Math.floor(((k + 1) * samples.length) / 10)),
  )
    .filter((part) => part.length > 0)
    .map((part) => Math.max(...part).toFixed(0));
  console.log(`  RSS per tenth   highest of each tenth of the run, MiB: ${tenths.join(', ')}`);
  console.log(`  load average    ${loadAtStart.toFixed(1)} at start, ${loadAtEnd.toFixed(1)} at end (1 minute)`);

  console.log('\nPer request (latency as autocannon measured it, one connection per user)');
  for (const r of requests) {
    const st = stats.get(r.name);
    const sorted = (st?.latencies ?? []).sort((a, b) => a - b);
    const mean = sorted.length ? sorted.reduce((a, b) => a + b, 0) / sorted.length : NaN;
    console.log(
      `  ${r.name.padEnd(width)}  n ${String(sorted.length).padStart(6)}  mean ${ms(mean).padStart(7)}  p50 ${ms(percentile(sorted, 50)).padStart(7)}  p99 ${ms(percentile(sorted, 99)).padStart(7)}  max ${ms(sorted[sorted.length - 1] ?? NaN).padStart(7)}  non-2xx ${st?.non2xx ?? 0}`,
    );
  }

  // The paced run: requests per second per connection so that each user sends both pages' requests once per PAGE_EVERY_S.
  const rate = requests.length / PAGE_EVERY_S;
  console.log(
    `\nPaced run: ${DURATION_S} s, each user opens both pages every ${PAGE_EVERY_S} s (${rate.toFixed(2)} requests/s per user, ${(rate * users.length).toFixed(0)}/s in all)...`,
  );
  // The bench's own event-loop delay meanwhile: a late timer here adds to every latency it measures.
  const benchDelay = monitorEventLoopDelay({ resolution: 10 });
  benchDelay.enable();
  const paced = await runPaced(s.baseUrl, users, requests, DURATION_S, PAGE_EVERY_S);
  benchDelay.disable();
  const pacedP99 = percentile(paced.latencies, 99);
  console.log(
    `  requests/s      mean ${(paced.latencies.length / paced.seconds).toFixed(1)} (total ${paced.latencies.length} in ${paced.seconds.toFixed(1)} s); users' visits spread over the ${PAGE_EVERY_S} s`,
  );
  console.log(
    `  latency         p50 ${ms(percentile(paced.latencies, 50))}, p97.5 ${ms(percentile(paced.latencies, 97.5))}, p99 ${ms(pacedP99)}, max ${ms(paced.latencies[paced.latencies.length - 1] ?? NaN)}`,
  );
  console.log(`  errors          ${paced.errors}, non-2xx ${paced.non2xx}`);
  console.log(
    `  bench's own event-loop delay p99 ${ms(benchDelay.percentile(99) / 1e6)}, max ${ms(benchDelay.max / 1e6)} (its lateness is in the figures above)`,
  );
  for (const r of requests) {
    const list = paced.byName.get(r.name) ?? [];
    console.log(
      `  ${r.name.padEnd(width)}  n ${String(list.length).padStart(6)}  p50 ${ms(percentile(list, 50)).padStart(7)}  p99 ${ms(percentile(list, 99)).padStart(7)}  max ${ms(list[list.length - 1] ?? NaN).padStart(7)}`,
    );
  }
  // The same rate as autocannon's overallRate gives it (every connection's request due at the
  // same instant each second): kept beside it, as earlier rounds measured it that way.
  const bursts = await runCannon(s.baseUrl, users, requests, DURATION_S, null, Math.max(1, Math.round(rate * users.length)), keepCannon);
  console.log(
    `  (autocannon's overallRate, ${bursts.requests.average.toFixed(1)} requests/s released in one burst each second: p50 ${ms(bursts.latency.p50)}, p99 ${ms(bursts.latency.p99)}, errors ${bursts.errors}, non-2xx ${bursts.non2xx})`,
  );

  const heavy = await heavyRun(s.baseUrl, demo.id, adminCookie, users, requests);

  const pacedFailures = paced.errors + paced.non2xx + bursts.errors + bursts.non2xx;
  const mark = (ok: boolean | null) => (ok === null ? 'not measured' : ok ? 'met' : 'NOT met');
  console.log('\nAims');
  console.log(`  closed loop p99 under ${AIM_P99_MS} ms: ${mark(p99Met)} (${ms(p99)})`);
  console.log(
    `  paced p99 under ${AIM_PACED_P99_MS} ms: ${mark(pacedP99 < AIM_PACED_P99_MS)} (${ms(pacedP99)}; in autocannon's bursts ${ms(bursts.latency.p99)})`,
  );
  console.log(
    `  /api/me p99 under ${AIM_HEAVY_ME_P99_MS} ms beside cold heavy work: ${mark(heavy.meP99 < AIM_HEAVY_ME_P99_MS && heavy.computations > 0)} (${ms(heavy.meP99)}, ${heavy.computations} cold computations)`,
  );
  console.log(
    `  no errors, timeouts or non-2xx (closed loop, paced, heavy): ${mark(errorsMet && pacedFailures === 0 && heavy.failures === 0)} (${failures}, ${pacedFailures}, ${heavy.failures})`,
  );
  console.log(`  memory steady (end RSS within ${STEADY_SHARE * 100}% of the RSS after warm-up): ${mark(steady)}`);
}

/**
 * The heavy run: every user asks for /api/me once a second while a coordinator (the admin) keeps
 * changing one operation's Hs limit by 1 cm back and forth and asking for the workability table
 * and the campaign simulation after each change: each change gives another limits version, so both
 * are computed cold over the whole hindcast (the older version's cached answer is dropped when the
 * new one is stored). Returns the p99 of /api/me and how many cold computations ran meanwhile.
 */
async function heavyRun(
  baseUrl: string,
  projectId: string,
  adminCookie: string,
  users: LoadUser[],
  requests: PageRequest[],
): Promise<{ meP99: number; computations: number; failures: number }> {
  const p = `/api/projects/${projectId}`;
  const ops = await expectOk<{ id: string; name: string; limits: Record<string, unknown> }[]>(baseUrl, 'GET', `${p}/operations`, {
    cookie: adminCookie,
  });
  const op = ops.find((o) => typeof o.limits.hsMax === 'number');
  if (!op) throw new Error('the demo project has no operation with an Hs limit');
  const hsMax = op.limits.hsMax as number;
  const heavyRequests = requests.filter((r) => r.name === 'workability' || r.name === 'simulate');
  console.log(
    `\nHeavy run: ${DURATION_S} s, each user asks for /api/me once a second (${users.length}/s in all) while the Hs limit of "${op.name}" moves by 1 cm ` +
      `back and forth and ${heavyRequests.map((r) => r.name).join(' and ')} are asked for after each change (computed cold)...`,
  );
  let stop = false;
  let computations = 0;
  let failures = 0;
  const times: number[] = [];
  const worker = (async () => {
    for (let k = 1; !stop; k++) {
      const limits = { ...op.limits, hsMax: k % 2 ? hsMax - 0.01 : hsMax };
      const { res } = await call(baseUrl, 'PATCH', `${p}/operations/${op.id}`, { cookie: adminCookie, body: { limits } });
      if (!res.ok) failures++;
      for (const r of heavyRequests) {
        const t = performance.now();
        const answer = await call(baseUrl, r.method, r.path, { cookie: adminCookie });
        if (!answer.res.ok) failures++;
        else {
          computations++;
          times.push(performance.now() - t);
        }
      }
    }
    // Put the limit back as it was.
    await call(baseUrl, 'PATCH', `${p}/operations/${op.id}`, { cookie: adminCookie, body: { limits: op.limits } });
  })();
  const me: PageRequest[] = [{ name: 'me', method: 'GET', path: '/api/me' }];
  let result: PacedResult;
  try {
    result = await runPaced(baseUrl, users, me, DURATION_S, 1);
  } finally {
    stop = true;
    await worker;
  }
  times.sort((a, b) => a - b);
  const meP99 = percentile(result.latencies, 99);
  console.log(
    `  /api/me         requests ${result.latencies.length}, the users' seconds spread; latency p50 ${ms(percentile(result.latencies, 50))}, p99 ${ms(meP99)}, max ${ms(result.latencies[result.latencies.length - 1] ?? NaN)}`,
  );
  console.log(
    `  cold answers    ${computations} (workability and simulation), each p50 ${ms(percentile(times, 50))}, max ${ms(times[times.length - 1] ?? NaN)}`,
  );
  console.log(`  errors          ${result.errors}, non-2xx ${result.non2xx}; heavy requests failed ${failures}`);
  return { meP99, computations, failures: failures + result.errors + result.non2xx };
}

let failed = false;
try {
  await main();
} catch (err) {
  failed = true;
  console.error(`\nThe load run failed: ${err instanceof Error ? err.message : String(err)}`);
} finally {
  await cleanup();
}
process.exit(failed ? 1 : 0);
