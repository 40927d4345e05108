import path from 'node:path';
import { migrate as migratePglite } from 'drizzle-orm/pglite/migrator';
import { migrate as migrateNodePg } from 'drizzle-orm/node-postgres/migrator';
import type { PgliteDatabase } from 'drizzle-orm/pglite';
import type { NodePgDatabase } from 'drizzle-orm/node-postgres';
import type { Database } from './client';

export const MIGRATIONS_FOLDER = path.resolve(import.meta.dirname, 'migrations');

/** Applies the drizzle-kit migrations that are not yet applied (both drivers). */
export async function migrateDatabase(database: Database): Promise<void> {
  if (database.kind === 'pglite') {
    await migratePglite(database.db as unknown as PgliteDatabase, { migrationsFolder: MIGRATIONS_FOLDER });
  } else {
    await migrateNodePg(database.db as unknown as NodePgDatabase, { migrationsFolder: MIGRATIONS_FOLDER });
  }
}
