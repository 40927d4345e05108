// Import bench (issue 4): a generated 30-year hourly CSV imported end to end through the API
// (multipart upload, streaming parse, derivation, one transaction into an on-disk PGlite), then
// read back into typed arrays. Prints both times.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { eq } from 'drizzle-orm';
import { readSeries } from '../server/services/series-store';
import { openBenchApp, timedImport } from './lib/bench-app';
import { operation, worksite } from '../server/db/schema';
import { startEnginePool } from '../server/services/engine-pool';
import { projectWorkability, settleStatsCache } from '../server/services/workability';

const RECORDS = 262_968; // 1996-01-01 to 2025-12-31 hourly

function writeCsv(file: string): number {
  const out = fs.openSync(file, 'w');
  const t0 = Date.UTC(1996, 0, 1);
  let buf = 'time,hs,tp,tz,dir,wind_speed,wind_dir\n';
  for (let i = 0; i < RECORDS; i++) {
    const hs = 1.2 + 0.8 * Math.sin(i / 700) + ((i * 7919) % 100) / 200;
    buf += `${new Date(t0 + i * 3_600_000).toISOString()},${hs.toFixed(2)},${(8 + hs).toFixed(1)},${(5.5 + hs * 0.6).toFixed(1)},${(200 + (i % 90)).toFixed(0)},${(4 + hs * 3).toFixed(1)},${(210 + (i % 80)).toFixed(0)}\n`;
    if (buf.length > 1 << 20) {
      fs.writeSync(out, buf);
      buf = '';
    }
  }
  fs.writeSync(out, buf);
  fs.closeSync(out);
  return fs.statSync(file).size;
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor((xs.length - 1) / 2)];

export async function runImportBench() {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lullwatch-bench-'));
  const csv = path.join(dir, 'hindcast-30y.csv');
  const bytes = writeCsv(csv);
  const app = await openBenchApp(dir);
  const { database } = app;
  const { res, importMs } = await timedImport(app, '30-year bench hindcast', csv);
  if (res.status !== 201 || res.body.records !== RECORDS) throw new Error(`import failed: ${res.status} ${res.text.slice(0, 300)}`);

  const reads: number[] = [];
  for (let i = 0; i < 5; i++) {
    const r0 = performance.now();
    const s = await readSeries(database.db, res.body.id);
    reads.push(performance.now() - r0);
    if (s.timeMs.length !== RECORDS) throw new Error('read-back length mismatch');
  }
  // Issue 6: all monthly statistics for 30 years hourly, five worksites, ten operations, cold,
  // server side (read, transform per worksite, engine, cache write), through the service.
  await database.db.insert(worksite).values({
    projectId: app.projectId,
    name: 'Bench berth',
    depthM: 12,
    shoreNormalDeg: 240,
    breakerIndex: 0.6,
    timeZone: 'Europe/London',
  });
  const extra = [1.0, 1.25, 1.75, 2.25, 2.5].map((hs, i) => ({
    projectId: app.projectId,
    name: `Bench operation ${i + 1}`,
    tpopH: 6 + 6 * i,
    tcH: 4,
    weatherRestricted: true,
    limits: { hsMax: hs, windMax: 15, ...(i % 2 ? { tpExcluded: [[13, 15]] } : { bedVelocityMax: 0.5, bedVelocityMethod: 'soulsby' }) },
    siteIds: [],
  }));
  await database.db.insert(operation).values(extra);
  await database.db.update(operation).set({ siteIds: [] });
  // The engine thread is started first and timed apart: under tsx it compiles every engine module
  // as it loads (seconds), once per process; the built server starts a bundled thread instead.
  const w0 = performance.now();
  await startEnginePool();
  const poolStartMs = performance.now() - w0;
  const s0 = performance.now();
  const stats = await projectWorkability(database.db, app.projectId, { datasetId: res.body.id, alpha: true });
  const statsColdMs = performance.now() - s0;
  await settleStatsCache(); // the cache row is written after the answer; a later view finds it
  const s1 = performance.now();
  await projectWorkability(database.db, app.projectId, { datasetId: res.body.id, alpha: true });
  const statsRepeatMs = performance.now() - s1;
  // A coordinator moves one limit: every pair is worked again (the series, tide and calendar kept).
  await database.db
    .update(operation)
    .set({ limits: { hsMax: 1.3, windMax: 15, bedVelocityMax: 0.5, bedVelocityMethod: 'soulsby' } })
    .where(eq(operation.name, 'Bench operation 1'));
  await settleStatsCache();
  const s2 = performance.now();
  await projectWorkability(database.db, app.projectId, { datasetId: res.body.id, alpha: true });
  const statsAfterChangeMs = performance.now() - s2;

  await app.close();
  fs.rmSync(dir, { recursive: true, force: true });
  const result = {
    importMs,
    readBackMedianMs: median(reads),
    bytes,
    statsColdMs,
    statsRepeatMs,
    statsAfterChangeMs,
    poolStartMs,
    pairs: stats.entries.length,
  };
  console.log(
    `import: 30-year hourly CSV (${RECORDS} records, ${(bytes / 1e6).toFixed(1)} MB) through the API into an on-disk database: ${importMs.toFixed(0)} ms\n` +
      `  read back into typed arrays: median ${result.readBackMedianMs.toFixed(0)} ms of 5 (${reads.map((x) => x.toFixed(0)).join(', ')} ms)\n` +
      `workability: all monthly statistics, ${result.pairs} operation x worksite pairs (5 worksites, 10 operations) over the 30 years, server side: cold ${statsColdMs.toFixed(0)} ms, repeat (cached) ${statsRepeatMs.toFixed(0)} ms, after one operation's limit changed ${statsAfterChangeMs.toFixed(0)} ms\n` +
      `  (on the engine thread, started beforehand: ${process.env.ENGINE_THREADS === '0' ? 'none, ENGINE_THREADS=0' : `${poolStartMs.toFixed(0)} ms under tsx`}, not in the cold figure)`,
  );
  return result;
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  runImportBench().catch((error: unknown) => {
    console.error(error);
    process.exitCode = 1;
  });
}
