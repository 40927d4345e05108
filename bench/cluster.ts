// `npm run bench:cluster`: two production instances on one PostgreSQL server, behind a small
// round-robin proxy on loopback, under the load of `npm run bench:load`, with one instance killed
// (SIGKILL) in the middle of each measured run and started again 10 s later.
//
// It starts a throwaway PostgreSQL cluster (scripts/lib/pg-cluster.ts), a mail receiver that keeps
// every Message-ID (server/mail/fake-smtp.ts), two instances with the same secret, the same
// BASE_URL (the proxy's) and scheduled jobs on, the planning job every --tick seconds (PLAN_CRON),
// and the proxy (bench/lib/round-robin-proxy.ts). Through the proxy it creates --connections users
// and signs each in, and three more projects on the forecast service (four are planned per tick).
// Then two measured runs of --duration seconds, a closed loop and a paced one (as bench:load); in
// each, --kill-at seconds in, one instance is killed, and --down seconds later started again on the
// same port. Meanwhile e-mails are written to the outbox (the app's own enqueueMail) for the
// instances to deliver.
//
// Prints and checks: throughput and p50/p99 per phase (both up, one down, both up again); that
// every failed request was in flight on the killed instance at the kill; that the planning job
// ran once per project per cron tick across the two instances (plan runs counted in the
// database); that each outbox e-mail was sent once, except at most one per kill (the receiver counts
// Message-IDs); that a session made on one instance works on the other, and that a sign-out on one
// ends it on the other within the documented 5 s. Each check prints met or NOT met with its figure.
// Exit code 0 whatever the figures (a measurement), 1 when the run itself failed.
//
// Options: --years N (demo hindcast, default 20), --duration S (each measured run, default 90),
// --warmup S (default 5), --connections N (= users, default 50), --page-every S (paced run, default
// 10), --kill-at S (default 20), --down S (default 10), --tick S (planning cron, default 30).
import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { parseArgs } from 'node:util';
import pg from 'pg';
import type autocannon from 'autocannon';
import { buildClientIfStale } from '../scripts/lib/client-build';
import { freePort } from '../scripts/lib/free-port';
import { startThrowawayCluster, type ThrowawayCluster } from '../scripts/lib/pg-cluster';
import { startServer, type ChildServer } from '../tests/support/child-server';
import { withDatabase } from '../tests/support/postgres';
import { startFakeSmtp, type FakeSmtp } from '../server/mail/fake-smtp';
import { openDatabase, type Database } from '../server/db/client';
import { enqueueMail } from '../server/services/outbox';
import { SESSION_CACHE_MS } from '../server/http/session-cache';
import {
  call,
  createUsers,
  expectOk,
  intOption,
  loadSettings,
  loadAverages,
  loadOptions,
  machineLine,
  ms,
  pageRequests,
  percentile,
  runCannon,
  signIn,
  sleep,
  type LoadUser,
  type PageRequest,
} from './lib/load-common';
import { RoundRobinProxy } from './lib/round-robin-proxy';

const ROOT = path.resolve(import.meta.dirname, '..');
const DEMO_PASSWORD = 'lullwatch-demo';
/** The aim of bench:load, per phase here: 99th percentile under 250 ms. */
const AIM_P99_MS = 250;
/** After the restart, throughput back to at least this share of the throughput before the kill. */
const RECOVERY_SHARE = 0.8;

const { values: args } = parseArgs({
  options: {
    ...loadOptions('90'),
    'kill-at': { type: 'string', default: '20' },
    down: { type: 'string', default: '10' },
    tick: { type: 'string', default: '30' },
  },
});

const DURATION_S = intOption('duration', args.duration, 10, 3600);
const { years: YEARS, warmupS: WARMUP_S, connections: CONNECTIONS, pageEveryS: PAGE_EVERY_S } = loadSettings(args);
const KILL_AT_S = intOption('kill-at', args['kill-at'], 1, DURATION_S - 1);
const DOWN_S = intOption('down', args.down, 0, 600);
/** The planning job's period; a divisor of 60 so that `*\/TICK * * * * *` ticks evenly. */
const TICK_S = intOption('tick', args.tick, 5, 30);
if (60 % TICK_S !== 0) {
  console.error(`--tick must divide 60 (got ${TICK_S})`);
  process.exit(1);
}

// ---------------------------------------------------------------------------------------------
// What runs, and its cleanup

let cluster: ThrowawayCluster | null = null;
let smtp: FakeSmtp | null = null;
let proxy: RoundRobinProxy | null = null;
let benchDb: Database | null = null;
/** The bench's own connection for counting (plan runs, the outbox). */
let reader: pg.Client = null as unknown as pg.Client;
let cannon: autocannon.Instance | null = null;
/** The shared runner's hooks: keep the running instance in `cannon` so a stop signal ends it. */
const keepCannon = { onStart: (i: autocannon.Instance) => (cannon = i) };
const instances = new Map<string, ChildServer>();
const workDir = fs.mkdtempSync(path.join(os.tmpdir(), 'lullwatch-cluster-'));

let cleaning: Promise<void> | null = null;
function cleanup(): Promise<void> {
  cleaning ??= (async () => {
    cannon?.stop();
    await Promise.all([...instances.values()].map((s) => s.stop()));
    await proxy?.close();
    await benchDb?.close().catch(() => {});
    await reader?.end().catch(() => {});
    await smtp?.close();
    cluster?.stop();
    fs.rmSync(workDir, { recursive: true, force: true });
  })();
  return cleaning;
}

for (const signal of ['SIGINT', 'SIGTERM'] as const) {
  process.on(signal, () => {
    console.error(`\n${signal}: stopping the instances and the cluster`);
    void cleanup().finally(() => process.exit(130));
  });
}

const mark = (ok: boolean) => (ok ? 'met' : 'NOT met');
const checks: { name: string; ok: boolean; figure: string }[] = [];
function check(name: string, ok: boolean, figure: string): void {
  checks.push({ name, ok, figure });
  console.log(`  ${name}: ${mark(ok)} (${figure})`);
}

// ---------------------------------------------------------------------------------------------
// Instances

interface InstanceSpec {
  name: string;
  port: number;
  dataDir: string;
}

function instanceEnv(databaseUrl: string, secret: string, proxyUrl: string, smtpUrl: string): Record<string, string> {
  return {
    DATABASE_URL: databaseUrl,
    BETTER_AUTH_SECRET: secret,
    // Both instances are reached through the proxy: one public address, one Origin.
    BASE_URL: proxyUrl,
    TRUST_PROXY: 'loopback',
    JOBS_ENABLED: 'true',
    // Seconds field first (node-cron): every TICK_S seconds.
    PLAN_CRON: `*/${TICK_S} * * * * *`,
    SMTP_URL: smtpUrl,
    SEED_DEMO: 'true',
    DEMO_HINDCAST_YEARS: String(YEARS),
  };
}

async function startInstance(spec: InstanceSpec, env: Record<string, string>): Promise<ChildServer> {
  const s = await startServer(spec.dataDir, env, { port: spec.port, startTimeoutMs: 15 * 60_000 });
  instances.set(spec.name, s);
  return s;
}

// ---------------------------------------------------------------------------------------------
// A measured run with a kill

interface Sample {
  /** When the request was sent (ms since the epoch). */
  start: number;
  ms: number;
  status: number;
}

interface Phase {
  name: string;
  from: number;
  to: number;
}

interface RunReport {
  label: string;
  result: autocannon.Result;
  samples: Sample[];
  phases: Phase[];
  killed: string;
}

async function measuredRun(
  label: string,
  proxyUrl: string,
  users: LoadUser[],
  requests: PageRequest[],
  victim: InstanceSpec,
  env: Record<string, string>,
  overallRate?: number,
): Promise<RunReport> {
  const samples: Sample[] = [];
  const t0 = Date.now();
  let killAt = 0;
  let restartedAt = 0;
  let upAgainAt = 0;
  const chaos = (async () => {
    await sleep(KILL_AT_S * 1000);
    proxy!.markKilled(victim.name);
    killAt = Date.now();
    await instances.get(victim.name)!.kill();
    proxy!.markDead(victim.name);
    console.log(`  ${((killAt - t0) / 1000).toFixed(1)} s: SIGKILL to instance ${victim.name}`);
    await sleep(DOWN_S * 1000);
    restartedAt = Date.now();
    console.log(`  ${((restartedAt - t0) / 1000).toFixed(1)} s: starting instance ${victim.name} again on port ${victim.port}`);
    await startInstance(victim, env);
    while (!proxy!.isUp(victim.name)) await sleep(50);
    upAgainAt = Date.now();
    console.log(
      `  ${((upAgainAt - t0) / 1000).toFixed(1)} s: instance ${victim.name} is up again in the proxy (${((upAgainAt - restartedAt) / 1000).toFixed(1)} s after its start)`,
    );
  })();
  const result = await runCannon(proxyUrl, users, requests, DURATION_S, null, overallRate, {
    ...keepCannon,
    onResponse: (_name, status, latency) => samples.push({ start: Date.now() - latency, ms: latency, status }),
  });
  const end = Date.now();
  await chaos;
  if (upAgainAt > end) console.log(`  the restarted instance came back after the run ended: no "both up again" phase`);
  const phases: Phase[] = [
    { name: 'both up', from: t0, to: killAt },
    { name: 'one down', from: killAt, to: Math.min(upAgainAt, end) },
    { name: 'both up again', from: Math.min(upAgainAt, end), to: end },
  ];
  return { label, result, samples, phases, killed: victim.name };
}

function phaseFigures(r: RunReport) {
  return r.phases.map((p) => {
    const inPhase = r.samples.filter((s) => s.start >= p.from && s.start < p.to);
    const sorted = inPhase.map((s) => s.ms).sort((a, b) => a - b);
    const seconds = (p.to - p.from) / 1000;
    return {
      ...p,
      seconds,
      n: inPhase.length,
      rate: seconds > 0 ? inPhase.length / seconds : NaN,
      p50: percentile(sorted, 50),
      p99: percentile(sorted, 99),
      failed: inPhase.filter((s) => s.status < 200 || s.status > 299).length,
    };
  });
}

function printRun(r: RunReport): void {
  const { result } = r;
  console.log(`\n${r.label}: ${result.requests.total} answers in ${result.duration.toFixed(1)} s; instance ${r.killed} killed`);
  for (const f of phaseFigures(r)) {
    console.log(
      `  ${f.name.padEnd(14)} ${f.seconds.toFixed(1).padStart(5)} s  ${f.rate.toFixed(1).padStart(6)} requests/s  p50 ${ms(f.p50).padStart(7)}  p99 ${ms(f.p99).padStart(7)}  non-2xx ${f.failed}`,
    );
  }
  console.log(`  socket errors ${result.errors} (timeouts ${result.timeouts}), non-2xx ${result.non2xx}`);
}

// ---------------------------------------------------------------------------------------------

async function main(): Promise<void> {
  console.log(machineLine('cluster'));
  console.log(
    `Two instances, demo hindcast ${YEARS} years, ${CONNECTIONS} users; runs of ${DURATION_S} s (kill at ${KILL_AT_S} s, restart ${DOWN_S} s later); planning every ${TICK_S} s\n`,
  );
  buildClientIfStale(ROOT);

  cluster = await startThrowawayCluster({ user: 'lullwatch_bench' });
  const maintenance = new pg.Client({ connectionString: cluster.url });
  await maintenance.connect();
  await maintenance.query('create database lullwatch');
  await maintenance.end();
  const databaseUrl = withDatabase(cluster.url, 'lullwatch');
  console.log(`PostgreSQL ${cluster.version} on 127.0.0.1:${cluster.port}`);

  smtp = await startFakeSmtp({ keep: 1_000_000 });
  const proxyPort = await freePort();
  const proxyUrl = `http://127.0.0.1:${proxyPort}`;
  const specs: InstanceSpec[] = [];
  for (const name of ['A', 'B']) {
    const dataDir = path.join(workDir, name);
    fs.mkdirSync(dataDir);
    specs.push({ name, port: await freePort(), dataDir });
  }
  const secret = crypto.randomBytes(32).toString('hex');
  const env = instanceEnv(databaseUrl, secret, proxyUrl, `smtp://127.0.0.1:${smtp.port}`);
  const t0 = Date.now();
  // Both at once: one migrates and seeds under the start-up lock, the other waits for it.
  await Promise.all(specs.map((s) => startInstance(s, env)));
  const bothUpAt = Date.now();
  console.log(
    `Instances A (port ${specs[0].port}) and B (port ${specs[1].port}) ready after ${((bothUpAt - t0) / 1000).toFixed(1)} s (migrations and demo seed by one of them)`,
  );
  proxy = new RoundRobinProxy(specs.map((s) => ({ name: s.name, host: '127.0.0.1', port: s.port })));
  await proxy.listen(proxyPort);
  console.log(`Proxy at ${proxyUrl}`);
  const direct = (name: string) => instances.get(name)!.baseUrl;
  const originOnly = { origin: proxyUrl };

  const adminCookie = await signIn(proxyUrl, 'admin@example.com', DEMO_PASSWORD, '198.51.100.254');
  const projects = await expectOk<{ id: string; name: string }[]>(proxyUrl, 'GET', '/api/projects', { cookie: adminCookie });
  const demo = projects.find((p) => /Varrow Reach/.test(p.name)) ?? projects[0];
  if (!demo) throw new Error('no demo project');
  // Three more projects on the forecast service: the planning job plans four per tick.
  for (let i = 1; i <= 3; i++) {
    const p = await expectOk<{ id: string }>(proxyUrl, 'POST', '/api/projects', {
      cookie: adminCookie,
      body: { name: `Cluster bench project ${i}` },
    });
    await expectOk(proxyUrl, 'PUT', `/api/projects/${p.id}/settings`, {
      cookie: adminCookie,
      body: {
        name: `Cluster bench project ${i}`,
        description: '',
        dataPointName: `Point ${i}`,
        dataPointLatitude: 54 + i / 10,
        dataPointLongitude: 1 + i / 10,
        dataPointDepthM: 40,
        forecastSource: 'service',
      },
    });
  }
  const t1 = Date.now();
  const users = await createUsers(proxyUrl, demo.id, adminCookie, CONNECTIONS);
  console.log(
    `Created ${users.length} users in "${demo.name}" through the proxy and signed each in, ${((Date.now() - t1) / 1000).toFixed(1)} s`,
  );

  // Sessions across instances (before the load, both up).
  console.log('\nSessions across instances');
  const onA = await signIn(direct('A'), 'skipper@example.com', DEMO_PASSWORD, '198.51.100.201', proxyUrl);
  const onB = await signIn(direct('B'), 'client@example.com', DEMO_PASSWORD, '198.51.100.202', proxyUrl);
  const aOnB = (await call(direct('B'), 'GET', '/api/me', { cookie: onA, headers: originOnly })).res.status;
  const bOnA = (await call(direct('A'), 'GET', '/api/me', { cookie: onB, headers: originOnly })).res.status;
  check('a session made on A works on B, and one made on B on A', aOnB === 200 && bOnA === 200, `GET /api/me answered ${aOnB} and ${bOnA}`);
  // A's lookup cache holds the session when B signs it out; A must refuse it within 5 s.
  await call(direct('A'), 'GET', '/api/me', { cookie: onB, headers: originOnly });
  const out = await call(direct('B'), 'POST', '/api/auth/sign-out', { cookie: onB, headers: originOnly, body: {} });
  const outAt = Date.now();
  if (!out.res.ok) throw new Error(`sign-out on B answered ${out.res.status}`);
  const onBStatus = (await call(direct('B'), 'GET', '/api/me', { cookie: onB, headers: originOnly })).res.status;
  let endedAfter = NaN;
  while (Date.now() - outAt < 15_000) {
    const st = (await call(direct('A'), 'GET', '/api/me', { cookie: onB, headers: originOnly })).res.status;
    if (st === 401) {
      endedAfter = Date.now() - outAt;
      break;
    }
    await sleep(100);
  }
  check(
    `a sign-out on B ends the session on B at once and on A within ${SESSION_CACHE_MS / 1000} s`,
    onBStatus === 401 && endedAfter <= SESSION_CACHE_MS + 100,
    `B answered ${onBStatus} right after; A answered 401 after ${Number.isFinite(endedAfter) ? `${(endedAfter / 1000).toFixed(2)} s` : 'more than 15 s'} (polled every 100 ms)`,
  );

  const requests = await pageRequests(proxyUrl, demo.id, users[0].cookie);
  console.log(`\nEach connection loops over ${requests.length} requests; first pass on each instance (cold caches)`);
  for (const name of ['A', 'B']) {
    const t = performance.now();
    for (const r of requests) {
      const { res } = await call(direct(name), r.method, r.path, { cookie: users[0].cookie, headers: originOnly });
      if (!res.ok) throw new Error(`${r.method} ${r.path} on ${name} answered ${res.status}`);
    }
    console.log(`  instance ${name}: ${ms(performance.now() - t)}`);
  }
  if (WARMUP_S > 0) {
    console.log(`Warm-up through the proxy: ${WARMUP_S} s (not measured)`);
    await runCannon(proxyUrl, users, requests, WARMUP_S, null, undefined, keepCannon);
    for (let i = 0; i < 3; i++) await call(proxyUrl, 'GET', '/api/health');
  }

  // E-mails written to the outbox while the load runs (the app's own enqueueMail, as the planning
  // job and the digests write them), for the two instances to deliver.
  benchDb = await openDatabase({ databaseUrl });
  reader = new pg.Client({ connectionString: databaseUrl });
  await reader.connect();
  let mailN = 0;
  let feeding = true;
  const feeder = (async () => {
    while (feeding) {
      const batch = Array.from({ length: 3 }, () => {
        const i = ++mailN;
        return {
          idempotencyKey: `cluster-bench:${i}`,
          projectId: null,
          userId: null,
          toEmail: `reader-${i}@example.com`,
          subject: `Bench message ${i}`,
          text: `Message ${i}`,
          html: `<p>Message ${i}</p>`,
        };
      });
      await enqueueMail(benchDb!.db, batch, new Date());
      await sleep(2000);
    }
  })();

  const loadStart = Date.now();
  console.log(`\nClosed loop: ${DURATION_S} s through the proxy`);
  const closed = await measuredRun('Closed loop', proxyUrl, users, requests, specs[1], env);
  const rate = requests.length / PAGE_EVERY_S;
  console.log(
    `\nPaced: ${DURATION_S} s, each user opens both pages every ${PAGE_EVERY_S} s (${(rate * users.length).toFixed(0)} requests/s in all)`,
  );
  const paced = await measuredRun('Paced', proxyUrl, users, requests, specs[0], env, Math.max(1, Math.round(rate * users.length)));
  const loadEnd = Date.now();
  feeding = false;
  await feeder;

  printRun(closed);
  printRun(paced);
  const stats = proxy.stats;
  console.log(
    `\nProxy: answered by A ${stats.answeredBy.A}, by B ${stats.answeredBy.B}; retried ${stats.retried} (${stats.retriedOk} then answered); failed ${stats.failures.length}; sent with no instance passing its health checks ${stats.failOpen}`,
  );
  for (const k of stats.kills)
    console.log(
      `  kill of ${k.backend}: ${k.inFlight} requests in flight on it, ${k.sentWhileDying} more sent to it before its process had exited`,
    );
  const byReason = new Map<string, number>();
  for (const f of stats.failures)
    byReason.set(
      `${f.method} on ${f.backend}: ${f.reason}${f.inFlightAtKill ? ' (in flight at the kill)' : ''}`,
      (byReason.get(`${f.method} on ${f.backend}: ${f.reason}${f.inFlightAtKill ? ' (in flight at the kill)' : ''}`) ?? 0) + 1,
    );
  for (const [k, v] of byReason) console.log(`  ${v} × ${k}`);

  // Mail: wait for the outbox to empty (a message claimed by the killed instance is due again a
  // minute later), then one more tick.
  console.log('\nWaiting for the outbox to empty (a message claimed by a killed instance is retried a minute later)...');
  const drainDeadline = Date.now() + 4 * 60_000;
  let pending = Infinity;
  while (Date.now() < drainDeadline) {
    pending = (await reader.query<{ n: number }>(`select count(*)::int as n from outbox where status <> 'sent'`)).rows[0].n;
    if (pending === 0) break;
    await sleep(2000);
  }
  await sleep(TICK_S * 1000);
  const checkEnd = Date.now();

  console.log('\nChecks');
  const figs = [closed, paced].map((r) => ({ r, f: phaseFigures(r) }));
  for (const { r, f } of figs) {
    for (const p of f)
      check(
        `${r.label}, ${p.name}: p99 under ${AIM_P99_MS} ms`,
        p.p99 < AIM_P99_MS,
        `${p.rate.toFixed(1)} requests/s, p50 ${ms(p.p50)}, p99 ${ms(p.p99)}`,
      );
    const before = f[0].rate;
    const down = f[1].rate;
    const again = f[2].rate;
    check(`${r.label}: answers go on with one instance down`, down > 0, `${down.toFixed(1)} requests/s`);
    check(
      `${r.label}: throughput after the restart at least ${RECOVERY_SHARE * 100}% of before the kill`,
      again >= before * RECOVERY_SHARE,
      `${again.toFixed(1)} against ${before.toFixed(1)} requests/s`,
    );
  }

  // Errors: every failure the users saw is a request that was in flight on the killed instance.
  const clientFailures = closed.result.non2xx + closed.result.errors + paced.result.non2xx + paced.result.errors;
  const inFlight = stats.failures.filter((f) => f.inFlightAtKill).length;
  const other = stats.failures.filter((f) => !f.inFlightAtKill).length;
  const inFlightAtKills = stats.kills.reduce((a, k) => a + k.inFlight + k.sentWhileDying, 0);
  check(
    'only requests in flight on the killed instance failed (the proxy retried the GETs)',
    other === 0 && clientFailures <= inFlight,
    `users saw ${clientFailures} failed answers (non-2xx or socket errors); the proxy failed ${inFlight} requests that were in flight on a killed instance (of ${inFlightAtKills}) and ${other} others; ${stats.retriedOk} retried and answered`,
  );

  // Planning: runs per project per tick, counted in the database.
  const runs = (
    await reader.query<{ project_id: string; started_ms: string; finished_ms: string | null; status: string }>(
      `select project_id, (extract(epoch from started_at) * 1000)::bigint::text as started_ms,
              (extract(epoch from finished_at) * 1000)::bigint::text as finished_ms, status
         from plan_run where trigger = 'schedule'`,
    )
  ).rows;
  /** A scheduled run of some project was still going at this time (node-cron skips an overlapping tick). */
  const busyAt = (t: number) => runs.some((r) => Number(r.started_ms) < t && (r.finished_ms === null ? false : Number(r.finished_ms) > t));
  const planned = (await reader.query<{ n: number }>(`select count(*)::int as n from project where forecast_source = 'service'`)).rows[0].n;
  const periodMs = TICK_S * 1000;
  const firstTick = Math.ceil((bothUpAt + 2000) / periodMs);
  const lastTick = Math.floor((checkEnd - periodMs) / periodMs);
  const perCell = new Map<string, { done: number; unfinished: number }>();
  let latest = 0;
  for (const r of runs) {
    const start = Number(r.started_ms);
    const tick = Math.floor(start / periodMs);
    if (tick < firstTick || tick > lastTick) continue;
    latest = Math.max(latest, start - tick * periodMs);
    const key = `${r.project_id}|${tick}`;
    const cell = perCell.get(key) ?? { done: 0, unfinished: 0 };
    if (r.status === 'running') cell.unfinished++;
    else cell.done++;
    perCell.set(key, cell);
  }
  const projectIds = [...new Set(runs.map((r) => r.project_id))];
  let once = 0;
  let twice = 0;
  let missing = 0;
  let missingBusy = 0;
  let cutByKill = 0;
  for (let tick = firstTick; tick <= lastTick; tick++) {
    for (const id of projectIds) {
      const c = perCell.get(`${id}|${tick}`) ?? { done: 0, unfinished: 0 };
      if (c.unfinished > 0 && c.done <= 1) cutByKill++;
      else if (c.done === 1) once++;
      else if (c.done === 0) {
        missing++;
        if (busyAt(tick * periodMs)) missingBusy++;
      } else twice++;
    }
  }
  check(
    'the planning job ran exactly once per project per cron tick across the two instances',
    twice === 0 && missing === 0 && projectIds.length === planned,
    `${projectIds.length} of ${planned} projects on the forecast service × ${lastTick - firstTick + 1} ticks: ${once} once, ${twice} more than once, ${missing} never (${missingBusy} of them at a tick when the previous tick's job was still running), ${cutByKill} cut short by a kill; latest start ${(latest / 1000).toFixed(1)} s after its tick`,
  );

  // Mail: every outbox message sent; each Message-ID caught once, except one per kill.
  const outboxRows = (await reader.query<{ id: string; status: string }>(`select id, status from outbox`)).rows;
  const caught = new Map<string, number>();
  for (const m of smtp.messages) {
    const id = /outbox\.([0-9a-f-]{36})@/.exec(m.messageId)?.[1];
    if (id) caught.set(id, (caught.get(id) ?? 0) + 1);
  }
  const unsent = outboxRows.filter((r) => !caught.has(r.id));
  const dup = [...caught.values()].filter((n) => n > 1).length;
  check(
    `each outbox e-mail was sent once, except at most one in flight at each of the ${stats.kills.length} kills`,
    unsent.length === 0 && dup <= stats.kills.length,
    `${outboxRows.length} in the outbox (${mailN} written by the bench), ${caught.size} distinct Message-IDs caught, ${dup} caught twice or more, ${unsent.length} never caught; ${pending === 0 ? 'outbox empty' : `${pending} not sent`}`,
  );

  console.log(`\nLoad ${((loadEnd - loadStart) / 1000).toFixed(0)} s; load average ${loadAverages()} at the end`);
  const notMet = checks.filter((c) => !c.ok);
  console.log(
    notMet.length === 0
      ? 'Every check met.'
      : `${notMet.length} of ${checks.length} checks NOT met: ${notMet.map((c) => c.name).join('; ')}`,
  );
}

let failed = false;
try {
  await main();
} catch (err) {
  failed = true;
  console.error(`\nThe cluster run failed: ${err instanceof Error ? (err.stack ?? err.message) : String(err)}`);
  for (const [name, s] of instances) console.error(`\n--- instance ${name} output (last lines) ---\n${s.output().slice(-3000)}`);
} finally {
  await cleanup();
}
process.exit(failed ? 1 : 0);
