// The per-instance session lookup reuse (server/http/session-cache.ts): a change takes effect at
// once on the instance that made it, and within the reuse time on another instance on the same
// database. Common practice for signed session caches, no source: the window is the trade-off
// written beside the code and in the README.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { createApp } from '../../server/app';
import { DEMO_PASSWORD } from '../../seed/scenario';
import { createTestApp, signIn, TEST_ORIGIN, type TestApp } from '../support/app';

let t: TestApp;

beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t.close();
});

async function sessionCookie(app: ReturnType<typeof createApp>, email: string): Promise<string> {
  const res = await request(app).post('/api/auth/sign-in/email').set('Origin', TEST_ORIGIN).send({ email, password: DEMO_PASSWORD });
  expect(res.status, res.text).toBe(200);
  return (res.headers['set-cookie'] as unknown as string[]).map((c) => c.split(';')[0]).join('; ');
}

const me = (app: ReturnType<typeof createApp>, cookie: string) => request(app).get('/api/me').set('Cookie', cookie);

async function signOut(app: ReturnType<typeof createApp>, cookie: string): Promise<void> {
  const out = await request(app).post('/api/auth/sign-out').set('Origin', TEST_ORIGIN).set('Cookie', cookie);
  expect(out.status, out.text).toBe(200);
}

/**
 * Signs `email` in on instance `a`, checks that instance `other` accepts the session, signs it out on
 * `a`, and answers what `a` and then `other` say to it after that.
 */
async function signOutAfterALookup(a: ReturnType<typeof createApp>, other: ReturnType<typeof createApp>, email: string) {
  const cookie = await sessionCookie(a, email);
  expect((await me(other, cookie)).status).toBe(200);
  await signOut(a, cookie);
  return { onA: (await me(a, cookie)).status, onOther: (await me(other, cookie)).status };
}

describe('session lookups reused for a few seconds per instance', () => {
  it('ends a deactivated user at once on the instance that deactivated them, and within the reuse time on another', async () => {
    const reuseMs = 1500;
    const a = createApp(t.deps, { sessionCacheMs: reuseMs });
    const b = createApp(t.deps, { sessionCacheMs: reuseMs });
    // Sign-ins empty the instance's cache too, so the administrator signs in before the lookups.
    const admin = await signIn(a, 'admin@example.com');
    const cookie = await sessionCookie(a, 'skipper@example.com');
    expect((await me(a, cookie)).status).toBe(200);
    expect((await me(b, cookie)).status).toBe(200);

    const changedAt = Date.now();
    const off = await admin.patch(`/api/admin/users/${t.demo.users.skipper}`).send({ active: false });
    expect(off.status, off.text).toBe(200);

    expect((await me(a, cookie)).status).toBe(401);
    const onB = (await me(b, cookie)).status;
    // Another instance may still answer from its reuse window, never after it.
    if (Date.now() - changedAt < reuseMs) expect([200, 401]).toContain(onB);
    await new Promise((r) => setTimeout(r, reuseMs + 100));
    expect((await me(b, cookie)).status).toBe(401);

    const on = await admin.patch(`/api/admin/users/${t.demo.users.skipper}`).send({ active: true });
    expect(on.status, on.text).toBe(200);
  });

  it('ends a signed-out session at once on the instance that signed it out', async () => {
    const a = createApp(t.deps);
    expect((await signOutAfterALookup(a, a, 'client@example.com')).onA).toBe(401);
  });

  it('looks every session up afresh when the reuse is turned off (sessionCacheMs 0)', async () => {
    const a = createApp(t.deps, { sessionCacheMs: 0 });
    const b = createApp(t.deps, { sessionCacheMs: 0 });
    expect((await signOutAfterALookup(a, b, 'coordinator@example.com')).onOther).toBe(401);
  });

  it('looks a session up once for the requests a page sends together with one cookie', async () => {
    const a = createApp(t.deps);
    const cookie = await sessionCookie(a, 'skipper@example.com');
    // The real lookup, counted (the spy calls through to the auth library).
    const getSession = vi.spyOn(t.deps.auth.api, 'getSession');
    try {
      const answers = await Promise.all(Array.from({ length: 6 }, () => me(a, cookie)));
      expect(answers.map((r) => r.status)).toEqual([200, 200, 200, 200, 200, 200]);
      expect(answers.every((r) => r.body.email === 'skipper@example.com')).toBe(true);
      expect(getSession).toHaveBeenCalledTimes(1);
      // Another browser (another cookie) has its own lookup.
      const other = await sessionCookie(a, 'client@example.com');
      expect((await me(a, other)).body.email).toBe('client@example.com');
      expect(getSession).toHaveBeenCalledTimes(2);
    } finally {
      getSession.mockRestore();
    }
  });

  it('reuses a lookup on another instance within the window (the documented trade-off)', async () => {
    const b = createApp(t.deps, { sessionCacheMs: 60_000 });
    const a = createApp(t.deps);
    // a (which handled the sign-out) refuses; b still has the lookup from before it.
    expect(await signOutAfterALookup(a, b, 'coordinator@example.com')).toEqual({ onA: 401, onOther: 200 });
  });
});
