// What an independent security probe of a running instance found (resource abuse, the auth
// library's extra routes, audit identity), one describe per finding, on the real app (PGlite, the
// local mailbox; no mocks). The sources named beside the checks are cited from memory.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { Readable } from 'node:stream';
import request from 'supertest';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { Limiter } from '../../server/http/limiter';
import { ensurePrivateDir, privateDiskStorage } from '../../server/http/private-uploads';
import { ledgerDay, operation, outbox, user } from '../../server/db/schema';
import { ByteBoundedMemo } from '../../server/services/byte-cache';
import { encodedAnswerBytes } from '../../server/services/encoded-answers';
import { enqueueMail, deliverDueMail, listOutbox } from '../../server/services/outbox';
import { UNSUBSCRIBE_LINK_MARK, unsubscribeUrl } from '../../server/services/alert-mail';
import { importLimiter, UPLOAD_DIR } from '../../server/routes/datasets';
import { loadEnv } from '../../server/env';
import { startLullwatch, isLoopback } from '../../server/composition-root';
import { silentLogger } from '../../server/deps';
import { passwordProblem } from '../../shared/auth/password-rules';
import { DEMO_PASSWORD } from '../../seed/scenario';
import { createTestApp, signIn, signInAll, TEST_ORIGIN, type Agent, type TestApp } from '../support/app';

const SIGN_IN = '/api/auth/sign-in/email';
const HOUR = 3_600_000;
const DAY = 24 * HOUR;

/** An hourly CSV of `hours` calm records from `startMs`. */
const hourlyCsv = (startMs: number, hours: number) =>
  [
    'time,hs,tp,dir,wind',
    ...Array.from(
      { length: hours },
      (_, i) => `${new Date(startMs + i * HOUR).toISOString()},${(0.5 + 0.3 * Math.sin(i / 7)).toFixed(2)},7,250,4`,
    ),
  ].join('\n') + '\n';

async function upload(agent: Agent, projectId: string, csv: string, fields: Record<string, string> = {}) {
  let req = agent.post(`/api/projects/${projectId}/datasets`);
  const all = { name: `Probe data ${Math.random().toString(36).slice(2, 8)}`, kind: 'hindcast', dataPointDepth: 'deep', ...fields };
  for (const [k, v] of Object.entries(all)) req = req.field(k, v);
  return req.attach('file', Buffer.from(csv), 'records.csv');
}

let now = new Date();
let t: TestApp;
let as: Awaited<ReturnType<typeof signInAll>>;
let siteId: string;
let operationId: string;

beforeAll(async () => {
  now = new Date();
  t = await createTestApp({ forecast: true, clock: () => now });
  as = await signInAll(t.app);
  const base = `/api/projects/${t.demo.projectId}`;
  const site = await as.coordinator.post(`${base}/sites`).send({ name: 'Probe site', depth: 12, timeZone: 'UTC', shoreNormal: 270 });
  expect(site.status, site.text).toBe(201);
  siteId = site.body.id;
  const op = await as.coordinator
    .post(`${base}/operations`)
    .send({ name: 'Probe operation', tpop: 6, tc: 2, weatherRestricted: true, limits: { hsMax: 1.5 }, siteIds: [siteId] });
  expect(op.status, op.text).toBe(201);
  operationId = op.body.id;
}, 120_000);

afterAll(async () => {
  await t?.close();
});

describe('1. a recurrence rule cannot freeze the server', () => {
  const path = () => `/api/projects/${t.demo.projectId}/operations/${operationId}/recurrence`;
  const iso = (ms: number) => new Date(ms).toISOString().slice(0, 16);

  it('refuses BYSECOND, BYMINUTE and rules with too many BY values, naming the rule', async () => {
    for (const rule of [
      'FREQ=DAILY;BYHOUR=0,1,2;BYMINUTE=0,30',
      'FREQ=DAILY;BYSECOND=0,1',
      `FREQ=YEARLY;BYYEARDAY=${Array.from({ length: 100 }, (_, i) => i + 1).join(',')}`,
    ]) {
      const res = await as.coordinator.put(path()).send({ start: iso(now.getTime()), timeZone: 'UTC', rule });
      expect(res.status, rule).toBe(400);
      expect(res.body.error.details[0].field, rule).toBe('rule');
    }
  });

  it('refuses a start more than two years from now (the probe used the year 1000)', async () => {
    for (const start of ['1000-01-01T00:00', iso(now.getTime() - 3 * 365 * DAY), iso(now.getTime() + 3 * 365 * DAY)]) {
      const res = await as.coordinator.put(path()).send({ start, timeZone: 'UTC', rule: 'FREQ=WEEKLY' });
      expect(res.status, start).toBe(400);
      expect(res.body.error.details[0].field, start).toBe('start');
    }
    const ok = await as.coordinator
      .put(path())
      .send({ start: iso(now.getTime() - 300 * DAY), timeZone: 'UTC', rule: 'FREQ=DAILY;BYHOUR=6,18' });
    expect(ok.status, ok.text).toBe(200);
  });

  it('plans no more than 200 ms slower with the probe’s rule stored (as a rule saved before these limits would be)', async () => {
    const plan = async () => {
      const started = performance.now();
      const res = await as.coordinator.get(`/api/projects/${t.demo.projectId}/plan`);
      expect(res.status, res.text.slice(0, 200)).toBe(200);
      return performance.now() - started;
    };
    const setRecurrence = (recurrence: Record<string, unknown> | null) =>
      t.database.db.update(operation).set({ recurrence }).where(eq(operation.id, operationId));
    // Each stored change gives a new setup and so a freshly computed (uncached) plan; the least of
    // three runs, to keep the machine's other load out of the comparison.
    const coldRuns = async (recurrence: (i: number) => Record<string, unknown> | null) => {
      const times: number[] = [];
      for (let i = 0; i < 3; i++) {
        await setRecurrence(recurrence(i));
        times.push(await plan());
      }
      return Math.min(...times);
    };
    const minute = (i: number) => String(i).padStart(2, '0');
    const baseline = await coldRuns((i) => ({ start: `2026-01-05T06:${minute(i)}`, timeZone: 'UTC', rule: 'FREQ=WEEKLY' }));
    const allHours = 'BYHOUR=0,1,2,3,4,5,6,7,8,9,10,11,12,13,14,15,16,17,18,19,20,21,22,23';
    const allMinutes = `BYMINUTE=${Array.from({ length: 60 }, (_, i) => i).join(',')}`;
    // The probe's rule (BYMINUTE and BYSECOND, from the year 1000), and rules that pass the rule
    // checks but start far back (as one stored before the start limit would): every hour since 1000.
    const probe = await coldRuns((i) => ({
      start: `1000-01-01T00:${minute(i)}`,
      timeZone: 'UTC',
      rule: `FREQ=DAILY;${allHours};${allMinutes};BYSECOND=${Array.from({ length: 60 }, (_, k) => k).join(',')}`,
    }));
    const hourlySince1000 = await coldRuns((i) => ({
      start: `1000-01-01T00:${minute(i)}`,
      timeZone: 'UTC',
      rule: `FREQ=DAILY;${allHours}`,
    }));
    const everyMinuteRecent = await coldRuns((i) => ({
      start: new Date(now.getTime() - 700 * DAY).toISOString().slice(0, 14) + minute(i),
      timeZone: 'UTC',
      rule: `FREQ=DAILY;${allHours};${allMinutes}`,
    }));
    await setRecurrence(null);
    expect(probe - baseline).toBeLessThan(200);
    expect(hourlySince1000 - baseline).toBeLessThan(200);
    expect(everyMinuteRecent - baseline).toBeLessThan(200);
  }, 120_000);
});

describe('2. plans are bounded, and caches by bytes', () => {
  let hindcastId: string;
  beforeAll(async () => {
    const res = await upload(as.coordinator, t.demo.projectId, hourlyCsv(Date.UTC(2024, 0, 1), 70 * 24));
    expect(res.status, res.text).toBe(201);
    hindcastId = res.body.id;
  }, 60_000);

  it('plans a hindcast on at most 31 days (by default its last ones) and refuses a longer stretch', async () => {
    const res = await as.coordinator.get(`/api/projects/${t.demo.projectId}/plan`).query({ dataset: hindcastId });
    expect(res.status, res.text.slice(0, 200)).toBe(200);
    const times: string[] = res.body.plans[0].times;
    expect(times.length).toBeLessThanOrEqual(31 * 24 + 1);
    expect(times.at(-1)).toBe(new Date(Date.UTC(2024, 0, 1) + (70 * 24 - 1) * HOUR).toISOString());
    const long = await as.coordinator
      .get(`/api/projects/${t.demo.projectId}/plan`)
      .query({ dataset: hindcastId, from: '2024-01-01T00:00:00Z', to: '2024-02-15T00:00:00Z' });
    expect(long.status).toBe(400);
    expect(long.body.error.details[0].field).toBe('to');
    const chosen = await as.coordinator
      .get(`/api/projects/${t.demo.projectId}/plan`)
      .query({ dataset: hindcastId, from: '2024-01-10T00:00:00Z', to: '2024-01-12T00:00:00Z' });
    expect(chosen.status).toBe(200);
    expect(chosen.body.plans[0].times.length).toBe(49);
  });

  it('does not key a hindcast plan by the clock minute: a later request reuses the kept answer', async () => {
    await as.coordinator.get(`/api/projects/${t.demo.projectId}/plan`).query({ dataset: hindcastId, alpha: 'false' });
    const held = encodedAnswerBytes(t.database.db);
    expect(held).toBeGreaterThan(0);
    const saved = now;
    try {
      for (const minutes of [3, 7, 11]) {
        now = new Date(saved.getTime() + minutes * 60_000);
        const res = await as.coordinator.get(`/api/projects/${t.demo.projectId}/plan`).query({ dataset: hindcastId, alpha: 'false' });
        expect(res.status).toBe(200);
      }
    } finally {
      now = saved;
    }
    expect(encodedAnswerBytes(t.database.db)).toBe(held);
  });

  it('keeps a cache within its byte budget whatever the number of entries (lru-cache maxSize)', async () => {
    const memo = new ByteBoundedMemo<Buffer>(1000, (b) => b.byteLength);
    for (let i = 0; i < 50; i++) await memo.get(`k${i}`, async () => Buffer.alloc(90));
    expect(memo.bytes).toBeLessThanOrEqual(1000);
    expect(memo.bytes).toBeGreaterThan(800);
    // One value larger than the whole budget is answered but not kept.
    const big = await memo.get('big', async () => Buffer.alloc(5000));
    expect(big.byteLength).toBe(5000);
    expect(memo.bytes).toBeLessThanOrEqual(1000);
    // Concurrent askers share one computation.
    let runs = 0;
    await Promise.all([1, 2, 3].map(() => memo.get('shared', async () => (runs++, Buffer.alloc(10)))));
    expect(runs).toBe(1);
  });
});

describe('3. heavy reads are bounded and limited per user', () => {
  let longId: string;
  beforeAll(async () => {
    const res = await upload(as.coordinator, t.demo.projectId, hourlyCsv(Date.UTC(2023, 0, 1), 400 * 24));
    expect(res.status, res.text.slice(0, 300)).toBe(201);
    longId = res.body.id;
  }, 120_000);

  it('refuses a records read longer than 366 days, naming the field, and answers a shorter one', async () => {
    const base = `/api/projects/${t.demo.projectId}/datasets/${longId}/records`;
    const all = await as.client.get(base);
    expect(all.status).toBe(400);
    expect(all.body.error.details[0].field).toBe('to');
    const month = await as.client.get(base).query({ from: '2023-03-01T00:00:00Z', to: '2023-03-31T23:00:00Z' });
    expect(month.status).toBe(200);
    expect(month.body.time.length).toBe(31 * 24);
  });

  it('answers conditions on a long dataset for at most 31 days', async () => {
    const res = await as.client.get(`/api/projects/${t.demo.projectId}/conditions/${siteId}`).query({ dataset: longId });
    expect(res.status, res.text.slice(0, 200)).toBe(200);
    expect(res.body.times.length).toBeLessThanOrEqual(31 * 24 + 1);
  });

  it('passes each heavy read of a user through the limiter, at most two at once; the rest wait and are answered', async () => {
    const limiter = new Limiter({ concurrency: 2, queue: 16, busyMessage: 'busy' });
    const app = createApp(t.deps, { heavyReads: limiter });
    const client = await signIn(app, 'client@example.com');
    const base = `/api/projects/${t.demo.projectId}/datasets/${longId}`;
    const answers = await Promise.all(
      Array.from({ length: 6 }, (_, i) =>
        client
          .get(`${base}/records`)
          .query({ from: new Date(Date.UTC(2023, i, 1)).toISOString(), to: new Date(Date.UTC(2023, i, 28)).toISOString() }),
      ),
    );
    expect(answers.map((a) => a.status)).toEqual([200, 200, 200, 200, 200, 200]);
    // Every read went through the limiter, never more than two at once.
    expect(limiter.peak).toBeGreaterThanOrEqual(1);
    expect(limiter.peak).toBeLessThanOrEqual(2);
  });

  it('refuses with 429 beyond the waiting room, per user, and frees slots when work ends', async () => {
    const limiter = new Limiter({ concurrency: 1, queue: 1, busyMessage: 'busy' });
    let release!: () => void;
    const gate = new Promise<void>((r) => (release = r));
    const first = limiter.run('u1', () => gate);
    const second = limiter.run('u1', async () => 'second');
    await expect(limiter.run('u1', async () => 'third')).rejects.toMatchObject({ status: 429 });
    // Another user is not held up.
    await expect(limiter.run('u2', async () => 'other')).resolves.toBe('other');
    release();
    await first;
    await expect(second).resolves.toBe('second');
    await expect(limiter.run('u1', async () => 'again')).resolves.toBe('again');
  });
});

describe('4. the auth routes read at most 64 kB', () => {
  it('answers 413 to a 1 MB body on sign-out and sign-in, in the JSON error shape', async () => {
    const big = JSON.stringify({ email: 'a@example.com', password: 'x', pad: 'y'.repeat(1024 * 1024) });
    for (const url of ['/api/auth/sign-out', SIGN_IN]) {
      const res = await request(t.app).post(url).set('Origin', TEST_ORIGIN).set('content-type', 'application/json').send(big);
      expect(res.status, url).toBe(413);
      expect(res.body.error.code, url).toBe('too_large');
    }
    // The ordinary sign-in still works.
    expect(
      (await request(t.app).post(SIGN_IN).set('Origin', TEST_ORIGIN).send({ email: 'client@example.com', password: DEMO_PASSWORD })).status,
    ).toBe(200);
  });
});

describe('5. the demo accounts stay on this machine', () => {
  const dirs: string[] = [];
  afterAll(() => {
    for (const d of dirs) fs.rmSync(d, { recursive: true, force: true });
  });
  const env = (extra: Record<string, string>) => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lullwatch-host-'));
    dirs.push(dir);
    return loadEnv({
      NODE_ENV: 'test',
      DATA_DIR: dir,
      PORT: '0',
      DEMO_HINDCAST_YEARS: '0',
      JOBS_ENABLED: 'false',
      SEED_DEMO: 'true',
      ...extra,
    });
  };

  it('knows loopback addresses', () => {
    expect(['127.0.0.1', '127.1.2.3', 'localhost', '::1', '[::1]'].every(isLoopback)).toBe(true);
    expect(['0.0.0.0', '::', '192.0.2.1', '10.0.0.1'].some(isLoopback)).toBe(false);
  });

  it('listens on 127.0.0.1 by default with the demo seeded, and refuses 0.0.0.0 while the demo password works', async () => {
    const local = await startLullwatch(env({}), silentLogger);
    try {
      expect(local.host).toBe('127.0.0.1');
    } finally {
      await local.close();
    }
    await expect(startLullwatch(env({ HOST: '0.0.0.0' }), silentLogger)).rejects.toThrow(
      /Refusing to listen on 0\.0\.0\.0.*SEED_DEMO=false/s,
    );
  }, 180_000);

  it('listens on every address by default without the demo', async () => {
    const running = await startLullwatch(env({ SEED_DEMO: 'false' }), silentLogger);
    try {
      expect(running.host).toBe('0.0.0.0');
    } finally {
      await running.close();
    }
  }, 120_000);
});

describe('6 and 7. no renaming oneself, no impersonation, identity in the audit trail', () => {
  it('answers 404 to update-user and the admin plugin’s routes, and the name stays', async () => {
    const attempts: [Agent, string, object][] = [
      [as.skipper, '/api/auth/update-user', { name: 'Demo Administrator' }],
      [as.skipper, '/api/auth/update-user', { name: 'line\r\nbreak\u202E' }],
      [as.admin, '/api/auth/admin/impersonate-user', { userId: t.demo.users.skipper }],
      [as.admin, '/api/auth/admin/stop-impersonating', {}],
      [as.admin, '/api/auth/admin/create-user', { email: 'root@example.com', password: 'a-long-password-123', name: 'Root', role: 'root' }],
      [as.admin, '/api/auth/admin/set-role', { userId: t.demo.users.skipper, role: 'anything at all' }],
    ];
    for (const [agent, url, body] of attempts) {
      const res = await agent.post(url).set('Origin', TEST_ORIGIN).send(body);
      expect(res.status, url).toBe(404);
    }
    const [skipper] = await t.database.db.select().from(user).where(eq(user.id, t.demo.users.skipper));
    expect(skipper.name).toBe('Demo Skipper');
    expect(skipper.role).not.toBe('anything at all');
    expect(await t.database.db.select().from(user).where(eq(user.email, 'root@example.com'))).toEqual([]);
  });

  it('shows the e-mail and id of whoever made each audited change', async () => {
    await as.coordinator.patch(`/api/projects/${t.demo.projectId}/sites/${siteId}`).send({ breakerIndex: 0.62 });
    const res = await as.client.get(`/api/projects/${t.demo.projectId}/audit`).query({ entity: 'worksite' });
    expect(res.status).toBe(200);
    const entry = res.body.find((e: { entityId: string }) => e.entityId === siteId);
    expect(entry).toMatchObject({ userId: t.demo.users.coordinator, userEmail: 'coordinator@example.com' });
  });
});

describe('8. a deactivated account’s right password gets the wrong-password answer, byte for byte', () => {
  it('answers the same text (same key order) as an unknown e-mail', async () => {
    const created = await as.admin.post('/api/admin/users').send({ name: 'Gone Deckhand', email: 'gone@example.com' });
    expect(created.status).toBe(201);
    expect((await as.admin.patch(`/api/admin/users/${created.body.user.id}`).send({ active: false })).status).toBe(200);
    const unknown = await request(t.app)
      .post(SIGN_IN)
      .set('Origin', TEST_ORIGIN)
      .send({ email: 'nobody-at-all@example.com', password: 'not-the-password' });
    const deactivated = await request(t.app)
      .post(SIGN_IN)
      .set('Origin', TEST_ORIGIN)
      .send({ email: 'gone@example.com', password: created.body.temporaryPassword });
    expect(unknown.status).toBe(401);
    expect(deactivated.status).toBe(401);
    expect(deactivated.text).toBe(unknown.text);
  });
});

describe('9. malformed requests are client errors, never 500', () => {
  it('answers 400 to a bad percent-escape in the path', async () => {
    const res = await as.coordinator.get('/api/projects/%E0%A4%A');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation');
  });

  it('answers 415 to an unknown charset', async () => {
    const res = await as.coordinator
      .post('/api/projects')
      .set('content-type', 'application/json; charset=x-no-such-charset')
      .send('{"name":"x"}');
    expect(res.status).toBe(415);
  });

  it('answers 400 or 413 to 100,000-deep JSON, on the API and on the auth routes', async () => {
    const deep = '['.repeat(100_000) + ']'.repeat(100_000);
    for (const url of ['/api/projects', SIGN_IN]) {
      const res = await as.coordinator.post(url).set('Origin', TEST_ORIGIN).set('content-type', 'application/json').send(deep);
      expect([400, 413], `${url}: ${res.status} ${res.text.slice(0, 200)}`).toContain(res.status);
    }
  });

  it('answers 404 to a job token of the right length in characters but not in bytes', async () => {
    const config = t.deps.config;
    const before = config.jobToken;
    config.jobToken = 'a'.repeat(32);
    try {
      for (const token of ['é'.repeat(32), 'é'.repeat(31), 'é'.repeat(33), 'ä'.repeat(16)]) {
        for (const url of ['/api/internal/jobs/plan', '/api/internal/backup']) {
          const res = await request(t.app).post(url).set('x-lullwatch-job-token', encodeURIComponent(token)).send({});
          expect(res.status, `${url} ${token.length}`).toBe(404);
          // Raw UTF-8 bytes in the header, as the probe sent them.
          const raw = await request(t.app).post(url).set('x-lullwatch-job-token', Buffer.from(token, 'utf8').toString('latin1')).send({});
          expect(raw.status, `${url} raw ${token.length}`).toBe(404);
        }
      }
    } finally {
      config.jobToken = before;
    }
  });
});

describe('10. one-click unsubscribe (RFC 8058)', () => {
  const linkFor = (userId: string, atMs: number) =>
    unsubscribeUrl(TEST_ORIGIN, t.deps.config.linkSecret, userId, t.demo.projectId, atMs).replace(TEST_ORIGIN, '');
  const subscribe = () =>
    as.skipper
      .put(`/api/projects/${t.demo.projectId}/subscription`)
      .send({ operationIds: [], siteIds: [], immediate: true, digest: false, digestTime: '06:00', digestTimeZone: 'UTC', active: true });
  const active = async () => (await as.skipper.get(`/api/projects/${t.demo.projectId}/subscription`)).body.active as boolean;

  it('changes nothing on GET or HEAD (a link scanner), shows a button, and unsubscribes on POST', async () => {
    expect((await subscribe()).status).toBe(200);
    const link = linkFor(t.demo.users.skipper, now.getTime());
    const page = await request(t.app).get(link);
    expect(page.status).toBe(200);
    expect(page.text).toMatch(/<form\b[^>]*\bmethod="post"/);
    expect((await request(t.app).head(link)).status).toBe(200);
    expect(await active()).toBe(true);
    // What a mail program sends (RFC 8058 section 3.1: POST with List-Unsubscribe=One-Click).
    const post = await request(t.app).post(link).type('form').send('List-Unsubscribe=One-Click');
    expect(post.status).toBe(200);
    expect(post.text).toContain('Unsubscribed');
    expect(await active()).toBe(false);
  });

  it('refuses a link past its expiry (60 days)', async () => {
    expect((await subscribe()).status).toBe(200);
    const old = linkFor(t.demo.users.skipper, now.getTime() - 61 * DAY);
    for (const res of [await request(t.app).get(old), await request(t.app).post(old)]) {
      expect(res.status).toBe(400);
      expect(res.text).toContain('expired');
    }
    expect(await active()).toBe(true);
  });

  it('keeps links out of the outbox view, and puts a fresh one with the RFC 8058 headers into the sent e-mail', async () => {
    await t.database.db.delete(outbox);
    await enqueueMail(
      t.database.db,
      [
        {
          idempotencyKey: `probe-${Date.now()}`,
          projectId: t.demo.projectId,
          userId: t.demo.users.skipper,
          toEmail: 'skipper@example.com',
          subject: 'Probe alert',
          text: `Hello\nStop these e-mails: ${UNSUBSCRIBE_LINK_MARK}`,
          html: `<a href="${UNSUBSCRIBE_LINK_MARK}">Stop</a>`,
        },
      ],
      now,
    );
    const view = await as.coordinator.get(`/api/projects/${t.demo.projectId}/outbox`);
    expect(view.status).toBe(200);
    expect(view.text).not.toContain('/api/unsubscribe');
    expect(view.text).not.toContain(UNSUBSCRIBE_LINK_MARK);
    expect((await listOutbox(t.database.db, t.demo.projectId))[0].text).toContain('unsubscribe link');
    const before = t.mailer.fake!.messages.length;
    const sent = await deliverDueMail(t.database.db, t.mailer, now, { maxAttempts: 3, log: silentLogger, links: t.deps.config });
    expect(sent.sent).toBe(1);
    const mail = t.mailer.fake!.messages.at(-1)!;
    expect(t.mailer.fake!.messages.length).toBe(before + 1);
    expect(mail.text).toMatch(/Stop these e-mails: http:\/\/localhost:3000\/api\/unsubscribe\?u=.+&e=\d+&sig=/);
    expect(mail.listUnsubscribe).toContain('/api/unsubscribe?');
    expect(mail.listUnsubscribePost).toBe('List-Unsubscribe=One-Click');
  });
});

describe('11. clients see confirmed ledger figures only', () => {
  it('gives clients no proposed hours or limiting factor of a corrected day', async () => {
    await t.database.db.insert(ledgerDay).values({
      projectId: t.demo.projectId,
      operationId,
      siteId,
      day: '2025-03-03',
      plannedHours: 24,
      proposedLostHours: 9,
      proposedLimiting: 'hs',
      lostHours: 4,
      limiting: 'wind',
      note: 'crew saw it',
      source: 'observation',
      status: 'confirmed',
      confirmedAt: new Date(),
    });
    const range = { from: '2025-03-03', to: '2025-03-03' };
    const client = await as.client.get(`/api/projects/${t.demo.projectId}/ledger`).query(range);
    expect(client.status).toBe(200);
    const mine = client.body.find((e: { siteId: string }) => e.siteId === siteId);
    expect(mine).toMatchObject({ lostHours: 4, limiting: 'wind', proposedLostHours: null, proposedLimiting: null });
    const coordinator = await as.coordinator.get(`/api/projects/${t.demo.projectId}/ledger`).query(range);
    expect(coordinator.body.find((e: { siteId: string }) => e.siteId === siteId)).toMatchObject({
      proposedLostHours: 9,
      proposedLimiting: 'hs',
    });
  });
});

describe('12. sessions and passwords', () => {
  it('refuses short and trivially weak passwords (NIST SP 800-63B 5.1.1.2, from memory)', () => {
    for (const pw of [
      'short-1',
      'password1234',
      'Password123!',
      'aaaaaaaaaaaaaa',
      '123456789012',
      'abcdefghijklm',
      'qwertyuiopas',
      'lullwatchlullwatch',
    ]) {
      expect(passwordProblem(pw), pw).not.toBeNull();
    }
    expect(passwordProblem('skipper@example.com', { email: 'skipper@example.com' })).not.toBeNull();
    for (const pw of ['lullwatch-demo', 'correct horse battery', 'tide-Kelp-7-harbour']) expect(passwordProblem(pw), pw).toBeNull();
  });

  it('changes a password with the auth library’s change-password, ends the other sessions, and returns no token', async () => {
    const created = await as.admin.post('/api/admin/users').send({ name: 'Probe Mate', email: 'mate@example.com' });
    const temp = created.body.temporaryPassword as string;
    const laptop = await signIn(t.app, 'mate@example.com', temp);
    const phone = await signIn(t.app, 'mate@example.com', temp);
    const weak = await laptop
      .post('/api/auth/change-password')
      .set('Origin', TEST_ORIGIN)
      .send({ currentPassword: temp, newPassword: 'password1234' });
    expect(weak.status).toBe(400);
    const tooShort = await laptop
      .post('/api/auth/change-password')
      .set('Origin', TEST_ORIGIN)
      .send({ currentPassword: temp, newPassword: 'tide-7-kelp' });
    expect(tooShort.status).toBe(400);
    const ok = await laptop
      .post('/api/auth/change-password')
      .set('Origin', TEST_ORIGIN)
      .send({ currentPassword: temp, newPassword: 'tide-Kelp-7-harbour', revokeOtherSessions: false });
    expect(ok.status, ok.text).toBe(200);
    expect(ok.text).not.toMatch(/"token"/);
    // OWASP Session Management Cheat Sheet: sessions end when the password changes (from memory).
    expect((await phone.get('/api/me')).status).toBe(401);
    expect((await laptop.get('/api/me')).status).toBe(200);
    expect((await request(t.app).post(SIGN_IN).set('Origin', TEST_ORIGIN).send({ email: 'mate@example.com', password: temp })).status).toBe(
      401,
    );
    expect(
      (await request(t.app).post(SIGN_IN).set('Origin', TEST_ORIGIN).send({ email: 'mate@example.com', password: 'tide-Kelp-7-harbour' }))
        .status,
    ).toBe(200);
  });

  it('requires a temporary password to be changed before anything else', async () => {
    const created = await as.admin.post('/api/admin/users').send({ name: 'Probe Bosun', email: 'bosun@example.com' });
    expect(created.body.user).toMatchObject({ mustChangePassword: true });
    const temp = created.body.temporaryPassword as string;
    const bosun = await signIn(t.app, 'bosun@example.com', temp);
    const me = await bosun.get('/api/me');
    expect(me.status).toBe(200);
    expect(me.body.mustChangePassword).toBe(true);
    const projects = await bosun.get('/api/projects');
    expect(projects.status).toBe(403);
    expect(projects.body.error.code).toBe('password_change_required');
    const changed = await bosun
      .post('/api/auth/change-password')
      .set('Origin', TEST_ORIGIN)
      .send({ currentPassword: temp, newPassword: 'bosun-Chain-locker-42' });
    expect(changed.status, changed.text).toBe(200);
    expect((await bosun.get('/api/me')).body.mustChangePassword).toBe(false);
    expect((await bosun.get('/api/projects')).status).toBe(200);
  });

  it('lets a temporary password expire after 7 days, and an administrator issue a new one', async () => {
    const created = await as.admin.post('/api/admin/users').send({ name: 'Probe Cook', email: 'cook@example.com' });
    const expires = Date.parse(created.body.user.temporaryPasswordExpiresAt);
    expect(expires - now.getTime()).toBeGreaterThan(7 * DAY - 60_000);
    expect(expires - now.getTime()).toBeLessThanOrEqual(7 * DAY);
    await t.database.db
      .update(user)
      .set({ temporaryPasswordExpiresAt: new Date(Date.now() - 1000) })
      .where(eq(user.id, created.body.user.id));
    const late = await request(t.app)
      .post(SIGN_IN)
      .set('Origin', TEST_ORIGIN)
      .send({ email: 'cook@example.com', password: created.body.temporaryPassword });
    expect(late.status).toBe(401);
    expect(late.body.code).toBe('TEMPORARY_PASSWORD_EXPIRED');
    expect(late.headers['set-cookie']).toBeUndefined();
    const fresh = await as.admin.post(`/api/admin/users/${created.body.user.id}/temporary-password`).send({});
    expect(fresh.status, fresh.text).toBe(200);
    expect(fresh.body.temporaryPassword).not.toBe(created.body.temporaryPassword);
    expect(
      (
        await request(t.app)
          .post(SIGN_IN)
          .set('Origin', TEST_ORIGIN)
          .send({ email: 'cook@example.com', password: fresh.body.temporaryPassword })
      ).status,
    ).toBe(200);
  });

  it('backs off one account after five attempts, without locking out others at the same address', async () => {
    const attempt = (email: string, password: string) => request(t.app).post(SIGN_IN).set('Origin', TEST_ORIGIN).send({ email, password });
    for (let i = 0; i < 5; i++) expect((await attempt('coordinator@example.com', `wrong-password-${i}`)).status).toBe(401);
    const sixth = await attempt('coordinator@example.com', DEMO_PASSWORD);
    expect(sixth.status).toBe(429);
    expect(sixth.body.code).toBe('TOO_MANY_ATTEMPTS');
    expect(Number(sixth.headers['retry-after'])).toBeGreaterThan(0);
    // The same address, another account: signs in.
    expect((await attempt('client@example.com', DEMO_PASSWORD)).status).toBe(200);
    // An unknown e-mail backs off the same way (no hint which accounts exist).
    for (let i = 0; i < 5; i++) await attempt('nobody-at-all-2@example.com', 'wrong');
    expect((await attempt('nobody-at-all-2@example.com', 'wrong')).status).toBe(429);
  });
});

describe('13. uploads', () => {
  it('keeps the upload folder at 0700 (tightening a looser one) and each upload at 0600', async () => {
    ensurePrivateDir(UPLOAD_DIR);
    fs.chmodSync(UPLOAD_DIR, 0o755);
    const res = await upload(as.coordinator, t.demo.projectId, hourlyCsv(Date.UTC(2022, 0, 1), 24));
    expect(res.status, res.text).toBe(201);
    expect(fs.statSync(UPLOAD_DIR).mode & 0o777).toBe(0o700);
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lullwatch-private-'));
    try {
      const stored = await new Promise<{ path: string; size?: number }>((resolve, reject) =>
        privateDiskStorage(dir)._handleFile({} as never, { stream: Readable.from([Buffer.from('time,hs\n')]) } as never, (err, info) =>
          err ? reject(err) : resolve(info as { path: string }),
        ),
      );
      expect(fs.statSync(stored.path).mode & 0o777).toBe(0o600);
      expect(stored.size).toBe(8);
    } finally {
      fs.rmSync(dir, { recursive: true, force: true });
    }
  });

  it('runs one import at a time in a process; the others wait and succeed', async () => {
    importLimiter.peak = 0;
    const answers = await Promise.all(
      [0, 1, 2].map((i) => upload(as.coordinator, t.demo.projectId, hourlyCsv(Date.UTC(2021, i, 1), 24 * 20))),
    );
    expect(answers.map((a) => a.status)).toEqual([201, 201, 201]);
    expect(importLimiter.peak).toBe(1);
  }, 60_000);

  it('refuses a dataset name of two lines, naming the field', async () => {
    const res = await upload(as.coordinator, t.demo.projectId, hourlyCsv(Date.UTC(2022, 5, 1), 24), { name: 'Two\nlines' });
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].field).toBe('name');
  });
});

describe('14. API answers are never cached', () => {
  it('sends Cache-Control: no-store on answers, errors and the auth routes', async () => {
    for (const res of [
      await as.client.get('/api/projects'),
      await request(t.app).get('/api/health'),
      await request(t.app).get('/api/projects'),
      await as.client.get('/api/no-such-route'),
      await request(t.app)
        .post(SIGN_IN)
        .set('Origin', TEST_ORIGIN)
        .send({ email: 'nobody-3@example.com', password: 'x'.repeat(12) }),
    ]) {
      expect(res.headers['cache-control'], `${res.status} ${res.text.slice(0, 80)}`).toBe('no-store');
    }
  });
});
