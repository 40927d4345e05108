// Migrates one embedded database and dumps it, so each test file starts from a copy in about a
// second instead of running initdb and the migrations again.
import fs from 'node:fs';
import path from 'node:path';
import { openDatabase } from '../../server/db/client';
import { migrateDatabase } from '../../server/db/migrate';

export const TEMPLATE_FILE = path.resolve(import.meta.dirname, '../.artifacts/db-template.tar.gz');

export default async function setup(): Promise<void> {
  fs.mkdirSync(path.dirname(TEMPLATE_FILE), { recursive: true });
  const database = await openDatabase({});
  await migrateDatabase(database);
  const dump = await database.pglite!.dumpDataDir('gzip');
  fs.writeFileSync(TEMPLATE_FILE, Buffer.from(await dump.arrayBuffer()));
  await database.close();
  process.env.LULLWATCH_DB_TEMPLATE = TEMPLATE_FILE;
}
