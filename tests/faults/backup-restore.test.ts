// `npm run db:backup` and `npm run db:restore` as a user runs them (child processes on a data folder
// of the test's own): a backup taken through the running server and one taken with no server,
// changes after the backup, refused restores (server running, missing, truncated, not a backup,
// an archive that does not open as a database) that leave the current data as it was, and a
// restore that brings back every dataset (records and a checksum of the stored series) and every
// operation limit as they were at backup time.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { execFileSync } from 'node:child_process';
import { eq } from 'drizzle-orm';
import type { PGlite } from '@electric-sql/pglite';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { checkIntegrity, integrityProblems, runScript, signIn, startServer, type ChildServer } from './harness';
import { openDatabase } from '../../server/db/client';
import { dataset, operation, project } from '../../server/db/schema';
import { createDataset } from '../../server/services/datasets';
import { toSeaSeries } from '../../server/services/sea-series';

const work = fs.mkdtempSync(path.join(os.tmpdir(), 'lullwatch-backup-'));
const dataDir = path.join(work, 'data');
const dbDir = path.join(dataDir, 'db');
const backups = path.join(work, 'backups');
const env = { DATA_DIR: dataDir };
let server: ChildServer | undefined;

/** What must come back: datasets with their record counts and a checksum of every stored chunk, operation limits, rows per table. */
async function databaseState(pg: PGlite) {
  const datasets = (
    await pg.query<{ id: string; name: string; records: number; chunks: number; checksum: string }>(
      `select d.id, d.name, d.record_count as records, count(c.seq)::int as chunks,
              md5(string_agg(c.time_ms || c.hs || c.tp || c.tz || c.te || c.dir || c.wind || c.wind_dir || c.given_periods, ''::bytea order by c.seq)) as checksum
         from dataset d left join dataset_chunk c on c.dataset_id = d.id
        group by d.id order by d.id`,
    )
  ).rows;
  const limits = (
    await pg.query<{ id: string; name: string; limits: string }>(`select id, name, limits::text as limits from operation order by id`)
  ).rows;
  const tables = (await pg.query<{ name: string }>(`select tablename as name from pg_tables where schemaname = 'public' order by 1`)).rows;
  const rows: Record<string, number> = {};
  for (const t of tables) rows[t.name] = (await pg.query<{ n: number }>(`select count(*)::int as n from "${t.name}"`)).rows[0].n;
  return { datasets, limits, rows };
}
type State = Awaited<ReturnType<typeof databaseState>>;

async function stateOf(options: { dataDir?: string; loadDataDir?: Blob }): Promise<State> {
  const database = await openDatabase(options);
  try {
    return await databaseState(database.pglite!);
  } finally {
    await database.close();
  }
}

/** Names, sizes and modification times of every file under a folder: any write changes it. */
function fingerprint(dir: string): string[] {
  const out: string[] = [];
  const walk = (d: string) => {
    for (const e of fs.readdirSync(d, { withFileTypes: true })) {
      const p = path.join(d, e.name);
      if (e.isDirectory()) walk(p);
      else {
        const st = fs.statSync(p);
        out.push(`${path.relative(dir, p)}:${st.size}:${st.mtimeMs}`);
      }
    }
  };
  walk(dir);
  return out.sort();
}

const hourlyCsv = (startMs: number, hours: number) => {
  const lines = ['time,hs,tp,dir'];
  for (let i = 0; i < hours; i++)
    lines.push(
      `${new Date(startMs + i * 3_600_000).toISOString()},${(1 + 0.5 * Math.sin(i / 50)).toFixed(3)},${(7 + (i % 5)).toFixed(1)},${(i * 7) % 360}`,
    );
  return lines.join('\n') + '\n';
};

let uploadedId = '';
let changedOperationId = '';
let liveBackup = '';
let offlineBackup = '';
let atBackup: State;
let afterChanges: string[];

beforeAll(async () => {
  fs.mkdirSync(backups, { recursive: true });
  server = await startServer(dataDir, { DEMO_HINDCAST_YEARS: '1' });
}, 300_000);

afterAll(async () => {
  await server?.kill();
  fs.rmSync(work, { recursive: true, force: true });
});

describe('backing up the embedded database', () => {
  it('adds a dataset and changes a limit through the API, then backs up through the running server', async () => {
    const base = server!.baseUrl;
    const cookie = await signIn(base, 'coordinator@example.com');
    const headers = { cookie, origin: base };
    const projects = (await (await fetch(`${base}/api/projects`, { headers })).json()) as { id: string; name: string }[];
    const projectId = projects.find((p) => /Varrow Reach/.test(p.name))!.id;

    const form = new FormData();
    form.set('name', 'Buoy extract kept in the backup');
    form.set('kind', 'observation');
    form.set('dataPointDepth', '30');
    form.set('file', new Blob([hourlyCsv(Date.UTC(2024, 0, 1), 24 * 400)]), 'extract.csv');
    const up = await fetch(`${base}/api/projects/${projectId}/datasets`, { method: 'POST', headers, body: form });
    expect(up.status, await up.clone().text()).toBe(201);
    uploadedId = ((await up.json()) as { id: string }).id;

    const ops = (await (await fetch(`${base}/api/projects/${projectId}/operations`, { headers })).json()) as {
      id: string;
      limits: Record<string, unknown>;
    }[];
    const op = ops.find((o) => typeof o.limits.hsMax === 'number')!;
    changedOperationId = op.id;
    const patch = await fetch(`${base}/api/projects/${projectId}/operations/${op.id}`, {
      method: 'PATCH',
      headers: { ...headers, 'content-type': 'application/json' },
      body: JSON.stringify({ limits: { ...op.limits, hsMax: 1.37 } }),
    });
    expect(patch.status, await patch.clone().text()).toBe(200);

    liveBackup = path.join(backups, 'live.tar.gz');
    const run = await runScript('scripts/db-backup.ts', [liveBackup], env);
    expect(run.code, run.stderr).toBe(0);
    expect(run.stdout).toContain('Asked the running server');
    expect(run.stdout).toMatch(
      new RegExp(`Backup written: ${liveBackup.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')} \\(\\d+(\\.\\d)? (kB|MB)\\)`),
    );
    expect(fs.readdirSync(backups)).toEqual(['live.tar.gz']); // no temporary file left
  }, 120_000);

  it('refuses to restore while the server runs, and the internal route is unknown without the token', async () => {
    const run = await runScript('scripts/db-restore.ts', [liveBackup], env);
    expect(run.code).toBe(2);
    expect(run.stderr).toMatch(/server \(pid \d+, port \d+\) is running .*Stop it first; nothing was changed/);
    const res = await fetch(`${server!.baseUrl}/api/internal/backup`, { method: 'POST', headers: { 'x-lullwatch-job-token': 'guess' } });
    expect(res.status).toBe(404);
    await server!.stop();
    server = undefined;
    atBackup = await stateOf({ dataDir: dbDir });
    expect(atBackup.datasets.find((d) => d.id === uploadedId)).toMatchObject({ records: 24 * 400, chunks: 2 });
    expect(JSON.parse(atBackup.limits.find((o) => o.id === changedOperationId)!.limits).hsMax).toBe(1.37);
  }, 120_000);

  it('backs up with no server running by opening the database itself; the copy holds the same data', async () => {
    offlineBackup = path.join(backups, 'offline.tar.gz');
    const run = await runScript('scripts/db-backup.ts', [offlineBackup], env);
    expect(run.code, run.stderr).toBe(0);
    expect(run.stdout).not.toContain('Asked the running server');
    expect(run.stdout).toContain(`Backup written: ${offlineBackup}`);
    expect(await stateOf({ loadDataDir: new Blob([fs.readFileSync(offlineBackup)]) })).toEqual(atBackup);
    // Never overwrites a backup.
    const again = await runScript('scripts/db-backup.ts', [offlineBackup], env);
    expect(again.code).toBe(1);
    expect(again.stderr).toContain('already exists');
  }, 120_000);
});

describe('restoring it', () => {
  it('refuses a missing, truncated, foreign or unopenable file and leaves the current data as it is', async () => {
    // Changes after the backup: the uploaded dataset deleted, the limit changed again, a new dataset.
    const database = await openDatabase({ dataDir: dbDir });
    try {
      await database.db.delete(dataset).where(eq(dataset.id, uploadedId));
      const [op] = await database.db.select().from(operation).where(eq(operation.id, changedOperationId));
      await database.db
        .update(operation)
        .set({ limits: { ...op.limits, hsMax: 2.5 } })
        .where(eq(operation.id, op.id));
      const [p] = await database.db.select().from(project).limit(1);
      const t = Float64Array.from({ length: 48 }, (_, i) => Date.UTC(2025, 5, 1) + i * 3_600_000);
      await createDataset(
        database.db,
        {
          projectId: p.id,
          createdBy: null,
          name: 'Added after the backup',
          kind: 'observation',
          dataPointName: '',
          dataPointLatitude: null,
          dataPointLongitude: null,
          dataPointDepthM: null,
          sourceKind: 'upload',
        },
        toSeaSeries({ timeMs: t, hs: t.map(() => 1.5), tp: t.map(() => 8) }),
        {},
      );
    } finally {
      await database.close();
    }
    afterChanges = fingerprint(dataDir);

    const bytes = fs.readFileSync(liveBackup);
    fs.writeFileSync(path.join(work, 'truncated.tar.gz'), bytes.subarray(0, Math.floor(bytes.length / 2)));
    // Not a backup: a gzip tar of an ordinary folder.
    fs.mkdirSync(path.join(work, 'notes'));
    fs.writeFileSync(path.join(work, 'notes', 'readme.txt'), 'not a database');
    execFileSync('tar', ['-czf', path.join(work, 'foreign.tar.gz'), '-C', path.join(work, 'notes'), '.'], { stdio: 'pipe' });
    // Looks like a data folder (PG_VERSION, global/pg_control) but the databases are gone: only opening it tells.
    const hollow = path.join(work, 'hollow');
    fs.mkdirSync(hollow);
    execFileSync('tar', ['-xzf', liveBackup, '-C', hollow], { stdio: 'pipe' });
    fs.rmSync(path.join(hollow, 'base'), { recursive: true });
    execFileSync('tar', ['-czf', path.join(work, 'hollow.tar.gz'), '-C', hollow, '.'], { stdio: 'pipe' });

    const cases: [string, RegExp][] = [
      ['missing.tar.gz', /No such file/],
      ['truncated.tar.gz', /not an intact gzip file/],
      ['foreign.tar.gz', /not a backup of an embedded Lullwatch database/],
      ['hollow.tar.gz', /does not open as a Lullwatch database/],
    ];
    const runs = await Promise.all(cases.map(([file]) => runScript('scripts/db-restore.ts', [path.join(work, file)], env)));
    runs.forEach((run, i) => {
      expect(run.code, `${cases[i][0]}: ${run.stdout}`).toBe(1);
      expect(run.stderr).toMatch(cases[i][1]);
      expect(run.stderr).toContain('Nothing was changed');
    });
    expect(fingerprint(dataDir)).toEqual(afterChanges);
  }, 120_000);

  it('restores the backup made through the server: every dataset and limit as at backup time, the current data kept aside', async () => {
    const run = await runScript('scripts/db-restore.ts', [liveBackup], env);
    expect(run.code, run.stderr).toBe(0);
    const kept = /kept in (\S+) /.exec(run.stdout)?.[1];
    expect(kept).toBeDefined();
    expect(path.dirname(kept!)).toBe(dataDir);
    expect(path.basename(kept!)).toMatch(/^db\.before-restore-\d{8}T\d{6}Z$/);
    expect(fs.readdirSync(dataDir).sort()).toEqual(['auth-secret', 'db', path.basename(kept!)].sort());

    const restored = await stateOf({ dataDir: dbDir });
    expect(restored).toEqual(atBackup);
    // The folder moved aside is the data as it was just before the restore.
    expect(fingerprint(kept!)).toEqual(afterChanges.filter((f) => f.startsWith(`db${path.sep}`)).map((f) => f.slice(3)));

    const report = await checkIntegrity(dbDir);
    expect(integrityProblems(report)).toEqual([]);
  }, 120_000);

  it('points to pg_dump and pg_restore when DATABASE_URL names a PostgreSQL server', async () => {
    const pgEnv = { ...env, DATABASE_URL: 'postgres://lullwatch@127.0.0.1:1/lullwatch' };
    const [backup, restore] = await Promise.all([
      runScript('scripts/db-backup.ts', [path.join(backups, 'never.tar.gz')], pgEnv),
      runScript('scripts/db-restore.ts', [liveBackup], pgEnv),
    ]);
    for (const run of [backup, restore]) {
      expect(run.code).toBe(2);
      expect(run.stderr).toContain('pg_dump --format=custom');
      expect(run.stderr).toContain('pg_restore --clean');
    }
    expect(fs.existsSync(path.join(backups, 'never.tar.gz'))).toBe(false);
  }, 60_000);
});
