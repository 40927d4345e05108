import fs from 'node:fs';
import path from 'node:path';
import { openDatabase, type Database } from '../../server/db/client';
import { migrateDatabase } from '../../server/db/migrate';
import { copyTemplate } from './postgres';

const TEMPLATE_FILE = path.resolve(import.meta.dirname, '../.artifacts/db-template.tar.gz');

/**
 * A fresh, migrated database for one test file: an in-memory PGlite from the dumped template, or,
 * when TEST_DATABASE_URL is set, a new database on that PostgreSQL server copied from the migrated
 * template (dropped again on close).
 */
export async function createTestDatabase(): Promise<Database> {
  const serverUrl = process.env.TEST_DATABASE_URL;
  if (serverUrl) {
    const copy = await copyTemplate(serverUrl);
    const database = await openDatabase({ databaseUrl: copy.url });
    await migrateDatabase(database); // no-op on the template
    return {
      ...database,
      async close() {
        await database.close();
        await copy.drop();
      },
    };
  }
  const blob = new Blob([fs.readFileSync(TEMPLATE_FILE)]);
  const database = await openDatabase({ loadDataDir: blob });
  await migrateDatabase(database); // no-op on the template; applies any migration added since
  return database;
}
