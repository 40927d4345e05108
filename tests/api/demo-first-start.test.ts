// The demo's first start on the embedded database: the accounts before listening, the sea data
// after (GET /api/health says demo: "loading" until they are in), and a start that finds the
// marker of an unfinished load (DATA_DIR/demo-loading) begins the demo afresh. The expectations
// are the behaviour the README's "Loading the demo" states.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { count } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import { loadEnv } from '../../server/env';
import { startLullwatch } from '../../server/composition-root';
import { silentLogger } from '../../server/deps';
import { dataset, project, user } from '../../server/db/schema';

describe('the demo on a first start', () => {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lullwatch-demo-start-'));
  afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));
  const env = loadEnv({
    NODE_ENV: 'test',
    DATA_DIR: dir,
    PORT: '0',
    DEMO_HINDCAST_YEARS: '1',
    JOBS_ENABLED: 'false',
    SEED_DEMO: 'true',
  });
  const marker = path.join(dir, 'demo-loading');

  it('signs in the accounts at once, loads the sea data after, and starts afresh after an unfinished load', async () => {
    const first = await startLullwatch(env, silentLogger);
    try {
      const [{ n: users }] = await first.database.db.select({ n: count() }).from(user);
      expect(users).toBe(4); // the four demo accounts of the README, there as soon as it listens
      const health = (await (await fetch(`http://127.0.0.1:${first.port}/api/health`)).json()) as { ok: boolean; demo?: string };
      expect(health.ok).toBe(true);
      // Still loading, or already done on a quick machine: never anything else.
      expect([undefined, 'loading']).toContain(health.demo);
    } finally {
      await first.close(); // waits for the sea data
    }
    expect(fs.existsSync(marker)).toBe(false);

    // A folder whose first load did not finish: an extra project marks the old database.
    const again = await startLullwatch(env, silentLogger);
    try {
      const [{ n: datasets }] = await again.database.db.select({ n: count() }).from(dataset);
      expect(datasets).toBeGreaterThan(0); // the hindcast and forecasts were kept (no marker)
      await again.database.db.insert(project).values({ name: 'Not part of the demo' });
    } finally {
      await again.close();
    }
    fs.writeFileSync(marker, 'unfinished\n');
    const fresh = await startLullwatch(env, silentLogger);
    try {
      const [{ n: projects }] = await fresh.database.db.select({ n: count() }).from(project);
      expect(projects).toBe(2); // the demo's two projects, the extra one gone with the old database
    } finally {
      await fresh.close();
    }
    expect(fs.existsSync(marker)).toBe(false);
  }, 600_000);
});
