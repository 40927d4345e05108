// `npm run plan:once`: runs the planning job once. The embedded database may be opened by one
// process only: when a server holds it, this asks that server to run the job; it never opens the
// same data folder twice. With DATABASE_URL (a PostgreSQL server) it runs here, and the job's
// advisory lock keeps it from planning a project another instance is planning.
import path from 'node:path';
import { loadEnv, resolveAuthSecret } from '../server/env';
import { claimDataDir, liveClaim, releaseDataDir } from '../server/data-dir-claim';
import { openDatabase } from '../server/db/client';
import { migrateDatabase } from '../server/db/migrate';
import { createAuth } from '../server/auth';
import { createForecastProvider } from '../server/forecast';
import { createMailer } from '../server/mail/mailer';
import { consoleLogger } from '../server/deps';
import { runPlanningJob } from '../server/services/planning';

const env = loadEnv();
const projectId = process.argv.find((a) => a.startsWith('--project='))?.slice('--project='.length);

async function viaServer(): Promise<boolean> {
  if (env.DATABASE_URL) return false;
  const info = liveClaim(env.DATA_DIR); // null when none runs, or the file was left by a killed server
  if (!info) return false;
  if (info.port === null) {
    console.error(
      `A Lullwatch server (pid ${info.pid}) is starting on ${env.DATA_DIR} (migrations or the demo seed): run this again once it is up.`,
    );
    process.exit(2);
  }
  const res = await fetch(`http://127.0.0.1:${info.port}/api/internal/jobs/plan`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', 'x-lullwatch-job-token': info.jobToken },
    body: JSON.stringify(projectId ? { projectId } : {}),
  }).catch((err: Error) => {
    console.error(
      `A Lullwatch server (pid ${info.pid}) holds ${env.DATA_DIR} but did not answer: ${err.message}. Refusing to open the database a second time.`,
    );
    process.exit(2);
  });
  if (!res.ok) {
    console.error(`The running server refused the job (${res.status}): ${await res.text()}`);
    process.exit(2);
  }
  console.log(`Asked the running server (pid ${info.pid}) to plan:`);
  console.log(JSON.stringify(await res.json(), null, 2));
  return true;
}

if (!(await viaServer())) {
  // On the embedded database, hold the data folder while it is open (server/data-dir-claim.ts).
  if (!env.DATABASE_URL) {
    try {
      claimDataDir(env.DATA_DIR, 'plan-once');
    } catch (err) {
      console.error((err as Error).message);
      process.exit(2);
    }
    process.on('exit', () => releaseDataDir(env.DATA_DIR));
  }
  const database = await openDatabase({ databaseUrl: env.DATABASE_URL, dataDir: path.join(env.DATA_DIR, 'db') });
  await migrateDatabase(database);
  const forecast = await createForecastProvider({ forecastUrl: env.FORECAST_URL, forecastApiKey: env.FORECAST_API_KEY });
  const mailer = await createMailer({ smtpUrl: env.SMTP_URL, from: env.MAIL_FROM });
  const secret = resolveAuthSecret(env);
  const baseUrl = env.BASE_URL ?? `http://localhost:${env.PORT}`;
  try {
    const result = await runPlanningJob(
      {
        db: database.db,
        database,
        auth: createAuth(database.db, {
          secret,
          baseURL: baseUrl,
          trustedOrigins: [baseUrl],
          secureCookies: baseUrl.startsWith('https://'),
        }),
        clock: () => new Date(),
        log: consoleLogger,
        forecast: forecast.provider,
        mailer,
        config: {
          baseUrl,
          trustedOrigins: [new URL(baseUrl).origin],
          linkSecret: secret,
          earliestMoveAlertHours: env.ALERT_EARLIEST_MOVE_HOURS,
          mailMaxAttempts: 6,
        },
      },
      { projectId, trigger: 'cli' },
    );
    console.log(JSON.stringify(result, null, 2));
    if (mailer.fake)
      console.log(`No SMTP_URL: ${mailer.fake.messages.length} e-mail(s) went to a local mailbox that stops with this command.`);
  } finally {
    await forecast.close();
    await mailer.close();
    await database.close();
  }
}
