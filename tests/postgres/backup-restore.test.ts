// Backup and restore on a PostgreSQL server, under load: the real server (a child process in the
// production mode) on a database of the throwaway cluster, users, projects, datasets and limit
// changes written through the API while `pg_dump` runs, the dump restored with the README's
// `pg_restore` command into a fresh database, a second server started on it, and every user,
// project, dataset series (record count and the sum of its wave heights) and audit entry that was
// written before the dump began checked there through the API; what was written only after the
// dump had finished must not be there (pg_dump reads one snapshot taken when it starts).
//
// Runs in `npm run test:postgres` (TEST_DATABASE_URL names the throwaway cluster, PG_BIN its
// programs); skipped in the embedded-database run.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { spawn } from 'node:child_process';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signIn, startServer, type ChildServer } from '../support/child-server';
import { copyTemplate, withDatabase } from '../support/postgres';
import { findPgBin } from '../../scripts/lib/pg-cluster';

const MAINTENANCE_URL = process.env.TEST_DATABASE_URL;
const SECRET = 'backup-restore-test-secret-0123456789abcdef';

const work = fs.mkdtempSync(path.join(os.tmpdir(), 'lullwatch-pg-backup-'));
let source: { url: string; drop: () => Promise<void> } | undefined;
const restoredName = `lullwatch_restored_${process.pid}`;
let original: ChildServer | undefined;
let restored: ChildServer | undefined;

/** Runs a PostgreSQL client program; resolves with its exit code and output. */
function pgProgram(program: string, args: string[]): Promise<{ code: number | null; out: string }> {
  const bin = findPgBin();
  if (!bin) throw new Error('PostgreSQL programs not found (PG_BIN)');
  return new Promise((resolve, reject) => {
    const child = spawn(path.join(bin, program), args, { stdio: ['ignore', 'pipe', 'pipe'] });
    let out = '';
    child.stdout.on('data', (d) => (out += d));
    child.stderr.on('data', (d) => (out += d));
    child.once('error', reject);
    child.once('exit', (code) => resolve({ code, out }));
  });
}

async function getJson<T>(base: string, cookie: string, url: string): Promise<T> {
  const res = await fetch(`${base}${url}`, { headers: { cookie, origin: base } });
  if (!res.ok) throw new Error(`GET ${url}: ${res.status} ${await res.text()}`);
  return (await res.json()) as T;
}

/** An hourly CSV of `hours` records; hs follows a slow sine wave, rounded to millimetres as written. */
function hourlyCsv(startMs: number, hours: number, phase: number): { csv: string; hsSum: number } {
  const lines = ['time,hs,tp,dir'];
  let hsSum = 0;
  for (let i = 0; i < hours; i++) {
    const hs = (1.2 + 0.6 * Math.sin((i + phase) / 40)).toFixed(3);
    hsSum += Number(hs);
    lines.push(`${new Date(startMs + i * 3_600_000).toISOString()},${hs},${(6 + (i % 7)).toFixed(1)},${(i * 11) % 360}`);
  }
  return { csv: lines.join('\n') + '\n', hsSum };
}

/** A write the load made: what it was, when it was sent and when its answer came. */
interface Write {
  kind: 'user' | 'project' | 'dataset' | 'limit';
  id: string;
  projectId?: string;
  records?: number;
  hsSum?: number;
  sentAt: number;
  doneAt: number;
}

interface RecordsAnswer {
  time: string[];
  hs: (number | null)[];
}

const sumOf = (xs: (number | null)[]) => xs.reduce<number>((a, b) => a + (b ?? 0), 0);

describe.skipIf(!MAINTENANCE_URL)('pg_dump under load, restored into a fresh database', () => {
  const writes: Write[] = [];
  let dumpStartedAt = 0;
  let dumpFinishedAt = 0;
  let demoProjectId = '';
  /** The seeded datasets as the original server answered before the load: record count and the sum of hs. */
  const seeded: { id: string; records: number; hsSum: number }[] = [];
  /** Audit entries of each project (ids, time) as the original server answered after the load. */
  let auditBefore: { projectId: string; id: string; at: string }[] = [];

  beforeAll(async () => {
    source = await copyTemplate(MAINTENANCE_URL!);
    original = await startServer(path.join(work, 'original'), {
      DATABASE_URL: source.url,
      BETTER_AUTH_SECRET: SECRET,
      DEMO_HINDCAST_YEARS: '1',
    });
  }, 240_000);

  afterAll(async () => {
    await original?.kill();
    await restored?.kill();
    await source?.drop();
    if (MAINTENANCE_URL) {
      const c = new pg.Client({ connectionString: MAINTENANCE_URL });
      await c.connect();
      await c.query(`drop database if exists ${restoredName} with (force)`);
      await c.end();
    }
    fs.rmSync(work, { recursive: true, force: true });
  });

  it('takes a pg_dump while users, projects, datasets and limit changes are written and pages are read', async () => {
    const base = original!.baseUrl;
    const admin = await signIn(base, 'admin@example.com');
    const coordinator = await signIn(base, 'coordinator@example.com');
    const projects = await getJson<{ id: string; name: string }[]>(base, admin, '/api/projects');
    demoProjectId = projects.find((p) => /Varrow Reach/.test(p.name))!.id;
    for (const d of await getJson<{ id: string }[]>(base, admin, `/api/projects/${demoProjectId}/datasets`)) {
      const rec = await getJson<RecordsAnswer>(base, admin, `/api/projects/${demoProjectId}/datasets/${d.id}/records`);
      seeded.push({ id: d.id, records: rec.time.length, hsSum: sumOf(rec.hs) });
    }
    expect(seeded.length).toBeGreaterThan(0);
    const ops = await getJson<{ id: string; limits: Record<string, unknown> }[]>(
      base,
      coordinator,
      `/api/projects/${demoProjectId}/operations`,
    );
    const op = ops.find((o) => typeof o.limits.hsMax === 'number')!;

    const post = async (cookie: string, url: string, body: unknown, method = 'POST') => {
      const res = await fetch(`${base}${url}`, {
        method,
        headers: { cookie, origin: base, 'content-type': 'application/json' },
        body: JSON.stringify(body),
      });
      if (!res.ok) throw new Error(`${method} ${url}: ${res.status} ${await res.text()}`);
      return (await res.json()) as Record<string, unknown>;
    };

    let stop = false;
    let n = 0;
    const writers = [
      // An administrator creating users and projects.
      async () => {
        while (!stop) {
          const i = n++;
          let sentAt = Date.now();
          const u = (await post(admin, '/api/admin/users', { name: `Restore user ${i}`, email: `restore-${i}@example.com` })) as {
            user: { id: string };
          };
          writes.push({ kind: 'user', id: u.user.id, sentAt, doneAt: Date.now() });
          sentAt = Date.now();
          const p = await post(admin, '/api/projects', { name: `Restore project ${i}` });
          writes.push({ kind: 'project', id: String(p.id), sentAt, doneAt: Date.now() });
        }
      },
      // A coordinator importing small datasets (each one transaction: the dataset row and its chunks).
      async () => {
        while (!stop) {
          const i = n++;
          const hours = 24 * (20 + (i % 30));
          const { csv, hsSum } = hourlyCsv(Date.UTC(2025, 0, 1) + i * 86_400_000, hours, i);
          const form = new FormData();
          form.set('name', `Restore buoy ${i}`);
          form.set('kind', 'observation');
          form.set('dataPointDepth', '30');
          form.set('file', new Blob([csv]), `buoy-${i}.csv`);
          const sentAt = Date.now();
          const res = await fetch(`${base}/api/projects/${demoProjectId}/datasets`, {
            method: 'POST',
            headers: { cookie: coordinator, origin: base },
            body: form,
          });
          if (res.status !== 201) throw new Error(`upload ${i}: ${res.status} ${await res.text()}`);
          const d = (await res.json()) as { id: string };
          writes.push({ kind: 'dataset', id: d.id, projectId: demoProjectId, records: hours, hsSum, sentAt, doneAt: Date.now() });
        }
      },
      // A coordinator changing an operation's wave-height limit (each change is an audit entry).
      async () => {
        while (!stop) {
          const i = n++;
          const sentAt = Date.now();
          await post(
            coordinator,
            `/api/projects/${demoProjectId}/operations/${op.id}`,
            { limits: { ...op.limits, hsMax: 1 + (i % 100) / 100 } },
            'PATCH',
          );
          writes.push({ kind: 'limit', id: op.id, projectId: demoProjectId, sentAt, doneAt: Date.now() });
          // A person's pace, and fewer entries than the audit list's 500 per request.
          await new Promise((r) => setTimeout(r, 100));
        }
      },
      // Readers: the watch board's plan and the dataset list.
      async () => {
        while (!stop) {
          await getJson(base, coordinator, `/api/projects/${demoProjectId}/plan?alpha=true`);
          await getJson(base, admin, `/api/projects/${demoProjectId}/datasets`);
        }
      },
    ];
    const running = writers.map((w) => w());

    // Each kind of write answered at least once before the dump starts, and sent again after it ends
    // (the machine may be slow: wait for it rather than for a fixed time).
    const kinds = ['user', 'project', 'dataset', 'limit'] as const;
    const waitFor = async (what: string, ok: () => boolean) => {
      const deadline = Date.now() + 90_000;
      while (!ok()) {
        if (Date.now() > deadline) throw new Error(`the load did not make ${what} within 90 s`);
        await new Promise((r) => setTimeout(r, 100));
      }
    };
    await waitFor('every kind of write', () => kinds.every((k) => writes.some((w) => w.kind === k)));
    const dumpFile = path.join(work, 'lullwatch.dump');
    dumpStartedAt = Date.now();
    // The README's backup command.
    const dump = await pgProgram('pg_dump', ['--format=custom', '--no-owner', `--file=${dumpFile}`, source!.url]);
    dumpFinishedAt = Date.now();
    expect(dump.code, dump.out).toBe(0);
    await waitFor('every kind of write after the dump', () =>
      kinds.every((k) => writes.some((w) => w.kind === k && w.sentAt > dumpFinishedAt)),
    );
    stop = true;
    await Promise.all(running);

    // Writes before, during and after the dump, or the test shows nothing.
    for (const kind of kinds) {
      const mine = writes.filter((w) => w.kind === kind);
      expect(
        mine.some((w) => w.doneAt < dumpStartedAt),
        `${kind} before the dump`,
      ).toBe(true);
      expect(
        mine.some((w) => w.sentAt > dumpFinishedAt),
        `${kind} after the dump`,
      ).toBe(true);
    }

    const all = await getJson<{ id: string }[]>(base, admin, '/api/projects');
    auditBefore = [];
    for (const p of all) {
      for (const e of await getJson<{ id: string; at: string }[]>(base, admin, `/api/projects/${p.id}/audit?limit=500`)) {
        if (Date.parse(e.at) < dumpStartedAt) auditBefore.push({ projectId: p.id, id: e.id, at: e.at });
      }
    }
    expect(auditBefore.length).toBeGreaterThan(0);
  }, 240_000);

  it('restores the dump into a fresh database with the README command, and an instance starts on it', async () => {
    const c = new pg.Client({ connectionString: MAINTENANCE_URL });
    await c.connect();
    await c.query(`create database ${restoredName}`);
    await c.end();
    const restoredUrl = withDatabase(MAINTENANCE_URL!, restoredName);
    const run = await pgProgram('pg_restore', [
      '--clean',
      '--if-exists',
      '--no-owner',
      '--single-transaction',
      `--dbname=${restoredUrl}`,
      path.join(work, 'lullwatch.dump'),
    ]);
    expect(run.code, run.out).toBe(0);
    restored = await startServer(path.join(work, 'restored'), {
      DATABASE_URL: restoredUrl,
      BETTER_AUTH_SECRET: SECRET,
      SEED_DEMO: 'false',
    });
  }, 240_000);

  it('has every user, project, dataset series and audit entry written before the dump, and nothing written after it', async () => {
    const base = restored!.baseUrl;
    const admin = await signIn(base, 'admin@example.com');

    const users = new Set((await getJson<{ id: string }[]>(base, admin, '/api/admin/users')).map((u) => u.id));
    const projects = new Set((await getJson<{ id: string }[]>(base, admin, '/api/projects')).map((p) => p.id));
    const datasets = new Map(
      (await getJson<{ id: string; records: number }[]>(base, admin, `/api/projects/${demoProjectId}/datasets`)).map((d) => [d.id, d]),
    );
    const before = (kind: Write['kind']) => writes.filter((w) => w.kind === kind && w.doneAt < dumpStartedAt);
    const after = (kind: Write['kind']) => writes.filter((w) => w.kind === kind && w.sentAt > dumpFinishedAt);

    expect(before('user').filter((w) => !users.has(w.id))).toEqual([]);
    expect(after('user').filter((w) => users.has(w.id))).toEqual([]);
    expect(before('project').filter((w) => !projects.has(w.id))).toEqual([]);
    expect(after('project').filter((w) => projects.has(w.id))).toEqual([]);
    expect(after('dataset').filter((w) => datasets.has(w.id))).toEqual([]);

    // Each dataset series: the record count and the sum of hs as written in the CSV (uploads) or as
    // the original server answered before the load (the seeded hindcast and forecast).
    const expected = [
      ...seeded.map((s) => ({ id: s.id, records: s.records, hsSum: s.hsSum })),
      ...before('dataset').map((w) => ({ id: w.id, records: w.records!, hsSum: w.hsSum! })),
    ];
    const total = { records: 0, expectedRecords: 0 };
    for (const e of expected) {
      expect(datasets.get(e.id)?.records, `dataset ${e.id}`).toBe(e.records);
      const rec = await getJson<RecordsAnswer>(base, admin, `/api/projects/${demoProjectId}/datasets/${e.id}/records`);
      expect(rec.time.length).toBe(e.records);
      expect(sumOf(rec.hs)).toBeCloseTo(e.hsSum, 6);
      total.records += rec.time.length;
      total.expectedRecords += e.records;
    }
    expect(total.records).toBe(total.expectedRecords);

    const audit = new Set<string>();
    for (const projectId of new Set(auditBefore.map((a) => a.projectId))) {
      for (const e of await getJson<{ id: string }[]>(base, admin, `/api/projects/${projectId}/audit?limit=500`)) audit.add(e.id);
    }
    expect(auditBefore.filter((a) => !audit.has(a.id))).toEqual([]);
    // The limit changes answered before the dump began are audit entries of the demo project there.
    expect(auditBefore.filter((a) => a.projectId === demoProjectId).length).toBeGreaterThanOrEqual(before('limit').length);
  }, 240_000);
});
