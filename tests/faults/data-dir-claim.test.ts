// One process per embedded data folder: a server claims DATA_DIR (server.json) before it opens the
// database, so a second server, a backup, a restore or plan:once never opens the folder beside it,
// also while the first one is still migrating or seeding.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { freePort, runScript, startServer, type ChildServer } from './harness';

const dirs: string[] = [];
const servers: ChildServer[] = [];
const tempDataDir = () => {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lullwatch-claim-'));
  dirs.push(dir);
  return dir;
};

afterAll(async () => {
  for (const s of servers) await s.stop();
  for (const d of dirs) fs.rmSync(d, { recursive: true, force: true });
});

describe('the data folder claim', () => {
  it('refuses a second server on a folder a live server holds, and the first keeps answering', async () => {
    const dataDir = tempDataDir();
    const first = await startServer(dataDir, { SEED_DEMO: 'false' });
    servers.push(first);
    const second = await runScript('server/index.ts', [], {
      DATA_DIR: dataDir,
      PORT: String(await freePort()),
      HOST: '127.0.0.1',
      SEED_DEMO: 'false',
      JOBS_ENABLED: 'false',
    });
    expect(second.code).toBe(1);
    expect(second.stderr).toContain(`Another Lullwatch server (pid ${first.pid}) is using ${dataDir}`);
    expect((await fetch(`${first.baseUrl}/api/health`)).status).toBe(200);
    // The claim still names the first server after the refusal.
    expect(JSON.parse(fs.readFileSync(path.join(dataDir, 'server.json'), 'utf8')).pid).toBe(first.pid);
  }, 240_000);

  it('makes backup, restore, plan:once and another server wait for a server that is still starting', async () => {
    const dataDir = tempDataDir();
    // A live process (this test runner) that has claimed the folder but does not listen yet.
    fs.writeFileSync(path.join(dataDir, 'server.json'), JSON.stringify({ pid: process.pid, port: null, jobToken: 'x'.repeat(32) }));
    const env = { DATA_DIR: dataDir };
    const backup = await runScript('scripts/db-backup.ts', [path.join(dataDir, 'b.tar.gz')], env);
    expect(backup.code).toBe(2);
    expect(backup.stderr).toContain(`(pid ${process.pid}) is starting`);
    const plan = await runScript('jobs/plan-once.ts', [], env);
    expect(plan.code).toBe(2);
    expect(plan.stderr).toContain(`(pid ${process.pid}) is starting`);
    const restore = await runScript('scripts/db-restore.ts', [path.join(dataDir, 'b.tar.gz')], env);
    expect(restore.code).toBe(2);
    const server = await runScript('server/index.ts', [], {
      ...env,
      PORT: String(await freePort()),
      HOST: '127.0.0.1',
      SEED_DEMO: 'false',
      JOBS_ENABLED: 'false',
    });
    expect(server.code).toBe(1);
    expect(server.stderr).toContain(`Another Lullwatch server (pid ${process.pid})`);
    // Nothing opened the folder: no database was created in it.
    expect(fs.existsSync(path.join(dataDir, 'db'))).toBe(false);
  }, 240_000);

  it('takes over a claim left by a process that is gone', async () => {
    const dataDir = tempDataDir();
    // A pid far above Linux's default pid_max (4,194,304 at most), so no process has it.
    fs.writeFileSync(path.join(dataDir, 'server.json'), JSON.stringify({ pid: 2 ** 30, port: 1, jobToken: 'x'.repeat(32) }));
    const server = await startServer(dataDir, { SEED_DEMO: 'false' });
    servers.push(server);
    expect(JSON.parse(fs.readFileSync(path.join(dataDir, 'server.json'), 'utf8'))).toMatchObject({ pid: server.pid, port: server.port });
    await server.stop();
    // A graceful stop gives the folder up.
    expect(fs.existsSync(path.join(dataDir, 'server.json'))).toBe(false);
  }, 240_000);
});
