// Test databases on a PostgreSQL server (TEST_DATABASE_URL): one migrated template database made
// once per run, and a copy of it per test file (CREATE DATABASE ... TEMPLATE takes well under a
// second), dropped when the file closes it. The URL names the server and a maintenance database.
import crypto from 'node:crypto';
import pg from 'pg';

export const PG_TEMPLATE_DB = 'lullwatch_test_template';

/** The same URL with another database name. */
export function withDatabase(url: string, database: string): string {
  const u = new URL(url);
  u.pathname = `/${database}`;
  return u.toString();
}

async function onMaintenance<T>(url: string, fn: (client: pg.Client) => Promise<T>): Promise<T> {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    return await fn(client);
  } finally {
    await client.end();
  }
}

/** Drops and recreates the (empty) template database; the caller migrates it. */
export async function recreateTemplate(url: string): Promise<string> {
  await onMaintenance(url, async (c) => {
    await c.query(`drop database if exists ${PG_TEMPLATE_DB} with (force)`);
    await c.query(`create database ${PG_TEMPLATE_DB}`);
  });
  return withDatabase(url, PG_TEMPLATE_DB);
}

/** A new database copied from the migrated template; answers its URL and a function that drops it. */
export async function copyTemplate(url: string): Promise<{ url: string; drop: () => Promise<void> }> {
  const name = `lullwatch_test_${process.pid}_${crypto.randomBytes(4).toString('hex')}`;
  await onMaintenance(url, async (c) => {
    // Two copies started at the same moment can collide on the template ("being accessed by other
    // users"); a short retry is the usual remedy.
    for (let attempt = 0; ; attempt++) {
      try {
        await c.query(`create database ${name} template ${PG_TEMPLATE_DB}`);
        return;
      } catch (e) {
        if (attempt >= 20 || !/being accessed by other users/.test(String(e))) throw e;
        await new Promise((r) => setTimeout(r, 100 + Math.random() * 200));
      }
    }
  });
  return {
    url: withDatabase(url, name),
    drop: () => onMaintenance(url, async (c) => void (await c.query(`drop database if exists ${name} with (force)`))),
  };
}
