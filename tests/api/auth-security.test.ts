// Sign-in and session security on the real app (real PGlite, no mocks): the sign-in rate limit,
// the session cookie's flags, refusal of cross-site state-changing requests, no account
// enumeration, and sessions that end on sign-out and on deactivation.
//
// The sources named beside each check are cited from memory, not quoted from the documents.
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import request from 'supertest';
import { eq } from 'drizzle-orm';
import type { Express } from 'express';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { CLIENT_IP_HEADER } from '../../server/auth';
import { session, user } from '../../server/db/schema/auth';
import { DEMO_PASSWORD } from '../../seed/scenario';
import { createTestApp, signIn, signInAll, TEST_ORIGIN, type TestApp } from '../support/app';

const SIGN_IN = '/api/auth/sign-in/email';
const EVIL_ORIGIN = 'http://evil.example';

interface RawAnswer {
  status: number;
  headers: http.IncomingHttpHeaders;
  body: unknown;
}

interface Listening {
  port: number;
  close(): Promise<void>;
}

/** Serves an app on a real socket so a request can come from another loopback address. */
async function listen(app: Express): Promise<Listening> {
  const server = http.createServer(app);
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  return {
    port: (server.address() as AddressInfo).port,
    close: () =>
      new Promise<void>((resolve) => {
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}

/** POSTs JSON from `localAddress` (any 127.x.y.z reaches the loopback interface on Linux). */
function postFrom(
  port: number,
  localAddress: string,
  path: string,
  json: unknown,
  headers: Record<string, string> = {},
): Promise<RawAnswer> {
  const payload = JSON.stringify(json);
  return new Promise((resolve, reject) => {
    const req = http.request(
      {
        host: '127.0.0.1',
        port,
        path,
        method: 'POST',
        localAddress,
        agent: false,
        headers: { 'content-type': 'application/json', 'content-length': Buffer.byteLength(payload), origin: TEST_ORIGIN, ...headers },
      },
      (res) => {
        let text = '';
        res.setEncoding('utf8');
        res.on('data', (chunk: string) => (text += chunk));
        res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body: text ? JSON.parse(text) : null }));
      },
    );
    req.on('error', reject);
    req.end(payload);
  });
}

/** The Set-Cookie lines of an answer, split into name, value and lower-cased attributes. */
function parseSetCookies(header: string | string[] | undefined) {
  const lines = header === undefined ? [] : Array.isArray(header) ? header : [header];
  return lines.map((line) => {
    const [pair, ...attrs] = line.split(';').map((s) => s.trim());
    const eqAt = pair.indexOf('=');
    const attributes = new Map<string, string>();
    for (const a of attrs) {
      const at = a.indexOf('=');
      attributes.set((at < 0 ? a : a.slice(0, at)).toLowerCase(), at < 0 ? '' : a.slice(at + 1));
    }
    return { name: pair.slice(0, eqAt), value: pair.slice(eqAt + 1), attributes };
  });
}

/**
 * An app with a sign-in limit of `limit` attempts a minute, served on a real socket (`serve` makes
 * the served app from the test app; by default the test app itself): one `beforeAll` starts it, one
 * `afterAll` closes it. Read its fields inside tests.
 */
function useRateLimitedServer(limit: number, serve: (t: TestApp) => Express = (t) => t.app) {
  const running = {} as { t: TestApp; server: Listening };
  beforeAll(async () => {
    running.t = await createTestApp({ signInPerMinute: limit });
    running.server = await listen(serve(running.t));
  });
  afterAll(async () => {
    await running.server?.close();
    await running.t?.close();
  });
  return running;
}

/** The `name=value` of the session cookie set by a sign-in answer. */
function sessionCookieOf(res: { headers: Record<string, unknown> }): string {
  const cookie = parseSetCookies(res.headers['set-cookie'] as string[] | undefined).find((c) => c.name.endsWith('lullwatch.session_token'));
  if (!cookie) throw new Error('no session cookie in the answer');
  return `${cookie.name}=${cookie.value}`;
}

describe('sign-in rate limit per client address', () => {
  // OWASP Authentication Cheat Sheet ("Protect against automated attacks": rate limiting) and
  // OWASP ASVS V2.2.1 (anti-automation on authentication), cited from memory.
  const LIMIT = 3;
  const app = useRateLimitedServer(LIMIT);

  it('answers 429 after the configured number of attempts, even to the right password', async () => {
    for (let i = 0; i < LIMIT; i++) {
      const res = await postFrom(app.server.port, '127.0.0.1', SIGN_IN, { email: 'coordinator@example.com', password: 'wrong-password-1' });
      expect(res.status, `attempt ${i + 1}`).toBe(401);
    }
    const blocked = await postFrom(app.server.port, '127.0.0.1', SIGN_IN, {
      email: 'coordinator@example.com',
      password: 'wrong-password-1',
    });
    expect(blocked.status).toBe(429);
    expect(Number(blocked.headers['x-retry-after'])).toBeGreaterThan(0);
    // Blocked means blocked: the right password gets no session either, so guessing cannot go on.
    const right = await postFrom(app.server.port, '127.0.0.1', SIGN_IN, { email: 'coordinator@example.com', password: DEMO_PASSWORD });
    expect(right.status).toBe(429);
    expect(right.headers['set-cookie']).toBeUndefined();
  });

  it('counts per address across e-mails (password spraying from one address is caught too)', async () => {
    const emails = ['a@example.com', 'b@example.com', 'c@example.com', 'd@example.com'];
    const statuses: number[] = [];
    for (const email of emails)
      statuses.push((await postFrom(app.server.port, '127.0.0.3', SIGN_IN, { email, password: 'wrong-password-2' })).status);
    expect(statuses).toEqual([401, 401, 401, 429]);
  });

  it('does not let a blocked client escape by sending its own client-address or forwarding headers', async () => {
    const attempts: Record<string, string>[] = [
      { [CLIENT_IP_HEADER]: '203.0.113.7' },
      { 'x-forwarded-for': '203.0.113.8' },
      { 'x-real-ip': '203.0.113.9' },
      { [CLIENT_IP_HEADER]: '203.0.113.10', 'x-forwarded-for': '203.0.113.10' },
    ];
    for (const headers of attempts) {
      const res = await postFrom(
        app.server.port,
        '127.0.0.1',
        SIGN_IN,
        { email: 'coordinator@example.com', password: DEMO_PASSWORD },
        headers,
      );
      expect(res.status, JSON.stringify(headers)).toBe(429);
    }
  });

  it('does not block another client address', async () => {
    // Another account: the coordinator's own account is now in its per-account back-off after
    // the attempts above (tests/api/probe-findings.test.ts covers that back-off).
    const res = await postFrom(app.server.port, '127.0.0.2', SIGN_IN, { email: 'skipper@example.com', password: DEMO_PASSWORD });
    expect(res.status).toBe(200);
    expect(sessionCookieOf(res)).toMatch(/session_token=/);
  });

  it('keeps the count in the database, so a second app instance on the same database also refuses', async () => {
    // DEVELOPERS.md "Sign-in rate limits in the database (several instances share them)".
    const other = createApp(app.t.deps);
    const res = await request(other)
      .post(SIGN_IN)
      .set('Origin', TEST_ORIGIN)
      .send({ email: 'coordinator@example.com', password: DEMO_PASSWORD });
    expect(res.status).toBe(429);
  });
});

describe('sign-in rate limit behind a trusted proxy', () => {
  const LIMIT = 3;
  // The proxy is on loopback; the client address is the nearest untrusted hop in X-Forwarded-For.
  const app = useRateLimitedServer(LIMIT, (t) => createApp(t.deps, { trustProxy: 'loopback' }));

  it('keys the limit on the forwarded client, and a forged leftmost address changes nothing', async () => {
    const attempt = (forwardedFor: string) =>
      postFrom(
        app.server.port,
        '127.0.0.1',
        SIGN_IN,
        { email: 'skipper@example.com', password: 'wrong-password-3' },
        { 'x-forwarded-for': forwardedFor },
      );
    for (let i = 0; i < LIMIT; i++) expect((await attempt('198.51.100.20')).status).toBe(401);
    expect((await attempt('198.51.100.20')).status).toBe(429);
    // A client cannot prepend an address of its choice: the proxy appends the real one last.
    expect((await attempt('203.0.113.99, 198.51.100.20')).status).toBe(429);
    // Another client behind the same proxy is not blocked (another account: this one is in its
    // per-account back-off after five attempts).
    const other = await postFrom(
      app.server.port,
      '127.0.0.1',
      SIGN_IN,
      { email: 'client@example.com', password: 'wrong-password-3' },
      { 'x-forwarded-for': '198.51.100.21' },
    );
    expect(other.status).toBe(401);
  });
});

describe('session cookie flags', () => {
  // RFC 6265bis (HttpOnly, Secure, SameSite, the __Secure- prefix) and the OWASP Session
  // Management Cheat Sheet ("Cookies": Secure, HttpOnly, SameSite, Path, no broad Domain),
  // cited from memory.
  let plain: TestApp;
  let secure: TestApp;

  beforeAll(async () => {
    [plain, secure] = await Promise.all([createTestApp(), createTestApp({ secureCookies: true })]);
  });
  afterAll(async () => {
    await Promise.all([plain?.close(), secure?.close()]);
  });

  const signInAnswer = (app: Express) =>
    request(app).post(SIGN_IN).set('Origin', TEST_ORIGIN).send({ email: 'client@example.com', password: DEMO_PASSWORD });

  it('sets HttpOnly, SameSite=Lax, Path=/ and no Domain on plain http (development), without Secure', async () => {
    const res = await signInAnswer(plain.app);
    expect(res.status).toBe(200);
    const cookies = parseSetCookies(res.headers['set-cookie']);
    const token = cookies.find((c) => c.name === 'lullwatch.session_token');
    expect(token, res.headers['set-cookie']?.toString()).toBeDefined();
    for (const c of cookies) {
      expect(c.attributes.has('httponly'), c.name).toBe(true);
      expect(c.attributes.get('samesite')?.toLowerCase(), c.name).toMatch(/^(lax|strict)$/);
      expect(c.attributes.get('path'), c.name).toBe('/');
      // Host-only: no Domain attribute, so sibling hosts do not receive it.
      expect(c.attributes.has('domain'), c.name).toBe(false);
      expect(c.attributes.has('secure'), c.name).toBe(false);
    }
    // Lifetime: the configured 7 days at most.
    expect(Number(token!.attributes.get('max-age'))).toBeLessThanOrEqual(7 * 24 * 3600);
  });

  it('adds Secure and the __Secure- name prefix when secure cookies are on (https)', async () => {
    const res = await signInAnswer(secure.app);
    expect(res.status).toBe(200);
    const cookies = parseSetCookies(res.headers['set-cookie']);
    expect(cookies.map((c) => c.name)).toContain('__Secure-lullwatch.session_token');
    for (const c of cookies) {
      expect(c.name.startsWith('__Secure-'), c.name).toBe(true);
      expect(c.attributes.has('secure'), c.name).toBe(true);
      expect(c.attributes.has('httponly'), c.name).toBe(true);
      expect(c.attributes.get('samesite')?.toLowerCase(), c.name).toMatch(/^(lax|strict)$/);
      expect(c.attributes.get('path'), c.name).toBe('/');
      expect(c.attributes.has('domain'), c.name).toBe(false);
    }
  });

  it('issues a fresh session token on every sign-in, ignoring a session cookie sent with it', async () => {
    // OWASP Session Management Cheat Sheet ("Renew the Session ID After Any Privilege Level
    // Change"): session fixation, cited from memory.
    const first = sessionCookieOf(await signInAnswer(plain.app));
    const second = await request(plain.app)
      .post(SIGN_IN)
      .set('Origin', TEST_ORIGIN)
      .set('Cookie', first)
      .send({ email: 'client@example.com', password: DEMO_PASSWORD });
    expect(second.status).toBe(200);
    expect(sessionCookieOf(second)).not.toBe(first);
  });

  it('keeps the raw session token out of the sign-in answer, and does not accept the bare token as a credential', async () => {
    // The auth library returns the session token in the JSON body; the app strips it (a script
    // on the page could read it there, never from the HttpOnly cookie). Without the bearer
    // plugin, only the signed cookie authenticates: the bare token (the cookie's value before
    // its signature) does not.
    const res = await signInAnswer(plain.app);
    expect(res.body).not.toHaveProperty('token');
    expect(res.text).not.toMatch(/"token"/);
    const token = decodeURIComponent(sessionCookieOf(res).split('=')[1]).split('.')[0];
    expect(token.length).toBeGreaterThan(16);
    expect((await request(plain.app).get('/api/me').set('Authorization', `Bearer ${token}`)).status).toBe(401);
    expect((await request(plain.app).get('/api/me').set('Cookie', `lullwatch.session_token=${token}`)).status).toBe(401);
    expect((await request(plain.app).get('/api/me').set('Cookie', sessionCookieOf(res))).status).toBe(200);
  });
});

describe('cross-site state-changing requests', () => {
  // OWASP Cross-Site Request Forgery Prevention Cheat Sheet ("Verifying Origin With Standard
  // Headers", "Fetch Metadata headers", SameSite cookies as defence in depth), cited from memory.
  let t: TestApp;
  let as: Awaited<ReturnType<typeof signInAll>>;

  beforeAll(async () => {
    t = await createTestApp({ enforceOriginCheck: true });
    as = await signInAll(t.app);
  });
  afterAll(async () => {
    await t?.close();
  });

  const projectNames = async () => ((await as.coordinator.get('/api/projects')).body as { name: string }[]).map((p) => p.name);

  it('refuses a POST from another origin with 403 and creates nothing', async () => {
    const res = await as.coordinator.post('/api/projects').set('Origin', EVIL_ORIGIN).send({ name: 'Forged from elsewhere' });
    expect(res.status).toBe(403);
    expect(res.body).toEqual({ error: { code: 'forbidden', message: expect.stringMatching(/another site/), details: null } });
    expect(await projectNames()).not.toContain('Forged from elsewhere');
  });

  it('refuses PUT, PATCH and DELETE from another origin and changes nothing', async () => {
    const before = (await as.coordinator.get(`/api/projects/${t.demo.projectId}`)).body as Record<string, unknown>;
    const put = await as.coordinator.put(`/api/projects/${t.demo.projectId}/settings`).set('Origin', EVIL_ORIGIN).send({
      name: 'Renamed by another site',
      description: before.description,
      dataPointName: before.dataPointName,
      dataPointLatitude: before.dataPointLatitude,
      dataPointLongitude: before.dataPointLongitude,
      dataPointDepthM: before.dataPointDepthM,
      forecastSource: before.forecastSource,
    });
    expect(put.status).toBe(403);
    expect(((await as.coordinator.get(`/api/projects/${t.demo.projectId}`)).body as { name: string }).name).toBe(before.name);

    const patch = await as.admin.patch(`/api/admin/users/${t.demo.users.skipper}`).set('Origin', EVIL_ORIGIN).send({ active: false });
    expect(patch.status).toBe(403);
    const del = await as.admin.delete(`/api/admin/users/${t.demo.users.skipper}/projects/${t.demo.projectId}`).set('Origin', EVIL_ORIGIN);
    expect(del.status).toBe(403);
    const skipper = ((await as.admin.get('/api/admin/users')).body as { id: string; active: boolean }[]).find(
      (u) => u.id === t.demo.users.skipper,
    );
    expect(skipper?.active).toBe(true);
    expect((await as.skipper.get(`/api/projects/${t.demo.projectId}`)).body.role).toBe('skipper');
  });

  it('refuses look-alike origins and the opaque origin "null"', async () => {
    for (const origin of [
      'http://localhost:3000.evil.example',
      'http://localhost:3001',
      'https://localhost:3000',
      'http://evil.example:3000',
      'null',
    ]) {
      const res = await as.coordinator
        .post('/api/projects')
        .set('Origin', origin)
        .send({ name: `From ${origin}` });
      expect(res.status, origin).toBe(403);
    }
  });

  it('refuses a request the browser marks Sec-Fetch-Site: cross-site, even without Origin', async () => {
    const res = await as.coordinator.post('/api/projects').set('Sec-Fetch-Site', 'cross-site').send({ name: 'Cross-site, no Origin' });
    expect(res.status).toBe(403);
    expect(await projectNames()).not.toContain('Cross-site, no Origin');
  });

  it('accepts the same POST from the app’s own origin', async () => {
    const res = await as.coordinator
      .post('/api/projects')
      .set('Origin', TEST_ORIGIN)
      .set('Sec-Fetch-Site', 'same-origin')
      .send({ name: 'From our own page' });
    expect(res.status).toBe(201);
  });

  it('accepts a POST without Origin (command-line and other non-browser clients)', async () => {
    const res = await as.coordinator.post('/api/projects').send({ name: 'From a script' });
    expect(res.status).toBe(201);
  });

  it('does not refuse reads from another origin, and grants no CORS read access', async () => {
    const res = await as.coordinator.get('/api/projects').set('Origin', EVIL_ORIGIN).set('Sec-Fetch-Site', 'cross-site');
    expect(res.status).toBe(200);
    expect(res.headers['access-control-allow-origin']).toBeUndefined();
    expect(res.headers['access-control-allow-credentials']).toBeUndefined();
  });

  it('lets the auth library refuse a cross-site sign-out, and the session survives', async () => {
    const agent = await signIn(t.app, 'client@example.com');
    const out = await agent.post('/api/auth/sign-out').set('Origin', EVIL_ORIGIN).send({});
    expect(out.status).toBe(403);
    expect((await agent.get('/api/me')).status).toBe(200);
  });

  it('lets the auth library refuse a cross-site sign-in (login forgery)', async () => {
    const res = await request(t.app)
      .post(SIGN_IN)
      .set('Origin', EVIL_ORIGIN)
      .set('Sec-Fetch-Site', 'cross-site')
      .set('Sec-Fetch-Mode', 'cors')
      .send({ email: 'client@example.com', password: DEMO_PASSWORD });
    expect(res.status).toBe(403);
    expect(res.headers['set-cookie']).toBeUndefined();
  });
});

describe('no account enumeration', () => {
  // OWASP Authentication Cheat Sheet ("Authentication and Error Messages": the same generic
  // answer whether the user does not exist, the password is wrong, or the account is disabled),
  // cited from memory.
  let t: TestApp;
  let deactivatedPassword: string;

  beforeAll(async () => {
    t = await createTestApp();
    const admin = await signIn(t.app, 'admin@example.com');
    const created = await admin.post('/api/admin/users').send({ name: 'Former Deckhand', email: 'former@example.com' });
    expect(created.status).toBe(201);
    deactivatedPassword = created.body.temporaryPassword;
    expect((await admin.patch(`/api/admin/users/${created.body.user.id}`).send({ active: false })).status).toBe(200);
  });
  afterAll(async () => {
    await t?.close();
  });

  const signInWith = (email: string, password: string) => request(t.app).post(SIGN_IN).set('Origin', TEST_ORIGIN).send({ email, password });

  it('answers an unknown e-mail, a wrong password and a deactivated account identically', async () => {
    const answers = {
      unknown: await signInWith('nobody-here@example.com', 'not-the-password'),
      wrongPassword: await signInWith('coordinator@example.com', 'not-the-password'),
      deactivatedWrongPassword: await signInWith('former@example.com', 'not-the-password'),
      deactivatedRightPassword: await signInWith('former@example.com', deactivatedPassword),
    };
    const reference = answers.unknown;
    expect(reference.status).toBe(401);
    for (const [name, res] of Object.entries(answers)) {
      expect(res.status, name).toBe(reference.status);
      expect(res.body, name).toEqual(reference.body);
      expect(res.headers['content-type'], name).toBe(reference.headers['content-type']);
      expect(res.headers['set-cookie'], name).toBeUndefined();
    }
  });

  it('answers closed sign-up the same for an existing and a new e-mail', async () => {
    const signUp = (email: string) =>
      request(t.app)
        .post('/api/auth/sign-up/email')
        .set('Origin', TEST_ORIGIN)
        .send({ email, password: 'a-long-password-123', name: 'Someone' });
    const existing = await signUp('coordinator@example.com');
    const fresh = await signUp('brand-new@example.com');
    expect(existing.status).toBeGreaterThanOrEqual(400);
    expect(existing.status).toBe(fresh.status);
    expect(existing.body).toEqual(fresh.body);
    expect(await t.database.db.select({ id: user.id }).from(user).where(eq(user.email, 'brand-new@example.com'))).toEqual([]);
  });

  it('has password reset and verification e-mails switched off, answering the same for any e-mail', async () => {
    for (const path of ['/api/auth/request-password-reset', '/api/auth/send-verification-email']) {
      const known = await request(t.app).post(path).set('Origin', TEST_ORIGIN).send({ email: 'coordinator@example.com', redirectTo: '/' });
      const unknown = await request(t.app)
        .post(path)
        .set('Origin', TEST_ORIGIN)
        .send({ email: 'nobody-here@example.com', redirectTo: '/' });
      expect(known.status, path).toBeGreaterThanOrEqual(400);
      expect(known.status, path).toBe(unknown.status);
      expect(known.body, path).toEqual(unknown.body);
    }
    expect(t.mailer.fake?.messages ?? []).toEqual([]);
  });
});

describe('sessions end on sign-out and on deactivation', () => {
  // OWASP Session Management Cheat Sheet ("Manual Session Expiration": the server invalidates the
  // session on logout; sessions of a disabled account end), cited from memory.
  let t: TestApp;

  beforeAll(async () => {
    t = await createTestApp();
  });
  afterAll(async () => {
    await t?.close();
  });

  const signInCookie = async (email: string, password = DEMO_PASSWORD) => {
    const res = await request(t.app).post(SIGN_IN).set('Origin', TEST_ORIGIN).send({ email, password });
    expect(res.status).toBe(200);
    return sessionCookieOf(res);
  };
  const meWith = (cookie: string) => request(t.app).get('/api/me').set('Cookie', cookie);
  /** The session row behind a cookie (its value is the token, a dot and a signature). */
  const sessionWith = async (cookie: string) => {
    const token = decodeURIComponent(cookie.split('=')[1]).split('.')[0];
    return t.database.db.select({ id: session.id }).from(session).where(eq(session.token, token));
  };

  it('invalidates the session on the server at sign-out: a copied cookie no longer works', async () => {
    const cookie = await signInCookie('skipper@example.com');
    const other = await signInCookie('skipper@example.com');
    expect((await meWith(cookie)).status).toBe(200);
    const out = await request(t.app).post('/api/auth/sign-out').set('Origin', TEST_ORIGIN).set('Cookie', cookie).send({});
    expect(out.status).toBe(200);
    // The answer clears the cookie in the browser...
    const cleared = parseSetCookies(out.headers['set-cookie']).find((c) => c.name === 'lullwatch.session_token');
    expect(cleared?.attributes.get('max-age')).toBe('0');
    // ...and the server forgets it: replaying the old value is refused.
    expect((await meWith(cookie)).status).toBe(401);
    expect(await sessionWith(cookie)).toEqual([]);
    expect((await request(t.app).post('/api/projects').set('Cookie', cookie).send({ name: 'After sign-out' })).status).toBe(401);
    // Signing out one session leaves the user's other sessions alone.
    expect((await meWith(other)).status).toBe(200);
  });

  it('ends every session of a deactivated user, on the server, and refuses new ones', async () => {
    const admin = await signIn(t.app, 'admin@example.com');
    const created = await admin.post('/api/admin/users').send({ name: 'Leaving Engineer', email: 'leaving@example.com' });
    expect(created.status).toBe(201);
    const { user: created_user, temporaryPassword } = created.body as { user: { id: string }; temporaryPassword: string };
    const laptop = await signInCookie('leaving@example.com', temporaryPassword);
    const phone = await signInCookie('leaving@example.com', temporaryPassword);
    expect((await meWith(laptop)).status).toBe(200);

    expect((await admin.patch(`/api/admin/users/${created_user.id}`).send({ active: false })).status).toBe(200);
    for (const cookie of [laptop, phone]) {
      expect((await meWith(cookie)).status).toBe(401);
      // The session rows are gone, not just filtered.
      expect(await sessionWith(cookie)).toEqual([]);
    }
    expect(await t.database.db.select({ id: session.id }).from(session).where(eq(session.userId, created_user.id))).toEqual([]);
    const again = await request(t.app)
      .post(SIGN_IN)
      .set('Origin', TEST_ORIGIN)
      .send({ email: 'leaving@example.com', password: temporaryPassword });
    expect(again.status).toBe(401);
    expect(again.headers['set-cookie']).toBeUndefined();

    // Reactivation does not bring the old sessions back.
    expect((await admin.patch(`/api/admin/users/${created_user.id}`).send({ active: true })).status).toBe(200);
    expect((await meWith(laptop)).status).toBe(401);
    expect((await signInCookie('leaving@example.com', temporaryPassword)).length).toBeGreaterThan(0);
  });
});
