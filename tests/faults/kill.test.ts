// The server killed with SIGKILL in the middle of its work, then started again on the same data
// folder: a planning run killed while its alert e-mails are being sent (once while an e-mail waits
// for the SMTP answer, once right after the answer), and a large import killed while its
// transaction writes the series. Mail goes to a receiver this test owns, so what was delivered is
// known across the restarts. After the last kill the data folder is opened directly (the first
// open after the crash) and checked table by table, key by key, and with amcheck.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  checkIntegrity,
  integrityProblems,
  serverInfo,
  signIn,
  startSmtpReceiver,
  startServer,
  type ReceivedMail,
  type ChildServer,
  type SmtpReceiver,
} from './harness';
import { openDatabase } from '../../server/db/client';
import { outbox } from '../../server/db/schema';
import { deliverDueMail } from '../../server/services/outbox';
import { createMailer } from '../../server/mail/mailer';
import { silentLogger } from '../../server/deps';

const work = fs.mkdtempSync(path.join(os.tmpdir(), 'lullwatch-kill-'));
const dataDir = path.join(work, 'data');
// The server's temporary folder (uploads land there), so what a killed upload leaves is removed with the rest.
const serverTmp = path.join(work, 'tmp');
fs.mkdirSync(serverTmp);
let receiver: SmtpReceiver;
let server: ChildServer | undefined;
let projectId = '';
/** Outbox ids of the e-mail held without an SMTP answer at the first kill, and of the one accepted just before the second. */
let heldId = '';
let racedId = '';
/** The address of the server that sent the raced e-mail: its unsubscribe link is built on it. */
let racedBaseUrl = '';

const start = async () =>
  (server = await startServer(dataDir, { SMTP_URL: receiver.smtpUrl, DEMO_HINDCAST_YEARS: '1', TMPDIR: serverTmp }));

/** Runs the planning job in the server as `npm run plan:once` does (token from server.json); null when the server died. */
function planOnce(): Promise<{ projects: { status: string; queued?: number }[]; mail: { sent: number } } | null> {
  const { port, jobToken } = serverInfo(dataDir);
  return fetch(`http://127.0.0.1:${port}/api/internal/jobs/plan`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', 'x-lullwatch-job-token': jobToken },
    body: '{}',
  }).then(
    async (res) => (res.ok ? await res.json() : null),
    () => null,
  );
}

async function api(cookie: string, method: string, url: string, body?: unknown) {
  const send = () =>
    fetch(`${server!.baseUrl}${url}`, {
      method,
      headers: { cookie, origin: server!.baseUrl, ...(body === undefined ? {} : { 'content-type': 'application/json' }) },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
  // A kept-alive connection the server closed while idle fails once; a fresh one then works.
  const res = await send().catch(() => send());
  if (!res.ok) throw new Error(`${method} ${url}: ${res.status} ${await res.text()}`);
  return res.status === 204 ? null : res.json();
}

function waitFor<T>(what: string, timeoutMs: number, setup: (resolve: (v: T) => void) => void): Promise<T> {
  return new Promise<T>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`timed out waiting for ${what}`)), timeoutMs);
    setup((v) => {
      clearTimeout(timer);
      resolve(v);
    });
  });
}

/** The outbox row id in a caught e-mail's Message-ID (`<outbox.<id>@domain>`). */
const outboxId = (m: ReceivedMail) => /^<outbox\.([0-9a-f-]{36})@/.exec(m.messageId)?.[1] ?? `unknown:${m.messageId}`;

beforeAll(async () => {
  receiver = await startSmtpReceiver();
  await start();
  // Everyone on the cable project hears about every operation at once: plenty of alert e-mails.
  for (const email of ['coordinator@example.com', 'skipper@example.com', 'client@example.com']) {
    const cookie = await signIn(server!.baseUrl, email);
    const projects = (await api(cookie, 'GET', '/api/projects')) as { id: string; name: string }[];
    projectId = projects.find((p) => /Varrow Reach/.test(p.name))!.id;
    await api(cookie, 'PUT', `/api/projects/${projectId}/subscription`, {
      operationIds: [],
      siteIds: [],
      immediate: true,
      digest: false,
      digestTime: '06:00',
      digestTimeZone: 'Europe/London',
      active: true,
    });
  }
}, 180_000);

afterAll(async () => {
  await server?.kill();
  await receiver?.close();
  fs.rmSync(work, { recursive: true, force: true });
});

describe('SIGKILL during a planning run and its e-mails', () => {
  it('kills the server while an alert e-mail waits for its SMTP answer', async () => {
    // The first e-mail is accepted; the server is killed while the second waits for the 250
    // reply, so it was never accepted (a sender that sees no 250 has not sent the message).
    const held = waitFor<number>('the second alert e-mail', 90_000, (resolve) => {
      receiver.decide = (_mail, i) => {
        if (i === 1) {
          resolve(i);
          return 'hold';
        }
        return 'accept';
      };
    });
    const job = planOnce();
    heldId = outboxId(receiver.seen[await held]);
    await server!.kill();
    expect(await job).toBeNull();
    expect(receiver.delivered).toHaveLength(1);
  }, 120_000);

  it('after a restart, kills it again when the SMTP server has taken an e-mail but before its answer arrives', async () => {
    await start();
    // The plan of the killed run was committed with its outbox rows before any sending, so a run
    // on the same forecast queues nothing new and sends the e-mails not yet tried. The receiver
    // takes the first of them and kills the server just before answering 250: the message is
    // delivered, but the server never learns it.
    const raced = waitFor<number>('an e-mail of the second run', 90_000, (resolve) => {
      receiver.decide = (_mail, i) => ({
        acceptAfter: () => {
          if (server!.child.exitCode === null && server!.child.signalCode === null) process.kill(server!.pid, 'SIGKILL');
          resolve(i);
        },
      });
    });
    const job = planOnce();
    const racedIndex = await raced;
    racedBaseUrl = server!.baseUrl;
    await server!.exited;
    expect(await job).toBeNull();
    racedId = outboxId(receiver.seen[racedIndex]);
    expect(receiver.delivered.at(-1)).toBe(receiver.seen[racedIndex]);
  }, 150_000);

  it('after another restart, a run queues nothing new and sends the e-mails not yet tried', async () => {
    await start();
    receiver.decide = () => 'accept';
    const again = await planOnce();
    expect(again).not.toBeNull();
    expect(again!.projects.every((p) => p.status === 'planned')).toBe(true);
    expect(again!.projects.reduce((n, p) => n + (p.queued ?? 0), 0)).toBe(0);
    expect(again!.mail.sent).toBeGreaterThan(0);
    // Nothing but the raced e-mail may have arrived twice so far (its retry is a minute after the claim).
    const ids = receiver.delivered.map(outboxId).filter((id) => id !== racedId);
    expect(new Set(ids).size, 'an e-mail arrived twice').toBe(ids.length);
    expect(ids.every((id) => !id.startsWith('unknown'))).toBe(true);
  }, 150_000);
});

describe('SIGKILL during a large import', () => {
  const YEARS = 20;
  const records = Math.round(YEARS * 365.25 * 24);
  let cookie = '';
  let csv: Blob;
  let before: { id: string; records: number }[] = [];
  let calibrated: { id: string; records: number; writeToEndMs: number };

  /** Bytes in the database's data files (DATA_DIR/db/base): they grow as a transaction writes rows. */
  function dataFileBytes(): number {
    let total = 0;
    const walk = (dir: string) => {
      for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
        const file = path.join(dir, entry.name);
        if (entry.isDirectory()) walk(file);
        else total += fs.statSync(file, { throwIfNoEntry: false })?.size ?? 0;
      }
    };
    walk(path.join(dataDir, 'db', 'base'));
    return total;
  }

  /**
   * Uploads the CSV with streamed progress. Once parsing has begun (parsing writes nothing to the
   * database) the data files are watched: their first growth is the import's transaction writing
   * rows, and `onWrite` runs then. (The 'saving' progress line cannot serve: the save keeps the
   * server's event loop busy, so that line reaches the client together with the result. The WAL
   * cannot either: PGlite writes this transaction's WAL to disk only at its commit.)
   */
  async function upload(
    name: string,
    onWrite?: () => void,
  ): Promise<{ result: { id: string; records: number } | null; writeToEndMs: number }> {
    const form = new FormData();
    form.set('name', name);
    form.set('kind', 'hindcast');
    form.set('format', 'csv');
    form.set('dataPointDepth', 'deep');
    form.set('file', csv, `hindcast-${YEARS}y.csv`);
    let writeAt = 0;
    let watch: ReturnType<typeof setInterval> | undefined;
    try {
      const res = await fetch(`${server!.baseUrl}/api/projects/${projectId}/datasets`, {
        method: 'POST',
        headers: { cookie, origin: server!.baseUrl, accept: 'application/x-ndjson' },
        body: form,
      });
      let buffered = '';
      for await (const chunk of res.body as unknown as AsyncIterable<Uint8Array>) {
        buffered += Buffer.from(chunk).toString('utf8');
        let nl: number;
        while ((nl = buffered.indexOf('\n')) >= 0) {
          const line = JSON.parse(buffered.slice(0, nl));
          buffered = buffered.slice(nl + 1);
          if (line.progress && !watch) {
            const baseline = dataFileBytes();
            watch = setInterval(() => {
              if (writeAt || dataFileBytes() === baseline) return;
              writeAt = performance.now();
              clearInterval(watch);
              onWrite?.();
            }, 10);
          }
          if (line.status === 201) return { result: line.result, writeToEndMs: writeAt ? performance.now() - writeAt : 0 };
          if (line.error) throw new Error(`import refused: ${JSON.stringify(line.error)}`);
        }
      }
    } catch (err) {
      if (!onWrite) throw err; // the killed upload ends with a reset connection
    } finally {
      clearInterval(watch);
    }
    return { result: null, writeToEndMs: 0 };
  }

  it(`imports a ${YEARS}-year hourly CSV completely once, timing its transaction`, async () => {
    const t0 = Date.UTC(1995, 0, 1);
    const lines = ['time,hs,tp,tz,dir,wind_speed,wind_dir'];
    for (let i = 0; i < records; i++) {
      const hs = 1.2 + 0.8 * Math.sin(i / 700) + ((i * 7919) % 100) / 200;
      lines.push(
        `${new Date(t0 + i * 3_600_000).toISOString()},${hs.toFixed(2)},${(8 + hs).toFixed(1)},${(5.5 + hs * 0.6).toFixed(1)},${200 + (i % 90)},${(4 + hs * 3).toFixed(1)},${210 + (i % 80)}`,
      );
    }
    csv = new Blob([lines.join('\n') + '\n'], { type: 'text/csv' });
    // The server of the last restart still runs.
    cookie = await signIn(server!.baseUrl, 'coordinator@example.com');
    before = ((await api(cookie, 'GET', `/api/projects/${projectId}/datasets`)) as { id: string; records: number }[]).map((d) => ({
      id: d.id,
      records: d.records,
    }));

    const { result, writeToEndMs } = await upload('Calibration hindcast (complete)');
    expect(result!.records).toBe(records);
    expect(writeToEndMs, 'no write to the data files seen during the import').toBeGreaterThan(0);
    calibrated = { ...result!, writeToEndMs };
  }, 120_000);

  it('kills the server a third of the way through the transaction of the same import; the first open after the kill finds it rolled back', async () => {
    let grownAtKill = 0;
    const startBytes = dataFileBytes();
    const { result } = await upload('Killed hindcast (must not exist)', () => {
      setTimeout(() => {
        if (server!.child.exitCode !== null || server!.child.signalCode !== null) return;
        process.kill(server!.pid, 'SIGKILL');
        grownAtKill = dataFileBytes() - startBytes;
      }, calibrated.writeToEndMs / 3);
    });
    await server!.exited;
    expect(result, 'the import finished before the kill').toBeNull();
    expect(grownAtKill, 'the kill came before the transaction wrote anything').toBeGreaterThan(0);
    server = undefined;
    const uploads = path.join(serverTmp, 'lullwatch-uploads');
    const leftover = fs.existsSync(uploads) ? fs.readdirSync(uploads) : [];
    console.log(
      `Import killed ${Math.round(calibrated.writeToEndMs / 3)} ms into its transaction (of about ${Math.round(calibrated.writeToEndMs)} ms), after ${(grownAtKill / 1e6).toFixed(1)} MB of data-file growth; ` +
        `${leftover.length} upload file(s) left in the server's temporary folder.`,
    );

    // The first open after the kill, with the app's openDatabase: PostgreSQL's crash recovery runs.
    const report = await checkIntegrity(path.join(dataDir, 'db'));
    expect(integrityProblems(report)).toEqual([]);
    expect(report.rows.dataset).toBe(before.length + 1);
    expect(report.rows.dataset_chunk).toBeGreaterThanOrEqual(Math.ceil(records / 8784));
    expect(report.amcheck.indexes).toBeGreaterThan(20);
    expect(report.amcheck.tables).toBe(Object.keys(report.rows).length + 1); // and drizzle's migrations table
  }, 150_000);

  it('after a restart, the dataset list is the one before the killed import plus the complete one', async () => {
    await start();
    cookie = await signIn(server!.baseUrl, 'coordinator@example.com');
    const after = (await api(cookie, 'GET', `/api/projects/${projectId}/datasets`)) as { id: string; records: number }[];
    const byId = (a: { id: string }, b: { id: string }) => a.id.localeCompare(b.id);
    expect(after.map((d) => ({ id: d.id, records: d.records })).sort(byId)).toEqual(
      [...before, { id: calibrated.id, records: calibrated.records }].sort(byId),
    );
    await server!.stop();
    server = undefined;
  }, 150_000);
});

describe('after the kills', () => {
  it('delivers every alert e-mail once, except the one taken while its SMTP answer was lost to the kill: twice, as the same message', async () => {
    // Deliver as the job would two hours later (past every retry time), to the same receiver.
    const database = await openDatabase({ dataDir: path.join(dataDir, 'db') });
    const mailer = await createMailer({ smtpUrl: receiver.smtpUrl, from: 'Lullwatch <alerts@lullwatch.invalid>' });
    try {
      // The same link settings as the server that sent the first copy (its address and the secret in its data folder).
      const links = {
        baseUrl: racedBaseUrl,
        linkSecret: process.env.BETTER_AUTH_SECRET ?? fs.readFileSync(path.join(dataDir, 'auth-secret'), 'utf8').trim(),
      };
      await deliverDueMail(database.db, mailer, new Date(Date.now() + 2 * 3_600_000), { maxAttempts: 6, log: silentLogger, links });
      const rows = await database.db.select().from(outbox);
      expect(rows.length).toBeGreaterThan(3);
      expect(rows.filter((r) => r.status !== 'sent').map((r) => r.status)).toEqual([]);
      const counts = new Map<string, number>();
      for (const m of receiver.delivered) counts.set(outboxId(m), (counts.get(outboxId(m)) ?? 0) + 1);
      expect([...counts.keys()].sort()).toEqual(rows.map((r) => r.id).sort());
      // (Under heavy load a restart can outlast the held e-mail's one-minute retry time; then it may be the raced one.)
      if (heldId !== racedId) expect(counts.get(heldId), 'the e-mail whose SMTP answer never came').toBe(1);
      expect([...counts].filter(([id, n]) => id !== racedId && n !== 1)).toEqual([]);
      // At least once: the e-mail the SMTP server took while its 250 answer was lost with the
      // killed server stayed 'claimed' in the outbox, so the retry sends it again, as the same
      // message (same Message-ID, subject and text).
      const copies = receiver.delivered.filter((m) => outboxId(m) === racedId);
      expect(copies).toHaveLength(2);
      for (const copy of copies) {
        expect(copy.messageId).toBe(copies[0].messageId);
        expect(copy.subject).toBe(copies[0].subject);
        expect(copy.text).toBe(copies[0].text);
      }
    } finally {
      await mailer.close();
      await database.close();
    }
  }, 120_000);
});
