import http from 'node:http';
import path from 'node:path';
import { count } from 'drizzle-orm';
import { loadEnv, resolveAuthSecret, type Env } from './env';
import { openDatabase, type Database } from './db/client';
import { migrateDatabase } from './db/migrate';
import { user } from './db/schema';
import { createAuth } from './auth';
import { createApp } from './app';
import { consoleLogger, type AppDeps, type Logger } from './deps';
import { seedDemo } from '../seed/demo';

export interface Running {
  url: string;
  port: number;
  database: Database;
  close(): Promise<void>;
}

const CLIENT_DIR = path.resolve(import.meta.dirname, '../dist');

/** Opens the database, migrates it, seeds the demo scenario when empty, and serves the app. */
export async function startLullwatch(env: Env = loadEnv(), log: Logger = consoleLogger): Promise<Running> {
  const database = await openDatabase({ databaseUrl: env.DATABASE_URL, dataDir: path.join(env.DATA_DIR, 'db') });
  await migrateDatabase(database);

  const port = env.PORT;
  const provisionalBase = env.BASE_URL ?? `http://localhost:${port || 3000}`;
  const makeDeps = (baseURL: string): AppDeps => ({
    db: database.db,
    auth: createAuth(database.db, {
      secret: resolveAuthSecret(env),
      baseURL,
      trustedOrigins: trustedOrigins(baseURL),
      secureCookies: baseURL.startsWith('https://'),
    }),
    clock: () => new Date(),
    log,
  });

  const deps = makeDeps(provisionalBase);
  const [{ n }] = await database.db.select({ n: count() }).from(user);
  if (n === 0 && env.SEED_DEMO) {
    log.info('Empty database: seeding the invented demo scenario');
    await seedDemo(deps);
  }

  const app = createApp(deps, {
    clientDir: CLIENT_DIR,
    trustProxy: parseTrustProxy(env.TRUST_PROXY),
    exposeStack: env.NODE_ENV === 'development',
  });
  const server = http.createServer(app);
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, env.HOST, () => resolve());
  });
  const actualPort = (server.address() as { port: number }).port;
  const url = env.BASE_URL ?? `http://localhost:${actualPort}`;
  log.info(`Lullwatch is running at ${url} (${database.kind === 'pglite' ? `embedded database in ${path.resolve(env.DATA_DIR)}` : 'PostgreSQL server'})`);

  return {
    url,
    port: actualPort,
    database,
    async close() {
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
      await database.close();
    },
  };
}

function trustedOrigins(baseURL: string): string[] {
  const origins = new Set([new URL(baseURL).origin]);
  const { port } = new URL(baseURL);
  // The same app reached as localhost or 127.0.0.1, and the Vite dev server in development.
  origins.add(`http://localhost:${port}`);
  origins.add(`http://127.0.0.1:${port}`);
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
