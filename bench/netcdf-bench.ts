// NetCDF import bench (issue 16): a 30-year hourly CF point file (262,968 records per variable,
// total and partitions, wind as u/v), written at bench time by the fixture script with Python's
// netCDF4 into a temporary folder (never committed), imported end to end through the API into an
// on-disk PGlite. Prints the time; the aim is under 10 s on this machine. Needs /usr/bin/python3
// with python3-netcdf4; without it the bench says so and skips.
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import request from 'supertest';
import { createApp } from '../server/app';
import { createAuth } from '../server/auth';
import { openDatabase } from '../server/db/client';
import { migrateDatabase } from '../server/db/migrate';
import { silentLogger } from '../server/deps';
import { createForecastProvider } from '../server/forecast';
import { createMailer } from '../server/mail/mailer';
import { seedDemo } from '../seed/demo';

const PYTHON = process.env.LULLWATCH_PYTHON ?? '/usr/bin/python3';
const SCRIPT = path.resolve(import.meta.dirname, '../tests/fixtures/netcdf/make_fixtures.py');

export async function runNetcdfBench(): Promise<{ importMs: number; records: number } | null> {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lullwatch-ncbench-'));
  try {
    const file = path.join(dir, 'hindcast-30y.nc');
    const w0 = performance.now();
    const made = spawnSync(PYTHON, [SCRIPT, '--big', file], { encoding: 'utf8' });
    if (made.status !== 0) {
      console.log(
        `netcdf import: skipped (${PYTHON} with netCDF4 could not write the file: ${(made.stderr || made.error?.message || '').trim().split('\n').pop()})`,
      );
      return null;
    }
    const records = Number(made.stdout.trim());
    const writeMs = performance.now() - w0;
    const bytes = fs.statSync(file).size;

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
    try {
      const demo = await seedDemo(deps, { hindcastYears: 0, forecast: false });
      const agent = request.agent(createApp(deps));
      await agent
        .post('/api/auth/sign-in/email')
        .set('Origin', origin)
        .send({ email: 'coordinator@example.com', password: 'lullwatch-demo' });
      const t0 = performance.now();
      const res = await agent
        .post(`/api/projects/${demo.projectId}/datasets`)
        .field('name', '30-year NetCDF bench hindcast')
        .field('kind', 'hindcast')
        .field('dataPointDepth', 'deep')
        .attach('file', file);
      const importMs = performance.now() - t0;
      if (res.status !== 201 || res.body.records !== records)
        throw new Error(`NetCDF import failed: ${res.status} ${res.text.slice(0, 300)}`);
      console.log(
        `netcdf import: 30-year hourly CF point file (${records} records per variable, total and two partitions, wind u/v, ${(bytes / 1e6).toFixed(1)} MB NetCDF-4) through the API into an on-disk database: ${importMs.toFixed(0)} ms (aim < 10,000 ms: ${importMs < 10_000 ? 'met' : 'NOT met'}; the file took ${(writeMs / 1000).toFixed(1)} s to write, not counted)\n` +
          `  partitions read: ${(res.body.netcdf?.partitionsRead ?? []).join(', ') || 'none'}`,
      );
      return { importMs, records };
    } finally {
      await forecast.close();
      await mailer.close();
      await database.close();
    }
  } finally {
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  runNetcdfBench().catch((error: unknown) => {
    console.error(error);
    process.exitCode = 1;
  });
}
