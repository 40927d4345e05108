import fs from 'node:fs';
import path from 'node:path';
import { PGlite } from '@electric-sql/pglite';
import { drizzle as drizzlePglite } from 'drizzle-orm/pglite';
import { drizzle as drizzleNodePg } from 'drizzle-orm/node-postgres';
import type { PgDatabase, PgQueryResultHKT } from 'drizzle-orm/pg-core';
import type { ExtractTablesWithRelations } from 'drizzle-orm';
import pg from 'pg';
import * as schema from './schema';

export type Schema = typeof schema;
/** The one database type the services use, whichever driver sits below it. */
export type Db = PgDatabase<PgQueryResultHKT, Schema, ExtractTablesWithRelations<Schema>>;

export interface Database {
  db: Db;
  /** 'pglite' (embedded, one process per data folder) or 'postgres' (a server, many instances). */
  kind: 'pglite' | 'postgres';
  /** The embedded engine, when embedded (for dumps and backups). */
  pglite?: PGlite;
  close(): Promise<void>;
}

export interface DatabaseConfig {
  /** `postgres://...` for a server; unset for the embedded database. */
  databaseUrl?: string;
  /** Folder of the embedded database; `memory://` or undefined for an in-memory one. */
  dataDir?: string;
  /** A dumped data directory to start an embedded database from (tests). */
  loadDataDir?: Blob | File;
}

export async function openDatabase(config: DatabaseConfig): Promise<Database> {
  if (config.databaseUrl) {
    const pool = new pg.Pool({ connectionString: config.databaseUrl, max: 10 });
    const db = drizzleNodePg({ client: pool, schema, casing: 'snake_case' }) as unknown as Db;
    return { db, kind: 'postgres', close: () => pool.end() };
  }
  const dataDir = config.dataDir && config.dataDir !== 'memory://' ? path.resolve(config.dataDir) : undefined;
  if (dataDir) fs.mkdirSync(dataDir, { recursive: true });
  const pglite = new PGlite({ dataDir, loadDataDir: config.loadDataDir });
  await pglite.waitReady;
  const db = drizzlePglite({ client: pglite, schema, casing: 'snake_case' }) as unknown as Db;
  return { db, kind: 'pglite', pglite, close: () => pglite.close() };
}
