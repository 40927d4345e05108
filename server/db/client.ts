import crypto from 'node:crypto';
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
  /**
   * Runs `fn` holding a database advisory lock on `key`, or returns `{ acquired: false }` at once
   * when another holder has it. On a PostgreSQL server this is a session-level
   * pg_try_advisory_lock on a dedicated connection, so app instances on other machines are
   * excluded; on the embedded database (one session, where advisory locks are re-entrant) the
   * same exclusion is kept per database in this process.
   */
  withAdvisoryLock<T>(key: number, fn: () => Promise<T>): Promise<{ acquired: true; value: T } | { acquired: false }>;
  /**
   * Embedded database only: a number that grows whenever this process sends a statement that may
   * change data (anything but SELECT, SHOW or EXPLAIN), before and after it runs. Every write goes
   * through this process (only one process opens the folder), so an answer computed while the
   * number stayed the same is still true. Undefined on a server, which other instances write to.
   */
  writeGeneration?: () => number;
  close(): Promise<void>;
}

/**
 * A stable 31-bit advisory-lock key for one kind of work on one project (`plan`, `statistics`,
 * `ledger`...), so that each kind excludes only its own other runs.
 */
export function advisoryLockKey(kind: string, projectId: string): number {
  return crypto.createHash('sha256').update(`${kind}:${projectId}`).digest().readInt32BE(0) & 0x7fffffff;
}

/** Statements that never change data. */
const READ_ONLY_SQL = /^\s*(select|show|explain)\b/i;

/** The write generation of each embedded database handle (see {@link writeGenerationOf}). */
const generations = new WeakMap<Db, () => number>();

/**
 * The write generation of an embedded database handle: a number that moves when any statement
 * that may change data starts and again when it ends, so a value read while it stays the same is
 * still current. Undefined for a database server (other instances write unseen) and for a
 * transaction's handle.
 */
export function writeGenerationOf(db: Db): (() => number) | undefined {
  return generations.get(db);
}

/** Wraps the embedded engine's query, exec and transaction so that every possible write moves the generation. */
function countWrites(pglite: PGlite): () => number {
  let generation = 0;
  type Runner = { query: PGlite['query']; exec: PGlite['exec'] };
  const watch = (target: Runner) => {
    const query = target.query.bind(target);
    const exec = target.exec.bind(target);
    target.query = (async (sql: string, ...rest: unknown[]) => {
      const write = !READ_ONLY_SQL.test(sql);
      if (write) generation++;
      try {
        return await (query as (...a: unknown[]) => Promise<unknown>)(sql, ...rest);
      } finally {
        if (write) generation++;
      }
    }) as PGlite['query'];
    target.exec = (async (sql: string, ...rest: unknown[]) => {
      generation++;
      try {
        return await (exec as (...a: unknown[]) => Promise<unknown>)(sql, ...rest);
      } finally {
        generation++;
      }
    }) as PGlite['exec'];
  };
  watch(pglite);
  const transaction = pglite.transaction.bind(pglite);
  pglite.transaction = ((fn: (tx: Parameters<Parameters<PGlite['transaction']>[0]>[0]) => Promise<unknown>) =>
    transaction(async (tx) => {
      watch(tx as unknown as Runner);
      return fn(tx);
    })) as PGlite['transaction'];
  return () => generation;
}

/** Namespace of the app's advisory locks (first key of the two-key form): "LW". */
const LOCK_NAMESPACE = 0x4c57;

export interface DatabaseConfig {
  /** `postgres://...` for a server; unset for the embedded database. */
  databaseUrl?: string;
  /** Folder of the embedded database; `memory://` or undefined for an in-memory one. */
  dataDir?: string;
  /** A dumped data directory to start an embedded database from (tests). */
  loadDataDir?: Blob | File;
}

// PGlite's default bytea codec converts hex byte by byte in JavaScript; long series are stored as
// bytea chunks, so use Node's native hex codec instead (about 20 times faster both ways).
const BYTEA_OID = 17;
const BYTEA_PARSERS = {
  [BYTEA_OID]: (text: string) => {
    const b = Buffer.from(text.slice(2), 'hex');
    return new Uint8Array(b.buffer, b.byteOffset, b.byteLength);
  },
};
const BYTEA_SERIALIZERS = {
  [BYTEA_OID]: (value: unknown) => {
    if (!(value instanceof Uint8Array)) throw new Error('Invalid input for bytea type');
    return `\\x${Buffer.from(value.buffer, value.byteOffset, value.byteLength).toString('hex')}`;
  },
};

export async function openDatabase(config: DatabaseConfig): Promise<Database> {
  if (config.databaseUrl) {
    const pool = new pg.Pool({ connectionString: config.databaseUrl, max: 10 });
    // A connection the server closes (a restart, a failover, an administrator) emits 'error': through
    // the pool while idle, on the connection itself while checked out or closing. Unheard, that
    // error would end the process; heard, the connection is dropped and the next query opens another
    // (a query running on it fails with its own error, to its caller).
    let ending = false;
    const onConnectionError = (err: Error) => {
      if (!ending) console.warn(`[lullwatch] The database server closed a connection (${err.message}); the next query opens another.`);
    };
    pool.on('error', onConnectionError);
    pool.on('connect', (client) => client.on('error', onConnectionError));
    const db = drizzleNodePg({ client: pool, schema, casing: 'snake_case' }) as unknown as Db;
    return {
      db,
      kind: 'postgres',
      async withAdvisoryLock(key, fn) {
        const client = await pool.connect();
        let broken: Error | undefined;
        try {
          const { rows } = await client.query<{ ok: boolean }>('select pg_try_advisory_lock($1, $2) as ok', [LOCK_NAMESPACE, key]);
          if (!rows[0]?.ok) return { acquired: false };
          try {
            return { acquired: true, value: await fn() };
          } finally {
            try {
              await client.query('select pg_advisory_unlock($1, $2)', [LOCK_NAMESPACE, key]);
            } catch (err) {
              // The session is gone, and a session-level lock with it: the work's own outcome stands.
              broken = err instanceof Error ? err : new Error(String(err));
            }
          }
        } finally {
          client.release(broken);
        }
      },
      close: () => {
        ending = true;
        return pool.end();
      },
    };
  }
  const dataDir = config.dataDir && config.dataDir !== 'memory://' ? path.resolve(config.dataDir) : undefined;
  if (dataDir) fs.mkdirSync(dataDir, { recursive: true });
  const pglite = new PGlite({ dataDir, loadDataDir: config.loadDataDir, parsers: BYTEA_PARSERS, serializers: BYTEA_SERIALIZERS });
  await pglite.waitReady;
  const writeGeneration = countWrites(pglite);
  const db = drizzlePglite({ client: pglite, schema, casing: 'snake_case' }) as unknown as Db;
  generations.set(db, writeGeneration);
  const held = new Set<number>();
  return {
    db,
    kind: 'pglite',
    pglite,
    writeGeneration,
    async withAdvisoryLock(key, fn) {
      if (held.has(key)) return { acquired: false };
      held.add(key);
      try {
        const [{ ok }] = (await pglite.query<{ ok: boolean }>('select pg_try_advisory_lock($1, $2) as ok', [LOCK_NAMESPACE, key])).rows;
        if (!ok) return { acquired: false };
        try {
          return { acquired: true, value: await fn() };
        } finally {
          await pglite.query('select pg_advisory_unlock($1, $2)', [LOCK_NAMESPACE, key]);
        }
      } finally {
        held.delete(key);
      }
    },
    close: () => pglite.close(),
  };
}
