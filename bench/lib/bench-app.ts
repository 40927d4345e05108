// The app in-process for the import benches: an on-disk PGlite in the bench's temporary folder,
// migrated, seeded with the demo (no hindcast, no forecast), and an agent signed in as the demo
// coordinator; plus the one timed upload both benches make.
import path from 'node:path';
import request from 'supertest';
import { createApp } from '../../server/app';
import { createAuth } from '../../server/auth';
import { openDatabase, type Database } from '../../server/db/client';
import { migrateDatabase } from '../../server/db/migrate';
import { silentLogger } from '../../server/deps';
import { createForecastProvider } from '../../server/forecast';
import { createMailer } from '../../server/mail/mailer';
import { seedDemo } from '../../seed/demo';
import { DEMO_PASSWORD } from '../../seed/scenario';

export interface BenchApp {
  database: Database;
  projectId: string;
  agent: ReturnType<typeof request.agent>;
  close(): Promise<void>;
}

export async function openBenchApp(dir: string): Promise<BenchApp> {
  const database = await openDatabase({ dataDir: path.join(dir, 'db') });
  await migrateDatabase(database);
  const forecast = await createForecastProvider();
  const mailer = await createMailer({ from: 'bench@lullwatch.invalid' });
  const origin = 'http://localhost:3000';
  const deps = {
    db: database.db,
    database,
    auth: createAuth(database.db, {
      secret: 'bench-secret-bench-secret-bench-secret',
      baseURL: origin,
      trustedOrigins: [origin],
      secureCookies: false,
    }),
    clock: () => new Date(),
    log: silentLogger,
    forecast: forecast.provider,
    mailer,
    config: { baseUrl: origin, trustedOrigins: [origin], linkSecret: 'bench', earliestMoveAlertHours: 6, mailMaxAttempts: 3 },
  };
  const close = async () => {
    await forecast.close();
    await mailer.close();
    await database.close();
  };
  try {
    const demo = await seedDemo(deps, { hindcastYears: 0, forecast: false });
    const agent = request.agent(createApp(deps));
    await agent.post('/api/auth/sign-in/email').set('Origin', origin).send({ email: 'coordinator@example.com', password: DEMO_PASSWORD });
    return { database, projectId: demo.projectId, agent, close };
  } catch (err) {
    await close();
    throw err;
  }
}

/** Uploads a file as a deep-water hindcast through the API; the answer and the time it took. */
export async function timedImport(app: BenchApp, name: string, file: string): Promise<{ res: request.Response; importMs: number }> {
  const t0 = performance.now();
  const res = await app.agent
    .post(`/api/projects/${app.projectId}/datasets`)
    .field('name', name)
    .field('kind', 'hindcast')
    .field('dataPointDepth', 'deep')
    .attach('file', file);
  return { res, importMs: performance.now() - t0 };
}
