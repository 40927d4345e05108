// The composition root: the one place that wires the server, the scheduled jobs (jobs/) and the demo
// seed (seed/) together. The linter lets no other server file import jobs/ or seed/.
import crypto from 'node:crypto';
import { closeEnginePool } from './services/engine-pool';
import http from 'node:http';
import fs from 'node:fs';
import path from 'node:path';
import { and, count, eq, inArray } from 'drizzle-orm';
import { loadEnv, resolveAuthSecret, type Env } from './env';
import { claimDataDir, publishPort, releaseDataDir } from './data-dir-claim';
import { openDatabase, type Database } from './db/client';
import { migrateDatabase } from './db/migrate';
import { copyTemplateIfEmpty } from './db/template';
import { account, user } from './db/schema';
import { DEMO_PASSWORD, DEMO_USERS } from '../seed/scenario';
import { createAuth } from './auth';
import { createApp } from './app';
import { consoleLogger, type AppDeps, type Logger } from './deps';
import { seedDemo, seedDemoAccounts, seedDemoData, type DemoBase } from '../seed/demo';
import { createForecastProvider } from './forecast';
import { createMailer } from './mail/mailer';
import { startPlanningSchedule } from '../jobs/schedule';

export interface Running {
  url: string;
  /** The address listened on. */
  host: string;
  port: number;
  database: Database;
  close(): Promise<void>;
}

const CLIENT_DIR = path.resolve(import.meta.dirname, '../dist');

/** Opens the database, migrates it, seeds the demo scenario when empty, and serves the app. */
export async function startLullwatch(env: Env = loadEnv(), log: Logger = consoleLogger): Promise<Running> {
  const jobToken = crypto.randomBytes(24).toString('base64url');
  // The embedded database: claim the data folder before opening it, so no second server, backup,
  // restore or plan:once opens it meanwhile (server/data-dir-claim.ts).
  const embedded = !env.DATABASE_URL;
  if (embedded) claimDataDir(env.DATA_DIR, jobToken);
  try {
    return await startOnClaimedFolder(env, log, jobToken);
  } catch (err) {
    if (embedded) releaseDataDir(env.DATA_DIR);
    throw err;
  }
}

async function startOnClaimedFolder(env: Env, log: Logger, jobToken: string): Promise<Running> {
  const dbDir = path.join(env.DATA_DIR, 'db');
  // The demo's sea data load after the server listens; this file marks a load not finished. A first
  // start stopped before its end leaves a demo without its hindcast: start the demo afresh.
  const demoMarker = path.join(env.DATA_DIR, 'demo-loading');
  if (!env.DATABASE_URL && fs.existsSync(demoMarker)) {
    log.warn('The demo was stopped while its sea data loaded: starting the demo afresh');
    fs.rmSync(dbDir, { recursive: true, force: true });
    fs.rmSync(demoMarker, { force: true });
  }
  // An empty data folder starts from the migrated empty database made at build time (server/db/template.ts).
  if (!env.DATABASE_URL && copyTemplateIfEmpty(dbDir))
    log.info('Empty data folder: the embedded database starts from the migrated template');
  const database = await openDatabase({ databaseUrl: env.DATABASE_URL, dataDir: dbDir });

  const forecast = await createForecastProvider({ forecastUrl: env.FORECAST_URL, forecastApiKey: env.FORECAST_API_KEY });
  if (forecast.fake) log.info(`No FORECAST_URL: local fake forecast service at ${forecast.fake.url}`);

  const mailer = await createMailer({ smtpUrl: env.SMTP_URL, from: env.MAIL_FROM });
  if (mailer.fake) log.info(`No SMTP_URL: local mailbox on port ${mailer.fake.port} (see the Mailbox page)`);

  const port = env.PORT;
  const provisionalBase = env.BASE_URL ?? `http://localhost:${port || 3000}`;
  // Cookies are Secure only when users reach the app over https; say so when production runs without it.
  if (
    env.NODE_ENV === 'production' &&
    !provisionalBase.startsWith('https://') &&
    !/^http:\/\/(localhost|127\.0\.0\.1)[:/]/.test(`${provisionalBase}/`)
  ) {
    log.warn(
      `BASE_URL ${provisionalBase} is not https: session cookies are sent without the Secure flag. Serve the app over https (a TLS proxy) and set BASE_URL to the https address.`,
    );
  }
  const secret = resolveAuthSecret(env);
  const makeDeps = (baseURL: string): AppDeps => ({
    db: database.db,
    database,
    auth: createAuth(database.db, {
      secret,
      baseURL,
      trustedOrigins: trustedOrigins(baseURL),
      secureCookies: baseURL.startsWith('https://'),
    }),
    clock: () => new Date(),
    log,
    forecast: forecast.provider,
    mailer,
    // The same list for the auth library's Origin check and for our own API (server/http/same-origin.ts).
    config: {
      baseUrl: baseURL,
      trustedOrigins: trustedOrigins(baseURL),
      linkSecret: secret,
      earliestMoveAlertHours: env.ALERT_EARLIEST_MOVE_HOURS,
      mailMaxAttempts: 6,
      jobToken,
      mapStyleUrl: env.MAP_STYLE_URL,
      mapAttribution: env.MAP_ATTRIBUTION,
    },
  });

  const startup = { demoLoading: false };
  const deps: AppDeps = { ...makeDeps(provisionalBase), startup };
  // Several instances may start at once on one PostgreSQL server: one migrates (and seeds an empty
  // database) while the others wait for it, so no migration or seed runs twice.
  let seeded = false;
  // The embedded demo: the accounts, projects and operations now, the sea data once listening.
  let demoBase: DemoBase | null = null;
  await whileHoldingStartLock(database, log, async () => {
    await migrateDatabase(database);
    const [{ n }] = await database.db.select({ n: count() }).from(user);
    if (n === 0 && env.SEED_DEMO) {
      log.info('Empty database: seeding the invented demo scenario');
      if (database.kind === 'pglite') {
        fs.writeFileSync(demoMarker, 'the demo sea data are loading\n');
        demoBase = await seedDemoAccounts(deps);
      } else await seedDemo(deps, { hindcastYears: env.DEMO_HINDCAST_YEARS, ledger: true });
      seeded = true;
    }
  });

  // The demo accounts' password is printed in the README: while any of them still signs in with
  // it, the server stays on this machine (127.0.0.1) unless told otherwise, and refuses to be told.
  // Just seeded: every demo account has the published password (no need for four slow hash checks).
  const demoAccounts = seeded ? DEMO_USERS.map((u) => u.email).sort() : await demoAccountsWithPublishedPassword(deps);
  const host = env.HOST ?? (demoAccounts.length > 0 ? '127.0.0.1' : '0.0.0.0');
  if (demoAccounts.length > 0 && !isLoopback(host)) {
    await forecast.close();
    await mailer.close();
    await database.close();
    throw new Error(
      `Refusing to listen on ${host}: the demo accounts ${demoAccounts.join(', ')} still have the password published in the README. ` +
        'To serve other machines, start on an empty data folder with SEED_DEMO=false (or change or deactivate those accounts), then set HOST.',
    );
  }
  if (demoAccounts.length > 0) {
    log.info(
      `The demo accounts (${demoAccounts.join(', ')}) use the published password, so the server listens on ${host} only. ` +
        'To serve other machines, start on an empty data folder with SEED_DEMO=false (or change or deactivate the demo accounts) and set HOST=0.0.0.0.',
    );
  }

  const app = createApp(deps, {
    clientDir: CLIENT_DIR,
    trustProxy: parseTrustProxy(env.TRUST_PROXY),
    exposeStack: env.NODE_ENV === 'development',
    answerCacheMs: env.ANSWER_CACHE_MS,
  });
  const schedule = startPlanningSchedule(deps, { planCron: env.PLAN_CRON, enabled: env.JOBS_ENABLED });
  const server = http.createServer(app);
  // Keep idle connections longer than the usual 60 s idle timeout of proxies and load balancers, so
  // the server is never the side that closes a socket a client is about to reuse (that race ends a
  // request with a connection reset); Node's default is 5 s (common practice, no source).
  server.keepAliveTimeout = 65_000;
  server.headersTimeout = 66_000;
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, host, () => resolve());
  });
  const actualPort = (server.address() as { port: number }).port;
  const url = env.BASE_URL ?? `http://localhost:${actualPort}`;
  // Tell `npm run plan:once` and `db:backup` how to reach this process (it holds the embedded database).
  if (database.kind === 'pglite') publishPort(env.DATA_DIR, actualPort, jobToken);
  log.info(
    `Lullwatch is running at ${url} (${database.kind === 'pglite' ? `embedded database in ${path.resolve(env.DATA_DIR)}` : 'PostgreSQL server'})`,
  );
  // The demo's hindcast, outlooks and forecasts load while the server answers (GET /api/health says
  // demo: "loading" meanwhile); a failure is logged and the next start begins the demo afresh.
  let demoData: Promise<void> = Promise.resolve();
  const base = demoBase as DemoBase | null;
  if (base) {
    startup.demoLoading = true;
    log.info('Loading the demo sea data (hindcast, campaign outlooks, forecasts) while the server answers');
    demoData = seedDemoData(deps, base, { hindcastYears: env.DEMO_HINDCAST_YEARS, ledger: true })
      .then(
        () => {
          fs.rmSync(demoMarker, { force: true });
          log.info('Demo sea data loaded');
        },
        (err: unknown) => log.error('The demo sea data did not load', { err: err instanceof Error ? err.message : String(err) }),
      )
      .finally(() => {
        startup.demoLoading = false;
      });
  }

  return {
    url,
    host,
    port: actualPort,
    database,
    async close() {
      if (startup.demoLoading) log.info('Waiting for the demo sea data to finish loading');
      await demoData;
      schedule.stop();
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
      await schedule.idle();
      await forecast.close();
      await mailer.close();
      await closeEnginePool();
      await database.close();
      if (database.kind === 'pglite') releaseDataDir(env.DATA_DIR);
    },
  };
}

/** Advisory-lock key of start-up work (migrations and the demo seed). */
const START_LOCK_KEY = 1;
/** How long an instance waits for another one's migrations and seed before giving up. */
const START_LOCK_WAIT_MS = 10 * 60_000;

async function whileHoldingStartLock(database: Database, log: Logger, fn: () => Promise<void>): Promise<void> {
  const deadline = Date.now() + START_LOCK_WAIT_MS;
  let told = false;
  for (;;) {
    const result = await database.withAdvisoryLock(START_LOCK_KEY, fn);
    if (result.acquired) return;
    if (Date.now() > deadline) throw new Error('Another instance held the start-up lock (migrations, seed) for over 10 minutes');
    if (!told) log.info('Another instance is migrating or seeding the database: waiting for it');
    told = true;
    await new Promise((r) => setTimeout(r, 1000));
  }
}

/** True for addresses only this machine reaches. */
export function isLoopback(host: string): boolean {
  const h = host.replace(/^\[|\]$/g, '').toLowerCase();
  return h === 'localhost' || h === '::1' || /^127\.\d{1,3}\.\d{1,3}\.\d{1,3}$/.test(h) || /^::ffff:127\./.test(h);
}

/** E-mails of active demo accounts that still sign in with the published demo password. */
export async function demoAccountsWithPublishedPassword(deps: Pick<AppDeps, 'db' | 'auth'>): Promise<string[]> {
  const rows = await deps.db
    .select({ email: user.email, banned: user.banned, hash: account.password })
    .from(user)
    .innerJoin(account, and(eq(account.userId, user.id), eq(account.providerId, 'credential')))
    .where(
      inArray(
        user.email,
        DEMO_USERS.map((u) => u.email),
      ),
    );
  const ctx = await deps.auth.$context;
  // The checks at once: each is a deliberately slow hash, run on the thread pool (part of every start).
  const checks = await Promise.all(
    rows.map(async (r) =>
      r.banned || !r.hash ? null : (await ctx.password.verify({ hash: r.hash, password: DEMO_PASSWORD })) ? r.email : null,
    ),
  );
  return checks.filter((e): e is string => e !== null).sort();
}

function trustedOrigins(baseURL: string): string[] {
  const base = new URL(baseURL);
  const origins = new Set([base.origin]);
  // On this machine the same app is reached as localhost or 127.0.0.1; a public address trusts only itself.
  if (base.hostname === 'localhost' || base.hostname === '127.0.0.1') {
    const port = base.port ? `:${base.port}` : '';
    origins.add(`${base.protocol}//localhost${port}`);
    origins.add(`${base.protocol}//127.0.0.1${port}`);
  }
  // The Vite dev server proxies the API in development.
  if (process.env.NODE_ENV !== 'production') origins.add('http://localhost:5173');
  return [...origins];
}

function parseTrustProxy(value: string | undefined): string | number | boolean | undefined {
  if (value === undefined || value === '') return undefined;
  if (value === 'true') return true;
  if (value === 'false') return false;
  const n = Number(value);
  return Number.isInteger(n) ? n : value;
}
