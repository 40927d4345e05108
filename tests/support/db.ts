import fs from 'node:fs';
import path from 'node:path';
import { openDatabase, type Database } from '../../server/db/client';
import { migrateDatabase } from '../../server/db/migrate';

const TEMPLATE_FILE = path.resolve(import.meta.dirname, '../.artifacts/db-template.tar.gz');

/**
 * A fresh, migrated database for one test file: an in-memory PGlite from the dumped template, or,
 * when TEST_DATABASE_URL is set, the PostgreSQL server it names (emptied first).
 */
export async function createTestDatabase(): Promise<Database> {
  if (process.env.TEST_DATABASE_URL) {
    const database = await openDatabase({ databaseUrl: process.env.TEST_DATABASE_URL });
    await migrateDatabase(database);
    return database;
  }
  const blob = new Blob([fs.readFileSync(TEMPLATE_FILE)]);
  const database = await openDatabase({ loadDataDir: blob });
  await migrateDatabase(database); // no-op on the template; applies any migration added since
  return database;
}
