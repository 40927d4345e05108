// A PostgreSQL server that closes the app's connections (a restart, a failover, an administrator):
// the pooled connections then emit 'error', idle ones through the pool and one checked out (the
// advisory lock's own connection) on itself. Unheard, such an error ends the process (Node's rule
// for an 'error' event without a listener; node-postgres's documentation asks for a pool listener).
// Here both kinds are closed by pg_terminate_backend from another session: the process must go on,
// the lock's work keep its outcome, and the next query open a new connection.
//
// Runs in `npm run test:postgres` (TEST_DATABASE_URL names the throwaway cluster); skipped in the
// embedded-database run. Vitest fails the run on an unhandled error, which is what the missing
// listeners gave.
import pg from 'pg';
import { sql } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { openDatabase } from '../../server/db/client';
import { project } from '../../server/db/schema';
import { copyTemplate } from '../support/postgres';

const MAINTENANCE_URL = process.env.TEST_DATABASE_URL;

/** Closes every other session on the database `url` names, from a session of its own; returns how many. */
async function terminateOthers(url: string): Promise<number> {
  const admin = new pg.Client({ connectionString: url });
  await admin.connect();
  try {
    const { rows } = await admin.query<{ n: string }>(
      'select count(pg_terminate_backend(pid)) as n from pg_stat_activity where datname = current_database() and pid <> pg_backend_pid()',
    );
    return Number(rows[0].n);
  } finally {
    await admin.end();
  }
}

const settle = () => new Promise((resolve) => setTimeout(resolve, 300));

describe.skipIf(!MAINTENANCE_URL)('connections the database server closes', () => {
  it('neither end the process nor the work, and the next query opens a new connection', async () => {
    const copy = await copyTemplate(MAINTENANCE_URL!);
    const database = await openDatabase({ databaseUrl: copy.url });
    try {
      // Two queries at once leave two idle connections in the pool.
      await Promise.all([database.db.execute(sql`select pg_sleep(0.05)`), database.db.execute(sql`select pg_sleep(0.05)`)]);
      const locked = await database.withAdvisoryLock(4242, async () => {
        // The lock's connection is checked out and idle while the work runs.
        const closed = await terminateOthers(copy.url);
        await settle();
        return closed;
      });
      // The lock's connection (one of the two, checked out) and the idle one were closed; the work's outcome stands.
      expect(locked.acquired).toBe(true);
      if (locked.acquired) expect(locked.value).toBeGreaterThanOrEqual(2);
      await settle();
      const projects = await database.db.select({ id: project.id }).from(project);
      expect(Array.isArray(projects)).toBe(true);
      // The lock can be taken again (it went with the closed session).
      const again = await database.withAdvisoryLock(4242, async () => 'again');
      expect(again).toEqual({ acquired: true, value: 'again' });
    } finally {
      await database.close();
      await copy.drop();
    }
  }, 60_000);
});
