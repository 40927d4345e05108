// Fault tests: the real server as a child process on a data folder the test owns, the backup and
// restore commands as child processes, a mail receiver that outlives server restarts, and an
// integrity check of an embedded data folder once no server holds it.
import fs from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import { PGlite } from '@electric-sql/pglite';
import { amcheck } from '@electric-sql/pglite/contrib/amcheck';
import { getTableName, isTable, type Table } from 'drizzle-orm';
import { readMigrationFiles } from 'drizzle-orm/migrator';
import { SMTPServer } from 'smtp-server';
import { simpleParser } from 'mailparser';
import * as schema from '../../server/db/schema';
import { openDatabase } from '../../server/db/client';
import { MIGRATIONS_FOLDER } from '../../server/db/migrate';

export { ROOT, freePort, runScript, startServer, type ChildServer, type ScriptRun } from '../support/child-server';

/** What the server wrote to DATA_DIR/server.json. */
export function serverInfo(dataDir: string): { pid: number; port: number; jobToken: string } {
  return JSON.parse(fs.readFileSync(path.join(dataDir, 'server.json'), 'utf8'));
}

export { signIn } from '../support/child-server';

// ---------------------------------------------------------------------------------------------
// A mail receiver owned by the test, so what was delivered is still known after the server dies.

export interface ReceivedMail {
  messageId: string;
  to: string[];
  subject: string;
  text: string;
}

/**
 * What to do with one complete message before answering the SMTP client: 'accept' (250, counted
 * as delivered), 'hold' (no answer; not delivered: an SMTP client that sees no 250 must treat the
 * message as not sent), or `{ acceptAfter }`: run the function (a kill of the client), then count
 * the message as delivered and answer 250, as a mail server that has taken the message does even
 * when its answer no longer reaches the sender.
 */
export type ReceiveDecision = 'accept' | 'hold' | { acceptAfter: () => void };

export interface SmtpReceiver {
  port: number;
  smtpUrl: string;
  delivered: ReceivedMail[];
  /** Called for each complete message; the default accepts. */
  decide: (mail: ReceivedMail, index: number) => ReceiveDecision;
  /** Messages seen (accepted or not), in order. */
  seen: ReceivedMail[];
  close(): Promise<void>;
}

export async function startSmtpReceiver(): Promise<SmtpReceiver> {
  const receiver: SmtpReceiver = {
    port: 0,
    smtpUrl: '',
    delivered: [],
    seen: [],
    decide: () => 'accept',
    close: async () => {},
  };
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['AUTH', 'STARTTLS'],
    logger: false,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((parsed) => {
          const mail: ReceivedMail = {
            messageId: parsed.messageId ?? '',
            to: session.envelope.rcptTo.map((r) => r.address),
            subject: parsed.subject ?? '',
            text: parsed.text ?? '',
          };
          receiver.seen.push(mail);
          const decision = receiver.decide(mail, receiver.seen.length - 1);
          if (decision === 'hold') return; // never answered
          if (typeof decision === 'object') decision.acceptAfter();
          receiver.delivered.push(mail);
          callback();
        })
        .catch((err: Error) => callback(err));
    },
  });
  server.on('error', () => {}); // a client killed mid-session resets its connection
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => resolve());
  });
  receiver.port = (server.server.address() as net.AddressInfo).port;
  receiver.smtpUrl = `smtp://127.0.0.1:${receiver.port}`;
  receiver.close = () => new Promise<void>((resolve) => server.close(() => resolve()));
  return receiver;
}

// ---------------------------------------------------------------------------------------------
// Integrity of an embedded data folder (no server may hold it).

export interface IntegrityReport {
  /** Rows per table of the Drizzle schema (every one was read). */
  rows: Record<string, number>;
  /** Tables in the database that the schema does not define, and the reverse. */
  unknownTables: string[];
  missingTables: string[];
  /** `table: key` of primary keys found more than once (read from the heap, not the index). */
  duplicateKeys: string[];
  /** `constraint: n` of foreign-key rows whose parent is missing. */
  orphans: string[];
  /** Datasets whose chunks do not add up to their record count (a partial import). */
  partialDatasets: string[];
  /** Applied migrations against the migration files (hash and time). */
  migrations: { applied: number; files: number; mismatched: string[] };
  /** amcheck: indexes checked with bt_index_check(heapallindexed), tables with verify_heapam (TOAST too), and what it found. */
  amcheck: { indexes: number; tables: number; problems: string[] };
}

/**
 * Opens the folder with the app's own openDatabase and reads it all: every schema table, primary
 * keys unique in the heap, every foreign key held, chunks matching each dataset's record count,
 * the migrations table matching the migration files; then reopens it with PGlite's amcheck
 * extension and verifies every B-tree index against its heap and every heap (and TOAST) page.
 */
export async function checkIntegrity(dbFolder: string): Promise<IntegrityReport> {
  const database = await openDatabase({ dataDir: dbFolder });
  const pg = database.pglite!;
  const q = async <T>(sql: string, params: unknown[] = []) => (await pg.query<T>(sql, params)).rows;
  const report: IntegrityReport = {
    rows: {},
    unknownTables: [],
    missingTables: [],
    duplicateKeys: [],
    orphans: [],
    partialDatasets: [],
    migrations: { applied: 0, files: 0, mismatched: [] },
    amcheck: { indexes: 0, tables: 0, problems: [] },
  };
  try {
    const schemaTables = Object.values(schema)
      .filter((t) => isTable(t))
      .map((t) => getTableName(t as Table));
    const inDb = (await q<{ name: string }>(`select tablename as name from pg_tables where schemaname = 'public'`)).map((r) => r.name);
    report.unknownTables = inDb.filter((t) => !schemaTables.includes(t));
    report.missingTables = schemaTables.filter((t) => !inDb.includes(t));
    for (const t of schemaTables.filter((name) => inDb.includes(name)).sort()) {
      report.rows[t] = (await q<{ n: number }>(`select count(*)::int as n from "${t}"`))[0].n;
    }

    // Primary keys, counted from a sequential scan so a damaged index cannot hide a duplicate.
    await pg.exec('set enable_indexscan = off; set enable_indexonlyscan = off; set enable_bitmapscan = off;');
    const keys = await q<{ table: string; cols: string[] }>(
      `select c.relname as table, array_agg(a.attname order by k.ord) as cols
         from pg_constraint con
         join pg_class c on c.oid = con.conrelid
         join pg_namespace n on n.oid = c.relnamespace
         cross join lateral unnest(con.conkey) with ordinality as k(attnum, ord)
         join pg_attribute a on a.attrelid = c.oid and a.attnum = k.attnum
        where con.contype = 'p' and n.nspname = 'public'
        group by c.relname`,
    );
    for (const k of keys) {
      const cols = k.cols.map((c) => `"${c}"`).join(', ');
      const dup = await q<{ n: number }>(
        `select count(*)::int as n from (select ${cols} from "${k.table}" group by ${cols} having count(*) > 1) d`,
      );
      if (dup[0].n > 0) report.duplicateKeys.push(`${k.table}: ${dup[0].n}`);
    }

    // Every foreign key of the schema, whatever its delete rule: no child row without its parent.
    const fks = await q<{ name: string; child: string; parent: string; childCols: string[]; parentCols: string[] }>(
      `select con.conname as name, ch.relname as child, pa.relname as parent,
              (select array_agg(a.attname order by k.ord) from unnest(con.conkey) with ordinality k(attnum, ord)
                 join pg_attribute a on a.attrelid = con.conrelid and a.attnum = k.attnum) as "childCols",
              (select array_agg(a.attname order by k.ord) from unnest(con.confkey) with ordinality k(attnum, ord)
                 join pg_attribute a on a.attrelid = con.confrelid and a.attnum = k.attnum) as "parentCols"
         from pg_constraint con
         join pg_class ch on ch.oid = con.conrelid
         join pg_class pa on pa.oid = con.confrelid
         join pg_namespace n on n.oid = ch.relnamespace
        where con.contype = 'f' and n.nspname = 'public'`,
    );
    for (const fk of fks) {
      const notNull = fk.childCols.map((c) => `c."${c}" is not null`).join(' and ');
      const match = fk.childCols.map((c, i) => `p."${fk.parentCols[i]}" = c."${c}"`).join(' and ');
      const n = (
        await q<{ n: number }>(
          `select count(*)::int as n from "${fk.child}" c where ${notNull} and not exists (select 1 from "${fk.parent}" p where ${match})`,
        )
      )[0].n;
      if (n > 0) report.orphans.push(`${fk.name}: ${n}`);
    }
    if (fks.length === 0) report.orphans.push('no foreign keys found: the schema did not load');
    await pg.exec('reset enable_indexscan; reset enable_indexonlyscan; reset enable_bitmapscan;');

    const partial = await q<{ id: string; name: string; records: number; chunked: number | null }>(
      `select d.id, d.name, d.record_count as records, (select sum(c.count)::int from dataset_chunk c where c.dataset_id = d.id) as chunked
         from dataset d`,
    );
    report.partialDatasets = partial.filter((d) => d.chunked !== d.records).map((d) => `${d.name}: ${d.chunked ?? 0} of ${d.records}`);

    const files = readMigrationFiles({ migrationsFolder: MIGRATIONS_FOLDER });
    const applied = await q<{ hash: string; created_at: string }>(
      `select hash, created_at::text from drizzle.__drizzle_migrations order by created_at`,
    );
    report.migrations = {
      applied: applied.length,
      files: files.length,
      mismatched: files
        .filter((f) => !applied.some((a) => a.hash === f.hash && Number(a.created_at) === f.folderMillis))
        .map((f) => String(f.folderMillis)),
    };
  } finally {
    await database.close();
  }

  // amcheck ships with PGlite as an extension; the app does not load it, so open the folder again with it.
  const checker = new PGlite({ dataDir: dbFolder, extensions: { amcheck } });
  try {
    await checker.exec('create extension if not exists amcheck');
    const indexes = (
      await checker.query<{ oid: number; name: string }>(
        `select c.oid::int as oid, c.relname as name from pg_index i join pg_class c on c.oid = i.indexrelid
           join pg_am a on a.oid = c.relam join pg_namespace n on n.oid = c.relnamespace
          where a.amname = 'btree' and n.nspname in ('public', 'drizzle')`,
      )
    ).rows;
    for (const ix of indexes) {
      try {
        await checker.query('select bt_index_check($1::regclass, true)', [ix.oid]);
      } catch (err) {
        report.amcheck.problems.push(`${ix.name}: ${(err as Error).message}`);
      }
    }
    const tables = (
      await checker.query<{ oid: number; name: string }>(
        `select c.oid::int as oid, c.relname as name from pg_class c join pg_namespace n on n.oid = c.relnamespace
          where c.relkind = 'r' and n.nspname in ('public', 'drizzle')`,
      )
    ).rows;
    for (const t of tables) {
      const found = (
        await checker.query<{ blkno: number; msg: string }>('select blkno, msg from verify_heapam($1::regclass, check_toast => true)', [
          t.oid,
        ])
      ).rows;
      for (const f of found) report.amcheck.problems.push(`${t.name} block ${f.blkno}: ${f.msg}`);
    }
    report.amcheck.indexes = indexes.length;
    report.amcheck.tables = tables.length;
  } finally {
    await checker.close();
  }
  return report;
}

/** The report's problems as one list (empty when the folder is sound). */
export function integrityProblems(r: IntegrityReport): string[] {
  return [
    ...r.unknownTables.map((t) => `table not in the schema: ${t}`),
    ...r.missingTables.map((t) => `schema table missing: ${t}`),
    ...r.duplicateKeys.map((d) => `duplicate primary key: ${d}`),
    ...r.orphans.map((o) => `orphan rows: ${o}`),
    ...r.partialDatasets.map((d) => `partial dataset: ${d}`),
    ...(r.migrations.applied !== r.migrations.files ? [`migrations applied ${r.migrations.applied}, files ${r.migrations.files}`] : []),
    ...r.migrations.mismatched.map((m) => `migration not applied as in its file: ${m}`),
    ...r.amcheck.problems.map((p) => `amcheck: ${p}`),
  ];
}
