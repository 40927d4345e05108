// Migrates one template database before the test files run, so each file starts from a copy in
// about a second instead of running the migrations again: a dumped embedded database, or, when
// TEST_DATABASE_URL names a PostgreSQL server, a template database on that server.
import fs from 'node:fs';
import path from 'node:path';
import { openDatabase } from '../../server/db/client';
import { migrateDatabase } from '../../server/db/migrate';
import { recreateTemplate } from './postgres';

export const TEMPLATE_FILE = path.resolve(import.meta.dirname, '../.artifacts/db-template.tar.gz');

export default async function setup(): Promise<void> {
  if (process.env.TEST_DATABASE_URL) {
    const templateUrl = await recreateTemplate(process.env.TEST_DATABASE_URL);
    const database = await openDatabase({ databaseUrl: templateUrl });
    await migrateDatabase(database);
    await database.close();
    return;
  }
  fs.mkdirSync(path.dirname(TEMPLATE_FILE), { recursive: true });
  const database = await openDatabase({});
  await migrateDatabase(database);
  const dump = await database.pglite!.dumpDataDir('gzip');
  fs.writeFileSync(TEMPLATE_FILE, Buffer.from(await dump.arrayBuffer()));
  await database.close();
}
